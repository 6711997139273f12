package org.headwater.lineage;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeSet;
import java.util.concurrent.locks.ReentrantReadWriteLock;
import java.util.function.Function;
import org.headwater.ingest.Change;
import org.headwater.ingest.ChangeListener;
import org.headwater.store.Store;

/**
 * The lineage of the whole catalog in memory, for answers in microseconds: datasets and columns as int
 * nodes, edges as parallel arrays, adjacency both ways. The store stays the truth: the graph is built
 * from it at start and, registered as an ingestor listener, re-reads the edges each committed batch
 * changed. A graph loaded {@linkplain #loadAsOf as of an instant} is a frozen picture of the past.
 *
 * <p>Walks may run concurrently with each other; a batch's changes are applied under a write lock.
 */
public final class LineageGraph implements ChangeListener {
    private final LineageLoader loader;
    private final Instant asOf;
    private final GraphIndex index;
    private final ReentrantReadWriteLock lock = new ReentrantReadWriteLock();
    private final ScratchPool datasetScratch = new ScratchPool();
    private final ScratchPool columnScratch = new ScratchPool();

    private LineageGraph(LineageLoader loader, Instant asOf, GraphIndex index) {
        this.loader = loader;
        this.asOf = asOf;
        this.index = index;
    }

    /** Builds the graph of the lineage in force now; register it with the ingestor to keep it current. */
    public static LineageGraph load(Store store) {
        LineageLoader loader = new LineageLoader(store);
        return new LineageGraph(loader, null, build(loader, null));
    }

    /** Builds the graph of the lineage that was in force at {@code asOf}, for questions about history. */
    public static LineageGraph loadAsOf(Store store, Instant asOf) {
        Objects.requireNonNull(asOf, "asOf");
        LineageLoader loader = new LineageLoader(store);
        return new LineageGraph(loader, asOf, build(loader, asOf));
    }

    private static GraphIndex build(LineageLoader loader, Instant asOf) {
        // Tables start small, grow by half and are trimmed once loaded: no counting queries first.
        GraphIndex index = new GraphIndex(1024, 1024, 1024);
        loader.datasets(index::putDataset);
        loader.edges(asOf, index::bulkEdge);
        loader.columnFlows(index::bulkFlows);
        index.link();
        return index;
    }

    /** The instant this graph pictures, or null when it follows the catalog as it is now. */
    public Instant asOf() {
        return asOf;
    }

    /** Datasets reached by following edges in the direction data flows. */
    public DatasetReach downstream(long datasetId, Query query) {
        return walkDatasets(datasetId, query, false);
    }

    /** Datasets reached by following edges against the direction data flows: what the start was made from. */
    public DatasetReach upstream(long datasetId, Query query) {
        return walkDatasets(datasetId, query, true);
    }

    /** Columns whose content the start column flows into, and (separately) those it only influences. */
    public ColumnClosure downstreamColumns(long datasetId, String column, Query query) {
        return walkColumns(datasetId, column, query, false);
    }

    /** Columns the start column's content comes from, and (separately) those that only influence it. */
    public ColumnClosure upstreamColumns(long datasetId, String column, Query query) {
        return walkColumns(datasetId, column, query, true);
    }

    private DatasetReach walkDatasets(long datasetId, Query query, boolean upstream) {
        Filter filter = Filter.of(query);
        return read(g -> {
            int start = g.nodes.node(datasetId);
            if (start < 0) {
                return DatasetReach.empty(datasetId);
            }
            Scratch scratch = datasetScratch.take(g.nodes.count());
            try {
                return Walks.datasets(g, scratch, start, filter, upstream);
            } finally {
                datasetScratch.give(scratch);
            }
        });
    }

    private ColumnClosure walkColumns(long datasetId, String column, Query query, boolean upstream) {
        Objects.requireNonNull(column, "column");
        Filter filter = Filter.of(query);
        return read(g -> {
            int dataset = g.nodes.node(datasetId);
            int start = dataset < 0 ? -1 : g.columns.node(dataset, column);
            if (start < 0) {
                ColumnKey key = new ColumnKey(datasetId, column);
                return new ColumnClosure(key, ColumnReach.empty(key), ColumnReach.empty(key));
            }
            Scratch scratch = columnScratch.take(g.columns.count());
            try {
                return Walks.columns(g, scratch, start, filter, upstream);
            } finally {
                columnScratch.give(scratch);
            }
        });
    }

    /**
     * Every edge that leaves a dataset and that {@code query}'s edge filters let a walk cross, in store-id
     * order. Unlike a walk, which keeps one edge per dataset reached, this lists parallel edges too (two
     * scripts writing one output from one input), which an impact report needs to name every script.
     */
    public List<Hop> edgesOut(long datasetId, Query query) {
        Filter filter = Filter.of(query);
        return read(g -> {
            int node = g.nodes.node(datasetId);
            List<Hop> hops = new ArrayList<>();
            if (node < 0) {
                return hops;
            }
            int[] slots = g.out.array(node);
            for (int i = g.out.offset(node), end = i + g.out.size(node); i < end; i++) {
                int slot = slots[i];
                if (filter.followsEdge(g.edges, slot)) {
                    long script = g.edges.script(slot);
                    hops.add(new Hop(g.edges.id(slot), datasetId, g.nodes.id(g.edges.to(slot)),
                            script == EdgeTable.NO_SCRIPT ? null : script, g.edges.run(slot), g.edges.evidence(slot),
                            roundedConfidence(g.edges.confidence(slot))));
                }
            }
            return hops;
        });
    }

    /** Every column edge that leaves a column and that {@code query}'s edge filters let a walk cross. */
    public List<ColumnHop> columnEdgesOut(long datasetId, String column, Query query) {
        Filter filter = Filter.of(query);
        return read(g -> {
            int dataset = g.nodes.node(datasetId);
            int node = dataset < 0 ? -1 : g.columns.node(dataset, column);
            List<ColumnHop> hops = new ArrayList<>();
            if (node < 0) {
                return hops;
            }
            ColumnKey from = new ColumnKey(datasetId, column);
            int[] slots = g.columnOut.array(node);
            for (int i = g.columnOut.offset(node), end = i + g.columnOut.size(node); i < end; i++) {
                int slot = slots[i];
                int edge = g.columnEdges.owner(slot);
                if (filter.followsEdge(g.edges, edge)) {
                    int to = g.columnEdges.to(slot);
                    long script = g.edges.script(edge);
                    hops.add(new ColumnHop(g.edges.id(edge), from,
                            new ColumnKey(g.nodes.id(g.columns.dataset(to)), g.columns.column(to)),
                            g.columnEdges.role(slot), script == EdgeTable.NO_SCRIPT ? null : script,
                            g.edges.run(edge), g.edges.evidence(edge), roundedConfidence(g.edges.confidence(edge))));
                }
            }
            return hops;
        });
    }

    private static double roundedConfidence(float stored) {
        double rounded = Math.rint(stored * 10_000.0) / 10_000.0;
        return (float) rounded == stored ? rounded : Double.parseDouble(Float.toString(stored));
    }

    /** Whether the edge with this store id is in the graph and carries column flows. */
    public boolean hasColumnFlows(long edgeId) {
        return read(g -> {
            int slot = g.edges.slot(edgeId);
            return slot >= 0 && g.edges.columnEdgeCount(slot) > 0;
        });
    }

    /** The columns an edge's own flows write into its target (not those spread from influencing flows). */
    public List<String> columnsWrittenBy(long edgeId) {
        return read(g -> {
            int slot = g.edges.slot(edgeId);
            List<String> written = new ArrayList<>();
            if (slot < 0) {
                return written;
            }
            int first = g.edges.firstColumnEdge(slot);
            for (int c = first; c < first + g.edges.columnEdgeCount(slot); c++) {
                String column = g.columnEdges.isLive(c) && g.columnEdges.owner(c) == slot
                        ? g.columns.column(g.columnEdges.to(c)) : null;
                if (column != null && !written.contains(column)) {
                    written.add(column);
                }
            }
            return written;
        });
    }

    /** Whether some column edge starts or ends at this column of this dataset. */
    public boolean hasColumn(long datasetId, String column) {
        return read(g -> {
            int dataset = g.nodes.node(datasetId);
            return dataset >= 0 && g.columns.node(dataset, column) >= 0;
        });
    }

    /** Datasets the graph knows (every dataset identity, with or without edges). */
    public int datasetCount() {
        return read(g -> g.nodes.count());
    }

    public int edgeCount() {
        return read(g -> g.edges.count());
    }

    public int columnCount() {
        return read(g -> g.columns.count());
    }

    public int columnEdgeCount() {
        return read(g -> g.columnEdges.live());
    }

    /**
     * Re-reads what a committed batch changed. Edge changes carry the id of the row written; a row that
     * is no longer current is removed, a current one replaces any earlier version of the same edge.
     * Dataset changes refresh the kind and source the filters test.
     */
    @Override
    public void committed(List<Change> changes) {
        if (asOf != null) {
            throw new IllegalStateException("A graph of the lineage as of " + asOf + " does not follow changes");
        }
        TreeSet<Long> edgeIds = new TreeSet<>();
        TreeSet<Long> datasetIds = new TreeSet<>();
        for (Change change : changes) {
            if (Change.EDGE.equals(change.entity())) {
                edgeIds.add(change.entityId());
            } else if (Change.DATASET.equals(change.entity())) {
                datasetIds.add(change.entityId());
            }
        }
        if (edgeIds.isEmpty() && datasetIds.isEmpty()) {
            return;
        }
        // Read outside the lock: walks go on while the store answers.
        List<EdgeRow> rows = loader.edgesById(edgeIds);
        List<Long> current = new ArrayList<>();
        for (EdgeRow row : rows) {
            datasetIds.add(row.sourceDatasetId());
            datasetIds.add(row.targetDatasetId());
            if (row.current()) {
                current.add(row.id());
            }
        }
        List<DatasetRow> datasets = loader.datasets(datasetIds);
        Map<Long, List<ColumnFlowRow>> flows = loader.columnFlowsOf(current);
        lock.writeLock().lock();
        try {
            datasets.forEach(index::putDataset);
            for (EdgeRow row : rows) {
                if (row.current()) {
                    index.putEdge(row, flows.getOrDefault(row.id(), List.of()));
                } else {
                    index.removeEdge(row.id());
                }
            }
        } finally {
            lock.writeLock().unlock();
        }
    }

    private <T> T read(Function<GraphIndex, T> question) {
        lock.readLock().lock();
        try {
            return question.apply(index);
        } finally {
            lock.readLock().unlock();
        }
    }
}
