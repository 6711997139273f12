package org.headwater.search;

import java.io.IOException;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.apache.lucene.index.DocValues;
import org.apache.lucene.index.LeafReaderContext;
import org.apache.lucene.index.NumericDocValues;
import org.apache.lucene.search.DoubleValues;
import org.apache.lucene.search.DoubleValuesSource;
import org.apache.lucene.search.IndexSearcher;
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

    /** The factor as a Lucene value source over the {@code rank_id} and {@code family} doc values. */
    DoubleValuesSource asValues() {
        return new Source(this);
    }

    private static final class Source extends DoubleValuesSource {
        private final Ranks ranks;

        Source(Ranks ranks) {
            this.ranks = ranks;
        }

        @Override
        public DoubleValues getValues(LeafReaderContext ctx, DoubleValues scores) throws IOException {
            NumericDocValues rankIds = DocValues.getNumeric(ctx.reader(), Documents.RANK_ID);
            NumericDocValues families = DocValues.getNumeric(ctx.reader(), Documents.FAMILY_CODE);
            return new DoubleValues() {
                double value;

                @Override
                public double doubleValue() {
                    return value;
                }

                @Override
                public boolean advanceExact(int doc) throws IOException {
                    long id = rankIds.advanceExact(doc) ? rankIds.longValue() : 0;
                    int family = families.advanceExact(doc) ? (int) families.longValue() : 0;
                    value = ranks.factor(family, id);
                    return true;
                }
            };
        }

        @Override
        public boolean needsScores() {
            return false;
        }

        @Override
        public DoubleValuesSource rewrite(IndexSearcher reader) {
            return this;
        }

        @Override
        public int hashCode() {
            return System.identityHashCode(ranks);
        }

        @Override
        public boolean equals(Object obj) {
            return obj instanceof Source other && Objects.equals(other.ranks, ranks);
        }

        @Override
        public String toString() {
            return "use and centrality";
        }

        @Override
        public boolean isCacheable(LeafReaderContext ctx) {
            return false;
        }
    }
}
