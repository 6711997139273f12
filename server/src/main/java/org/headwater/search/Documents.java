package org.headwater.search;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.miscellaneous.PerFieldAnalyzerWrapper;
import org.apache.lucene.document.Document;
import org.apache.lucene.document.Field;
import org.apache.lucene.document.NumericDocValuesField;
import org.apache.lucene.document.StoredField;
import org.apache.lucene.document.StringField;
import org.apache.lucene.document.TextField;
import org.apache.lucene.facet.FacetsConfig;
import org.apache.lucene.facet.sortedset.SortedSetDocValuesFacetField;
import org.headwater.store.SearchSource.DatasetDoc;
import org.headwater.store.SearchSource.OwnerDoc;
import org.headwater.store.SearchSource.ScriptDoc;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.IndexEntry;

/**
 * Turns catalog things into Lucene documents: one per dataset, per column of a dataset's current schema, per
 * script and per owner. Identifier fields (names, paths, columns, read and written datasets) use
 * {@link IdentifierAnalyzer}; prose fields (descriptions, docstrings, titles) use {@link ProseAnalyzer} and
 * are also indexed as identifiers, so a path written in a comment still splits into its words.
 */
final class Documents {
    static final String KEY = "key";
    static final String FAMILY = "family";
    static final String KIND = "kind";
    static final String NAME_EXACT = "name_exact";
    static final String RANK_ID = "rank_id";
    static final String FAMILY_CODE = "family_code";
    /**
     * The order documents are kept in within a segment: datasets, scripts, owners, then columns, the family of
     * the smallest rank factor, so that the top-hit search knows where only columns are left.
     */
    static final String FAMILY_ORDER = "family_order";
    private static final int[] ORDER_OF_FAMILY = {0, 3, 1, 2};
    static final org.apache.lucene.search.Sort INDEX_ORDER = new org.apache.lucene.search.Sort(
            new org.apache.lucene.search.SortField(FAMILY_ORDER, org.apache.lucene.search.SortField.Type.LONG));
    /** Every word of a document, unstemmed: the dictionary for "did you mean". */
    static final String WORDS = "words";

    /**
     * The name of a column's dataset, in the column's document. It is searched only for texts of two words or
     * more ("nitrate site_id"): a column is found by a word of its own, and its dataset's name only narrows it
     * down; with one word, every column of every dataset so named would match and say nothing the dataset
     * does not.
     */
    static final String IN_DATASET = "in_dataset";
    static final float IN_DATASET_WEIGHT = 0.4f;

    /** Identifier fields searched, with their weights. */
    static final Map<String, Float> IDENTIFIER_FIELDS = Map.of(
            "name", 4.0f,
            "columns", 1.5f,
            "tags", 2.0f,
            "dataset", 0.4f,
            "owners", 1.5f,
            "reads", 1.0f,
            "writes", 1.0f,
            "prose_ids", 1.0f,
            "type", 0.5f,
            "kind_words", 1.0f);
    /** Prose fields searched with stems, with their weights. */
    static final Map<String, Float> PROSE_FIELDS = Map.of(
            "description", 2.0f,
            "prose", 1.5f,
            "stems", 2.5f);
    /** Fields snippets are cut from, in order of preference. */
    static final String[] SNIPPET_FIELDS = {"description", "prose", "columns", "name"};
    /** Facet dimensions counted from doc values; {@code freshness} is counted apart from the provider. */
    static final List<String> FACETS = List.of("kind", "format", "owner", "tag", "source");

    static final int DATASET = 0;
    static final int COLUMN = 1;
    static final int SCRIPT = 2;
    static final int OWNER = 3;

    static final FacetsConfig FACETS_CONFIG = facetsConfig();

    private Documents() {
    }

    private static FacetsConfig facetsConfig() {
        FacetsConfig config = new FacetsConfig();
        config.setMultiValued("owner", true);
        config.setMultiValued("tag", true);
        return config;
    }

    /** The analyzer documents are written with: prose fields by {@link ProseAnalyzer}, all others as identifiers. */
    static Analyzer indexAnalyzer() {
        Analyzer prose = new ProseAnalyzer();
        return new PerFieldAnalyzerWrapper(IdentifierAnalyzer.forIndexing(),
                Map.of("description", prose, "prose", prose, "stems", IdentifierAnalyzer.stemming()));
    }

    static String key(String family, long id) {
        return family + ":" + id;
    }

    static String exactForm(String name) {
        return name.toLowerCase(Locale.ROOT).trim();
    }

    static String baseName(String name) {
        String file = name.substring(name.lastIndexOf('/') + 1);
        int dot = file.lastIndexOf('.');
        return dot > 0 ? file.substring(0, dot) : file;
    }

    static Document dataset(DatasetDoc d) {
        IndexEntry e = d.entry();
        Document doc = common(key("dataset", e.id()), "dataset", DATASET, e.kind(), e.id(), e.id(), e.uri(), e.name());
        List<String> prose = new ArrayList<>(d.titles());
        if (e.description() != null) {
            prose.add(0, e.description());
        }
        text(doc, "description", String.join("\n", prose));
        text(doc, "prose_ids", String.join("\n", prose));
        List<String> columnLines = new ArrayList<>();
        for (ColumnView c : d.columns()) {
            columnLines.add(c.name());
        }
        text(doc, "columns", String.join("\n", columnLines));
        text(doc, "tags", String.join("\n", e.tags()));
        text(doc, "owners", String.join("\n", e.owners()));
        // A dataset is also found by the scripts that write it (a figure by the script that draws it).
        text(doc, "writes", String.join("\n", d.writtenBy()));
        text(doc, "reads", String.join("\n", d.readBy()));
        facet(doc, "format", e.format());
        facet(doc, "source", e.source());
        e.owners().forEach(o -> facet(doc, "owner", o));
        new LinkedHashSet<>(e.tags()).forEach(t -> facet(doc, "tag", t));
        stored(doc, "format", e.format());
        stored(doc, "source", e.source());
        words(doc, e.name(), String.join(" ", columnLines), String.join(" ", prose), String.join(" ", e.tags()));
        return doc;
    }

    static Document column(DatasetDoc d, ColumnView c) {
        return column(d, c, null);
    }

    /** A column's document; its short texts' tokens come from {@code tokens} when given (see {@link RepeatedTokens}). */
    static Document column(DatasetDoc d, ColumnView c, RepeatedTokens tokens) {
        IndexEntry e = d.entry();
        String name = e.name() + "#" + c.name();
        Document doc = common(key("column", e.id()) + ":" + c.ordinal(), "column", COLUMN, "column", e.id(), e.id(),
                e.uri() + "#" + c.name(), c.name(), tokens);
        doc.add(new StringField(NAME_EXACT, exactForm(name), Field.Store.NO));
        stored(doc, "display", name);
        stored(doc, "dataset_name", e.name());
        text(doc, IN_DATASET, e.name(), tokens, false);
        text(doc, "type", c.type(), tokens, true);
        text(doc, "tags", String.join("\n", e.tags()));
        facet(doc, "format", e.format());
        facet(doc, "source", e.source());
        stored(doc, "format", e.format());
        stored(doc, "source", e.source());
        return doc;
    }

    static Document script(ScriptDoc s, String prose) {
        IndexEntry e = s.entry();
        Document doc = common(key("script", e.id()), "script", SCRIPT, "script", e.id(), 0, e.uri(), e.name());
        text(doc, "prose", prose);
        text(doc, "prose_ids", prose);
        text(doc, "reads", String.join("\n", s.reads()));
        text(doc, "writes", String.join("\n", s.writes()));
        facet(doc, "format", e.format());
        facet(doc, "source", e.source());
        stored(doc, "format", e.format());
        stored(doc, "source", e.source());
        words(doc, e.name(), prose);
        return doc;
    }

    static Document owner(OwnerDoc o) {
        Document doc = common(key("owner", o.id()), "owner", OWNER, o.kind().equals("team") ? "team" : "owner", o.id(), 0,
                "owner:" + o.name(), o.name());
        text(doc, "dataset", String.join("\n", o.datasets()));
        facet(doc, "owner", o.name());
        words(doc, o.name());
        return doc;
    }

    private static Document common(String key, String family, int familyCode, String kind, long id, long rankId,
            String uri, String name) {
        return common(key, family, familyCode, kind, id, rankId, uri, name, null);
    }

    private static Document common(String key, String family, int familyCode, String kind, long id, long rankId,
            String uri, String name, RepeatedTokens tokens) {
        Document doc = new Document();
        doc.add(new StringField(KEY, key, Field.Store.YES));
        doc.add(new StringField(FAMILY, family, Field.Store.NO));
        doc.add(new StringField(KIND, kind, Field.Store.YES));
        // People type the kind as a word: "nitrate figure", "summary script".
        doc.add(tokens == null ? new TextField("kind_words", kind.replace('_', ' '), Field.Store.NO)
                : tokens.field("kind_words", kind.replace('_', ' '), true));
        doc.add(new SortedSetDocValuesFacetField("kind", kind));
        doc.add(new NumericDocValuesField(RANK_ID, rankId));
        doc.add(new NumericDocValuesField(FAMILY_CODE, familyCode));
        doc.add(new NumericDocValuesField(FAMILY_ORDER, ORDER_OF_FAMILY[familyCode]));
        doc.add(new StoredField("id", id));
        doc.add(new StoredField("uri", uri));
        if (tokens == null) {
            doc.add(new TextField("name", name, Field.Store.YES));
        } else {
            doc.add(new StoredField("name", name));
            doc.add(tokens.field("name", name, true));
        }
        doc.add(new StringField(NAME_EXACT, exactForm(name), Field.Store.NO));
        doc.add(new StringField(NAME_EXACT, exactForm(baseName(name)), Field.Store.NO));
        // The name's words stemmed, so "cleaned" finds visits_clean.
        doc.add(tokens == null ? new TextField("stems", name, Field.Store.NO) : tokens.field("stems", name, true));
        return doc;
    }

    private static void text(Document doc, String field, String value) {
        if (value != null && !value.isBlank()) {
            doc.add(new TextField(field, value, Field.Store.YES));
        }
    }

    /** As {@link #text(Document, String, String)}, the tokens replayed from {@code tokens} when given (see {@link RepeatedTokens#field}). */
    private static void text(Document doc, String field, String value, RepeatedTokens tokens, boolean shared) {
        if (tokens == null) {
            text(doc, field, value);
        } else if (value != null && !value.isBlank()) {
            doc.add(new StoredField(field, value));
            doc.add(tokens.field(field, value, shared));
        }
    }

    private static void stored(Document doc, String field, String value) {
        if (value != null) {
            doc.add(new StoredField(field, value));
        }
    }

    private static void facet(Document doc, String dimension, String value) {
        if (value != null && !value.isBlank()) {
            doc.add(new SortedSetDocValuesFacetField(dimension, value));
            // Filters use the same words as the facets, lower-cased.
            doc.add(new StringField("f_" + dimension, value.toLowerCase(Locale.ROOT), Field.Store.NO));
        }
    }

    private static void words(Document doc, String... texts) {
        Set<String> seen = new LinkedHashSet<>();
        for (String t : texts) {
            if (t != null && !t.isBlank()) {
                seen.add(t);
            }
        }
        doc.add(new TextField(WORDS, String.join("\n", seen), Field.Store.NO));
    }
}
