package org.headwater.lineage;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The obvious in-memory alternative the benchmark measures against: boxed ids in hash maps and lists,
 * a fresh queue and fresh maps for every walk. It answers the same question as
 * {@link LineageGraph#downstream}: each descendant's distance and the edge it was first reached by.
 */
final class NaiveGraph {
    private record Out(long edgeId, long target) {
    }

    private final Map<Long, List<Out>> successors = new HashMap<>();

    NaiveGraph(SyntheticLineage g) {
        for (int e = 0; e < g.edges(); e++) {
            successors.computeIfAbsent(g.source()[e], k -> new ArrayList<>()).add(new Out(e + 1L, g.target()[e]));
        }
    }

    /** Distance and entering edge of every descendant, keyed by dataset id. */
    Map<Long, long[]> downstream(long start) {
        Map<Long, long[]> reached = new HashMap<>();
        ArrayDeque<Long> queue = new ArrayDeque<>();
        queue.add(start);
        reached.put(start, new long[] {0, -1});
        while (!queue.isEmpty()) {
            long node = queue.poll();
            long next = reached.get(node)[0] + 1;
            for (Out out : successors.getOrDefault(node, List.of())) {
                if (!reached.containsKey(out.target())) {
                    reached.put(out.target(), new long[] {next, out.edgeId()});
                    queue.add(out.target());
                }
            }
        }
        reached.remove(start);
        return reached;
    }
}
