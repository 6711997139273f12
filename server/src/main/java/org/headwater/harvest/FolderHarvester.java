package org.headwater.harvest;

import java.io.IOException;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;
import org.headwater.harvest.FileInspector.Inspection;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.ingest.Change;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Sources;
import org.headwater.store.CatalogReader;
import org.headwater.store.Views.HarvestErrorView;
import org.headwater.store.Views.KnownFile;

/**
 * Harvests a local folder: every regular file becomes a dataset or a script observation. Hidden files and
 * folders, the catalog's own directory, symbolic links and special files are left alone. A file whose size
 * and modification time are unchanged since the last harvest is not read again. A file that cannot be
 * read is recorded with its error, and the walk goes on.
 */
public final class FolderHarvester {

    /**
     * Tuning of a folder harvest.
     *
     * @param hashCapBytes files larger than this get no content hash
     * @param sampleBytes how much of the start of each file the format readers see
     * @param batchSize observations applied per transaction
     * @param excluded folders never to enter (the catalog's own data directory)
     * @param full read every file even when it looks unchanged
     */
    public record Options(long hashCapBytes, int sampleBytes, int batchSize, Set<Path> excluded, boolean full) {
        public Options {
            excluded = Set.copyOf(excluded);
        }

        public static Options defaults() {
            return new Options(64L * 1024 * 1024, 64 * 1024, 250, Set.of(), false);
        }

        public Options excluding(Path folder) {
            Set<Path> more = new HashSet<>(excluded);
            more.add(folder.toAbsolutePath().normalize());
            return new Options(hashCapBytes, sampleBytes, batchSize, more, full);
        }

        public Options withFull(boolean value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, value);
        }
    }

    private static final int ERRORS_IN_SUMMARY = 50;

    private final Ingestor ingestor;
    private final Sources sources;
    private final HarvestJournal journal;
    private final CatalogReader reader;
    private final FileInspector inspector;
    private final Options options;

    public FolderHarvester(Ingestor ingestor, Sources sources, HarvestJournal journal, CatalogReader reader,
            FormatRegistry formats, Options options) {
        this.ingestor = ingestor;
        this.sources = sources;
        this.journal = journal;
        this.reader = reader;
        this.inspector = new FileInspector(formats, options.hashCapBytes(), options.sampleBytes());
        this.options = options;
    }

    /**
     * Harvests one folder.
     *
     * @throws NoSuchFileException when the root is not an existing directory
     */
    public HarvestSummary harvest(Path folder, HarvestProgress progress) throws IOException {
        if (!Files.isDirectory(folder)) {
            throw new NoSuchFileException(folder.toString(), null, "not a directory");
        }
        Path root = folder.toRealPath();
        String name = root.getFileName() == null ? "root" : root.getFileName().toString();
        long sourceId = sources.ensure(name, "folder", root.toUri().toString());
        long harvestId = journal.start(sourceId);
        long started = System.nanoTime();
        Walk walk = new Walk(root, sourceId, harvestId, reader.knownFiles(sourceId), progress);
        String status;
        try {
            Files.walkFileTree(root, walk);
            walk.flush();
            walk.removeVanished();
            status = walk.errors == 0 ? HarvestJournal.OK : HarvestJournal.WITH_ERRORS;
        } catch (IOException | RuntimeException e) {
            journal.error(harvestId, root.toUri().toString(), "harvest_failed", String.valueOf(e.getMessage()));
            walk.errors++;
            status = HarvestJournal.FAILED;
            journal.finish(harvestId, status, walk.counts());
            progress.finished();
            throw e;
        }
        journal.finish(harvestId, status, walk.counts());
        progress.finished();
        return new HarvestSummary(harvestId, name, root.toString(), status, walk.filesSeen, walk.unchanged, walk.ignored,
                walk.datasets, walk.scripts, walk.changes, walk.removed, walk.errors, walk.errorsByKind,
                List.copyOf(walk.firstErrors), (System.nanoTime() - started) / 1_000_000);
    }

    /** The state of one walk over a root. */
    private final class Walk extends SimpleFileVisitor<Path> {
        final Path root;
        final long sourceId;
        final long harvestId;
        final Map<String, KnownFile> known;
        final HarvestProgress progress;
        final Set<String> seenUris = new HashSet<>();
        final List<Observation> batch = new ArrayList<>();
        final Map<String, Integer> errorsByKind = new TreeMap<>();
        final List<HarvestErrorView> firstErrors = new ArrayList<>();
        int filesSeen;
        int unchanged;
        int ignored;
        int datasets;
        int scripts;
        int changes;
        int removed;
        int errors;

        Walk(Path root, long sourceId, long harvestId, Map<String, KnownFile> known, HarvestProgress progress) {
            this.root = root;
            this.sourceId = sourceId;
            this.harvestId = harvestId;
            this.known = known;
            this.progress = progress;
        }

        @Override
        public FileVisitResult preVisitDirectory(Path dir, BasicFileAttributes attrs) {
            if (dir.equals(root)) {
                return FileVisitResult.CONTINUE;
            }
            if (isHidden(dir) || options.excluded().contains(dir.toAbsolutePath().normalize())) {
                return FileVisitResult.SKIP_SUBTREE;
            }
            return FileVisitResult.CONTINUE;
        }

        @Override
        public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) throws IOException {
            // walkFileTree does not follow links, so a link arrives here as a link: never followed, so
            // nothing outside the root is ever read through one.
            if (!attrs.isRegularFile() || attrs.isSymbolicLink() || isHidden(file)) {
                ignored++;
                return FileVisitResult.CONTINUE;
            }
            filesSeen++;
            String uri = file.toUri().toString();
            seenUris.add(uri);
            KnownFile before = known.get(uri);
            boolean isScript = org.headwater.model.Language.ofFileName(file.getFileName().toString()).isPresent();
            if (isScript) {
                scripts++;
            } else {
                datasets++;
            }
            if (!options.full() && before != null && before.script() == isScript && unchanged(before, attrs)) {
                unchanged++;
            } else {
                Inspection inspection = inspector.inspect(file, attrs, relativeName(file), sourceId);
                if (inspection.errorKind() != null) {
                    error(uri, inspection.errorKind(), inspection.errorMessage());
                }
                add(inspection.observation());
            }
            progress.filesSeen(filesSeen);
            return FileVisitResult.CONTINUE;
        }

        @Override
        public FileVisitResult visitFileFailed(Path file, IOException e) {
            // The file or folder vanished or cannot be opened: say so and go on.
            error(file.toUri().toString(), "unreadable", e.getClass().getSimpleName() + ": " + e.getMessage());
            return FileVisitResult.CONTINUE;
        }

        private boolean unchanged(KnownFile before, BasicFileAttributes attrs) {
            return Objects.equals(before.sizeBytes(), attrs.size())
                    && before.modifiedAt() != null
                    && before.modifiedAt().equals(attrs.lastModifiedTime().toInstant().truncatedTo(ChronoUnit.MICROS));
        }

        private String relativeName(Path file) {
            return root.relativize(file).toString().replace(java.io.File.separatorChar, '/');
        }

        private void error(String uri, String kind, String message) {
            errors++;
            errorsByKind.merge(kind, 1, Integer::sum);
            if (firstErrors.size() < ERRORS_IN_SUMMARY) {
                firstErrors.add(new HarvestErrorView(uri, kind, message));
            }
            journal.error(harvestId, uri, kind, message);
        }

        private void add(Observation observation) {
            batch.add(observation);
            if (batch.size() >= options.batchSize()) {
                flush();
            }
        }

        void flush() {
            if (batch.isEmpty()) {
                return;
            }
            for (Change change : ingestor.apply("harvest:" + harvestId, List.copyOf(batch))) {
                changes++;
                if (change.operation().equals("removed")) {
                    removed++;
                }
            }
            batch.clear();
        }

        /** Files the catalog holds for this source that the walk did not find any more. */
        void removeVanished() {
            for (KnownFile file : known.values()) {
                if (!seenUris.contains(file.uri())) {
                    add(file.script() ? new Observation.ScriptGone(file.uri()) : new Observation.DatasetGone(file.uri()));
                }
            }
            flush();
        }

        HarvestJournal.Counts counts() {
            return new HarvestJournal.Counts(filesSeen, unchanged, ignored, datasets, scripts, changes, removed, errors);
        }
    }

    private static boolean isHidden(Path path) {
        Path name = path.getFileName();
        return name != null && name.toString().startsWith(".");
    }

}
