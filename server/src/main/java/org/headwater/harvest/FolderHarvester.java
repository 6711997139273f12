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
import org.headwater.analysis.ScriptLineage;
import org.headwater.analysis.script.ScriptAnalysis;
import org.headwater.analysis.script.WorkspaceAnalysis;
import org.headwater.harvest.FileInspector.Facts;
import org.headwater.harvest.PartitionPatterns.Placement;
import org.headwater.harvest.format.FormatReader;
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
 * Harvests a storage root (a local folder, an object-store prefix: see {@link StorageBackend}): every
 * regular file becomes a dataset, a partition of a partitioned set, or a script, and every table folder
 * (Delta Lake, Apache Iceberg) one dataset. Hidden files and folders, the catalog's own directory, symbolic
 * links and special files are left alone. A file whose size and modification time (and ETag, where the store
 * has one) are unchanged since the last harvest is not read again.
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
            int threads, NameFilter filter, boolean sampling) {
        public Options {
            excluded = Set.copyOf(excluded);
            Objects.requireNonNull(filter, "filter");
        }

        public static Options defaults() {
            return new Options(64L * 1024 * 1024, 64 * 1024, 250, Set.of(), false,
                    Math.max(1, Math.min(4, Runtime.getRuntime().availableProcessors())), NameFilter.ALL, false);
        }

        public Options excluding(Path folder) {
            Set<Path> more = new HashSet<>(excluded);
            more.add(folder.toAbsolutePath().normalize());
            return new Options(hashCapBytes, sampleBytes, batchSize, more, full, threads, filter, sampling);
        }

        public Options withFull(boolean value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, value, threads, filter, sampling);
        }

        /** Only objects whose relative names the filter selects are harvested. */
        public Options withFilter(NameFilter value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, full, threads, value, sampling);
        }

        /**
         * Whether cell values (a column's minimum and maximum) may be kept. Off strips them from what the
         * readers found before anything reaches the store.
         */
        public Options withSampling(boolean value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, full, threads, filter, value);
        }

        /** How many bytes of each object the format readers see. */
        public Options withSampleBytes(int value) {
            return new Options(hashCapBytes, value, batchSize, excluded, full, threads, filter, sampling);
        }

        public Options withThreads(int value) {
            return new Options(hashCapBytes, sampleBytes, batchSize, excluded, full, value, filter, sampling);
        }
    }

    private static final int ERRORS_IN_SUMMARY = 50;

    private final Ingestor ingestor;
    private final Sources sources;
    private final HarvestJournal journal;
    private final CatalogReader reader;
    private final FileInspector inspector;
    private final Options options;
    private final ScriptLineage scriptLineage;

    /**
     * @param scriptLineage the static analysis, applied once the files are in, or null to harvest files only
     */
    public FolderHarvester(Ingestor ingestor, Sources sources, HarvestJournal journal, CatalogReader reader,
            FormatRegistry formats, Options options, ScriptLineage scriptLineage) {
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
        LocalFolder backend = new LocalFolder(folder.toRealPath(), options.excluded());
        return harvest(backend, backend.defaultName(), progress);
    }

    /**
     * Harvests one storage root: lists it, groups partitions, reads table folders as one dataset each, reads
     * what changed, and ends what vanished. When the listing fails nothing is observed, so the source keeps
     * its previous state; the harvest is recorded as failed and the error thrown.
     *
     * @param name the preferred source name (a configured source's own)
     */
    public HarvestSummary harvest(StorageBackend backend, String name, HarvestProgress progress) throws IOException {
        long sourceId = sources.ensure(name, backend.kind(), backend.rootUri());
        long harvestId = journal.start(sourceId);
        long started = System.nanoTime();
        Run run = new Run(backend, sourceId, harvestId, reader.knownFiles(sourceId), progress);
        ExecutorService pool = Executors.newFixedThreadPool(options.threads(), r -> {
            Thread t = new Thread(r, "headwater-harvest");
            t.setDaemon(true);
            return t;
        });
        String status;
        try {
            StorageBackend.Listing listing = backend.list();
            run.ignored += listing.ignored();
            listing.problems().forEach(p -> run.error(p.uri(), p.kind(), p.message()));
            listing.skipped().forEach(p -> run.skipped(p.uri(), p.kind(), p.message()));
            List<StoredObject> selected = new ArrayList<>();
            for (StoredObject o : listing.objects()) {
                if (options.filter().selects(o.name())) {
                    selected.add(o);
                } else {
                    run.ignored++;
                }
            }
            List<StoredObject> files = run.tables(selected);
            run.startAnalysis(files, pool);
            run.process(files, pool);
            run.readTables(pool);
            run.assembleSets(pool);
            run.removeVanished();
            run.analyseScripts(name);
            run.applyOwnersFile();
            status = run.errors == 0 ? HarvestJournal.OK : HarvestJournal.WITH_ERRORS;
        } catch (IOException | RuntimeException e) {
            journal.error(harvestId, backend.rootUri(), "harvest_failed", String.valueOf(e.getMessage()));
            run.errors++;
            journal.finish(harvestId, HarvestJournal.FAILED, run.counts());
            progress.finished();
            throw new HarvestFailedException(harvestId, e);
        } finally {
            pool.shutdownNow();
            run.git.close();
        }
        journal.finish(harvestId, status, run.counts());
        progress.finished();
        String shown = backend.localRoot().map(Path::toString).orElse(backend.rootUri());
        return new HarvestSummary(harvestId, name, shown, status, run.filesSeen, run.unchanged, run.ignored,
                run.datasets, run.scripts, run.changes, run.removed, run.errors, run.errorsByKind,
                List.copyOf(run.firstErrors), (System.nanoTime() - started) / 1_000_000);
    }

    /** A partitioned set found in this harvest. */
    private record SetInfo(String uri, String name, List<String> keyNames) {
    }

    /** The state of one harvest of a root. */
    private final class Run {
        final StorageBackend backend;
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

        final Map<String, List<StoredObject>> tableMembers = new TreeMap<>();
        /**
         * Name to URI of each dataset of this root present once the harvest is in, and of each partition (to
         * its set's URI), read or unchanged: what the static analysis resolves references against, without
         * reading 50,000 rows back from the store at the end of a harvest.
         */
        final Map<String, String> datasetNames = new HashMap<>();
        final Map<String, String> partitionNames = new HashMap<>();
        /** The scripts this listing found, relative to the root in name order, for the static analysis. */
        List<Path> scriptPaths = List.of();
        /** The static analysis, started on the pool ahead of the files when anything is to be read; or null. */
        Future<List<ScriptAnalysis>> analysis;

        Run(StorageBackend backend, long sourceId, long harvestId, Map<String, KnownFile> known, HarvestProgress progress) {
            this.backend = backend;
            this.sourceId = sourceId;
            this.harvestId = harvestId;
            this.known = known;
            this.progress = progress;
            for (FileRole role : FileRole.values()) {
                seen.put(role, new HashSet<>());
            }
        }

        /** Sets the objects of table folders aside (each folder is one dataset) and returns the rest. */
        List<StoredObject> tables(List<StoredObject> objects) {
            Map<String, TableFolders.Format> roots = TableFolders.find(objects);
            if (roots.isEmpty()) {
                return objects;
            }
            List<StoredObject> rest = new ArrayList<>();
            for (StoredObject o : objects) {
                String table = TableFolders.tableOf(o.name(), roots.keySet());
                if (table == null) {
                    rest.add(o);
                } else {
                    tableMembers.computeIfAbsent(table, k -> new ArrayList<>()).add(o);
                }
            }
            return rest;
        }

        /**
         * Starts the static analysis of the listed scripts on the pool, ahead of the files, when any file
         * is new or changed: it needs no store, so it runs while the files are read instead of after them.
         * With nothing to read it is left to {@link #analyseScripts}, which then usually has nothing to do.
         */
        void startAnalysis(List<StoredObject> files, ExecutorService pool) {
            Path root = backend.localRoot().orElse(null);
            if (root == null || scriptLineage == null) {
                return;
            }
            scriptPaths = files.stream().filter(f -> WorkspaceAnalysis.analysed(f.fileName()))
                    .map(StoredObject::name).sorted().map(Path::of).toList();
            boolean anyToRead = options.full() || files.stream().anyMatch(f -> {
                KnownFile before = known.get(f.uri());
                return before == null || !unchanged(before, f);
            });
            if (anyToRead) {
                analysis = pool.submit(() -> ScriptLineage.analyse(root, scriptPaths));
            }
        }

        /**
         * Each table folder becomes one dataset read from its own metadata (always read: logs are small,
         * and an unchanged table applies as no change).
         */
        void readTables(ExecutorService pool) throws IOException {
            List<String> prefixes = new ArrayList<>(tableMembers.keySet());
            List<Future<TableFolders.Result>> reading = new ArrayList<>();
            for (String prefix : prefixes) {
                reading.add(pool.submit(() -> TableFolders.read(backend, prefix, tableMembers.get(prefix))));
            }
            for (int i = 0; i < prefixes.size(); i++) {
                String prefix = prefixes.get(i);
                TableFolders.Result result = await(reading.get(i), "Reading a table");
                String uri = backend.uriOf(prefix);
                filesSeen += tableMembers.get(prefix).size();
                datasets++;
                seen.get(FileRole.DATASET).add(uri);
                String name = prefix.isEmpty() ? backend.defaultName() : prefix.substring(0, prefix.length() - 1);
                datasetNames.put(name, uri);
                if (result.error() != null) {
                    error(uri, "unreadable_table", result.error());
                    add(new DatasetSeen(uri, name, DatasetKind.TABLE, sourceId, result.format(), null, null, null,
                            null, false, null, result.error(), null));
                } else {
                    Reading r = result.reading();
                    // Versions first: the dataset's columns then equal the newest version's and add no other.
                    add(new Observation.TableVersionsSeen(uri, name, sourceId, result.versions()));
                    add(new DatasetSeen(uri, name, r.kind(), sourceId, r.format(), result.sizeBytes(),
                            result.modified(), null, r.rowCount(), r.rowCountExact(), Json.canonical(r.details()), null,
                            r.columns()));
                }
                progress.filesSeen(filesSeen);
                journal.seen(harvestId, filesSeen);
            }
            flush();
        }

        /**
         * Reads the files a chunk at a time and applies each chunk as one batch. The next chunk is already
         * being read while one is applied, so the readers do not wait for the store; at most two chunks of
         * facts are held at once.
         */
        void process(List<StoredObject> files, ExecutorService pool) throws IOException {
            Map<String, Placement> placements = group(files);
            Chunk next = submit(files, 0, placements, pool);
            while (next != null) {
                Chunk current = next;
                next = submit(files, current.end(), placements, pool);
                for (int i = 0; i < current.toRead().size(); i++) {
                    StoredObject f = current.toRead().get(i);
                    Facts facts = await(current.reading().get(i), "Reading a file");
                    if (facts.errorKind() != null) {
                        error(f.uri(), facts.errorKind(), facts.errorMessage());
                    }
                    add(observation(f, facts, placements.get(f.name())));
                }
                progress.filesSeen(current.filesSeen());
                journal.seen(harvestId, current.filesSeen());
                flush();
            }
        }

        /** The files of one chunk being read, and how far the listing goes once it is counted. */
        private record Chunk(List<StoredObject> toRead, List<Future<Facts>> reading, int end, int filesSeen) {
        }

        private Chunk submit(List<StoredObject> files, int from, Map<String, Placement> placements,
                ExecutorService pool) {
            if (from >= files.size()) {
                return null;
            }
            int end = Math.min(files.size(), from + options.batchSize());
            List<Future<Facts>> reading = new ArrayList<>();
            List<StoredObject> toRead = new ArrayList<>();
            for (StoredObject f : files.subList(from, end)) {
                filesSeen++;
                Placement placement = placements.get(f.name());
                FileRole role = org.headwater.model.Language.ofFileName(f.fileName()).isPresent()
                        ? FileRole.SCRIPT : placement != null ? FileRole.PARTITION : FileRole.DATASET;
                String uri = f.uri();
                seen.get(role).add(uri);
                if (role == FileRole.SCRIPT) {
                    scripts++;
                } else if (role == FileRole.DATASET) {
                    datasets++;
                    datasetNames.put(f.name(), uri);
                } else {
                    partitionNames.put(f.name(), sets.get(placement.pattern()).uri());
                }
                KnownFile before = known.get(uri);
                if (!options.full() && before != null && before.role() == role && unchanged(before, f)) {
                    unchanged++;
                    continue;
                }
                toRead.add(f);
                // A partition keeps only its columns and row count; the set's own facts are summed from them.
                FormatReader.Detail detail = role == FileRole.PARTITION ? FormatReader.Detail.SCHEMA : FormatReader.Detail.FULL;
                reading.add(pool.submit(() -> inspector.inspect(backend, f, detail)));
            }
            return new Chunk(toRead, reading, end, filesSeen);
        }

        /** Files that share a partition pattern with at least one other file, by name. */
        private Map<String, Placement> group(List<StoredObject> files) {
            Map<String, List<String>> byPattern = new HashMap<>();
            Map<String, Placement> placed = new HashMap<>();
            for (StoredObject f : files) {
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
                            backend.uriOf(pattern), pattern, List.copyOf(p.keys().keySet())));
                }
            }
            datasets += sets.size();
            return grouped;
        }

        private Observation observation(StoredObject f, Facts facts, Placement placement) {
            String uri = f.uri();
            if (facts.language().isPresent()) {
                var git = backend.localFile(f).flatMap(this.git::of);
                return new ScriptSeen(uri, f.name(), facts.language().get(), sourceId, facts.size(), facts.modified(),
                        facts.sha256(), git.map(GitHistory.FileHistory::commit).orElse(null),
                        git.map(GitHistory.FileHistory::author).orElse(null),
                        git.map(GitHistory.FileHistory::committedAt).orElse(null),
                        git.map(GitHistory.FileHistory::authors).orElse(List.of()));
            }
            Reading r = options.sampling() ? facts.reading() : ValueSamples.withoutValues(facts.reading());
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
        void assembleSets(ExecutorService pool) throws IOException {
            for (KnownFile file : known.values()) {
                if (file.role() == FileRole.PARTITION && seen.get(FileRole.PARTITION).add(file.uri())) {
                    add(new Observation.PartitionGone(file.setUri(), file.uri()));
                }
            }
            flush();
            // Reading a set's partitions back and summing them needs only the store's reader: the sets are
            // assembled on the pool, and applied here in their order.
            List<Future<Observation>> assembled = new ArrayList<>();
            for (SetInfo set : sets.values()) {
                assembled.add(pool.submit(() -> {
                    long id = reader.findDatasets(set.uri()).get(0).id();
                    return PartitionSetAssembler.assemble(set.uri(), set.name(), sourceId, set.keyNames(),
                            reader.partitions(id, null));
                }));
                seen.get(FileRole.DATASET).add(set.uri());
                datasetNames.put(set.name(), set.uri());
            }
            for (Future<Observation> set : assembled) {
                add(await(set, "Assembling a partitioned set"));
            }
            flush();
        }

        private boolean unchanged(KnownFile before, StoredObject now) {
            // Where the store gives an ETag it must match too: a rewrite within the same second and size
            // keeps the modification time and size of an object store, not its ETag.
            return Objects.equals(before.sizeBytes(), now.size())
                    && before.modifiedAt() != null
                    && before.modifiedAt().equals(now.modified().truncatedTo(ChronoUnit.MICROS))
                    && (now.etag() == null || Objects.equals(before.contentHash(), FileInspector.etagIdentity(now.etag())));
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
            Path root = backend.localRoot().orElse(null);
            if (root == null || scriptLineage == null || (changes == 0 && !options.full())) {
                return;
            }
            try {
                List<ScriptAnalysis> analyses = analysis != null ? analysis.get() : ScriptLineage.analyse(root, scriptPaths);
                // Partitions last, as CatalogReader.namesOfSource reads them: a partition's name stands for its set.
                Map<String, String> names = new HashMap<>(datasetNames);
                names.putAll(partitionNames);
                // The harvest's own account must be the store's (checked whenever assertions are on: the tests).
                assert names.equals(reader.namesOfSource(sourceId)) : "the harvest's dataset names differ from the store's";
                apply(scriptLineage.observe(root, sourceId, sourceName, analyses, names));
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                error(root.toUri().toString(), "analysis_failed", "Script analysis interrupted");
            } catch (ExecutionException | RuntimeException e) {
                Throwable cause = e instanceof ExecutionException ? e.getCause() : e;
                error(root.toUri().toString(), "analysis_failed", "Script analysis failed: " + cause);
            }
        }

        /**
         * The owners file's rules, turned into ownerships of this source's datasets (after analysis: views
         * too). Only local folders have one for now; an object store's would be read through the backend.
         */
        void applyOwnersFile() {
            Path root = backend.localRoot().orElse(null);
            if (root == null) {
                return;
            }
            String fileUri = root.resolve(org.headwater.owners.OwnersFile.NAME).toUri().toString();
            org.headwater.owners.OwnersFile file;
            try {
                file = org.headwater.owners.OwnersFile.read(root);
            } catch (IOException e) {
                error(fileUri, "owners_file", "Cannot read the owners file: " + e.getMessage());
                return;
            }
            file.problems().forEach(p -> error(fileUri, "owners_file", p.toString()));
            var owners = reader.owners();
            batch.addAll(org.headwater.owners.FileOwners.observe(file, owners.presentOfSource(sourceId),
                    owners.currentOfSource(sourceId)));
            flush();
        }

        HarvestJournal.Counts counts() {
            return new HarvestJournal.Counts(filesSeen, unchanged, ignored, datasets, scripts, changes, removed, errors);
        }
    }

    /** The result of work handed to the pool; {@code what} names the work in the error when it failed. */
    private static <T> T await(Future<T> future, String what) throws IOException {
        try {
            return future.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("Harvest interrupted", e);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof java.io.UncheckedIOException u && u.getCause() instanceof StoreUnavailableException s) {
                throw s;
            }
            throw new IOException(what + " failed unexpectedly", e.getCause());
        }
    }

    /** Whether a file or folder is hidden by the usual convention (a name starting with a dot); never harvested. */
    public static boolean isHidden(Path path) {
        Path name = path.getFileName();
        return name != null && name.toString().startsWith(".");
    }
}
