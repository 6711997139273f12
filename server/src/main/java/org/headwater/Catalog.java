package org.headwater;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import org.headwater.analysis.ScriptLineage;
import org.headwater.harvest.FolderHarvester;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.jdbc.DatabaseHarvester;
import org.headwater.harvest.jdbc.DatabaseSource;
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

    private Catalog(Path dataDir, Store store, SearchIndex index, Clock clock) {
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
    }

    /** Opens (creating if needed) the catalog kept in {@code dataDir}: {@code catalog.mv.db} and {@code index/}. */
    public static Catalog open(Path dataDir) {
        return open(dataDir, StoreConfig.embedded(dataDir), Clock.systemUTC());
    }

    /** Opens a catalog whose store is described by {@code storeConfig}; the index lives in {@code dataDir}. */
    public static Catalog open(Path dataDir, StoreConfig storeConfig, Clock clock) {
        Path dir = dataDir.toAbsolutePath().normalize();
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UncheckedIOException("Cannot create the catalog directory " + dir, e);
        }
        Store store = Store.open(storeConfig);
        try {
            SearchIndex index = SearchIndex.open(dir.resolve("index"), new CatalogReader(store));
            return new Catalog(dir, store, index, clock);
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

    /** Harvests a database over JDBC through the ingestion path; a failure is reported in the summary. */
    public HarvestSummary harvestDatabase(DatabaseSource source, HarvestProgress progress) {
        return new DatabaseHarvester(ingestor, sources, journal, reader).harvest(source, progress);
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

    /** The underlying store, for tools and tests that need to look below the reader. */
    public Store store() {
        return store;
    }

    @Override
    public void close() {
        try {
            index.close();
        } finally {
            store.close();
        }
    }
}
