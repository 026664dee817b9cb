package hammerstep.config;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.Set;

/**
 * Whether a folder named in a configuration file can hold the station's files: it is a writable
 * folder, or the nearest part of its path that exists is one (so the station can make it). Checked
 * without making anything, as {@code hammerstep check} and {@code hammerstep run} read the file alike;
 * the answer is for the user who checks (run {@code check} as the service's user).
 */
public final class Folders {

    /** File systems that show kernel state, not storage: nothing written there is kept. */
    private static final Set<String> KERNEL_FILE_SYSTEMS = Set.of("proc", "sysfs", "devtmpfs", "devpts", "cgroup",
            "cgroup2", "debugfs", "tracefs", "securityfs", "configfs", "pstore", "bpf", "efivarfs", "mqueue",
            "fusectl", "binfmt_misc");

    private Folders() {
    }

    /** Why {@code dir} cannot be (made into) a writable folder, or null when it can. */
    public static String problem(Path dir) {
        Path p = dir.toAbsolutePath().normalize();
        Path existing = p;
        while (existing != null && !Files.exists(existing, LinkOption.NOFOLLOW_LINKS)) {
            existing = existing.getParent();
        }
        if (existing == null) {
            return "no part of " + p + " exists";
        }
        if (!Files.isDirectory(existing)) {
            return existing.equals(p) ? p + " is " + kind(p) + ", not a folder"
                    : existing + " is " + kind(existing) + ": no folder can be made in it";
        }
        String type = fileSystem(existing);
        if (type != null && KERNEL_FILE_SYSTEMS.contains(type)) {
            return p + " is on the " + type + " file system, which shows kernel state and keeps nothing";
        }
        if (!Files.isWritable(existing)) {
            String who = " for user " + System.getProperty("user.name") + " (check as the service's user)";
            return existing.equals(p) ? "the folder " + p + " is not writable" + who
                    : "cannot make " + p + ": " + existing + " is not writable" + who;
        }
        return null;
    }

    private static String kind(Path p) {
        return Files.isSymbolicLink(p) && !Files.exists(p) ? "a broken link" : "a file";
    }

    private static String fileSystem(Path p) {
        try {
            return Files.getFileStore(p).type();
        } catch (IOException | SecurityException e) {
            return null;
        }
    }
}
