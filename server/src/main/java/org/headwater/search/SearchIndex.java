package org.headwater.search;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.apache.lucene.document.Document;
import org.apache.lucene.index.DirectoryReader;
import org.apache.lucene.index.IndexReader;
import org.apache.lucene.index.IndexWriter;
import org.apache.lucene.index.IndexWriterConfig;
import org.apache.lucene.index.SegmentInfos;
import org.apache.lucene.index.Term;
import org.apache.lucene.search.Explanation;
import org.apache.lucene.search.IndexSearcher;
import org.apache.lucene.search.MatchAllDocsQuery;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.ScoreDoc;
import org.apache.lucene.search.SearcherFactory;
import org.apache.lucene.search.SearcherManager;
import org.apache.lucene.search.TopDocs;
import org.apache.lucene.search.TopScoreDocCollectorManager;
import org.apache.lucene.search.uhighlight.DefaultPassageFormatter;
import org.apache.lucene.search.uhighlight.UnifiedHighlighter;
import org.apache.lucene.store.ByteBuffersDirectory;
import org.apache.lucene.store.Directory;
import org.apache.lucene.store.FSDirectory;
import org.headwater.ingest.Change;
import org.headwater.ingest.ChangeListener;
import org.headwater.store.CatalogReader;
import org.headwater.store.SearchSource;
import org.headwater.store.SearchSource.DatasetDoc;
import org.headwater.store.SearchSource.ScriptDoc;
import org.headwater.store.Views.ColumnView;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The Lucene index of datasets, their columns, scripts and owners. It listens to the ingestion path and
 * stores, with each commit, the change-log sequence number it has absorbed; at open it catches up from the
 * change log, and rebuilds from the store when it is missing, damaged or ahead of the store.
 */
public final class SearchIndex implements ChangeListener, AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(SearchIndex.class);
    static final String SEQ_KEY = "headwater.change_seq";
    /**
     * The layout of the documents: an index written with another is rebuilt at open. 2: a column's dataset
     * name moved to its own field; 3: documents kept in family order.
     */
    static final String FORMAT_KEY = "headwater.index_format";
    static final String FORMAT = "3";
    /** Dataset and column documents carry their dataset's id here, so a dataset's documents leave together. */
    private static final String OF_DATASET = "of_dataset";
    private static final int FACET_VALUES = 50;
    /** Matches visited for the total and the facets before they become estimates. */
    static final int COUNT_CAP = 10_000;
    private static final int SNIPPET_LENGTH = 240;
    private static final double BUFFER_MB = 64;
    private static final double REBUILD_BUFFER_MB = 256;
    private static final int INDEXING_THREADS = 2;
    /** Threads that search segments in parallel, shared by every index of the process. */
    private static final java.util.concurrent.ExecutorService SEARCH_THREADS = searchThreads();

    private final Directory directory;
    private final IndexWriter writer;
    private final SearcherManager searchers;
    private final SearchSource source;
    /** Column documents repeat their names, types and dataset's name: analysed once, replayed after. */
    private final RepeatedTokens repeated = new RepeatedTokens(Documents.indexAnalyzer());
    private static final LuceneQueries QUERIES = new LuceneQueries();
    private volatile Ranks ranks = Ranks.NONE;
    private volatile boolean ranksStale = true;
    private volatile FreshnessProvider freshness = FreshnessProvider.UNKNOWN;
    private volatile int countCap = COUNT_CAP;

    private SearchIndex(Directory directory, CatalogReader catalog) throws IOException {
        this.directory = directory;
        this.source = new SearchSource(catalog);
        IndexWriterConfig config = new IndexWriterConfig(Documents.indexAnalyzer())
                .setOpenMode(IndexWriterConfig.OpenMode.CREATE_OR_APPEND)
                .setRAMBufferSizeMB(BUFFER_MB)
                .setIndexSort(Documents.INDEX_ORDER)
                // Compound files copy every new segment once more; the index is few enough segments without them.
                .setUseCompoundFile(false);
        config.getMergePolicy().setNoCFSRatio(0.0);
        this.writer = new IndexWriter(directory, config);
        this.searchers = new SearcherManager(writer, new SearcherFactory() {
            @Override
            public IndexSearcher newSearcher(IndexReader reader, IndexReader previous) {
                // Segments are searched on the search threads as well as the caller's, so one broad search
                // uses every core; the query cache is off because the filters here are cheap to rerun and
                // caching one means visiting every match once.
                IndexSearcher searcher = new IndexSearcher(reader, SEARCH_THREADS);
                searcher.setQueryCache(null);
                return searcher;
            }
        });
    }

    private static java.util.concurrent.ExecutorService searchThreads() {
        java.util.concurrent.atomic.AtomicInteger n = new java.util.concurrent.atomic.AtomicInteger();
        return java.util.concurrent.Executors.newFixedThreadPool(Math.max(1, Math.min(4, Runtime.getRuntime().availableProcessors())),
                r -> {
                    Thread t = new Thread(r, "search-" + n.incrementAndGet());
                    t.setDaemon(true);
                    return t;
                });
    }

    /** Opens the index in a folder, bringing it up to date with the store. */
    public static SearchIndex open(Path folder, CatalogReader catalog) {
        try {
            Files.createDirectories(folder);
            SearchIndex index;
            discardOtherFormat(folder);
            try {
                index = new SearchIndex(FSDirectory.open(folder), catalog);
            } catch (IOException | RuntimeException damaged) {
                LOG.warn("The search index in {} could not be opened ({}); rebuilding it from the store", folder,
                        damaged.toString());
                deleteIndexFiles(folder);
                index = new SearchIndex(FSDirectory.open(folder), catalog);
            }
            index.catchUp();
            return index;
        } catch (IOException e) {
            throw new SearchException("Cannot open the search index in " + folder, e);
        }
    }

    /**
     * Deletes an index written in another layout: a writer cannot reopen an index kept in another order, and
     * the store rebuilds it anyway.
     */
    private static void discardOtherFormat(Path folder) throws IOException {
        String format;
        try (Directory existing = FSDirectory.open(folder)) {
            if (!DirectoryReader.indexExists(existing)) {
                return;
            }
            format = SegmentInfos.readLatestCommit(existing).getUserData().get(FORMAT_KEY);
        } catch (IOException | RuntimeException unreadable) {
            // A damaged index is dealt with where the writer opens it.
            return;
        }
        if (!FORMAT.equals(format)) {
            LOG.info("The search index in {} was written in another layout ({}); rebuilding it from the store", folder,
                    format == null ? "before layouts were numbered" : "layout " + format);
            deleteIndexFiles(folder);
        }
    }

    /** An index held in memory, rebuilt from the store; for tests and throwaway catalogs. */
    public static SearchIndex inMemory(CatalogReader catalog) {
        try {
            SearchIndex index = new SearchIndex(new ByteBuffersDirectory(), catalog);
            index.catchUp();
            return index;
        } catch (IOException e) {
            throw new SearchException("Cannot create an in-memory index", e);
        }
    }

    /** Sets where the freshness facet comes from; until then every dataset is {@code unknown}. */
    public void useFreshness(FreshnessProvider provider) {
        this.freshness = java.util.Objects.requireNonNull(provider, "provider");
    }

    /** Sets how many matches are counted exactly before totals and facets are estimated; for tests. */
    void countCap(int cap) {
        this.countCap = cap;
    }

    /** The change-log sequence number the index has absorbed. */
    public long absorbedSeq() {
        awaitWrites();
        return absorbed();
    }

    private synchronized long absorbed() {
        return Long.parseLong(commitData().getOrDefault(SEQ_KEY, "0"));
    }

    private Map<String, String> commitData() {
        Map<String, String> data = new java.util.HashMap<>();
        Iterable<Map.Entry<String, String>> live = writer.getLiveCommitData();
        if (live != null) {
            live.forEach(e -> data.put(e.getKey(), e.getValue()));
        }
        return data;
    }

    private synchronized void catchUp() throws IOException {
        long absorbed = absorbed();
        long last = source.reader().lastChangeSeq();
        if (absorbed == last) {
            return;
        }
        if (absorbed > last || absorbed == 0) {
            // Ahead of the store means the store was replaced; an empty index has nothing to keep.
            rebuild();
            return;
        }
        Changed changed = new Changed();
        for (Map.Entry<String, Long> entry : source.reader().changedSince(absorbed)) {
            changed.add(entry.getKey(), entry.getValue());
        }
        LOG.info("Search index catching up: {} datasets, {} scripts, {} edges changed since sequence {}",
                changed.datasets.size(), changed.scripts.size(), changed.edges.size(), absorbed);
        write(changed, last);
    }

    /** Throws the index away and builds it again from the store. */
    public synchronized void rebuild() {
        try {
            long seq = source.reader().lastChangeSeq();
            writer.deleteAll();
            // A bigger buffer while rebuilding: fewer, larger segments to flush and merge.
            writer.getConfig().setRAMBufferSizeMB(REBUILD_BUFFER_MB);
            List<Long> datasets = source.reader().presentDatasetIds();
            try (Indexers indexers = new Indexers()) {
                for (int from = 0; from < datasets.size(); from += 1000) {
                    // The store is read here while the batch before is analysed on the indexing threads.
                    List<DatasetDoc> batch = source.datasets(datasets.subList(from, Math.min(datasets.size(), from + 1000)));
                    indexers.submit(() -> {
                        for (DatasetDoc doc : batch) {
                            addDataset(doc);
                        }
                    });
                }
                List<Long> scripts = source.presentScriptIds();
                for (int from = 0; from < scripts.size(); from += 1000) {
                    List<ScriptDoc> batch = source.scripts(scripts.subList(from, Math.min(scripts.size(), from + 1000)));
                    indexers.submit(() -> {
                        for (ScriptDoc doc : batch) {
                            writer.addDocument(build(Documents.script(doc, ScriptProse.of(doc.entry().uri()))));
                        }
                    });
                }
            }
            writeOwners();
            ranksStale = true;
            commit(seq);
        } catch (IOException e) {
            throw new SearchException("Rebuilding the search index failed", e);
        } finally {
            writer.getConfig().setRAMBufferSizeMB(BUFFER_MB);
        }
    }

    /** Work that adds documents; IndexWriter takes documents from several threads at once. */
    private interface Indexing {
        void run() throws IOException;
    }

    /**
     * A few threads that analyse and add documents while the caller reads the next batch from the store; at
     * most {@code 2 × threads} batches wait, so memory stays bounded. Closing waits for all and rethrows the
     * first failure.
     */
    private static final class Indexers implements AutoCloseable {
        private final int threads = Math.max(1, Math.min(INDEXING_THREADS, Runtime.getRuntime().availableProcessors()));
        private final java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "search-indexing");
            t.setDaemon(true);
            return t;
        });
        private final java.util.concurrent.Semaphore waiting = new java.util.concurrent.Semaphore(2 * threads);
        private final List<java.util.concurrent.Future<?>> running = new ArrayList<>();

        void submit(Indexing work) throws IOException {
            try {
                waiting.acquire();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new java.io.InterruptedIOException("Interrupted while rebuilding the search index");
            }
            running.add(pool.submit(() -> {
                try {
                    work.run();
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                } finally {
                    waiting.release();
                }
            }));
        }

        @Override
        public void close() throws IOException {
            try {
                for (java.util.concurrent.Future<?> f : running) {
                    f.get();
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new java.io.InterruptedIOException("Interrupted while rebuilding the search index");
            } catch (java.util.concurrent.ExecutionException e) {
                Throwable cause = e.getCause() instanceof UncheckedIOException u ? u.getCause() : e.getCause();
                throw cause instanceof IOException io ? io : new IOException(cause);
            } finally {
                pool.shutdownNow();
            }
        }
    }

    @Override
    public void committed(List<Change> changes) {
        synchronized (writesLock) {
            writesHanded++;
        }
        try {
            writes.execute(() -> absorbHanded(changes));
        } catch (java.util.concurrent.RejectedExecutionException closed) {
            synchronized (writesLock) {
                writesHanded--;
            }
            throw new SearchException("The search index is closed; the batch is in the store and will be indexed at the next start", closed);
        }
    }

    /** Indexes a batch handed over by {@link #committed}, on the writer thread, and counts it as done. */
    private void absorbHanded(List<Change> changes) {
        try {
            absorb(changes);
        } catch (RuntimeException e) {
            // The store is the truth and already holds the batch; the index catches up from the change log at
            // the next start.
            LOG.warn("Indexing a batch failed; the index will catch up from the change log", e);
        } finally {
            synchronized (writesLock) {
                writesDone++;
                writesLock.notifyAll();
            }
        }
    }

    private synchronized void absorb(List<Change> changes) {
        Changed changed = new Changed();
        long seq = 0;
        for (Change change : changes) {
            changed.add(change.entity(), change.entityId());
            seq = Math.max(seq, change.seq());
        }
        try {
            write(changed, Math.max(seq, absorbed()));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * Batches are indexed on this thread, one after another, so that the ingestion path goes on to its next
     * batch while the last one is analysed; a read waits for the batches handed over before it
     * ({@link #awaitWrites}), so what was applied is what is searched.
     */
    private final java.util.concurrent.ExecutorService writes = java.util.concurrent.Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "search-index-writer");
        t.setDaemon(true);
        return t;
    });
    private final Object writesLock = new Object();
    private long writesHanded;
    private long writesDone;
    private static final long WRITE_WAIT_MILLIS = 120_000;

    /** Waits until every batch handed to the index before this call is in it (at most two minutes). */
    private void awaitWrites() {
        synchronized (writesLock) {
            long target = writesHanded;
            long deadline = System.currentTimeMillis() + WRITE_WAIT_MILLIS;
            while (writesDone < target) {
                long left = deadline - System.currentTimeMillis();
                if (left <= 0) {
                    LOG.warn("The search index is still {} batches behind; searching what it holds", target - writesDone);
                    return;
                }
                try {
                    writesLock.wait(left);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    return;
                }
            }
        }
    }

    /** What a batch of changes touched, sorted by entity. */
    private static final class Changed {
        final Set<Long> datasets = new HashSet<>();
        final Set<Long> scripts = new HashSet<>();
        final Set<Long> edges = new HashSet<>();

        void add(String entity, long id) {
            switch (entity) {
                case Change.DATASET -> datasets.add(id);
                case Change.SCRIPT -> scripts.add(id);
                case Change.EDGE -> edges.add(id);
                default -> {
                    // Runs and anything newer change use counts only; the ranks are recomputed below.
                }
            }
        }
    }

    private void write(Changed changed, long seq) throws IOException {
        // A script's reads and writes appear in the documents of the datasets at both ends.
        Set<Long> datasets = new HashSet<>(changed.datasets);
        datasets.addAll(source.edgeEnds(changed.edges));
        datasets.addAll(source.referencedBy(changed.scripts));
        Set<Long> remaining = new HashSet<>(datasets);
        for (DatasetDoc doc : source.datasets(datasets)) {
            writer.deleteDocuments(new Term(OF_DATASET, Long.toString(doc.entry().id())));
            addDataset(doc);
            remaining.remove(doc.entry().id());
        }
        for (long gone : remaining) {
            writer.deleteDocuments(new Term(OF_DATASET, Long.toString(gone)));
        }
        Set<Long> scriptsLeft = new HashSet<>(changed.scripts);
        for (ScriptDoc doc : source.scripts(changed.scripts)) {
            writer.updateDocument(new Term(Documents.KEY, Documents.key("script", doc.entry().id())),
                    build(Documents.script(doc, ScriptProse.of(doc.entry().uri()))));
            scriptsLeft.remove(doc.entry().id());
        }
        for (long gone : scriptsLeft) {
            writer.deleteDocuments(new Term(Documents.KEY, Documents.key("script", gone)));
        }
        if (!changed.datasets.isEmpty()) {
            writeOwners();
        }
        ranksStale = true;
        commit(seq);
    }

    private void addDataset(DatasetDoc doc) throws IOException {
        String of = Long.toString(doc.entry().id());
        Document dataset = Documents.dataset(doc);
        dataset.add(new org.apache.lucene.document.StringField(OF_DATASET, of, org.apache.lucene.document.Field.Store.NO));
        writer.addDocument(build(dataset));
        for (ColumnView column : doc.columns()) {
            Document c = Documents.column(doc, column, repeated);
            c.add(new org.apache.lucene.document.StringField(OF_DATASET, of, org.apache.lucene.document.Field.Store.NO));
            writer.addDocument(build(c));
        }
    }

    /** Owner documents list the datasets each owns; there are few owners, so they are rewritten together. */
    private void writeOwners() throws IOException {
        writer.deleteDocuments(new Term(Documents.FAMILY, "owner"));
        for (SearchSource.OwnerDoc owner : source.owners()) {
            writer.addDocument(build(Documents.owner(owner)));
        }
    }

    private static Document build(Document doc) throws IOException {
        return Documents.FACETS_CONFIG.build(doc);
    }

    /**
     * Records the absorbed sequence number and marks the index as holding what no searcher sees yet. The
     * durable Lucene commit, which syncs files, happens at most every {@link #COMMIT_INTERVAL_NANOS} and at
     * close: an index that loses its last second to a crash catches up from the change log at the next start,
     * from the number of its last commit.
     */
    private void commit(long seq) throws IOException {
        writer.setLiveCommitData(Map.of(SEQ_KEY, Long.toString(seq), FORMAT_KEY, FORMAT).entrySet());
        long now = System.nanoTime();
        if (now - lastCommitNanos >= COMMIT_INTERVAL_NANOS) {
            writer.commit();
            lastCommitNanos = now;
        }
        // Set after the documents went in, so a reader that clears it then refreshes sees them.
        unseen = true;
    }

    /**
     * Makes what was written searchable (a near-real-time reader on the writer) before a read, instead of
     * after every batch: a harvest of many batches with no one searching reopens no reader at all.
     */
    private void refreshIfWritten() throws IOException {
        if (unseen) {
            unseen = false;
            searchers.maybeRefreshBlocking();
        }
    }

    private volatile boolean unseen;

    private static final long COMMIT_INTERVAL_NANOS = 1_000_000_000L;
    private long lastCommitNanos = System.nanoTime() - COMMIT_INTERVAL_NANOS;

    /** The first {@code limit} hits for {@code text}, optionally of one kind. */
    public List<SearchHit> search(String text, String kind, int limit) {
        return search(SearchRequest.of(text, kind, Math.min(limit, SearchRequest.MAX_SIZE))).hits();
    }

    /**
     * Runs a search: all words required first, any word when nothing has them all; hits ordered by text
     * relevance times use and centrality, exact name matches first; the total and the facets counted over
     * all matches, or estimated from a share of them when there are more than the count cap.
     *
     * @throws QuerySyntaxException when the text does not follow the query syntax
     */
    public SearchResult search(SearchRequest request) {
        return search(request, SearchIndex::topHits);
    }

    /**
     * The same search with every match scored and nothing skipped, by Lucene's exhaustive top-hit collection;
     * tests compare {@link #search} with it.
     */
    SearchResult searchScoringEveryMatch(SearchRequest request) {
        return search(request, (searcher, query, bonuses, ranks, depth) -> List.of(searcher.search(
                new RankedQuery(QUERIES.withBonuses(query, bonuses, false), ranks),
                new TopScoreDocCollectorManager(depth, null, Integer.MAX_VALUE)).scoreDocs));
    }

    /** How the best hits of a query and its bonuses are found. */
    private interface HitFinder {
        List<ScoreDoc> find(IndexSearcher searcher, Query query, List<Query> bonuses, Ranks ranks, int depth)
                throws IOException;
    }

    private SearchResult search(SearchRequest request, HitFinder topHits) {
        QueryText text = QueryText.parse(request.text());
        awaitWrites();
        Ranks current = currentRanks();
        Query filter = QUERIES.filters(text, request.kind(), freshness);
        try {
            refreshIfWritten();
            IndexSearcher searcher = searchers.acquire();
            try {
                Vocabulary known = Vocabulary.of(searcher.getIndexReader());
                Query allWords = QUERIES.text(text, LuceneQueries.Mode.ALL_WORDS, known);
                if (allWords == null && text.hasText()) {
                    return empty(request, known, text);
                }
                int depth = request.page() * request.size();
                Query query = QUERIES.combined(allWords, filter);
                List<Query> bonuses = allWords == null ? List.of() : QUERIES.bonuses(text);
                List<ScoreDoc> ranked = new ArrayList<>(topHits.find(searcher, query, bonuses, current, depth));
                int allWordHits = ranked.size();
                Query textQuery = allWords;
                if (allWords != null && ranked.size() < depth && text.words().size() > 1) {
                    // All words preferred: documents with only some of the words follow those with all of them.
                    Query anyWord = QUERIES.text(text, LuceneQueries.Mode.ANY_WORD, known);
                    query = QUERIES.combined(anyWord, filter);
                    Set<Integer> seen = new HashSet<>();
                    ranked.forEach(sd -> seen.add(sd.doc));
                    for (ScoreDoc sd : topHits.find(searcher, query, bonuses, current, depth)) {
                        if (ranked.size() < depth && seen.add(sd.doc)) {
                            ranked.add(sd);
                        }
                    }
                    textQuery = anyWord;
                }
                // The any-word matches include the all-word ones, so its count is the total.
                MatchCounter.Counted counted = MatchCounter.count(searcher, query, countCap, FACET_VALUES, freshness);
                int from = Math.min(ranked.size(), (request.page() - 1) * request.size());
                List<SearchHit> hits = new ArrayList<>();
                Query explained = textQuery == null ? null : QUERIES.withBonuses(textQuery, bonuses, false);
                for (int i = from; i < ranked.size(); i++) {
                    String mode = i < allWordHits ? "all words" : "any word";
                    hits.add(hit(searcher, ranked.get(i), explained, request.explain() ? mode : null, current));
                }
                hits = withSnippets(searcher, hits, ranked.subList(from, ranked.size()), textQuery);
                return new SearchResult(request.text(), counted.total(), counted.exact(), request.page(), request.size(),
                        hits, counted.facets(), suggestion(known, text));
            } finally {
                searchers.release(searcher);
            }
        } catch (IOException e) {
            throw new SearchException("Search failed", e);
        }
    }

    private SearchResult empty(SearchRequest request, Vocabulary known, QueryText text) {
        return new SearchResult(request.text(), 0, true, request.page(), request.size(), List.of(), emptyFacets(),
                suggestion(known, text));
    }

    /**
     * The best {@code depth} hits of the query plus its bonuses, found in two searches that each let blocks of
     * postings that cannot reach the top be skipped: the matches that have a bonus, scored with it (few: they
     * hold a rare whole identifier or name), and all matches scored without. A match without a bonus has the
     * same score in both; one with a bonus scores higher in the first. So every hit of the best {@code depth}
     * is among the first search's hits or the second's best {@code depth}.
     */
    private static List<ScoreDoc> topHits(IndexSearcher searcher, Query query, List<Query> bonuses, Ranks ranks,
            int depth) throws IOException {
        Map<Integer, ScoreDoc> byDoc = new java.util.HashMap<>();
        float floor = 0;
        if (!bonuses.isEmpty()) {
            ScoreDoc[] withBonus = best(searcher, QUERIES.withBonuses(query, bonuses, true), ranks, depth, 0);
            for (ScoreDoc sd : withBonus) {
                byDoc.put(sd.doc, sd);
            }
            // With a full page of bonus hits, a match scoring below the last of them cannot make the page.
            floor = withBonus.length == depth ? withBonus[depth - 1].score : 0;
        }
        for (ScoreDoc sd : best(searcher, query, ranks, depth, floor)) {
            byDoc.putIfAbsent(sd.doc, sd);
        }
        List<ScoreDoc> out = new ArrayList<>(byDoc.values());
        out.sort((a, b) -> a.score != b.score ? Float.compare(b.score, a.score) : Integer.compare(a.doc, b.doc));
        return out.size() > depth ? new ArrayList<>(out.subList(0, depth)) : out;
    }

    /** The best {@code depth} hits of the query, ranked, leaving out what scores below {@code floor}. */
    private static ScoreDoc[] best(IndexSearcher searcher, Query query, Ranks ranks, int depth, float floor)
            throws IOException {
        return searcher.search(new RankedQuery(query, ranks),
                ScoreFloor.of(new TopScoreDocCollectorManager(depth, null, depth), floor)).scoreDocs;
    }


    private Ranks currentRanks() {
        if (ranksStale) {
            synchronized (this) {
                if (ranksStale) {
                    ranksStale = false;
                    ranks = Ranks.compute(source);
                }
            }
        }
        return ranks;
    }

    private SearchHit hit(IndexSearcher searcher, ScoreDoc sd, Query textQuery, String explainMode, Ranks ranks)
            throws IOException {
        Document d = searcher.storedFields().document(sd.doc);
        String name = d.get("display") != null ? d.get("display") : d.get("name");
        HitExplanation explanation = explainMode == null ? null : explain(searcher, sd.doc, textQuery, explainMode, ranks);
        return new SearchHit(d.get("kind"), d.getField("id").numericValue().longValue(), name, d.get("uri"),
                d.get("format"), d.get("source"), sd.score, null, explanation);
    }

    private List<SearchHit> withSnippets(IndexSearcher searcher, List<SearchHit> hits, List<ScoreDoc> docs,
            Query textQuery) throws IOException {
        Map<Integer, String> snippets = snippets(searcher, docs.toArray(new ScoreDoc[0]), textQuery);
        List<SearchHit> out = new ArrayList<>(hits.size());
        for (int i = 0; i < hits.size(); i++) {
            SearchHit h = hits.get(i);
            out.add(new SearchHit(h.kind(), h.id(), h.name(), h.uri(), h.format(), h.source(), h.score(),
                    snippets.get(docs.get(i).doc), h.explain()));
        }
        return out;
    }

    private Map<Integer, String> snippets(IndexSearcher searcher, ScoreDoc[] page, Query textQuery) throws IOException {
        Map<Integer, String> out = new java.util.HashMap<>();
        if (textQuery == null || page.length == 0) {
            return out;
        }
        UnifiedHighlighter highlighter = UnifiedHighlighter.builder(searcher, Documents.indexAnalyzer())
                .withFormatter(new DefaultPassageFormatter("<mark>", "</mark>", " … ", true))
                .withMaxLength(10_000)
                // Prefix and typo queries would be re-run per document over an in-memory index, which costs more
                // than the search itself; snippets mark whole words and stems.
                .withHandleMultiTermQuery(false)
                .build();
        int[] docs = new int[page.length];
        int[] passages = new int[Documents.SNIPPET_FIELDS.length];
        for (int i = 0; i < page.length; i++) {
            docs[i] = page[i].doc;
        }
        java.util.Arrays.fill(passages, 1);
        Map<String, String[]> byField = highlighter.highlightFields(Documents.SNIPPET_FIELDS, textQuery, docs, passages);
        for (int i = 0; i < docs.length; i++) {
            for (String field : Documents.SNIPPET_FIELDS) {
                String[] values = byField.get(field);
                if (values != null && values[i] != null && values[i].contains("<mark>")) {
                    out.put(docs[i], shorten(field.equals("columns") ? markedLines(values[i]) : values[i].strip()));
                    break;
                }
            }
        }
        return out;
    }

    /** Of a list of columns, one a line, the ones with a match. */
    private static String markedLines(String text) {
        return String.join(", ", text.lines().filter(l -> l.contains("<mark>")).map(String::strip).toList());
    }

    /** Caps a snippet's length without cutting inside a tag or an escape. */
    private static String shorten(String snippet) {
        if (snippet.length() <= SNIPPET_LENGTH) {
            return snippet;
        }
        int end = snippet.lastIndexOf(' ', SNIPPET_LENGTH);
        int open = snippet.lastIndexOf("<mark>", end);
        int close = snippet.lastIndexOf("</mark>", end);
        if (open > close) {
            end = snippet.indexOf("</mark>", open) + "</mark>".length();
        }
        int amp = snippet.lastIndexOf('&', end);
        if (amp >= 0 && snippet.indexOf(';', amp) >= end) {
            end = amp;
        }
        return end <= 0 ? snippet : snippet.substring(0, end) + " …";
    }

    private HitExplanation explain(IndexSearcher searcher, int doc, Query textQuery, String mode, Ranks ranks)
            throws IOException {
        Document d = searcher.storedFields().document(doc);
        String kind = d.get("kind");
        long id = d.getField("id").numericValue().longValue();
        boolean datasetRanked = !kind.equals("script") && !kind.equals("owner") && !kind.equals("team");
        int family = switch (kind) {
            case "column" -> Documents.COLUMN;
            case "script" -> Documents.SCRIPT;
            case "owner", "team" -> Documents.OWNER;
            default -> Documents.DATASET;
        };
        double text = 0;
        boolean exact = false;
        List<String> matched = new ArrayList<>();
        if (textQuery != null) {
            Explanation e = searcher.explain(textQuery, doc);
            text = e.getValue().doubleValue();
            collectMatches(e, matched);
            exact = matched.contains(Documents.NAME_EXACT);
            matched.remove(Documents.NAME_EXACT);
        }
        long rankId = datasetRanked ? id : 0;
        return new HitExplanation(mode, text, exact, ranks.uses(rankId), ranks.centrality(rankId),
                ranks.factor(family, rankId), List.copyOf(new TreeSet<>(matched)));
    }

    /** How a word-beginning clause explains itself: {@code name:chromat*}, maybe with {@code ^weight}. */
    private static final java.util.regex.Pattern BEGINNING = java.util.regex.Pattern.compile("\\w+:[^\\s:]+\\*(\\^[\\d.E-]+)?");

    private static void collectMatches(Explanation e, List<String> out) {
        String description = e.getDescription();
        if (description.startsWith("weight(") && e.isMatch()) {
            int space = description.indexOf(" in ");
            String term = description.substring("weight(".length(), space < 0 ? description.length() : space);
            // Fuzzy and prefix rewrites name their field and term the same way.
            out.add(term.replaceFirst("^\\(", ""));
        } else if (description.contains(Documents.NAME_EXACT + ":") && e.isMatch()) {
            out.add(Documents.NAME_EXACT);
        } else if (description.startsWith("ConstantScore(") && e.isMatch()) {
            out.add(description.substring("ConstantScore(".length(), description.length() - 1));
        } else if (e.isMatch() && e.getDetails().length == 0 && BEGINNING.matcher(description).matches()) {
            // A word beginning scores as a constant: its explanation is the query itself, with its weight.
            out.add(description.replaceFirst("\\^[^^]*$", ""));
        }
        for (Explanation detail : e.getDetails()) {
            collectMatches(detail, out);
        }
    }

    private static Map<String, Map<String, Integer>> emptyFacets() {
        Map<String, Map<String, Integer>> out = new LinkedHashMap<>();
        for (String dim : Documents.FACETS) {
            out.put(dim, new LinkedHashMap<>());
        }
        out.put("freshness", new TreeMap<>());
        return out;
    }

    /**
     * "Did you mean": each word that occurs in no document is replaced by the closest word that does (one
     * edit away for words under eight letters, two from eight, or two when nothing is one away; the first
     * letter kept, the most used first among equally close ones); null when every word occurs or nothing
     * close exists. It asks the search's vocabulary, which already looked up the typed words and their near
     * words while the query was built.
     */
    private static String suggestion(Vocabulary known, QueryText text) {
        boolean changed = false;
        List<String> out = new ArrayList<>();
        for (String word : text.words()) {
            String lower = word.toLowerCase(java.util.Locale.ROOT);
            if (lower.length() >= 4 && !known.has(lower)) {
                int edits = Math.max(1, LuceneQueries.editsFor(lower));
                List<Vocabulary.Near> near = known.near(lower, edits);
                if (near.isEmpty() && edits < 2) {
                    near = known.near(lower, 2);
                }
                if (!near.isEmpty()) {
                    out.add(near.get(0).word());
                    changed = true;
                    continue;
                }
            }
            out.add(word);
        }
        if (!changed) {
            return null;
        }
        for (String phrase : text.phrases()) {
            out.add("\"" + phrase + "\"");
        }
        text.filters().forEach((field, values) -> values.forEach(v -> out.add(field + "=" + (v.contains(" ") ? "\"" + v + "\"" : v))));
        return String.join(" ", out);
    }

    /** Number of documents in the index; tests compare it with the store. */
    public int documentCount() {
        awaitWrites();
        try {
            searchers.maybeRefreshBlocking();
            IndexSearcher searcher = searchers.acquire();
            try {
                return searcher.getIndexReader().numDocs();
            } finally {
                searchers.release(searcher);
            }
        } catch (IOException e) {
            throw new SearchException("Cannot count documents", e);
        }
    }

    /** The keys of every document ({@code dataset:7}, {@code column:7:2}, {@code script:3}, {@code owner:1}), sorted. */
    public List<String> keys() {
        awaitWrites();
        try {
            searchers.maybeRefreshBlocking();
            IndexSearcher searcher = searchers.acquire();
            try {
                TopDocs all = searcher.search(new MatchAllDocsQuery(), Math.max(1, searcher.getIndexReader().numDocs()));
                var stored = searcher.storedFields();
                List<String> keys = new ArrayList<>();
                for (ScoreDoc sd : all.scoreDocs) {
                    keys.add(stored.document(sd.doc).get(Documents.KEY));
                }
                keys.sort(null);
                return keys;
            } finally {
                searchers.release(searcher);
            }
        } catch (IOException e) {
            throw new SearchException("Cannot list documents", e);
        }
    }

    private static void deleteIndexFiles(Path folder) throws IOException {
        try (var files = Files.list(folder)) {
            for (Path file : (Iterable<Path>) files::iterator) {
                Files.deleteIfExists(file);
            }
        }
    }

    @Override
    public void close() {
        awaitWrites();
        writes.shutdown();
        try {
            if (!writes.awaitTermination(WRITE_WAIT_MILLIS, java.util.concurrent.TimeUnit.MILLISECONDS)) {
                LOG.warn("The search index writer did not finish; the index will catch up from the change log");
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        closeWriter();
    }

    private synchronized void closeWriter() {
        try {
            writer.commit();
            searchers.close();
            writer.close();
            directory.close();
        } catch (IOException e) {
            throw new SearchException("Closing the search index failed", e);
        }
    }
}
