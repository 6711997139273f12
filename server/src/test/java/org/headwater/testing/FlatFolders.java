package org.headwater.testing;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

/** Copies and deletes a folder of plain files with no subfolders, as a Lucene index directory is. */
public final class FlatFolders {
    private FlatFolders() {
    }

    public static void copy(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (Stream<Path> files = Files.list(from)) {
            for (Path f : (Iterable<Path>) files::iterator) {
                Files.copy(f, to.resolve(f.getFileName()));
            }
        }
    }

    public static void delete(Path dir) throws IOException {
        try (Stream<Path> files = Files.list(dir)) {
            for (Path f : (Iterable<Path>) files::iterator) {
                Files.delete(f);
            }
        }
        Files.delete(dir);
    }
}
