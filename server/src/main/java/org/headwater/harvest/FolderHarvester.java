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
import java.util.EnumMap;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.headwater.harvest.FileInspector.Facts;
import org.headwater.harvest.PartitionPatterns.Placement;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.format.Reading;
import org.headwater.ingest.Change;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Json;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.PartitionSeen;
import org.headwater.ingest.Observation.ScriptSeen;
import org.headwater.ingest.Sources;
import org.headwater.model.DatasetKind;
import org.headwater.store.CatalogReader;
import org.headwater.store.Views.FileRole;
import org.headwater.store.Views.HarvestErrorView;
import org.headwater.store.Views.KnownFile;

/**
 * Harvests a local folder: every regular file becomes a dataset, a partition of a partitioned set, or a
 * script. Hidden files and folders, the catalog's own directory, symbolic links and special files are left
 * alone. A file whose size and modification time are unchanged since the last harvest is not read again.
 * A file that cannot be read is recorded with its error, and the harvest goes on.
 *
 * <p>The walk comes first (it only lists), so that files sharing a partition pattern can be grouped
 * before any is read; files are then read in parallel, a batch at a time, and applied in path order.
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
     * @param threads how many files are read at once
     */
    public record Options(long hashCapBytes, int sampleBytes, int batchSize, Set<Path> excluded, boolean full,
            int threads) {
        public Options {
            excluded = Set.copyOf(excluded);
        }

        public static Options defaults() {
            return new Options(64L * 1024 * 1024, 64 * 1024, 250, Set.of(), false,
                    Math.max(1, Math.min(4, Runtime.getRuntime().availableProcessors())));
        }

        public Options excluding(Path folder) {
            Set<Path> more = new HashSet<>(excluded);
            more.add(folder.toAbsolutePath().normalize());
            return new Options(hashCapBytes, sampleBytes, batchSize, more, full, threads);
        }

        public Options withFull(boolean value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, value, threads);
        }
    }

    private static final int ERRORS_IN_SUMMARY = 50;

    private final Ingestor ingestor;
    private final Sources sources;
    private final HarvestJournal journal;
    private final CatalogReader reader;
    private final FileInspector inspector;
    private final Options options;
    private final org.headwater.analysis.ScriptLineage scriptLineage;

    /**
     * @param scriptLineage the static analysis run after the files are in, or null to harvest files only
     */
    public FolderHarvester(Ingestor ingestor, Sources sources, HarvestJournal journal, CatalogReader reader,
            FormatRegistry formats, Options options, org.headwater.analysis.ScriptLineage scriptLineage) {
        this.scriptLineage = scriptLineage;
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
        Run run = new Run(root, sourceId, harvestId, reader.knownFiles(sourceId), progress);
        ExecutorService pool = Executors.newFixedThreadPool(options.threads(), r -> {
            Thread t = new Thread(r, "headwater-harvest");
            t.setDaemon(true);
            return t;
        });
        String status;
        try {
            Lister lister = new Lister(root, run);
            Files.walkFileTree(root, lister);
            run.process(lister.files, pool);
            run.assembleSets();
            run.removeVanished();
            run.analyseScripts(name);
            status = run.errors == 0 ? HarvestJournal.OK : HarvestJournal.WITH_ERRORS;
        } catch (IOException | RuntimeException e) {
            journal.error(harvestId, root.toUri().toString(), "harvest_failed", String.valueOf(e.getMessage()));
            run.errors++;
            journal.finish(harvestId, HarvestJournal.FAILED, run.counts());
            progress.finished();
            throw e;
        } finally {
            pool.shutdownNow();
            run.git.close();
        }
        journal.finish(harvestId, status, run.counts());
        progress.finished();
        return new HarvestSummary(harvestId, name, root.toString(), status, run.filesSeen, run.unchanged, run.ignored,
                run.datasets, run.scripts, run.changes, run.removed, run.errors, run.errorsByKind,
                List.copyOf(run.firstErrors), (System.nanoTime() - started) / 1_000_000);
    }

    /** A regular file found by the walk, not read yet. */
    private record Listed(Path file, BasicFileAttributes attrs, String name) {
    }

    /** Lists the files of the root, skipping what is never harvested. */
    private final class Lister extends SimpleFileVisitor<Path> {
        final Path root;
        final Run run;
        final List<Listed> files = new ArrayList<>();

        Lister(Path root, Run run) {
            this.root = root;
            this.run = run;
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
        public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) {
            // walkFileTree does not follow links, so a link arrives here as a link: never followed, so
            // nothing outside the root is ever read through one.
            if (isHidden(file)) {
                run.ignored++;
            } else if (!attrs.isRegularFile() || attrs.isSymbolicLink()) {
                // Never read, but said why: a link is not followed, a device or FIFO could block or never end.
                SpecialFiles.Skip skip = SpecialFiles.describe(root, file, attrs);
                run.skipped(file.toUri().toString(), skip.kind(), skip.reason());
            } else {
                files.add(new Listed(file, attrs, root.relativize(file).toString().replace(java.io.File.separatorChar, '/')));
            }
            return FileVisitResult.CONTINUE;
        }

        @Override
        public FileVisitResult visitFileFailed(Path file, IOException e) {
            // The file or folder vanished or cannot be opened: say so and go on.
            run.error(file.toUri().toString(), "unreadable", e.getClass().getSimpleName() + ": " + e.getMessage());
            return FileVisitResult.CONTINUE;
        }
    }

    /** A partitioned set found in this harvest. */
    private record SetInfo(String uri, String name, List<String> keyNames) {
    }

    /** The state of one harvest of a root. */
    private final class Run {
        final Path root;
        final long sourceId;
        final long harvestId;
        final Map<String, KnownFile> known;
        final HarvestProgress progress;
        final Map<FileRole, Set<String>> seen = new EnumMap<>(FileRole.class);
        final Map<String, SetInfo> sets = new LinkedHashMap<>();
        final List<Observation> batch = new ArrayList<>();
        final Map<String, Integer> errorsByKind = new TreeMap<>();
        final GitHistory git = new GitHistory();
        final List<HarvestErrorView> firstErrors = new ArrayList<>();
        int filesSeen;
        int unchanged;
        int ignored;
        int datasets;
        int scripts;
        int changes;
        int removed;
        int errors;

        Run(Path root, long sourceId, long harvestId, Map<String, KnownFile> known, HarvestProgress progress) {
            this.root = root;
            this.sourceId = sourceId;
            this.harvestId = harvestId;
            this.known = known;
            this.progress = progress;
            for (FileRole role : FileRole.values()) {
                seen.put(role, new HashSet<>());
            }
        }

        void process(List<Listed> files, ExecutorService pool) throws IOException {
            Map<String, Placement> placements = group(files);
            for (int from = 0; from < files.size(); from += options.batchSize()) {
                List<Listed> chunk = files.subList(from, Math.min(files.size(), from + options.batchSize()));
                List<Future<Facts>> reading = new ArrayList<>();
                List<Listed> toRead = new ArrayList<>();
                for (Listed f : chunk) {
                    filesSeen++;
                    Placement placement = placements.get(f.name());
                    FileRole role = org.headwater.model.Language.ofFileName(f.file().getFileName().toString()).isPresent()
                            ? FileRole.SCRIPT : placement != null ? FileRole.PARTITION : FileRole.DATASET;
                    String uri = f.file().toUri().toString();
                    seen.get(role).add(uri);
                    if (role == FileRole.SCRIPT) {
                        scripts++;
                    } else if (role == FileRole.DATASET) {
                        datasets++;
                    }
                    KnownFile before = known.get(uri);
                    if (!options.full() && before != null && before.role() == role && unchanged(before, f.attrs())) {
                        unchanged++;
                        continue;
                    }
                    toRead.add(f);
                    reading.add(pool.submit(() -> inspector.inspect(f.file(), f.attrs())));
                }
                for (int i = 0; i < toRead.size(); i++) {
                    Listed f = toRead.get(i);
                    Facts facts = await(reading.get(i));
                    if (facts.errorKind() != null) {
                        error(f.file().toUri().toString(), facts.errorKind(), facts.errorMessage());
                    }
                    add(observation(f, facts, placements.get(f.name())));
                }
                progress.filesSeen(filesSeen);
                flush();
            }
        }

        /** Files that share a partition pattern with at least one other file, by name. */
        private Map<String, Placement> group(List<Listed> files) {
            Map<String, List<String>> byPattern = new HashMap<>();
            Map<String, Placement> placed = new HashMap<>();
            for (Listed f : files) {
                PartitionPatterns.place(f.name()).ifPresent(p -> {
                    placed.put(f.name(), p);
                    byPattern.computeIfAbsent(p.pattern(), k -> new ArrayList<>()).add(f.name());
                });
            }
            Map<String, Placement> grouped = new HashMap<>();
            for (Map.Entry<String, List<String>> e : byPattern.entrySet()) {
                if (e.getValue().size() < 2) {
                    continue;
                }
                for (String member : e.getValue()) {
                    Placement p = placed.get(member);
                    grouped.put(member, p);
                    sets.computeIfAbsent(p.pattern(), pattern -> new SetInfo(
                            root.resolve(pattern).toUri().toString(), pattern, List.copyOf(p.keys().keySet())));
                }
            }
            datasets += sets.size();
            return grouped;
        }

        private Observation observation(Listed f, Facts facts, Placement placement) {
            String uri = f.file().toUri().toString();
            if (facts.language().isPresent()) {
                var git = this.git.of(f.file());
                return new ScriptSeen(uri, f.name(), facts.language().get(), sourceId, facts.size(), facts.modified(),
                        facts.sha256(), git.map(GitHistory.FileHistory::commit).orElse(null),
                        git.map(GitHistory.FileHistory::author).orElse(null),
                        git.map(GitHistory.FileHistory::committedAt).orElse(null),
                        git.map(GitHistory.FileHistory::authors).orElse(List.of()));
            }
            Reading r = facts.reading();
            if (placement != null) {
                SetInfo set = sets.get(placement.pattern());
                return new PartitionSeen(set.uri(), set.name(), sourceId, uri, f.name(), Json.canonical(placement.keys()),
                        facts.size(), facts.modified(), facts.sha256(), r == null ? null : r.rowCount(),
                        r != null && r.rowCountExact(), r == null ? null : r.columns(), facts.errorMessage());
            }
            if (r == null) {
                return new DatasetSeen(uri, f.name(), DatasetKind.OTHER, sourceId, facts.fallbackFormat(), facts.size(),
                        facts.modified(), facts.sha256(), null, false, null, facts.errorMessage(), null);
            }
            return new DatasetSeen(uri, f.name(), r.kind(), sourceId, r.format(), facts.size(), facts.modified(),
                    facts.sha256(), r.rowCount(), r.rowCountExact(), Json.canonical(r.details()), null, r.columns());
        }

        /**
         * Each set's own facts, from all its stored partitions (read now or earlier). Vanished partitions
         * are ended first, so that the union schema and totals count only members still present.
         */
        void assembleSets() {
            for (KnownFile file : known.values()) {
                if (file.role() == FileRole.PARTITION && seen.get(FileRole.PARTITION).add(file.uri())) {
                    add(new Observation.PartitionGone(file.setUri(), file.uri()));
                }
            }
            flush();
            for (SetInfo set : sets.values()) {
                long id = reader.findDatasets(set.uri()).get(0).id();
                add(PartitionSetAssembler.assemble(set.uri(), set.name(), sourceId, set.keyNames(),
                        reader.partitions(id, null)));
                seen.get(FileRole.DATASET).add(set.uri());
            }
            flush();
        }

        private boolean unchanged(KnownFile before, BasicFileAttributes attrs) {
            return Objects.equals(before.sizeBytes(), attrs.size())
                    && before.modifiedAt() != null
                    && before.modifiedAt().equals(attrs.lastModifiedTime().toInstant().truncatedTo(ChronoUnit.MICROS));
        }

        /** A file left out on purpose: counted as ignored, with its reason in the harvest's error list. */
        void skipped(String uri, String kind, String message) {
            ignored++;
            journal.error(harvestId, uri, kind, message);
        }

        void error(String uri, String kind, String message) {
            errors++;
            errorsByKind.merge(kind, 1, Integer::sum);
            if (firstErrors.size() < ERRORS_IN_SUMMARY) {
                firstErrors.add(new HarvestErrorView(uri, kind, message));
            }
            journal.error(harvestId, uri, kind, message);
        }

        private void add(Observation observation) {
            batch.add(observation);
        }

        void flush() {
            apply(batch);
            batch.clear();
        }

        private void apply(List<Observation> observations) {
            if (observations.isEmpty()) {
                return;
            }
            for (Change change : ingestor.apply("harvest:" + harvestId, List.copyOf(observations))) {
                changes++;
                if (change.operation().equals("removed")) {
                    removed++;
                }
            }
        }

        /** Files the catalog holds for this source that this harvest did not find in the same role. */
        void removeVanished() {
            for (KnownFile file : known.values()) {
                if (seen.get(file.role()).contains(file.uri())) {
                    continue;
                }
                add(switch (file.role()) {
                    case SCRIPT -> new Observation.ScriptGone(file.uri());
                    case PARTITION -> new Observation.PartitionGone(file.setUri(), file.uri());
                    case DATASET -> new Observation.DatasetGone(file.uri());
                });
            }
            flush();
        }

        /**
         * Static analysis of the workspace's scripts, when anything changed: a changed data file can resolve
         * a reference, and a changed config module can change every script that imports it.
         */
        void analyseScripts(String sourceName) {
            if (scriptLineage == null || (changes == 0 && !options.full())) {
                return;
            }
            try {
                apply(scriptLineage.observe(root, sourceId, sourceName));
            } catch (IOException | RuntimeException e) {
                error(root.toUri().toString(), "analysis_failed", "Script analysis failed: " + e);
            }
        }

        HarvestJournal.Counts counts() {
            return new HarvestJournal.Counts(filesSeen, unchanged, ignored, datasets, scripts, changes, removed, errors);
        }
    }

    private static Facts await(Future<Facts> future) throws IOException {
        try {
            return future.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("Harvest interrupted", e);
        } catch (ExecutionException e) {
            throw new IOException("Reading a file failed unexpectedly", e.getCause());
        }
    }

    /** Whether a file or folder is hidden by the usual convention (a name starting with a dot); never harvested. */
    public static boolean isHidden(Path path) {
        Path name = path.getFileName();
        return name != null && name.toString().startsWith(".");
    }
}
