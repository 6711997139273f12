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
import org.apache.lucene.index.IndexReader;
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

    /**
     * How one segment is cut: its windows in document order ({@code start[w]} to {@code end[w]}) and its strata,
     * each the ids of one family's windows in their drawn order. It depends on the segment alone, so it is
     * worked out once per segment and kept until the segment closes: cutting and shuffling the windows again
     * for every search cost about a twentieth of a broad one.
     */
    private record Layout(int[] start, int[] end, int[][] strata) {
        static Layout of(LeafReaderContext leaf) throws IOException {
            List<int[]> windows = new ArrayList<>();
            List<int[]> strata = new ArrayList<>();
            for (int[] range : familyRanges(leaf)) {
                // Small families get smaller windows: a stratum of a few windows makes a coarse sample.
                int size = Math.max(MIN_WINDOW, Math.min(WINDOW, (range[1] - range[0] + WINDOWS_PER_STRATUM - 1) / WINDOWS_PER_STRATUM));
                List<Integer> own = new ArrayList<>();
                for (int start = range[0], end; start < range[1]; start = end) {
                    end = (int) Math.min(range[1], (long) start + size);
                    own.add(windows.size());
                    windows.add(new int[] {start, end});
                }
                // The same draw for the same segment: a repeated query gives the same estimate.
                java.util.Collections.shuffle(own, new java.util.Random(SEED + 31L * leaf.reader().maxDoc() + range[0]));
                strata.add(own.stream().mapToInt(Integer::intValue).toArray());
            }
            int[] start = new int[windows.size()];
            int[] end = new int[windows.size()];
            for (int w = 0; w < start.length; w++) {
                start[w] = windows.get(w)[0];
                end[w] = windows.get(w)[1];
            }
            return new Layout(start, end, strata.toArray(new int[0][]));
        }
    }

    private static final Map<Object, Layout> LAYOUTS = new java.util.concurrent.ConcurrentHashMap<>();

    private static Layout layout(LeafReaderContext leaf) throws IOException {
        IndexReader.CacheHelper helper = leaf.reader().getCoreCacheHelper();
        if (helper == null) {
            return Layout.of(leaf);
        }
        Layout known = LAYOUTS.get(helper.getKey());
        if (known == null) {
            known = Layout.of(leaf);
            if (LAYOUTS.putIfAbsent(helper.getKey(), known) == null) {
                helper.addClosedListener(LAYOUTS::remove);
            }
        }
        return known;
    }

    /** One segment's layout and, for this search, the matches found in each window visited. */
    private static final class Visits {
        final Layout layout;
        final int[] from;
        final int[] count;
        int[] docs = new int[256];
        int size;

        Visits(Layout layout) {
            this.layout = layout;
            this.from = new int[layout.start().length];
            this.count = new int[layout.start().length];
        }

        void add(int window, int doc) {
            if (size == docs.length) {
                docs = java.util.Arrays.copyOf(docs, size * 2);
            }
            docs[size++] = doc;
            count[window]++;
        }
    }

    /** One family's windows in one segment, and how many of them, in their drawn order, are visited. */
    private static final class Stratum {
        final int leaf;
        final int[] windows;
        int visited;

        Stratum(int leaf, int[] windows) {
            this.leaf = leaf;
            this.windows = windows;
        }

        /** What each visited match stands for: the stratum's windows over those visited. */
        double weight() {
            return visited == 0 ? 0 : (double) windows.length / visited;
        }
    }

    static Counted count(IndexSearcher searcher, Query query, int cap, int valuesPerFacet, FreshnessProvider freshness)
            throws IOException {
        Weight weight = searcher.createWeight(searcher.rewrite(new ConstantScoreQuery(query)), ScoreMode.COMPLETE_NO_SCORES, 1);
        List<LeafReaderContext> leaves = searcher.getIndexReader().leaves();
        List<Stratum> strata = new ArrayList<>();
        Visits[] visits = new Visits[leaves.size()];
        int windowCount = 0;
        for (int i = 0; i < leaves.size(); i++) {
            visits[i] = new Visits(layout(leaves.get(i)));
            for (int[] own : visits[i].layout.strata()) {
                strata.add(new Stratum(i, own));
                windowCount += own.length;
            }
        }
        long visitedMatches = 0;
        int visitedWindows = 0;
        double fraction = Math.min(1.0, (double) FIRST_ROUND_WINDOWS / Math.max(1, windowCount));
        for (int round = 0; round < ROUNDS && visitedWindows < windowCount; round++) {
            int[] targets = new int[strata.size()];
            // A segment's chosen windows, at most all of its windows.
            int[][] chosen = new int[leaves.size()][];
            int[] chosenCount = new int[leaves.size()];
            for (int i = 0; i < leaves.size(); i++) {
                chosen[i] = new int[visits[i].layout.start().length];
            }
            for (int k = 0; k < strata.size(); k++) {
                Stratum s = strata.get(k);
                targets[k] = Math.max(s.visited,
                        Math.min(s.windows.length, Math.max(1, (int) Math.ceil(fraction * s.windows.length))));
                int n = targets[k] - s.visited;
                System.arraycopy(s.windows, s.visited, chosen[s.leaf], chosenCount[s.leaf], n);
                chosenCount[s.leaf] += n;
            }
            visit(searcher, weight, leaves, visits, chosen, chosenCount);
            for (int k = 0; k < strata.size(); k++) {
                strata.get(k).visited = targets[k];
            }
            visitedMatches = 0;
            for (int i = 0; i < leaves.size(); i++) {
                visitedWindows += chosenCount[i];
                visitedMatches += visits[i].size;
            }
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
                Visits v = visits[index];
                for (Stratum s : strata) {
                    if (s.leaf != index) {
                        continue;
                    }
                    double each = s.weight();
                    for (int k = 0; k < s.visited; k++) {
                        int w = s.windows[k];
                        segment.total += v.count[w] * each;
                        for (int d = v.from[w], last = v.from[w] + v.count[w]; d < last; d++) {
                            segment.add(v.docs[d], each);
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
     * scorer, whose iterator only moves forward), the segments at the same time. Window ids are in document
     * order, so sorting the ids sorts the windows.
     */
    private static void visit(IndexSearcher searcher, Weight weight, List<LeafReaderContext> leaves, Visits[] visits,
            int[][] chosen, int[] chosenCount) throws IOException {
        List<java.util.concurrent.Callable<Void>> tasks = new ArrayList<>();
        for (int i = 0; i < leaves.size(); i++) {
            if (chosenCount[i] == 0) {
                continue;
            }
            int[] own = chosen[i];
            int n = chosenCount[i];
            java.util.Arrays.sort(own, 0, n);
            LeafReaderContext leaf = leaves.get(i);
            Visits v = visits[i];
            tasks.add(() -> {
                visitLeaf(weight, leaf, v, own, n);
                return null;
            });
        }
        searcher.getTaskExecutor().invokeAll(tasks);
    }

    private static void visitLeaf(Weight weight, LeafReaderContext leaf, Visits v, int[] windows, int n) throws IOException {
        Scorer scorer = weight.scorer(leaf);
        if (scorer == null) {
            // Nothing matches here: every window's count stays 0.
            return;
        }
        TwoPhaseIterator twoPhase = scorer.twoPhaseIterator();
        DocIdSetIterator docs = twoPhase == null ? scorer.iterator() : TwoPhaseIterator.asDocIdSetIterator(twoPhase);
        Bits live = leaf.reader().getLiveDocs();
        int[] start = v.layout.start();
        int[] end = v.layout.end();
        for (int k = 0; k < n; k++) {
            int w = windows[k];
            v.from[w] = v.size;
            int doc = docs.docID() < start[w] ? docs.advance(start[w]) : docs.docID();
            while (doc < end[w]) {
                if (live == null || live.get(doc)) {
                    v.add(w, doc);
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
