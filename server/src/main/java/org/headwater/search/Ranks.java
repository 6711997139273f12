package org.headwater.search;

import java.io.IOException;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.lucene.index.DocValues;
import org.apache.lucene.index.IndexReader;
import org.apache.lucene.index.LeafReader;
import org.apache.lucene.index.NumericDocValues;
import org.headwater.store.SearchSource;

/**
 * How much each dataset is used (reads by scripts and in runs) and how central it is in the lineage graph
 * (PageRank), and the factor both give a hit's text score. Computed from the store after each batch that
 * changed edges, scripts or runs; immutable once made.
 */
final class Ranks {
    /** Weight of each kind of document, by {@link Documents} family code: datasets first, then scripts, owners, columns. */
    private static final double[] FAMILY_WEIGHT = {1.0, 0.6, 0.9, 0.9};
    private static final double USE_WEIGHT = 0.3;
    private static final double CENTRALITY_WEIGHT = 0.3;

    static final Ranks NONE = new Ranks(new long[0], new int[0], new double[0]);

    private final long[] ids;
    private final int[] uses;
    private final double[] centrality;
    private final Map<IndexReader.CacheKey, SegmentFactors> factorsBySegment = new java.util.concurrent.ConcurrentHashMap<>();

    private Ranks(long[] ids, int[] uses, double[] centrality) {
        this.ids = ids;
        this.uses = uses;
        this.centrality = centrality;
    }

    /**
     * Reads use counts and the dataset graph. Edges point from a derived dataset to what it was made from,
     * like a citation, so the sources many results are built on collect rank. Centrality is the PageRank
     * times the number of datasets in the graph: 1 is the average.
     */
    static Ranks compute(SearchSource source) {
        return of(source.uses(), source.datasetEdges());
    }

    /** Ranks from use counts by dataset id and (source, target) dataset edges. */
    static Ranks of(Map<Long, Integer> useCounts, List<long[]> edges) {
        Map<Long, Integer> node = new HashMap<>();
        int[] from = new int[edges.size()];
        int[] to = new int[edges.size()];
        for (int i = 0; i < edges.size(); i++) {
            from[i] = node.computeIfAbsent(edges.get(i)[1], k -> node.size());
            to[i] = node.computeIfAbsent(edges.get(i)[0], k -> node.size());
        }
        double[] pr = PageRank.of(node.size(), from, to);
        java.util.TreeSet<Long> all = new java.util.TreeSet<>(useCounts.keySet());
        all.addAll(node.keySet());
        long[] ids = new long[all.size()];
        int[] uses = new int[all.size()];
        double[] centrality = new double[all.size()];
        int i = 0;
        for (long id : all) {
            ids[i] = id;
            uses[i] = useCounts.getOrDefault(id, 0);
            Integer n = node.get(id);
            centrality[i] = n == null ? 0 : pr[n] * node.size();
            i++;
        }
        return new Ranks(ids, uses, centrality);
    }

    int uses(long datasetId) {
        int at = Arrays.binarySearch(ids, datasetId);
        return at < 0 ? 0 : uses[at];
    }

    double centrality(long datasetId) {
        int at = Arrays.binarySearch(ids, datasetId);
        return at < 0 ? 0 : centrality[at];
    }

    /** The factor a hit's text score is multiplied by; saturating, so use and centrality reorder close matches only. */
    double factor(int family, long datasetId) {
        int u = uses(datasetId);
        double c = centrality(datasetId);
        return FAMILY_WEIGHT[family] * (1 + USE_WEIGHT * u / (u + 2.0)) * (1 + CENTRALITY_WEIGHT * c / (c + 1.0));
    }

    /**
     * The factor of every document of a segment, by document number: two doc-values reads per document, done
     * once per segment and ranks instead of once per match of every search. Ranks are replaced after every
     * batch that touched the index, so the arrays of merged-away segments go with them.
     */
    SegmentFactors factors(LeafReader segment) throws IOException {
        IndexReader.CacheHelper helper = segment.getCoreCacheHelper();
        if (helper == null || this == NONE) {
            // NONE is shared by every index of the process; it would keep their segments' arrays.
            return computeFactors(segment);
        }
        SegmentFactors cached = factorsBySegment.get(helper.getKey());
        if (cached == null) {
            cached = computeFactors(segment);
            factorsBySegment.put(helper.getKey(), cached);
        }
        return cached;
    }

    /**
     * The factors of a segment's documents, and for each block of {@link #BLOCK} documents the largest factor
     * from that block to the segment's end: the bound on the factor of every document still to come. Exact, not
     * an ulp above: {@code RankedQuery} works out the threshold it passes on in the same float arithmetic as the
     * scores, so a margin here would only keep tied matches from being skipped.
     */
    record SegmentFactors(float[] byDoc, float[] largestFromBlock) {
        float largestFrom(int doc) {
            int block = doc >>> BLOCK_SHIFT;
            return block < largestFromBlock.length ? largestFromBlock[block] : 0;
        }
    }

    private static final int BLOCK_SHIFT = 7;
    static final int BLOCK = 1 << BLOCK_SHIFT;

    private SegmentFactors computeFactors(LeafReader segment) throws IOException {
        float[] out = new float[segment.maxDoc()];
        NumericDocValues rankIds = DocValues.getNumeric(segment, Documents.RANK_ID);
        NumericDocValues families = DocValues.getNumeric(segment, Documents.FAMILY_CODE);
        for (int doc = 0; doc < out.length; doc++) {
            long id = rankIds.advanceExact(doc) ? rankIds.longValue() : 0;
            int family = families.advanceExact(doc) ? (int) families.longValue() : 0;
            out[doc] = (float) factor(family, id);
        }
        float[] largest = new float[(out.length + BLOCK - 1) >>> BLOCK_SHIFT];
        float running = 0;
        for (int doc = out.length - 1; doc >= 0; doc--) {
            running = Math.max(running, out[doc]);
            if ((doc & (BLOCK - 1)) == 0) {
                largest[doc >>> BLOCK_SHIFT] = running;
            }
        }
        return new SegmentFactors(out, largest);
    }

}
