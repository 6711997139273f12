package org.headwater.search;

import java.io.IOException;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import org.apache.lucene.index.LeafReaderContext;
import org.apache.lucene.search.Collector;
import org.apache.lucene.search.CollectorManager;
import org.apache.lucene.search.FilterLeafCollector;
import org.apache.lucene.search.LeafCollector;
import org.apache.lucene.search.Scorable;
import org.apache.lucene.search.ScoreMode;

/**
 * Tells the scorers of a top-hits search, from the start, that nothing scoring below a floor is wanted: a
 * threshold the collector would otherwise only reach after collecting enough hits of its own. The search
 * that found the floor already holds a page of hits at or above it.
 */
final class ScoreFloor {
    private ScoreFloor() {
    }

    static <C extends Collector, T> CollectorManager<Collector, T> of(CollectorManager<C, T> manager, float floor) {
        return new CollectorManager<>() {
            @Override
            public Collector newCollector() throws IOException {
                return new Floored<>(manager.newCollector(), floor);
            }

            @Override
            public T reduce(Collection<Collector> collectors) throws IOException {
                List<C> inner = new ArrayList<>();
                for (Collector c : collectors) {
                    @SuppressWarnings("unchecked")
                    Floored<C> f = (Floored<C>) c;
                    inner.add(f.in);
                }
                return manager.reduce(inner);
            }
        };
    }

    private static final class Floored<C extends Collector> implements Collector {
        final C in;
        private final float floor;

        Floored(C in, float floor) {
            this.in = in;
            this.floor = floor;
        }

        @Override
        public LeafCollector getLeafCollector(LeafReaderContext context) throws IOException {
            LeafCollector leaf = in.getLeafCollector(context);
            if (floor <= 0) {
                return leaf;
            }
            return new FilterLeafCollector(leaf) {
                @Override
                public void setScorer(Scorable scorer) throws IOException {
                    Scorable floored = new Scorable() {
                        @Override
                        public float score() throws IOException {
                            return scorer.score();
                        }

                        @Override
                        public int docID() {
                            return scorer.docID();
                        }

                        @Override
                        public void setMinCompetitiveScore(float minScore) throws IOException {
                            scorer.setMinCompetitiveScore(Math.max(minScore, floor));
                        }
                    };
                    in.setScorer(floored);
                    floored.setMinCompetitiveScore(floor);
                }
            };
        }

        @Override
        public ScoreMode scoreMode() {
            return in.scoreMode();
        }
    }
}
