package org.headwater.lineage;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.ingest.Observation.ColumnRole;

/**
 * The graph's data: dataset and column nodes, dataset and column edges, and adjacency in both directions
 * for both levels. Not thread-safe; {@link LineageGraph} guards it with a read-write lock.
 *
 * <p>Built in two phases when loaded in bulk (tables first, then adjacency packed list after list), then
 * kept current one edge at a time.
 */
final class GraphIndex {
    final DatasetNodes nodes;
    final ColumnNodes columns;
    final EdgeTable edges;
    final ColumnEdgeTable columnEdges;
    final Adjacency out = new Adjacency();
    final Adjacency in = new Adjacency();
    final Adjacency columnOut = new Adjacency();
    final Adjacency columnIn = new Adjacency();
    private final Adjacency.Order edgeOrder;
    private final Adjacency.Order columnOrder;
    /** Edge slot to its influencing flows without a target column; few edges have any. */
    private final Map<Integer, Influence> influence = new HashMap<>();

    GraphIndex(int expectedDatasets, int expectedEdges, int expectedColumnEdges) {
        nodes = new DatasetNodes(expectedDatasets);
        columns = new ColumnNodes(expectedColumnEdges);
        edges = new EdgeTable(expectedEdges);
        columnEdges = new ColumnEdgeTable(expectedColumnEdges);
        edgeOrder = edges::after;
        columnOrder = (a, b) -> edges.after(columnEdges.owner(a), columnEdges.owner(b));
    }

    void putDataset(DatasetRow row) {
        nodes.put(row.id(), row.kind(), row.sourceId());
    }

    // ---- bulk loading -------------------------------------------------------------------------------

    /** Records an edge without linking it; {@link #link()} builds every adjacency list at the end. */
    void bulkEdge(EdgeRow row) {
        edges.add(row, nodes.ensure(row.sourceDatasetId()), nodes.ensure(row.targetDatasetId()));
    }

    /** Records the column flows of one edge already recorded; flows of edges not in the graph are ignored. */
    void bulkFlows(List<ColumnFlowRow> flows) {
        int slot = edges.slot(flows.get(0).edgeId());
        if (slot >= 0) {
            addColumnEdges(slot, flows, false);
        }
    }

    /**
     * Lays out every adjacency list and fills it in slot order, which bulk loading made id order; trims the
     * tables to what was loaded; then spreads influencing flows, which needs the in-lists.
     */
    void link() {
        int[] outDegree = new int[nodes.count()];
        int[] inDegree = new int[nodes.count()];
        for (int slot = 0; slot < edges.highWater(); slot++) {
            if (edges.live(slot)) {
                outDegree[edges.from(slot)]++;
                inDegree[edges.to(slot)]++;
            }
        }
        out.layout(nodes.count(), outDegree);
        in.layout(nodes.count(), inDegree);
        for (int slot = 0; slot < edges.highWater(); slot++) {
            if (edges.live(slot)) {
                out.append(edges.from(slot), slot);
                in.append(edges.to(slot), slot);
            }
        }
        int[] columnOutDegree = new int[columns.count()];
        int[] columnInDegree = new int[columns.count()];
        for (int slot = 0; slot < columnEdges.highWater(); slot++) {
            if (columnEdges.isLive(slot)) {
                columnOutDegree[columnEdges.from(slot)]++;
                columnInDegree[columnEdges.to(slot)]++;
            }
        }
        columnOut.layout(columns.count(), columnOutDegree);
        columnIn.layout(columns.count(), columnInDegree);
        // Column flows arrive grouped by edge id, so column-edge slots are in edge-id order too.
        for (int slot = 0; slot < columnEdges.highWater(); slot++) {
            if (columnEdges.isLive(slot)) {
                columnOut.append(columnEdges.from(slot), slot);
                columnIn.append(columnEdges.to(slot), slot);
            }
        }
        nodes.trim();
        columns.trim();
        edges.trim();
        columnEdges.trim();
        spreadAllInfluence();
    }

    // ---- keeping current ----------------------------------------------------------------------------

    /**
     * Adds the current version of an edge, replacing an earlier version of the same edge: the store closes
     * the old row and inserts a new one under a new id, and only the new id is announced.
     */
    void putEdge(EdgeRow row, List<ColumnFlowRow> flows) {
        removeEdge(row.id());
        int fromNode = nodes.ensure(row.sourceDatasetId());
        int toNode = nodes.ensure(row.targetDatasetId());
        out.ensureNodes(nodes.count());
        in.ensureNodes(nodes.count());
        int slot = edges.add(row, fromNode, toNode);
        for (int superseded : supersededBy(slot)) {
            removeSlot(superseded);
        }
        out.insert(fromNode, slot, edgeOrder);
        in.insert(toNode, slot, edgeOrder);
        addColumnEdges(slot, flows, true);
        respreadGroup(toNode, edges.script(slot));
    }

    private List<Integer> supersededBy(int slot) {
        List<Integer> same = new ArrayList<>();
        int fromNode = edges.from(slot);
        int[] list = out.array(fromNode);
        int end = out.offset(fromNode) + out.size(fromNode);
        for (int i = out.offset(fromNode); i < end; i++) {
            if (list[i] != slot && edges.sameKey(list[i], slot)) {
                same.add(list[i]);
            }
        }
        return same;
    }

    /** Removes an edge and its column edges; an id the graph does not hold is ignored. */
    void removeEdge(long edgeId) {
        int slot = edges.slot(edgeId);
        if (slot >= 0) {
            removeSlot(slot);
        }
    }

    private void removeSlot(int slot) {
        int target = edges.to(slot);
        long script = edges.script(slot);
        out.remove(edges.from(slot), slot);
        in.remove(target, slot);
        int first = edges.firstColumnEdge(slot);
        for (int c = first; c < first + edges.columnEdgeCount(slot); c++) {
            unlinkColumnEdge(c);
        }
        Influence spread = influence.remove(slot);
        if (spread != null) {
            for (int c = spread.first; c < spread.first + spread.count; c++) {
                unlinkColumnEdge(c);
            }
        }
        edges.release(slot);
        respreadGroup(target, script);
    }

    /**
     * Turns an edge's column flows into column edges. A flow with a target column is one edge; a flow
     * without one that is not influencing reaches the target as a whole. Influencing flows without a
     * target column are kept aside and spread by {@link #spreadInfluence}.
     */
    private void addColumnEdges(int slot, List<ColumnFlowRow> flows, boolean linkNow) {
        if (flows == null || flows.isEmpty()) {
            return;
        }
        int fromNode = edges.from(slot);
        int toNode = edges.to(slot);
        List<Integer> influencers = new ArrayList<>();
        int first = columnEdges.highWater();
        for (ColumnFlowRow flow : flows) {
            int source = columns.ensure(fromNode, flow.sourceColumn());
            if (flow.targetColumn() != null) {
                columnEdge(source, columns.ensure(toNode, flow.targetColumn()), flow.role(), slot, linkNow);
            } else if (flow.role() == ColumnRole.INFLUENCING) {
                influencers.add(source);
            } else {
                columnEdge(source, columns.ensure(toNode, null), flow.role(), slot, linkNow);
            }
        }
        edges.columnEdges(slot, first, columnEdges.highWater() - first);
        if (!influencers.isEmpty()) {
            influence.put(slot, new Influence(influencers.stream().mapToInt(Integer::intValue).toArray()));
        }
    }

    /** After bulk linking: spreads every influencing flow, now that the in-lists tell which edges write a target. */
    private void spreadAllInfluence() {
        for (int slot : List.copyOf(influence.keySet())) {
            spreadInfluence(slot);
        }
    }

    /** Re-spreads the influencing flows of every edge that one script writes into one target. */
    private void respreadGroup(int targetNode, long script) {
        int[] list = in.array(targetNode);
        int end = in.offset(targetNode) + in.size(targetNode);
        List<Integer> group = new ArrayList<>();
        for (int i = in.offset(targetNode); i < end; i++) {
            if (edges.script(list[i]) == script && influence.containsKey(list[i])) {
                group.add(list[i]);
            }
        }
        group.forEach(this::spreadInfluence);
    }

    /**
     * An influencing column without a target column (a filter, a join key, a grouping) decides which rows
     * the target holds, so it reaches every column the same script writes into that target, whichever
     * input the written column comes from: one statement's join key filters the rows of all its outputs.
     * When the script writes no named column of the target, it reaches the target as a whole.
     */
    private void spreadInfluence(int slot) {
        Influence spread = influence.get(slot);
        int[] targets = writtenBy(edges.to(slot), edges.script(slot));
        if (targets.length == 0) {
            targets = new int[] {columns.ensure(edges.to(slot), null)};
        }
        if (spread.covers(columnEdges, targets)) {
            return;
        }
        for (int c = spread.first; c < spread.first + spread.count; c++) {
            unlinkColumnEdge(c);
        }
        spread.first = columnEdges.highWater();
        for (int source : spread.sources) {
            for (int target : targets) {
                columnEdge(source, target, ColumnRole.INFLUENCING, slot, true);
            }
        }
        spread.count = columnEdges.highWater() - spread.first;
    }

    /** Named target columns that edges of {@code script} into {@code targetNode} write, in edge-id order. */
    private int[] writtenBy(int targetNode, long script) {
        Set<Integer> written = new LinkedHashSet<>();
        int[] list = in.array(targetNode);
        int end = in.offset(targetNode) + in.size(targetNode);
        for (int i = in.offset(targetNode); i < end; i++) {
            int slot = list[i];
            if (edges.script(slot) != script) {
                continue;
            }
            int first = edges.firstColumnEdge(slot);
            for (int c = first; c < first + edges.columnEdgeCount(slot); c++) {
                int target = columnEdges.to(c);
                if (columns.column(target) != null) {
                    written.add(target);
                }
            }
        }
        return written.stream().mapToInt(Integer::intValue).toArray();
    }

    private void unlinkColumnEdge(int c) {
        columnOut.remove(columnEdges.from(c), c);
        columnIn.remove(columnEdges.to(c), c);
        columnEdges.kill(c);
    }

    private void columnEdge(int source, int target, ColumnRole role, int owner, boolean linkNow) {
        int c = columnEdges.add(source, target, role, owner);
        if (linkNow) {
            columnOut.ensureNodes(columns.count());
            columnIn.ensureNodes(columns.count());
            columnOut.insert(source, c, columnOrder);
            columnIn.insert(target, c, columnOrder);
        }
    }

    /** The influencing flows of one edge that name no target column, and the column edges they were spread to. */
    private static final class Influence {
        final int[] sources;
        int first;
        int count;

        Influence(int[] sources) {
            this.sources = sources;
        }

        /** Whether the current spread already reaches exactly {@code targets}, in order, from every source. */
        boolean covers(ColumnEdgeTable columnEdges, int[] targets) {
            if (count != sources.length * targets.length) {
                return false;
            }
            for (int i = 0; i < count; i++) {
                if (columnEdges.to(first + i) != targets[i % targets.length]) {
                    return false;
                }
            }
            return true;
        }
    }
}
