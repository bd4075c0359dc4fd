package dev.erg.maven;

import java.util.ArrayList;
import java.util.List;
import org.apache.maven.plugin.logging.SystemStreamLog;

/** A mojo log that keeps the info and warning lines, prefixed "[INFO] " and "[WARNING] " as Maven prints them. */
final class CapturingLog extends SystemStreamLog {
    final List<String> lines = new ArrayList<>();

    @Override
    public void info(CharSequence content) {
        lines.add("[INFO] " + content);
    }

    @Override
    public void warn(CharSequence content) {
        lines.add("[WARNING] " + content);
    }
}
