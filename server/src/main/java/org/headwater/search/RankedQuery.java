package org.headwater.search;

import java.io.IOException;
import java.util.Collection;
import java.util.List;
import java.util.Objects;
import org.apache.lucene.index.LeafReaderContext;
import org.apache.lucene.search.BooleanClause;
import org.apache.lucene.search.DocIdSetIterator;
import org.apache.lucene.search.Explanation;
import org.apache.lucene.search.FilterWeight;
import org.apache.lucene.search.IndexSearcher;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.QueryVisitor;
import org.apache.lucene.search.ScoreMode;
import org.apache.lucene.search.Scorer;
import org.apache.lucene.search.ScorerSupplier;
import org.apache.lucene.search.TwoPhaseIterator;
import org.apache.lucene.search.Weight;

/**
 * A query whose scores are the inner query's times the {@link Ranks} factor of each document. Unlike a
 * function-score wrapper it passes the collector's threshold on to the inner query (divided by the largest
 * factor still to come) and lets that query know it is scored at the top level, so collecting the top hits
 * can skip blocks of postings that cannot reach them instead of scoring every match.
 */
final class RankedQuery extends Query {
    private final Query inner;
    private final Ranks ranks;

    RankedQuery(Query inner, Ranks ranks) {
        this.inner = Objects.requireNonNull(inner, "inner");
        this.ranks = Objects.requireNonNull(ranks, "ranks");
    }

    @Override
    public Query rewrite(IndexSearcher searcher) throws IOException {
        Query rewritten = inner.rewrite(searcher);
        return rewritten == inner ? super.rewrite(searcher) : new RankedQuery(rewritten, ranks);
    }

    @Override
    public Weight createWeight(IndexSearcher searcher, ScoreMode scoreMode, float boost) throws IOException {
        Weight in = searcher.createWeight(inner, scoreMode, boost);
        if (!scoreMode.needsScores()) {
            return in;
        }
        return new FilterWeight(this, in) {
            @Override
            public Scorer scorer(LeafReaderContext context) throws IOException {
                ScorerSupplier supplier = scorerSupplier(context);
                return supplier == null ? null : supplier.get(Long.MAX_VALUE);
            }

            @Override
            public ScorerSupplier scorerSupplier(LeafReaderContext context) throws IOException {
                ScorerSupplier inner = in.scorerSupplier(context);
                if (inner == null) {
                    return null;
                }
                Weight weight = this;
                return new ScorerSupplier() {
                    @Override
                    public Scorer get(long leadCost) throws IOException {
                        return new RankedScorer(weight, inner.get(leadCost), ranks.factors(context.reader()));
                    }

                    @Override
                    public long cost() {
                        return inner.cost();
                    }

                    @Override
                    public void setTopLevelScoringClause() throws IOException {
                        // The inner query's scores reach the collector through this one only; it may skip
                        // blocks the way a top-level query does (a block-max conjunction of the words).
                        inner.setTopLevelScoringClause();
                    }
                };
            }

            @Override
            public boolean isCacheable(LeafReaderContext context) {
                return false;
            }

            @Override
            public Explanation explain(LeafReaderContext context, int doc) throws IOException {
                Explanation text = in.explain(context, doc);
                if (!text.isMatch()) {
                    return text;
                }
                double factor = ranks.factors(context.reader()).byDoc()[doc];
                return Explanation.match((float) (text.getValue().doubleValue() * factor), "product of:", text,
                        Explanation.match((float) factor, "use and centrality"));
            }
        };
    }

    @Override
    public void visit(QueryVisitor visitor) {
        inner.visit(visitor.getSubVisitor(BooleanClause.Occur.MUST, this));
    }

    @Override
    public String toString(String field) {
        return "ranked(" + inner.toString(field) + ")";
    }

    @Override
    public boolean equals(Object other) {
        return sameClassAs(other) && inner.equals(((RankedQuery) other).inner) && ranks == ((RankedQuery) other).ranks;
    }

    @Override
    public int hashCode() {
        return 31 * classHash() + inner.hashCode();
    }

    /**
     * The least text score whose product with {@code factor}, in the float arithmetic of the ranked scores,
     * reaches {@code minScore}. The product only grows with either operand, so no document of a factor up to
     * this one scoring less can compete. Exact rather than rounded down: the collector asks for a score above
     * its last hit's, since equal scores lose to earlier documents, and a threshold an ulp lower kept every
     * block of tied matches competitive (a one-word search over the benchmark catalog scored about 4,600 tied
     * dataset names instead of about 1,000).
     */
    static float leastCompeting(float minScore, float factor) {
        float s = minScore / factor;
        if (!Float.isFinite(s) || s == 0) {
            return Math.nextDown(s);
        }
        // The quotient is within an ulp or two of the answer; the bounds only guard against surprises.
        for (int i = 0; i < 16 && s > 0 && s * factor >= minScore; i++) {
            s = Math.nextDown(s);
        }
        for (int i = 0; i < 32 && s * factor < minScore; i++) {
            s = Math.nextUp(s);
        }
        // Not found: no threshold at all, which skips nothing and is always right.
        return s * factor >= minScore && Math.nextDown(s) * factor < minScore ? s : 0;
    }

    /**
     * The inner scorer's matches, each score multiplied by its document's factor. A threshold from the collector
     * is passed on divided by the largest factor still to come; documents are kept in family order, columns
     * (the smallest factor) last, so once only columns are left the threshold passed on rises and their
     * postings skip more.
     */
    private static final class RankedScorer extends Scorer {
        private final Scorer in;
        private final Ranks.SegmentFactors factors;
        private float bound;
        private int boundBlockDoc = -1;
        private float minScore;

        RankedScorer(Weight weight, Scorer in, Ranks.SegmentFactors factors) {
            super(weight);
            this.in = in;
            this.factors = factors;
            this.bound = factors.largestFrom(0);
        }

        @Override
        public float score() throws IOException {
            int doc = in.docID();
            if (doc >= boundBlockDoc + Ranks.BLOCK) {
                boundBlockDoc = doc & -Ranks.BLOCK;
                float remaining = factors.largestFrom(doc);
                if (remaining < bound) {
                    bound = remaining;
                    passOn();
                }
            }
            return in.score() * factors.byDoc()[doc];
        }

        @Override
        public float getMaxScore(int upTo) throws IOException {
            float max = in.getMaxScore(upTo);
            return max == Float.POSITIVE_INFINITY ? max : Math.nextUp(max * factors.largestFrom(Math.max(0, in.docID())));
        }

        @Override
        public int advanceShallow(int target) throws IOException {
            return in.advanceShallow(target);
        }

        @Override
        public void setMinCompetitiveScore(float minScore) throws IOException {
            this.minScore = minScore;
            passOn();
        }

        /** A document of the largest factor still to come needs at least this much text score to compete. */
        private void passOn() throws IOException {
            if (minScore > 0 && bound > 0) {
                in.setMinCompetitiveScore(leastCompeting(minScore, bound));
            }
        }

        @Override
        public int docID() {
            return in.docID();
        }

        @Override
        public DocIdSetIterator iterator() {
            return in.iterator();
        }

        @Override
        public TwoPhaseIterator twoPhaseIterator() {
            return in.twoPhaseIterator();
        }

        @Override
        public Collection<ChildScorable> getChildren() {
            return List.of(new ChildScorable(in, "MUST"));
        }
    }
}
