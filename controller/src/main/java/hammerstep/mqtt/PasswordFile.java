package hammerstep.mqtt;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.util.Arrays;
import java.util.Set;

/** The broker password, kept in a file of its own that only the service may read. Never logged. */
public final class PasswordFile {

    private PasswordFile() {
    }

    /** Why the file cannot be used, or null when it can. */
    public static String problem(Path file) {
        if (!Files.isRegularFile(file)) {
            return "no such file " + file;
        }
        try {
            Set<PosixFilePermission> perms = Files.getPosixFilePermissions(file);
            if (perms.contains(PosixFilePermission.OTHERS_READ) || perms.contains(PosixFilePermission.OTHERS_WRITE)) {
                return file + " is readable or writable by every user: chmod 600 (or 640 for the service group)";
            }
        } catch (UnsupportedOperationException e) {
            return null;
        } catch (IOException e) {
            return "cannot read " + file + ": " + e.getMessage();
        }
        if (!Files.isReadable(file)) {
            return "cannot read " + file;
        }
        return null;
    }

    /** The password: the file's bytes without a trailing line break. */
    public static byte[] read(Path file) throws IOException {
        String why = problem(file);
        if (why != null) {
            throw new IOException(why);
        }
        byte[] bytes = Files.readAllBytes(file);
        int end = bytes.length;
        while (end > 0 && (bytes[end - 1] == '\n' || bytes[end - 1] == '\r')) {
            end--;
        }
        byte[] pw = Arrays.copyOf(bytes, end);
        Arrays.fill(bytes, (byte) 0);
        if (pw.length == 0) {
            throw new IOException(file + " is empty");
        }
        return pw;
    }

    /** The password as text, for clients that take a string. */
    static String text(byte[] pw) {
        return new String(pw, StandardCharsets.UTF_8);
    }
}
