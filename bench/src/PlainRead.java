import java.io.FileInputStream;
import java.io.IOException;
import java.io.InputStream;

/**
 * The benchmark's reference: reads every byte of a file through a FileInputStream with a 1 MiB
 * buffer and prints the byte count. Usage: java -cp CLASSES PlainRead FILE
 */
public final class PlainRead {
    private PlainRead() {
    }

    public static void main(String[] args) throws IOException {
        byte[] buf = new byte[1 << 20];
        long total = 0;
        try (InputStream in = new FileInputStream(args[0])) {
            int n;
            while ((n = in.read(buf)) > 0) {
                total += n;
            }
        }
        System.out.println(total + " bytes read");
    }
}
