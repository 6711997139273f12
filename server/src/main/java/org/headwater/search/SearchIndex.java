package org.headwater.search;

import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.tokenattributes.CharTermAttribute;
import org.apache.lucene.document.Document;
import org.apache.lucene.document.Field;
import org.apache.lucene.document.StoredField;
import org.apache.lucene.document.StringField;
import org.apache.lucene.document.TextField;
import org.apache.lucene.index.IndexWriter;
import org.apache.lucene.index.IndexWriterConfig;
import org.apache.lucene.index.Term;
import org.apache.lucene.search.BooleanClause.Occur;
import org.apache.lucene.search.BooleanQuery;
import org.apache.lucene.search.BoostQuery;
import org.apache.lucene.search.IndexSearcher;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.ScoreDoc;
import org.apache.lucene.search.SearcherManager;
import org.apache.lucene.search.TermQuery;
import org.apache.lucene.search.TopDocs;
import org.apache.lucene.store.ByteBuffersDirectory;
import org.apache.lucene.store.Directory;
import org.apache.lucene.store.FSDirectory;
import org.headwater.ingest.Change;
import org.headwater.ingest.ChangeListener;
import org.headwater.store.CatalogReader;
import org.headwater.store.Views.IndexEntry;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The Lucene index of datasets and scripts. It listens to the ingestion path and stores, with each
 * commit, the change-log sequence number it has absorbed; at open it catches up from the change log,
 * and rebuilds from the store when it is missing, damaged or ahead of the store.
 */
public final class SearchIndex implements ChangeListener, AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(SearchIndex.class);
    static final String SEQ_KEY = "headwater.change_seq";

    /** Text fields searched, with the weight a match in each carries. */
    static final Map<String, Float> FIELD_WEIGHTS = Map.of(
            "name", 4.0f,
            "columns", 2.0f,
            "tags", 2.0f,
            "description", 1.5f);

    private final Directory directory;
    private final IndexWriter writer;
    private final SearcherManager searchers;
    private final CatalogReader catalog;
    private final Analyzer queryAnalyzer = IdentifierAnalyzer.forQueries();

    private SearchIndex(Directory directory, CatalogReader catalog) throws IOException {
        this.directory = directory;
        this.catalog = catalog;
        IndexWriterConfig config = new IndexWriterConfig(IdentifierAnalyzer.forIndexing())
                .setOpenMode(IndexWriterConfig.OpenMode.CREATE_OR_APPEND);
        this.writer = new IndexWriter(directory, config);
        this.searchers = new SearcherManager(writer, null);
    }

    /** Opens the index in a folder, bringing it up to date with the store. */
    public static SearchIndex open(Path folder, CatalogReader catalog) {
        try {
            Files.createDirectories(folder);
            SearchIndex index;
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

    /** The change-log sequence number the index has absorbed. */
    public synchronized long absorbedSeq() {
        Map<String, String> data = new java.util.HashMap<>();
        Iterable<Map.Entry<String, String>> live = writer.getLiveCommitData();
        if (live != null) {
            live.forEach(e -> data.put(e.getKey(), e.getValue()));
        }
        return Long.parseLong(data.getOrDefault(SEQ_KEY, "0"));
    }

    private synchronized void catchUp() throws IOException {
        long absorbed = absorbedSeq();
        long last = catalog.lastChangeSeq();
        if (absorbed == last) {
            return;
        }
        if (absorbed > last || absorbed == 0) {
            // Ahead of the store means the store was replaced; an empty index has nothing to keep.
            rebuild();
            return;
        }
        Set<Long> datasets = new HashSet<>();
        Set<Long> scripts = new HashSet<>();
        for (Map.Entry<String, Long> changed : catalog.changedSince(absorbed)) {
            sortInto(changed.getKey(), changed.getValue(), datasets, scripts);
        }
        LOG.info("Search index catching up: {} datasets, {} scripts changed since sequence {}", datasets.size(),
                scripts.size(), absorbed);
        write(datasets, scripts, last);
    }

    /** Throws the index away and builds it again from the store. */
    public synchronized void rebuild() {
        try {
            long seq = catalog.lastChangeSeq();
            writer.deleteAll();
            List<Long> datasets = catalog.presentDatasetIds();
            for (int from = 0; from < datasets.size(); from += 1000) {
                for (IndexEntry entry : catalog.datasetEntries(datasets.subList(from, Math.min(datasets.size(), from + 1000)))) {
                    writer.addDocument(document(entry));
                }
            }
            List<Long> scripts = catalog.presentScriptIds();
            for (int from = 0; from < scripts.size(); from += 1000) {
                for (IndexEntry entry : catalog.scriptEntries(scripts.subList(from, Math.min(scripts.size(), from + 1000)))) {
                    writer.addDocument(document(entry));
                }
            }
            commit(seq);
        } catch (IOException e) {
            throw new SearchException("Rebuilding the search index failed", e);
        }
    }

    @Override
    public synchronized void committed(List<Change> changes) {
        Set<Long> datasets = new HashSet<>();
        Set<Long> scripts = new HashSet<>();
        long seq = 0;
        for (Change change : changes) {
            sortInto(change.entity(), change.entityId(), datasets, scripts);
            seq = Math.max(seq, change.seq());
        }
        try {
            write(datasets, scripts, Math.max(seq, absorbedSeq()));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static void sortInto(String entity, long id, Set<Long> datasets, Set<Long> scripts) {
        if (entity.equals(Change.DATASET)) {
            datasets.add(id);
        } else if (entity.equals(Change.SCRIPT)) {
            scripts.add(id);
        }
    }

    private void write(Set<Long> datasets, Set<Long> scripts, long seq) throws IOException {
        replace("dataset", datasets, catalog.datasetEntries(datasets));
        replace("script", scripts, catalog.scriptEntries(scripts));
        commit(seq);
    }

    /** Re-indexes the given ids; an id with no entry is no longer present and leaves the index. */
    private void replace(String family, Set<Long> ids, List<IndexEntry> entries) throws IOException {
        Set<Long> remaining = new HashSet<>(ids);
        for (IndexEntry entry : entries) {
            writer.updateDocument(new Term("key", key(family, entry.id())), document(entry));
            remaining.remove(entry.id());
        }
        for (long gone : remaining) {
            writer.deleteDocuments(new Term("key", key(family, gone)));
        }
    }

    private void commit(long seq) throws IOException {
        writer.setLiveCommitData(Map.of(SEQ_KEY, Long.toString(seq)).entrySet());
        writer.commit();
        searchers.maybeRefreshBlocking();
    }

    private static String key(String family, long id) {
        return family + ":" + id;
    }

    private static Document document(IndexEntry entry) {
        String family = entry.kind().equals("script") ? "script" : "dataset";
        Document doc = new Document();
        doc.add(new StringField("key", key(family, entry.id()), Field.Store.YES));
        doc.add(new StringField("family", family, Field.Store.NO));
        doc.add(new StringField("kind", entry.kind(), Field.Store.YES));
        doc.add(new StoredField("id", entry.id()));
        doc.add(new StoredField("uri", entry.uri()));
        doc.add(new TextField("name", entry.name(), Field.Store.YES));
        doc.add(new StringField("name_exact", exactForm(entry.name()), Field.Store.NO));
        doc.add(new StringField("name_exact", exactForm(baseName(entry.name())), Field.Store.NO));
        // The URI is stored but not searched: the folders above a workspace (home, work, …) are noise.
        doc.add(new TextField("columns", String.join("\n", entry.columns()), Field.Store.NO));
        if (entry.description() != null) {
            doc.add(new TextField("description", entry.description(), Field.Store.NO));
        }
        doc.add(new TextField("tags", String.join("\n", entry.tags()), Field.Store.NO));
        if (entry.format() != null) {
            doc.add(new StringField("format", entry.format(), Field.Store.YES));
        }
        if (entry.source() != null) {
            doc.add(new StringField("source", entry.source(), Field.Store.YES));
        }
        return doc;
    }

    private static String exactForm(String name) {
        return name.toLowerCase(Locale.ROOT).trim();
    }

    private static String baseName(String name) {
        String file = name.substring(name.lastIndexOf('/') + 1);
        int dot = file.lastIndexOf('.');
        return dot > 0 ? file.substring(0, dot) : file;
    }

    /**
     * Finds datasets and scripts matching the words of {@code text}. Every word is looked for in every
     * text field with that field's weight; documents matching more words, and datasets over scripts,
     * rank higher; an exact name match ranks first.
     *
     * @param kind only this kind ({@code file}, {@code figure}, {@code script}, …), or null for all
     */
    public List<SearchHit> search(String text, String kind, int limit) {
        List<String> words = words(text);
        if (words.isEmpty()) {
            return List.of();
        }
        BooleanQuery.Builder anyWord = new BooleanQuery.Builder();
        for (String word : words) {
            for (Map.Entry<String, Float> field : FIELD_WEIGHTS.entrySet()) {
                anyWord.add(new BoostQuery(new TermQuery(new Term(field.getKey(), word)), field.getValue()), Occur.SHOULD);
            }
        }
        anyWord.add(new BoostQuery(new TermQuery(new Term("name_exact", exactForm(text))), 20f), Occur.SHOULD);
        BooleanQuery.Builder query = new BooleanQuery.Builder()
                .add(anyWord.build(), Occur.MUST)
                .add(new BoostQuery(new TermQuery(new Term("family", "dataset")), 0.5f), Occur.SHOULD);
        if (kind != null) {
            query.add(new TermQuery(new Term("kind", kind)), Occur.FILTER);
        }
        return run(query.build(), limit);
    }

    private List<SearchHit> run(Query query, int limit) {
        try {
            IndexSearcher searcher = searchers.acquire();
            try {
                TopDocs top = searcher.search(query, Math.max(1, limit));
                List<SearchHit> hits = new ArrayList<>(top.scoreDocs.length);
                var stored = searcher.storedFields();
                for (ScoreDoc sd : top.scoreDocs) {
                    Document d = stored.document(sd.doc);
                    hits.add(new SearchHit(d.get("kind"), d.getField("id").numericValue().longValue(), d.get("name"),
                            d.get("uri"), d.get("format"), d.get("source"), sd.score));
                }
                return hits;
            } finally {
                searchers.release(searcher);
            }
        } catch (IOException e) {
            throw new SearchException("Search failed", e);
        }
    }

    /** Number of documents in the index; tests compare it with the store. */
    public int documentCount() {
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

    private List<String> words(String text) {
        List<String> words = new ArrayList<>();
        try (TokenStream stream = queryAnalyzer.tokenStream("name", new StringReader(text))) {
            CharTermAttribute term = stream.addAttribute(CharTermAttribute.class);
            stream.reset();
            while (stream.incrementToken()) {
                String word = term.toString();
                if (!words.contains(word)) {
                    words.add(word);
                }
            }
            stream.end();
        } catch (IOException e) {
            throw new SearchException("Cannot analyse the query", e);
        }
        return words;
    }

    private static void deleteIndexFiles(Path folder) throws IOException {
        try (var files = Files.list(folder)) {
            for (Path file : (Iterable<Path>) files::iterator) {
                Files.deleteIfExists(file);
            }
        }
    }

    @Override
    public synchronized void close() {
        try {
            searchers.close();
            writer.close();
            directory.close();
        } catch (IOException e) {
            throw new SearchException("Closing the search index failed", e);
        }
    }

}
