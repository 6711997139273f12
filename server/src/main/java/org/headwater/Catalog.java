package org.headwater;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import org.headwater.analysis.ScriptLineage;
import org.headwater.harvest.FolderHarvester;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.format.FormatRegistry;
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
        // Derived like the index: built from the store now, kept current by the ingestion path.
        this.lineage = LineageGraph.load(store);
        ingestor.addListener(index);
        ingestor.addListener(lineage);
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
        FolderHarvester.Options options = FolderHarvester.Options.defaults().excluding(dataDir).withFull(full);
        return new FolderHarvester(ingestor, sources, journal, reader, FormatRegistry.standard(), options,
                new ScriptLineage(reader)).harvest(folder, progress);
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
