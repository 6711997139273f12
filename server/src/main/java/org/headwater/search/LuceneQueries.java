package org.headwater.search;

import java.io.IOException;
import java.io.StringReader;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.en.EnglishAnalyzer;
import org.apache.lucene.analysis.tokenattributes.CharTermAttribute;
import org.apache.lucene.index.Term;
import org.apache.lucene.search.BooleanClause.Occur;
import org.apache.lucene.search.BooleanQuery;
import org.apache.lucene.search.BoostQuery;
import org.apache.lucene.search.ConstantScoreQuery;
import org.apache.lucene.search.DisjunctionMaxQuery;
import org.apache.lucene.search.BlendedTermQuery;
import org.apache.lucene.search.MatchAllDocsQuery;
import org.apache.lucene.search.AutomatonQuery;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.TermQuery;
import org.apache.lucene.util.QueryBuilder;
import org.apache.lucene.util.automaton.Automata;
import org.apache.lucene.util.automaton.Automaton;
import org.apache.lucene.util.automaton.Operations;

/**
 * Builds the Lucene queries for a {@link QueryText}. Each word becomes one clause that any field may satisfy:
 * the word itself in identifier fields, its stem in prose fields, words it begins (search-as-you-type) and,
 * for words of four letters or more, words one or two edits away (typos). The all-words query requires every
 * word's clause; the any-word query, the fallback, requires one.
 */
final class LuceneQueries {
    /** Fields searched for prefixes: the ones whose words people half-type. */
    private static final Map<String, Float> PREFIX_FIELDS = Map.of("name", 4.0f, "columns", 1.5f, "prose_ids", 1.0f,
            "tags", 1.5f);
    /** Fields searched for the prefix of a word the catalog holds. */
    private static final Map<String, Float> KNOWN_PREFIX_FIELDS = Map.of("prose_ids", 1.0f, "tags", 1.5f);
    /** Fields searched for typos; few, because each costs an automaton per query. */
    private static final Map<String, Float> FUZZY_FIELDS = Map.of("name", 4.0f, "columns", 1.5f, "prose_ids", 1.0f);
    private static final float PREFIX_SHARE = 0.25f;
    private static final float FUZZY_SHARE = 0.3f;
    private static final float EXACT_NAME_BOOST = 1000f;
    /**
     * A word's score is its best field's, with nothing added for the other fields it is in. A share of the
     * others (0.2 until December 2026) moved neither judged query set by more than 0.001 of nDCG, and without
     * it each field's postings can skip blocks that cannot reach the top hits.
     */
    private static final float TIE_BREAKER = 0.0f;

    private final Analyzer identifiers = IdentifierAnalyzer.forQueries();
    private final Analyzer prose = new ProseAnalyzer();

    /** Whether the all-words or any-word form is built. */
    enum Mode { ALL_WORDS, ANY_WORD }

    /** The clause matching the whole text as an exact name, worth 1000: it puts exact matches first. */
    Query exactName(QueryText text) {
        return new BoostQuery(new ConstantScoreQuery(new TermQuery(new Term(Documents.NAME_EXACT,
                Documents.exactForm(text.plainText())))), EXACT_NAME_BOOST);
    }

    /** The text part of the query with prefix clauses for every word; see {@link #text(QueryText, Mode, Vocabulary)}. */
    Query text(QueryText text, Mode mode) {
        return text(text, mode, Vocabulary.EMPTY);
    }

    /**
     * The text part of the query (words and phrases, no filters, no ranking), or null for a text of filters only.
     * A word the catalog holds is matched as itself, by its stem and as a beginning; only an unknown one, a
     * half-typed word or a typo, also gets the typo clauses: the words of the vocabulary near it, which widen
     * every disjunction the search then scores.
     */
    Query text(QueryText text, Mode mode, Vocabulary vocabulary) {
        if (!text.hasText()) {
            return null;
        }
        BooleanQuery.Builder query = new BooleanQuery.Builder();
        List<String> parts = wordParts(text.words());
        boolean inDataset = parts.size() > 1;
        if (mode == Mode.ALL_WORDS) {
            for (String part : parts) {
                query.add(wordClause(part, vocabulary, inDataset), Occur.MUST);
            }
        } else {
            // Any typed word will do, but the parts of one identifier (merge_lab_results) still go together.
            for (String word : text.words()) {
                List<String> own = wordParts(List.of(word)).stream().filter(parts::contains).toList();
                if (own.isEmpty()) {
                    continue;
                }
                BooleanQuery.Builder together = new BooleanQuery.Builder();
                own.forEach(part -> together.add(wordClause(part, vocabulary, inDataset), Occur.MUST));
                query.add(together.build(), Occur.SHOULD);
            }
        }
        for (String phrase : text.phrases()) {
            query.add(phraseClause(phrase), Occur.MUST);
        }
        if (parts.isEmpty() && text.phrases().isEmpty()) {
            return null;
        }
        return query.build();
    }

    /**
     * Clauses that add to the score of a match but match nothing the words do not: a whole identifier as typed
     * ({@code nitrate_mg_l}, indexed unsplit as well as in parts) in each identifier field, and the whole text
     * as an exact name. The search scores them apart (see {@code SearchIndex.topHits}): as optional clauses
     * of the words' query they would let no block of postings be skipped, since any block might hold one.
     */
    List<Query> bonuses(QueryText text) {
        List<Query> out = new ArrayList<>();
        List<String> parts = wordParts(text.words());
        for (String word : text.words()) {
            String whole = word.toLowerCase(java.util.Locale.ROOT);
            if (!parts.contains(whole) && whole.length() > 1) {
                for (Map.Entry<String, Float> f : Documents.IDENTIFIER_FIELDS.entrySet()) {
                    out.add(new BoostQuery(new TermQuery(new Term(f.getKey(), whole)), f.getValue()));
                }
            }
        }
        out.add(exactName(text));
        return out;
    }

    /** The query as hits are scored: the words' query plus whatever bonuses a match also has. */
    Query withBonuses(Query textQuery, List<Query> bonuses, boolean bonusRequired) {
        BooleanQuery.Builder q = new BooleanQuery.Builder().add(textQuery, Occur.MUST);
        if (bonusRequired) {
            // Two required scoring clauses, the same sum: the form a top-hit search can skip blocks in.
            BooleanQuery.Builder any = new BooleanQuery.Builder();
            bonuses.forEach(b -> any.add(b, Occur.SHOULD));
            return q.add(any.build(), Occur.MUST).build();
        }
        bonuses.forEach(b -> q.add(b, Occur.SHOULD));
        return q.build();
    }

    /** The filters of the text as one query to use as a filter, or null when there are none. */
    Query filters(QueryText text, String kind, FreshnessProvider freshness) {
        BooleanQuery.Builder all = new BooleanQuery.Builder();
        boolean any = false;
        for (Map.Entry<String, List<String>> f : text.filters().entrySet()) {
            if (f.getKey().equals("fresh")) {
                all.add(new FreshnessFilter(java.util.Set.copyOf(f.getValue()), freshness), Occur.FILTER);
                any = true;
                continue;
            }
            BooleanQuery.Builder oneOf = new BooleanQuery.Builder();
            for (String value : f.getValue()) {
                String field = f.getKey().equals("kind") ? Documents.KIND : "f_" + f.getKey();
                oneOf.add(new TermQuery(new Term(field, value)), Occur.SHOULD);
            }
            all.add(oneOf.build(), Occur.FILTER);
            any = true;
        }
        if (kind != null) {
            all.add(new TermQuery(new Term(Documents.KIND, kind)), Occur.FILTER);
            any = true;
        }
        return any ? all.build() : null;
    }

    /** Text and filters together; a text of filters only matches every document that passes them. */
    Query combined(Query textQuery, Query filter) {
        BooleanQuery.Builder q = new BooleanQuery.Builder();
        q.add(textQuery == null ? new MatchAllDocsQuery() : textQuery, Occur.MUST);
        if (filter != null) {
            q.add(filter, Occur.FILTER);
        }
        return q.build();
    }

    /** The identifier parts of the words, without repeats and without English stop words (unless that is all there is). */
    List<String> wordParts(List<String> words) {
        List<String> parts = new ArrayList<>();
        for (String word : words) {
            for (String part : analyze(identifiers, word)) {
                if (!parts.contains(part)) {
                    parts.add(part);
                }
            }
        }
        List<String> content = parts.stream().filter(p -> !EnglishAnalyzer.ENGLISH_STOP_WORDS_SET.contains(p)).toList();
        return content.isEmpty() ? parts : content;
    }

    private Query wordClause(String part, Vocabulary vocabulary, boolean inDataset) {
        boolean known = vocabulary.has(part);
        List<Query> alternatives = new ArrayList<>();
        for (Map.Entry<String, Float> f : Documents.IDENTIFIER_FIELDS.entrySet()) {
            alternatives.add(new BoostQuery(new TermQuery(new Term(f.getKey(), part)), f.getValue()));
        }
        if (inDataset) {
            alternatives.add(new BoostQuery(new TermQuery(new Term(Documents.IN_DATASET, part)), Documents.IN_DATASET_WEIGHT));
        }
        List<String> stems = analyze(prose, part);
        if (!stems.isEmpty()) {
            for (Map.Entry<String, Float> f : Documents.PROSE_FIELDS.entrySet()) {
                alternatives.add(new BoostQuery(new TermQuery(new Term(f.getKey(), stems.get(0))), f.getValue()));
            }
        }
        if (known && !stems.isEmpty() && !stems.get(0).equals(part)) {
            // What the typo clauses used to catch for a known word: its other inflection in names and the
            // identifiers of prose ("results" finds lab_result), as plain terms, without an automaton.
            for (Map.Entry<String, Float> f : FUZZY_FIELDS.entrySet()) {
                alternatives.add(new BoostQuery(new TermQuery(new Term(f.getKey(), stems.get(0))), f.getValue() * FUZZY_SHARE));
            }
        }
        int edits = known ? 0 : editsFor(part);
        if (part.length() >= 3 && !isNumber(part)) {
            // A known word's longer forms in names and columns are found by its stem (the stemmed name field) or
            // are identifiers that also hold the word itself as a part; in the unstemmed words of prose they are
            // not (merge finds merged), so there the prefix stays.
            for (Map.Entry<String, Float> f : (known ? KNOWN_PREFIX_FIELDS : PREFIX_FIELDS).entrySet()) {
                alternatives.add(new BoostQuery(beginning(f.getKey(), part), f.getValue() * PREFIX_SHARE));
            }
        }
        List<Vocabulary.Near> near = edits > 0 ? vocabulary.near(part, edits) : List.of();
        if (!near.isEmpty()) {
            for (Map.Entry<String, Float> f : FUZZY_FIELDS.entrySet()) {
                // Scored as a typo query's expansion is: each near word weighed by its closeness, all with the
                // same (blended) word frequency, so a rare near word does not outrank the common one meant.
                BlendedTermQuery.Builder blended = new BlendedTermQuery.Builder()
                        .setRewriteMethod(BlendedTermQuery.BOOLEAN_REWRITE);
                near.forEach(n -> blended.add(new Term(f.getKey(), n.word()), n.closeness()));
                alternatives.add(new BoostQuery(blended.build(), f.getValue() * FUZZY_SHARE));
            }
        }
        return new DisjunctionMaxQuery(alternatives, TIE_BREAKER);
    }

    /**
     * Words that begin with {@code part}, leaving out whole identifiers with a joiner ({@code _ . -}) in them.
     * A query part has no joiner, so such an identifier begins with the part only if its first word does, and
     * that word is a term of the same document: leaving them out loses no match and, the clause being
     * constant-score, changes no score. It does spare expanding to one term per file name
     * ({@code nitrate_raw_1.csv}, {@code nitrate_raw_2.csv}, …) in a large catalog. The one thing not found
     * is a beginning that runs across a camelCase boundary inside a joined name.
     */
    static Query beginning(String field, String part) {
        Term term = new Term(field, part);
        // Compiling the automaton cost about a twentieth of a whole search; the query is immutable and shared.
        Query known = BEGINNINGS.get(term);
        if (known == null) {
            Automaton a = Operations.concatenate(Automata.makeString(part), Operations.repeat(WORD_CHAR));
            known = new Beginning(term, Operations.determinize(a, Operations.DEFAULT_DETERMINIZE_WORK_LIMIT));
            BEGINNINGS.put(term, known);
        }
        return known;
    }

    /** The word-beginning queries built lately, by field and part, the least recently used dropped first. */
    private static final Map<Term, Query> BEGINNINGS = java.util.Collections.synchronizedMap(
            new java.util.LinkedHashMap<>(256, 0.75f, true) {
                @Override
                protected boolean removeEldestEntry(Map.Entry<Term, Query> eldest) {
                    return size() > 2_048;
                }
            });

    /** The words of a field that begin with a part, written {@code field:part*} as a prefix query is. */
    private static final class Beginning extends AutomatonQuery {
        Beginning(Term part, Automaton automaton) {
            super(part, automaton);
        }

        @Override
        public String toString(String field) {
            return (term.field().equals(field) ? "" : term.field() + ":") + term.text() + "*";
        }
    }

    /** Any character but the joiners that the identifier analyzer keeps inside a whole identifier. */
    private static final Automaton WORD_CHAR = Operations.union(List.of(
            Automata.makeCharRange(0, '-' - 1),
            Automata.makeCharRange('.' + 1, '_' - 1),
            Automata.makeCharRange('_' + 1, Character.MAX_CODE_POINT)));

    /** Edits allowed for a typo: none up to three letters, one up to seven, two from eight. */
    static int editsFor(String word) {
        if (word.length() < 4 || isNumber(word)) {
            return 0;
        }
        return word.length() < 8 ? 1 : 2;
    }

    private static boolean isNumber(String word) {
        return word.chars().allMatch(Character::isDigit);
    }

    private Query phraseClause(String phrase) {
        List<Query> alternatives = new ArrayList<>();
        QueryBuilder idBuilder = new QueryBuilder(identifiers);
        for (Map.Entry<String, Float> f : Documents.IDENTIFIER_FIELDS.entrySet()) {
            Query q = idBuilder.createPhraseQuery(f.getKey(), phrase);
            if (q != null) {
                alternatives.add(new BoostQuery(q, f.getValue()));
            }
        }
        QueryBuilder proseBuilder = new QueryBuilder(prose);
        for (Map.Entry<String, Float> f : Documents.PROSE_FIELDS.entrySet()) {
            Query q = proseBuilder.createPhraseQuery(f.getKey(), phrase);
            if (q != null) {
                alternatives.add(new BoostQuery(q, f.getValue()));
            }
        }
        return new DisjunctionMaxQuery(alternatives, TIE_BREAKER);
    }

    static List<String> analyze(Analyzer analyzer, String text) {
        List<String> out = new ArrayList<>();
        try (TokenStream stream = analyzer.tokenStream("name", new StringReader(text))) {
            CharTermAttribute term = stream.addAttribute(CharTermAttribute.class);
            stream.reset();
            while (stream.incrementToken()) {
                out.add(term.toString());
            }
            stream.end();
        } catch (IOException e) {
            throw new SearchException("Cannot analyse the query", e);
        }
        return out;
    }
}
