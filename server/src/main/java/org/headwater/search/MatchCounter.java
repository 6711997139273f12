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
 * Counts the matches of a query and their facet values, visiting about {@code cap} of them. Each segment is
 * cut into windows of at most {@link #WINDOW} documents (at least 16 per family unless they would fall under
 * 16 documents) that never span two families; the windows of one family in one segment form a stratum.
 * Windows are visited whole, in an order drawn at random once per stratum with a fixed seed: the first round
 * visits a small equal share of every stratum, later rounds a larger one sized by the density seen so far,
 * until the cap is spent. When what is left looks no larger than twice what the cap still allows, every
 * window is visited and every count is exact. Otherwise each stratum's visited matches stand for the whole
 * stratum in the ratio of its windows to those visited (stratified cluster sampling), and the total and the
 * counts are estimates and say so. Visiting every match of a word found in a tenth of a large catalog is what
 * made broad searches slow, and an "about" count serves the person as well. Whole windows drawn at random
 * replaced a prefix of every window: matches come in runs (the columns of one dataset), and a prefix stopped
 * inside a run overrated its window's density, up to 14 % on the benchmark catalog.
 */
final class MatchCounter {
    static final int WINDOW = 512;
    private static final int MIN_WINDOW = 16;
    private static final int WINDOWS_PER_STRATUM = 16;
    private static final int ROUNDS = 4;
    /** Windows visited in the first round, spread over the strata in proportion to their size. */
    private static final int FIRST_ROUND_WINDOWS = 64;
    private static final long SEED = 0x4857_5345_4152_4348L;
    private static final String FACET_FIELD = FacetsConfig.DEFAULT_INDEX_FIELD_NAME;
    private static final char DELIMITER = FacetsConfig.DELIM_CHAR;

    private MatchCounter() {
    }

    /** The total, whether it and the counts are exact, and the counts by facet and value (freshness included). */
    record Counted(long total, boolean exact, Map<String, Map<String, Integer>> facets) {
    }

    /** A stretch of one segment's documents and, once visited, its matches. */
    private static final class Window {
        final int leaf;
        final int start;
        final int end;
        int[] docs = new int[8];
        int seen;

        Window(int leaf, int start, int end) {
            this.leaf = leaf;
            this.start = start;
            this.end = end;
        }

        void add(int doc) {
            if (seen == docs.length) {
                docs = java.util.Arrays.copyOf(docs, seen * 2);
            }
            docs[seen++] = doc;
        }
    }

    /** One family's windows in one segment, in their drawn order, and how many of them are visited. */
    private static final class Stratum {
        final int leaf;
        final List<Window> windows;
        int visited;

        Stratum(int leaf, List<Window> windows) {
            this.leaf = leaf;
            this.windows = windows;
        }

        /** What each visited match stands for: the stratum's windows over those visited. */
        double weight() {
            return visited == 0 ? 0 : (double) windows.size() / visited;
        }
    }

    static Counted count(IndexSearcher searcher, Query query, int cap, int valuesPerFacet, FreshnessProvider freshness)
            throws IOException {
        Weight weight = searcher.createWeight(searcher.rewrite(new ConstantScoreQuery(query)), ScoreMode.COMPLETE_NO_SCORES, 1);
        List<LeafReaderContext> leaves = searcher.getIndexReader().leaves();
        List<Stratum> strata = new ArrayList<>();
        int windowCount = 0;
        for (int i = 0; i < leaves.size(); i++) {
            for (int[] range : familyRanges(leaves.get(i))) {
                List<Window> own = new ArrayList<>();
                // Small families get smaller windows: a stratum of a few windows makes a coarse sample.
                int size = Math.max(MIN_WINDOW, Math.min(WINDOW, (range[1] - range[0] + WINDOWS_PER_STRATUM - 1) / WINDOWS_PER_STRATUM));
                for (int start = range[0], end; start < range[1]; start = end) {
                    end = (int) Math.min(range[1], (long) start + size);
                    own.add(new Window(i, start, end));
                }
                // The same draw for the same index: a repeated query gives the same estimate.
                java.util.Collections.shuffle(own, new java.util.Random(SEED + 31L * i + range[0]));
                strata.add(new Stratum(i, own));
                windowCount += own.size();
            }
        }
        long visitedMatches = 0;
        int visitedWindows = 0;
        double fraction = Math.min(1.0, (double) FIRST_ROUND_WINDOWS / Math.max(1, windowCount));
        for (int round = 0; round < ROUNDS && visitedWindows < windowCount; round++) {
            int[] targets = new int[strata.size()];
            List<Window> chosen = new ArrayList<>();
            for (int k = 0; k < strata.size(); k++) {
                Stratum s = strata.get(k);
                targets[k] = Math.max(s.visited,
                        Math.min(s.windows.size(), Math.max(1, (int) Math.ceil(fraction * s.windows.size()))));
                chosen.addAll(s.windows.subList(s.visited, targets[k]));
            }
            visit(searcher, weight, leaves, chosen);
            for (int k = 0; k < strata.size(); k++) {
                strata.get(k).visited = targets[k];
            }
            for (Window w : chosen) {
                visitedMatches += w.seen;
            }
            visitedWindows += chosen.size();
            long budget = cap - visitedMatches;
            if (budget <= 0) {
                break;
            }
            double perWindow = (double) visitedMatches / Math.max(1, visitedWindows);
            double rest = perWindow * (windowCount - visitedWindows);
            // What is left looks no larger than what the cap still allows, with room for a wrong guess: all of it.
            fraction = rest <= 2.0 * budget ? 1.0
                    : Math.min(1.0, (double) visitedWindows / windowCount + budget / (perWindow * windowCount));
        }
        boolean exact = visitedWindows == windowCount;
        List<java.util.concurrent.Callable<Segment>> tally = new ArrayList<>();
        for (int i = 0; i < leaves.size(); i++) {
            LeafReaderContext leaf = leaves.get(i);
            int index = i;
            tally.add(() -> {
                Segment segment = new Segment(leaf, freshness);
                for (Stratum s : strata) {
                    if (s.leaf != index) {
                        continue;
                    }
                    double each = s.weight();
                    for (Window w : s.windows.subList(0, s.visited)) {
                        segment.total += w.seen * each;
                        for (int d = 0; d < w.seen; d++) {
                            segment.add(w.docs[d], each);
                        }
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
        return new Counted(Math.round(total), exact, facets);
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

    /**
     * Visits the chosen windows whole, each segment's in document order by one task (its windows share one
     * scorer, whose iterator only moves forward), the segments at the same time.
     */
    private static void visit(IndexSearcher searcher, Weight weight, List<LeafReaderContext> leaves, List<Window> chosen)
            throws IOException {
        List<List<Window>> byLeaf = new ArrayList<>();
        leaves.forEach(l -> byLeaf.add(new ArrayList<>()));
        chosen.forEach(w -> byLeaf.get(w.leaf).add(w));
        List<java.util.concurrent.Callable<Void>> tasks = new ArrayList<>();
        for (int i = 0; i < leaves.size(); i++) {
            List<Window> own = byLeaf.get(i);
            if (own.isEmpty()) {
                continue;
            }
            own.sort(java.util.Comparator.comparingInt(w -> w.start));
            LeafReaderContext leaf = leaves.get(i);
            tasks.add(() -> {
                visitLeaf(weight, leaf, own);
                return null;
            });
        }
        searcher.getTaskExecutor().invokeAll(tasks);
    }

    private static void visitLeaf(Weight weight, LeafReaderContext leaf, List<Window> windows) throws IOException {
        Scorer scorer = weight.scorer(leaf);
        if (scorer == null) {
            return;
        }
        TwoPhaseIterator twoPhase = scorer.twoPhaseIterator();
        DocIdSetIterator docs = twoPhase == null ? scorer.iterator() : TwoPhaseIterator.asDocIdSetIterator(twoPhase);
        Bits live = leaf.reader().getLiveDocs();
        for (Window w : windows) {
            int doc = docs.docID() < w.start ? docs.advance(w.start) : docs.docID();
            while (doc < w.end) {
                if (live == null || live.get(doc)) {
                    w.add(doc);
                }
                doc = docs.nextDoc();
            }
        }
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
