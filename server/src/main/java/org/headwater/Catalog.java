package org.headwater;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import org.headwater.analysis.ScriptLineage;
import org.headwater.checks.FreshnessChecks;
import org.headwater.checks.PolicySync;
import org.headwater.harvest.FolderHarvester;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.StorageBackend;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.jdbc.DatabaseHarvester;
import org.headwater.harvest.jdbc.DatabaseSource;
import org.headwater.ingest.ChangeFollower;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Sources;
import org.headwater.lineage.LineageGraph;
import org.headwater.search.SearchIndex;
import org.headwater.store.CatalogReader;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;

/**
 * One open catalog: the store, the ingestion path and the search index, wired together. The CLI and the
 * HTTP server each hold one; tests open one on a temporary directory.
 */
public final class Catalog implements AutoCloseable {
    private final Path dataDir;
    private final Store store;
    private final CatalogReader reader;
    private final Ingestor ingestor;
    private final Sources sources;
    private final HarvestJournal journal;
    private final SearchIndex index;
    private final LineageGraph lineage;
    private final Clock clock;
    private final ChangeFollower follower;

    /** How often a catalog on a shared store looks for changes other processes made. */
    public static final Duration FOLLOW_INTERVAL = Duration.ofSeconds(1);

    private Catalog(Path dataDir, Store store, SearchIndex index, Clock clock, long seen, Duration followInterval) {
        this.dataDir = dataDir;
        this.store = store;
        this.reader = new CatalogReader(store);
        this.ingestor = new Ingestor(store, clock);
        this.sources = new Sources(store, clock);
        this.journal = new HarvestJournal(store, clock);
        this.index = index;
        this.clock = clock;
        // Derived like the index: built from the store now, kept current by the ingestion path.
        this.lineage = LineageGraph.load(store);
        ingestor.addListener(index);
        ingestor.addListener(lineage);
        // The search's freshness facet shows the states the checks last recorded.
        var recorded = new org.headwater.checks.RecordedStates(store);
        ingestor.addListener(recorded);
        index.useFreshness(recorded);
        // On a shared store, other processes write too: follow the change log from where the index and
        // the graph were loaded (re-delivering a change is harmless, missing one is not).
        this.follower = ChangeFollower.start(store, ingestor, seen, store.shared() ? followInterval : null);
        journal.markInterrupted();
    }

    /** Opens (creating if needed) the catalog kept in {@code dataDir}: {@code catalog.mv.db} and {@code index/}. */
    public static Catalog open(Path dataDir) {
        return open(dataDir, StoreConfig.embedded(dataDir), Clock.systemUTC());
    }

    /** Opens a catalog whose store is described by {@code storeConfig}; the index lives in {@code dataDir}. */
    public static Catalog open(Path dataDir, StoreConfig storeConfig, Clock clock) {
        return open(dataDir, storeConfig, clock, FOLLOW_INTERVAL);
    }

    /**
     * Opens a catalog; on a shared store it polls the change log every {@code followInterval} (null: only
     * when {@link ChangeFollower#poll} is called, for tests that want to decide when).
     */
    public static Catalog open(Path dataDir, StoreConfig storeConfig, Clock clock, Duration followInterval) {
        Path dir = dataDir.toAbsolutePath().normalize();
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UncheckedIOException("Cannot create the catalog directory " + dir, e);
        }
        Store store = Store.open(storeConfig);
        try {
            long seen = new CatalogReader(store).lastChangeSeq();
            SearchIndex index = SearchIndex.open(dir.resolve("index"), new CatalogReader(store));
            try {
                return new Catalog(dir, store, index, clock, seen, followInterval);
            } catch (RuntimeException e) {
                index.close();
                throw e;
            }
        } catch (RuntimeException e) {
            store.close();
            throw e;
        }
    }

    /** Harvests a local folder through the ingestion path; the catalog directory itself is never harvested. */
    public HarvestSummary harvestFolder(Path folder, boolean full, HarvestProgress progress) throws IOException {
        return harvestFolder(folder, full, false, progress);
    }

    /**
     * As above; {@code sampling} keeps the smallest and largest value of number and date columns, which are
     * cell values and so stay out of the catalog unless asked for (README, "A caution about personal data").
     */
    public HarvestSummary harvestFolder(Path folder, boolean full, boolean sampling, HarvestProgress progress)
            throws IOException {
        FolderHarvester.Options options = harvestOptions(full).withSampling(sampling);
        HarvestSummary summary = new FolderHarvester(ingestor, sources, journal, reader,
                FormatRegistry.forHarvest(options.sampling()), options, new ScriptLineage(reader)).harvest(folder, progress);
        return withPolicyFile(folder, summary);
    }

    /** Reads the folder's freshness policy file after its files; a bad line is a harvest error, never a stop. */
    private HarvestSummary withPolicyFile(Path folder, HarvestSummary summary) throws IOException {
        PolicySync.FileResult result = new PolicySync(store, ingestor).applyFile(folder, "harvest:" + summary.harvestId());
        if (result.problems().isEmpty()) {
            return summary;
        }
        String uri = result.file().toUri().toString();
        var errorsByKind = new java.util.TreeMap<>(summary.errorsByKind());
        var firstErrors = new java.util.ArrayList<>(summary.firstErrors());
        for (var problem : result.problems()) {
            String message = (problem.line() > 0 ? "line " + problem.line() + ": " : "") + problem.message();
            journal.error(summary.harvestId(), uri, "freshness_policy", message);
            errorsByKind.merge("freshness_policy", 1, Integer::sum);
            firstErrors.add(new org.headwater.store.Views.HarvestErrorView(uri, "freshness_policy", message));
        }
        journal.addErrors(summary.harvestId(), result.problems().size());
        String status = summary.status().equals(HarvestJournal.OK) ? HarvestJournal.WITH_ERRORS : summary.status();
        return new HarvestSummary(summary.harvestId(), summary.source(), summary.root(), status, summary.filesSeen(),
                summary.filesUnchanged(), summary.filesIgnored(), summary.datasets(), summary.scripts(), summary.changes(),
                summary.removed(), summary.errors() + result.problems().size(), errorsByKind, firstErrors,
                summary.elapsedMillis());
    }

    /** Freshness checks of this catalog's datasets, on the catalog's clock. */
    public FreshnessChecks freshness() {
        return new FreshnessChecks(store, lineage, ingestor, clock);
    }

    /** Freshness policies from policy files and from people. */
    public PolicySync policies() {
        return new PolicySync(store, ingestor);
    }

    /** Harvests a database over JDBC through the ingestion path; a failure is reported in the summary. */
    public HarvestSummary harvestDatabase(DatabaseSource source, HarvestProgress progress) {
        return new DatabaseHarvester(ingestor, sources, journal, reader).harvest(source, progress);
    }

    /** The folder harvest's defaults for this catalog: its own directory is never harvested. */
    public FolderHarvester.Options harvestOptions(boolean full) {
        return FolderHarvester.Options.defaults().excluding(dataDir).withFull(full);
    }

    /**
     * Harvests any storage backend (a configured folder, an object-store prefix) through the ingestion path;
     * a local folder's freshness policy file is read after its files, as for {@link #harvestFolder}.
     */
    public HarvestSummary harvest(StorageBackend backend, String sourceName, FolderHarvester.Options options,
            HarvestProgress progress) throws IOException {
        java.util.Optional<Path> root = backend.localRoot();
        ScriptLineage scripts = root.isPresent() ? new ScriptLineage(reader) : null;
        HarvestSummary summary = new FolderHarvester(ingestor, sources, journal, reader,
                FormatRegistry.forHarvest(options.sampling()), options, scripts).harvest(backend, sourceName, progress);
        return root.isPresent() ? withPolicyFile(root.get(), summary) : summary;
    }

    /**
     * Records a harvest of a source that failed before it could start (bad settings, missing folder): the
     * source gets a harvest record with status failed and the message, and nothing else changes.
     */
    public long recordFailedHarvest(String sourceName, String kind, String rootUri, String message) {
        long sourceId = sources.ensure(sourceName, kind, rootUri);
        long harvestId = journal.start(sourceId);
        journal.error(harvestId, rootUri, "harvest_failed", message);
        journal.finish(harvestId, HarvestJournal.FAILED, new HarvestJournal.Counts(0, 0, 0, 0, 0, 0, 0, 1));
        return harvestId;
    }

    /** Marks a harvest as run by the sources-file entry {@code configuredName} (see {@code HarvestJournal#runAs}). */
    public void recordRunAs(long harvestId, String configuredName) {
        journal.runAs(harvestId, configuredName);
    }

    public Path dataDir() {
        return dataDir;
    }

    public CatalogReader reader() {
        return reader;
    }

    public Ingestor ingestor() {
        return ingestor;
    }

    public SearchIndex index() {
        return index;
    }

    /** The in-memory lineage graph, for upstream and downstream walks. */
    public LineageGraph lineage() {
        return lineage;
    }

    /** What brings in changes other processes made to a shared store. */
    public ChangeFollower follower() {
        return follower;
    }

    /** The harvest records. */
    public HarvestJournal journal() {
        return journal;
    }

    /** The underlying store, for tools and tests that need to look below the reader. */
    public Store store() {
        return store;
    }

    @Override
    public void close() {
        try {
            follower.close();
            index.close();
        } finally {
            store.close();
        }
    }
}
