package dev.erg.device;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.networknt.schema.JsonSchema;
import com.networknt.schema.JsonSchemaFactory;
import com.networknt.schema.SpecVersion;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;

/** The packaged profile schema, read and compiled once, on first use. */
final class SchemaSource {
    private SchemaSource() {
    }

    static final JsonNode JSON;
    static final JsonSchema SCHEMA;

    static {
        quietLogging();
        try (InputStream in = SchemaSource.class.getClassLoader().getResourceAsStream(ProfileSchema.RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException("the profile schema " + ProfileSchema.RESOURCE + " is not packaged");
            }
            JSON = new ObjectMapper().readTree(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        SCHEMA = JsonSchemaFactory.getInstance(SpecVersion.VersionFlag.V202012).getSchema(JSON);
    }

    /**
     * The validator logs through SLF4J. When no logging provider is on the class path (the CLI), SLF4J
     * falls back to no logging but first warns on stderr; select that fallback explicitly instead, so a
     * command's output stays its own. A host with a provider (Maven, an application) is left alone.
     */
    private static void quietLogging() {
        if (System.getProperty("slf4j.provider") != null) {
            return;
        }
        try {
            Class<?> spi = Class.forName("org.slf4j.spi.SLF4JServiceProvider");
            if (java.util.ServiceLoader.load(spi, spi.getClassLoader()).findFirst().isPresent()) {
                return;
            }
        } catch (ClassNotFoundException | java.util.ServiceConfigurationError e) {
            return;
        }
        System.setProperty("slf4j.provider", "org.slf4j.helpers.NOP_FallbackServiceProvider");
        if (System.getProperty("slf4j.internal.verbosity") == null) {
            System.setProperty("slf4j.internal.verbosity", "WARN");
        }
    }
}
