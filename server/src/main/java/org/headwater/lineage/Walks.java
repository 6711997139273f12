package org.headwater.lineage;

/** Runs walks over a {@link GraphIndex} and copies what they found into results. Callers hold the read lock. */
final class Walks {
    private Walks() {
    }

    static DatasetReach datasets(GraphIndex g, Scratch s, int start, Filter filter, boolean upstream) {
        EdgeTable edges = g.edges;
        int generation = s.nextGeneration();
        int visited = BreadthFirst.walk(s, s.stamp, generation, start, upstream ? g.in : g.out,
                upstream ? edges.fromArray() : edges.toArray(), slot -> filter.followsEdge(edges, slot),
                filter.maxDepth);
        Trace trace = new Trace(visited, upstream, s.returnsToStart);
        long[] ids = new long[visited];
        ids[0] = g.nodes.id(start);
        for (int p = 1; p < visited; p++) {
            int node = s.queue[p];
            int slot = s.via[node];
            int previous = upstream ? edges.to(slot) : edges.from(slot);
            ids[p] = g.nodes.id(node);
            trace.record(p, s.position[previous], s.distance[node], edges, slot);
            if (filter.reportsDataset(g.nodes, node)) {
                trace.report(p);
            }
        }
        trace.finish();
        return new DatasetReach(ids[0], ids, trace);
    }

    /**
     * Two walks from one column: the first crosses direct and derived column edges only, the second any
     * column edge; what only the second reached is reported as indirect.
     */
    static ColumnClosure columns(GraphIndex g, Scratch s, int start, Filter filter, boolean upstream) {
        EdgeTable edges = g.edges;
        ColumnEdgeTable columnEdges = g.columnEdges;
        Adjacency adjacency = upstream ? g.columnIn : g.columnOut;
        int[] far = upstream ? columnEdges.fromArray() : columnEdges.toArray();

        int flowGeneration = s.nextGeneration();
        int flowVisited = BreadthFirst.walk(s, s.stamp, flowGeneration, start, adjacency, far,
                slot -> columnEdges.roleOrdinal(slot) != ColumnEdgeTable.INFLUENCING
                        && filter.followsEdge(edges, columnEdges.owner(slot)),
                filter.maxDepth);
        ColumnReach flows = capture(g, s, flowVisited, filter, upstream, null, 0);

        int anyGeneration = s.nextGeneration();
        int anyVisited = BreadthFirst.walk(s, s.stampB, anyGeneration, start, adjacency, far,
                slot -> filter.followsEdge(edges, columnEdges.owner(slot)), filter.maxDepth);
        ColumnReach indirect = capture(g, s, anyVisited, filter, upstream, s.stamp, flowGeneration);
        return new ColumnClosure(key(g, start), flows, indirect);
    }

    /** Copies a column walk; when {@code exclude} is given, nodes it marks with {@code excluded} are not reported. */
    private static ColumnReach capture(GraphIndex g, Scratch s, int visited, Filter filter, boolean upstream,
            int[] exclude, int excluded) {
        ColumnEdgeTable columnEdges = g.columnEdges;
        Trace trace = new Trace(visited, upstream, s.returnsToStart);
        ColumnKey[] keys = new ColumnKey[visited];
        byte[] roles = new byte[visited];
        keys[0] = key(g, s.queue[0]);
        for (int p = 1; p < visited; p++) {
            int node = s.queue[p];
            int slot = s.via[node];
            int previous = upstream ? columnEdges.to(slot) : columnEdges.from(slot);
            keys[p] = key(g, node);
            roles[p] = (byte) columnEdges.roleOrdinal(slot);
            trace.record(p, s.position[previous], s.distance[node], g.edges, columnEdges.owner(slot));
            boolean wanted = exclude == null || exclude[node] != excluded;
            if (wanted && filter.reportsDataset(g.nodes, g.columns.dataset(node))) {
                trace.report(p);
            }
        }
        trace.finish();
        return new ColumnReach(keys, roles, trace);
    }

    private static ColumnKey key(GraphIndex g, int columnNode) {
        return new ColumnKey(g.nodes.id(g.columns.dataset(columnNode)), g.columns.column(columnNode));
    }
}
