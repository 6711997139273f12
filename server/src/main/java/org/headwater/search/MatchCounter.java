package org.headwater.search;

import java.io.IOException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.apache.lucene.facet.FacetsConfig;
import org.apache.lucene.index.DocValues;
import org.apache.lucene.index.LeafReaderContext;
import org.apache.lucene.index.NumericDocValues;
import org.apache.lucene.index.PostingsEnum;
import org.apache.lucene.index.SortedSetDocValues;
import org.apache.lucene.index.Terms;
import org.apache.lucene.index.TermsEnum;
import org.apache.lucene.util.BytesRef;
import org.apache.lucene.search.ConstantScoreQuery;
import org.apache.lucene.search.DocIdSetIterator;
import org.apache.lucene.search.IndexSearcher;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.ScoreMode;
import org.apache.lucene.search.Scorer;
import org.apache.lucene.search.TwoPhaseIterator;
import org.apache.lucene.search.Weight;
import org.apache.lucene.util.Bits;

/**
 * Counts the matches of a query and their facet values, visiting at most about {@code cap} of them. Each
 * segment is cut into windows of {@link #WINDOW} documents. In the first round every window may visit an
 * equal share of half the cap; in the following rounds what is left of the cap is shared among the windows
 * not yet through. When every window gets through, every count is exact. Otherwise a window not through
 * stands for its whole length, its counts scaled by its density so far (stratified sampling, with windows
 * that each hold one family of documents), and the total and the counts are estimates and
 * say so. Visiting every match of a word found in a tenth of a large catalog is what made broad searches
 * slow, and an "about" count serves the person as well.
 */
final class MatchCounter {
    static final int WINDOW = 4096;
    private static final int ROUNDS = 4;
    private static final String FACET_FIELD = FacetsConfig.DEFAULT_INDEX_FIELD_NAME;
    private static final char DELIMITER = FacetsConfig.DELIM_CHAR;

    private MatchCounter() {
    }

    /** The total, whether it and the counts are exact, and the counts by facet and value (freshness included). */
    record Counted(long total, boolean exact, Map<String, Map<String, Integer>> facets) {
    }

    /** A stretch of one segment's documents and the matches visited in it so far. */
    private static final class Window {
        final int start;
        final int end;
        int resume;
        boolean through;
        int[] docs = new int[8];
        int seen;

        Window(int start, int end) {
            this.start = start;
            this.end = end;
            this.resume = start;
        }

        void add(int doc) {
            if (seen == docs.length) {
                docs = java.util.Arrays.copyOf(docs, seen * 2);
            }
            docs[seen++] = doc;
        }

        /**
         * How many matches the window stands for. Sampling stopped at a match, so (seen − 1) ÷ (covered − 1) is
         * the unbiased estimate of the density of the part not visited.
         */
        double estimate() {
            int covered = resume - start;
            if (through || seen < 2 || covered < 2) {
                return through ? seen : (double) seen * (end - start) / Math.max(1, covered);
            }
            return seen + (double) (seen - 1) / (covered - 1) * (end - resume);
        }
    }

    static Counted count(IndexSearcher searcher, Query query, int cap, int valuesPerFacet, FreshnessProvider freshness)
            throws IOException {
        Weight weight = searcher.createWeight(searcher.rewrite(new ConstantScoreQuery(query)), ScoreMode.COMPLETE_NO_SCORES, 1);
        List<LeafReaderContext> leaves = searcher.getIndexReader().leaves();
        List<List<Window>> windows = new ArrayList<>();
        int count = 0;
        for (LeafReaderContext leaf : leaves) {
            List<Window> own = new ArrayList<>();
            for (int[] range : familyRanges(leaf)) {
                for (int start = range[0], end; start < range[1]; start = end) {
                    end = (int) Math.min(range[1], (long) start + WINDOW);
                    own.add(new Window(start, end));
                }
            }
            windows.add(own);
            count += own.size();
        }
        long budget = cap;
        int share = Math.max(2, cap / 2 / Math.max(1, count));
        int open = count;
        for (int round = 0; round < ROUNDS && open > 0 && budget > 0; round++) {
            // Segments are visited at the same time, each by one task: a segment's windows share its scorer.
            int roundShare = share;
            List<java.util.concurrent.Callable<Long>> visits = new ArrayList<>();
            for (int i = 0; i < leaves.size(); i++) {
                LeafReaderContext leaf = leaves.get(i);
                List<Window> own = windows.get(i);
                visits.add(() -> visit(weight, leaf, own, roundShare));
            }
            long used = 0;
            for (long n : searcher.getTaskExecutor().invokeAll(visits)) {
                used += n;
            }
            budget -= used;
            open = 0;
            for (List<Window> own : windows) {
                for (Window w : own) {
                    open += w.through ? 0 : 1;
                }
            }
            share = (int) Math.max(1, budget / Math.max(1, open));
        }
        List<java.util.concurrent.Callable<Segment>> tally = new ArrayList<>();
        for (int i = 0; i < leaves.size(); i++) {
            LeafReaderContext leaf = leaves.get(i);
            List<Window> own = windows.get(i);
            tally.add(() -> {
                Segment segment = new Segment(leaf, freshness);
                for (Window w : own) {
                    double estimate = w.estimate();
                    segment.total += estimate;
                    double weightOfEach = w.seen == 0 ? 0 : estimate / w.seen;
                    for (int d = 0; d < w.seen; d++) {
                        segment.add(w.docs[d], weightOfEach);
                    }
                }
                return segment;
            });
        }
        double total = 0;
        Map<String, Map<String, Double>> counts = new LinkedHashMap<>();
        Map<String, Double> fresh = new TreeMap<>();
        // Summed in segment order, as when one thread did it all: the same floating-point sums every time.
        for (Segment segment : searcher.getTaskExecutor().invokeAll(tally)) {
            total += segment.total;
            segment.fresh.forEach((state, n) -> fresh.merge(state, n, Double::sum));
            segment.addTo(counts);
        }
        Map<String, Map<String, Integer>> facets = new LinkedHashMap<>();
        for (String dim : Documents.FACETS) {
            facets.put(dim, top(counts.getOrDefault(dim, Map.of()), valuesPerFacet));
        }
        Map<String, Integer> freshOut = new TreeMap<>();
        fresh.forEach((state, n) -> freshOut.put(state, (int) Math.round(n)));
        facets.put("freshness", freshOut);
        return new Counted(Math.round(total), open == 0, facets);
    }

    /**
     * The stretches of a segment that hold one family each, in order. Documents are kept in family order, so
     * a family's documents are the {@code docFreq} documents from its first; a window never spans two
     * families, whose densities of matches differ by tens of times (a word in most datasets' column lists
     * is in a few per cent of the columns).
     */
    private static List<int[]> familyRanges(LeafReaderContext leaf) throws IOException {
        List<int[]> ranges = new ArrayList<>();
        Terms terms = leaf.reader().terms(Documents.FAMILY);
        if (terms != null) {
            TermsEnum families = terms.iterator();
            for (BytesRef family = families.next(); family != null; family = families.next()) {
                PostingsEnum docs = families.postings(null, PostingsEnum.NONE);
                int first = docs.nextDoc();
                ranges.add(new int[] {first, first + families.docFreq()});
            }
        }
        ranges.sort(java.util.Comparator.comparingInt(r -> r[0]));
        int covered = ranges.stream().mapToInt(r -> r[1] - r[0]).sum();
        boolean contiguous = covered == leaf.reader().maxDoc();
        for (int i = 1; i < ranges.size() && contiguous; i++) {
            contiguous = ranges.get(i)[0] == ranges.get(i - 1)[1];
        }
        // Any other layout (an index not yet rebuilt in family order) is cut into plain windows.
        return contiguous ? ranges : List.<int[]>of(new int[] {0, leaf.reader().maxDoc()});
    }

    /** Visits up to {@code share} more matches in each window of a segment not yet through; returns how many. */
    private static long visit(Weight weight, LeafReaderContext leaf, List<Window> windows, int share) throws IOException {
        Scorer scorer = null;
        DocIdSetIterator docs = null;
        Bits live = leaf.reader().getLiveDocs();
        long visited = 0;
        for (Window w : windows) {
            if (w.through) {
                continue;
            }
            if (scorer == null) {
                scorer = weight.scorer(leaf);
                if (scorer == null) {
                    windows.forEach(x -> x.through = true);
                    return visited;
                }
                TwoPhaseIterator twoPhase = scorer.twoPhaseIterator();
                docs = twoPhase == null ? scorer.iterator() : TwoPhaseIterator.asDocIdSetIterator(twoPhase);
            }
            int doc = docs.docID() < w.resume ? docs.advance(w.resume) : docs.docID();
            int taken = 0;
            while (doc < w.end && taken < share) {
                if (live == null || live.get(doc)) {
                    w.add(doc);
                    taken++;
                }
                doc = docs.nextDoc();
            }
            visited += taken;
            w.resume = Math.min(doc, w.end);
            w.through = doc >= w.end;
        }
        return visited;
    }

    /** The most frequent values, most first (then by value), their counts rounded. */
    private static Map<String, Integer> top(Map<String, Double> counts, int n) {
        List<Map.Entry<String, Double>> entries = new ArrayList<>(counts.entrySet());
        entries.sort((a, b) -> !a.getValue().equals(b.getValue()) ? Double.compare(b.getValue(), a.getValue())
                : a.getKey().compareTo(b.getKey()));
        Map<String, Integer> out = new LinkedHashMap<>();
        for (Map.Entry<String, Double> e : entries.subList(0, Math.min(n, entries.size()))) {
            out.put(e.getKey(), (int) Math.min(Integer.MAX_VALUE, Math.round(e.getValue())));
        }
        return out;
    }

    /**
     * One segment's facet values and freshness, read for the documents visited, in order. Counts are kept by
     * ordinal while the segment is visited and named once at its end: a visit may pass tens of thousands of
     * documents, each with several values.
     */
    private static final class Segment {
        private final SortedSetDocValues values;
        private final NumericDocValues families;
        private final NumericDocValues rankIds;
        private final FreshnessProvider freshness;
        private final double[] byOrd;
        /** The matches the segment's windows stand for, and its datasets' weights by freshness state. */
        double total;
        final Map<String, Double> fresh = new TreeMap<>();

        Segment(LeafReaderContext leaf, FreshnessProvider freshness) throws IOException {
            this.values = DocValues.getSortedSet(leaf.reader(), FACET_FIELD);
            this.families = DocValues.getNumeric(leaf.reader(), Documents.FAMILY_CODE);
            this.rankIds = DocValues.getNumeric(leaf.reader(), Documents.RANK_ID);
            this.freshness = freshness;
            this.byOrd = new double[(int) Math.min(Integer.MAX_VALUE - 8, values.getValueCount())];
        }

        void add(int doc, double weight) throws IOException {
            if (values.advanceExact(doc)) {
                for (int i = 0; i < values.docValueCount(); i++) {
                    byOrd[(int) values.nextOrd()] += weight;
                }
            }
            if (families.advanceExact(doc) && families.longValue() == Documents.DATASET && rankIds.advanceExact(doc)) {
                fresh.merge(freshness.stateOf(rankIds.longValue()), weight, Double::sum);
            }
        }

        /** Adds the segment's counts to those by facet and value. */
        void addTo(Map<String, Map<String, Double>> counts) throws IOException {
            for (int ord = 0; ord < byOrd.length; ord++) {
                if (byOrd[ord] == 0) {
                    continue;
                }
                String path = values.lookupOrd(ord).utf8ToString();
                int cut = path.indexOf(DELIMITER);
                if (cut >= 0) {
                    counts.computeIfAbsent(path.substring(0, cut), k -> new HashMap<>())
                            .merge(path.substring(cut + 1), byOrd[ord], Double::sum);
                }
            }
        }
    }
}
