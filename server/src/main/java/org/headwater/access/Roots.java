package org.headwater.access;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The folders whose contents may enter the catalog through the API (run records, harvests started
 * remotely). A path is inside when its normalised form lies under a root and, if it exists, so does
 * the real path it resolves to: a link inside a root that points outside it does not count as inside.
 */
public final class Roots {
    private final List<Path> roots;
    private final List<Path> realRoots;

    private Roots(List<Path> roots) {
        this.roots = roots.stream().map(p -> p.toAbsolutePath().normalize()).toList();
        List<Path> real = new ArrayList<>();
        for (Path root : this.roots) {
            try {
                real.add(root.toRealPath());
            } catch (IOException e) {
                real.add(root);
            }
        }
        this.realRoots = List.copyOf(real);
    }

    /** Roots that admit only what lies under {@code folders}; no folders admits everything. */
    public static Roots of(List<Path> folders) {
        return new Roots(folders);
    }

    public boolean unrestricted() {
        return roots.isEmpty();
    }

    public List<Path> folders() {
        return roots;
    }

    /** Why {@code path} may not enter the catalog, or empty when it may. */
    public Optional<String> refusal(Path path) {
        if (roots.isEmpty()) {
            return Optional.empty();
        }
        if (!path.isAbsolute()) {
            return Optional.of("not an absolute path");
        }
        Path normal = path.normalize();
        if (roots.stream().noneMatch(normal::startsWith)) {
            return Optional.of("outside the configured roots " + roots);
        }
        if (Files.exists(normal, LinkOption.NOFOLLOW_LINKS)) {
            try {
                Path real = normal.toRealPath();
                if (realRoots.stream().noneMatch(real::startsWith)) {
                    return Optional.of("a symbolic link that leads outside the configured roots, to " + real);
                }
            } catch (IOException e) {
                return Optional.of("cannot be resolved (" + e.getClass().getSimpleName() + ": " + e.getMessage() + ")");
            }
        }
        return Optional.empty();
    }
}
