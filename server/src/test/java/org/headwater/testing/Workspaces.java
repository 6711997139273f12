package org.headwater.testing;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

/** Locates the repository's example workspaces and copies them where a test may change them. */
public final class Workspaces {
    private Workspaces() {
    }

    /** The repository root: set by the build, else found by walking up from the working directory. */
    public static Path repoRoot() {
        String configured = System.getProperty("headwater.repoRoot");
        if (configured != null && !configured.isBlank() && !configured.startsWith("$")) {
            return Path.of(configured).toAbsolutePath().normalize();
        }
        Path dir = Path.of("").toAbsolutePath();
        while (dir != null && !Files.isDirectory(dir.resolve("examples"))) {
            dir = dir.getParent();
        }
        if (dir == null) {
            throw new IllegalStateException("Cannot find the repository root (no examples/ folder above the working directory)");
        }
        return dir;
    }

    /** The demo workspace, read-only by convention. */
    public static Path demo() {
        return repoRoot().resolve("examples/quillwater-lab");
    }

    /** The second invented workspace (a bakery cooperative's ovens, orders and deliveries), read-only by convention. */
    public static Path bakery() {
        return repoRoot().resolve("examples/ovenmere-bakery");
    }

    /** A private copy of the demo workspace, for tests that touch files. */
    public static Path demoCopy(Path target) throws IOException {
        Path from = demo();
        Path to = target.resolve("quillwater-lab");
        try (Stream<Path> paths = Files.walk(from)) {
            for (Path p : (Iterable<Path>) paths::iterator) {
                Path out = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(out);
                } else {
                    Files.copy(p, out);
                    Files.setLastModifiedTime(out, Files.getLastModifiedTime(p));
                }
            }
        }
        return to;
    }
}
