package org.headwater.cli;

import java.io.IOException;
import java.net.URI;
import java.net.URISyntaxException;
import java.net.URL;
import java.nio.file.FileSystem;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.stream.Stream;

/** The invented demo workspace shipped inside the jar (from the examples module), copied out to a folder. */
final class DemoWorkspace {
    static final String RESOURCE = "headwater-demo/quillwater-lab";

    private DemoWorkspace() {
    }

    /** Copies the workspace into {@code target}/quillwater-lab and returns that folder. */
    static Path copyTo(Path target) throws IOException {
        URL url = DemoWorkspace.class.getClassLoader().getResource(RESOURCE);
        if (url == null) {
            throw new IOException("The demo workspace is not on the class path (" + RESOURCE + "); build with 'mvn package'");
        }
        Path destination = target.resolve("quillwater-lab");
        try {
            URI uri = url.toURI();
            if (uri.getScheme().equals("jar")) {
                try (FileSystem jar = FileSystems.newFileSystem(uri, Map.of())) {
                    copyTree(jar.provider().getPath(uri), destination);
                }
            } else {
                copyTree(Path.of(uri), destination);
            }
        } catch (URISyntaxException e) {
            throw new IOException("Bad resource location " + url, e);
        }
        return destination;
    }

    private static void copyTree(Path from, Path to) throws IOException {
        try (Stream<Path> paths = Files.walk(from)) {
            for (Path p : (Iterable<Path>) paths::iterator) {
                Path rel = from.relativize(p);
                Path out = to.resolve(rel.toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(out);
                } else {
                    Files.createDirectories(out.getParent());
                    Files.copy(p, out);
                }
            }
        }
    }

    /** Deletes a folder tree, best effort; used for the demo's temporary catalog at exit. */
    static void deleteTree(Path root) {
        if (!Files.exists(root)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(root)) {
            paths.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException e) {
            // Leaving a temporary folder behind is harmless; the operating system cleans it.
        }
    }
}
