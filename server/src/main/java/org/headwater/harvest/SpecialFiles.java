package org.headwater.harvest;

import java.io.IOException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.Map;

/**
 * Names what a walk found that is not a regular file, and why it is not read: symbolic links (with where
 * they lead: inside the root, outside it, nowhere, or round in a loop), FIFOs, devices and sockets.
 */
final class SpecialFiles {
    /** The file type bits of {@code st_mode} (POSIX {@code S_IFMT} and its values, from {@code <sys/stat.h>}). */
    private static final int S_IFMT = 0170000;
    private static final Map<Integer, Skip> BY_MODE = Map.of(
            0010000, new Skip("fifo", "a FIFO (named pipe): reading it could block the harvest, so it is skipped"),
            0020000, new Skip("device_file", "a character device: not a data file, skipped"),
            0060000, new Skip("device_file", "a block device: not a data file, skipped"),
            0140000, new Skip("socket", "a socket: not a data file, skipped"));

    private SpecialFiles() {
    }

    /** Why a file is skipped: a {@code harvest_error} kind and a sentence. */
    record Skip(String kind, String reason) {
    }

    static Skip describe(Path root, Path file, BasicFileAttributes attrs) {
        if (attrs.isSymbolicLink()) {
            return link(root, file);
        }
        try {
            Object mode = Files.getAttribute(file, "unix:mode", LinkOption.NOFOLLOW_LINKS);
            if (mode instanceof Integer m && BY_MODE.containsKey(m & S_IFMT)) {
                return BY_MODE.get(m & S_IFMT);
            }
        } catch (IOException | UnsupportedOperationException | IllegalArgumentException e) {
            // No unix view (not a POSIX file system): fall through to the general answer.
        }
        return new Skip("special_file", "not a regular file, skipped");
    }

    private static Skip link(Path root, Path file) {
        try {
            Path target = file.toRealPath();
            return target.startsWith(root)
                    ? new Skip("symlink", "a symbolic link to " + root.relativize(target) + " inside the root; links are never followed")
                    : new Skip("symlink_escape", "a symbolic link that leads outside the root, to " + target + "; not followed");
        } catch (NoSuchFileException e) {
            return new Skip("symlink_dangling", "a symbolic link to nothing; not followed");
        } catch (FileSystemException e) {
            // ELOOP comes as a FileSystemException whose reason names the loop.
            String reason = String.valueOf(e.getReason());
            return reason.contains("levels of symbolic links")
                    ? new Skip("symlink_loop", "a symbolic link in a loop (" + reason + "); not followed")
                    : new Skip("symlink", "a symbolic link that cannot be resolved (" + reason + "); not followed");
        } catch (IOException e) {
            return new Skip("symlink", "a symbolic link that cannot be resolved (" + e.getMessage() + "); not followed");
        }
    }
}
