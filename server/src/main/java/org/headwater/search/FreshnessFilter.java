package org.headwater.search;

import java.io.IOException;
import java.util.Objects;
import java.util.Set;
import org.apache.lucene.index.DocValues;
import org.apache.lucene.index.LeafReaderContext;
import org.apache.lucene.index.NumericDocValues;
import org.apache.lucene.search.ConstantScoreScorer;
import org.apache.lucene.search.ConstantScoreWeight;
import org.apache.lucene.search.DocIdSetIterator;
import org.apache.lucene.search.IndexSearcher;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.QueryVisitor;
import org.apache.lucene.search.ScoreMode;
import org.apache.lucene.search.Scorer;
import org.apache.lucene.search.TwoPhaseIterator;
import org.apache.lucene.search.Weight;

/**
 * The {@code fresh=} filter: datasets, and the columns of datasets, whose freshness state is one of the given
 * ones. States live outside the index (they change with every check), so each candidate is asked of the
 * provider at search time; as a filter it only ever sees documents the text query already matched.
 */
final class FreshnessFilter extends Query {
    private final Set<String> states;
    private final FreshnessProvider provider;

    FreshnessFilter(Set<String> states, FreshnessProvider provider) {
        this.states = Set.copyOf(states);
        this.provider = Objects.requireNonNull(provider, "provider");
    }

    @Override
    public Weight createWeight(IndexSearcher searcher, ScoreMode scoreMode, float boost) {
        return new ConstantScoreWeight(this, boost) {
            @Override
            public Scorer scorer(LeafReaderContext context) throws IOException {
                NumericDocValues ids = DocValues.getNumeric(context.reader(), Documents.RANK_ID);
                DocIdSetIterator approximation = DocIdSetIterator.all(context.reader().maxDoc());
                TwoPhaseIterator matching = new TwoPhaseIterator(approximation) {
                    @Override
                    public boolean matches() throws IOException {
                        // Scripts and owners carry dataset id 0: they have no freshness.
                        return ids.advanceExact(approximation.docID()) && ids.longValue() != 0
                                && states.contains(provider.stateOf(ids.longValue()));
                    }

                    @Override
                    public float matchCost() {
                        return 10;
                    }
                };
                return new ConstantScoreScorer(this, score(), scoreMode, matching);
            }

            @Override
            public boolean isCacheable(LeafReaderContext ctx) {
                // The states change without the index changing.
                return false;
            }
        };
    }

    @Override
    public void visit(QueryVisitor visitor) {
        visitor.visitLeaf(this);
    }

    @Override
    public String toString(String field) {
        return "fresh=" + String.join(",", new java.util.TreeSet<>(states));
    }

    @Override
    public boolean equals(Object other) {
        return sameClassAs(other) && states.equals(((FreshnessFilter) other).states)
                && provider == ((FreshnessFilter) other).provider;
    }

    @Override
    public int hashCode() {
        return classHash() * 31 + states.hashCode();
    }
}
