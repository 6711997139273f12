package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.harvest.format.FileTailReader;
import org.headwater.harvest.format.TailReader;

/**
 * A local folder as a storage backend. Hidden files and folders, excluded folders (the catalog's own),
 * symbolic links and special files are never listed.
 */
public final class LocalFolder implements StorageBackend {
    private final Path root;
    private final Set<Path> excluded;
    private final Map<String, Path> files = new HashMap<>();

    /** @param root an existing directory, already resolved to its real path */
    public LocalFolder(Path root, Set<Path> excluded) {
        this.root = root;
        this.excluded = Set.copyOf(excluded);
    }

    @Override
    public String kind() {
        return "folder";
    }

    @Override
    public String rootUri() {
        return root.toUri().toString();
    }

    @Override
    public String defaultName() {
        return root.getFileName() == null ? "root" : root.getFileName().toString();
    }

    @Override
    public Listing list() throws IOException {
        List<StoredObject> objects = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        List<Problem> skipped = new ArrayList<>();
        int[] ignored = {0};
        Files.walkFileTree(root, new SimpleFileVisitor<>() {
            @Override
            public FileVisitResult preVisitDirectory(Path dir, BasicFileAttributes attrs) {
                if (dir.equals(root)) {
                    return FileVisitResult.CONTINUE;
                }
                if (FolderHarvester.isHidden(dir) || excluded.contains(dir.toAbsolutePath().normalize())) {
                    return FileVisitResult.SKIP_SUBTREE;
                }
                return FileVisitResult.CONTINUE;
            }

            @Override
            public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) {
                // walkFileTree does not follow links, so a link arrives here as a link: never followed, so
                // nothing outside the root is ever read through one.
                if (FolderHarvester.isHidden(file)) {
                    ignored[0]++;
                } else if (!attrs.isRegularFile() || attrs.isSymbolicLink()) {
                    // Never read, but said why: a link is not followed, a device or FIFO could block or never end.
                    SpecialFiles.Skip skip = SpecialFiles.describe(root, file, attrs);
                    skipped.add(new Problem(file.toUri().toString(), skip.kind(), skip.reason()));
                } else {
                    String name = root.relativize(file).toString().replace(java.io.File.separatorChar, '/');
                    StoredObject object = new StoredObject(name, file.toUri().toString(), attrs.size(),
                            attrs.lastModifiedTime().toInstant(), null);
                    synchronized (files) {
                        files.put(name, file);
                    }
                    objects.add(object);
                }
                return FileVisitResult.CONTINUE;
            }

            @Override
            public FileVisitResult visitFileFailed(Path file, IOException e) {
                // The file or folder vanished or cannot be opened: say so and go on.
                problems.add(new Problem(file.toUri().toString(), "unreadable",
                        e.getClass().getSimpleName() + ": " + e.getMessage()));
                return FileVisitResult.CONTINUE;
            }
        });
        return new Listing(objects, ignored[0], problems, skipped);
    }

    @Override
    public String uriOf(String relativeName) {
        return root.resolve(relativeName).toUri().toString();
    }

    @Override
    public InputStream open(StoredObject object, long length) throws IOException {
        return Files.newInputStream(file(object));
    }

    @Override
    public boolean hashesContent() {
        return true;
    }

    @Override
    public TailReader tailOf(StoredObject object) {
        return new FileTailReader(file(object), object.size());
    }

    @Override
    public Optional<Path> localFile(StoredObject object) {
        return Optional.of(file(object));
    }

    @Override
    public Optional<Path> localRoot() {
        return Optional.of(root);
    }

    private Path file(StoredObject object) {
        synchronized (files) {
            Path known = files.get(object.name());
            return known != null ? known : root.resolve(object.name());
        }
    }
}
