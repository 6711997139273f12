package org.headwater.lineage;

import java.util.Arrays;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;

/** A {@link Query} turned into bit masks and a sorted array, so the walk's inner loop tests primitives. */
final class Filter {
    private static final int ALL = -1;

    final int maxDepth;
    private final int evidenceMask;
    private final float minConfidence;
    private final int kindMask;
    private final long[] sources;

    private Filter(Query query) {
        maxDepth = query.maxDepth();
        int evidence = 0;
        for (Evidence e : query.evidence()) {
            evidence |= 1 << e.ordinal();
        }
        evidenceMask = query.evidence().isEmpty() ? ALL : evidence;
        minConfidence = (float) query.minConfidence();
        int kinds = 0;
        for (DatasetKind k : query.kinds()) {
            kinds |= 1 << k.ordinal();
        }
        kindMask = query.kinds().isEmpty() ? ALL : kinds;
        sources = query.sources().isEmpty() ? null
                : query.sources().stream().mapToLong(Long::longValue).sorted().toArray();
    }

    static Filter of(Query query) {
        return new Filter(query);
    }

    boolean followsEdge(EdgeTable edges, int slot) {
        return (evidenceMask & (1 << edges.evidenceOrdinal(slot))) != 0 && edges.confidence(slot) >= minConfidence;
    }

    boolean reportsDataset(DatasetNodes nodes, int node) {
        return (kindMask & (1 << nodes.kind(node))) != 0
                && (sources == null || Arrays.binarySearch(sources, nodes.source(node)) >= 0);
    }
}
