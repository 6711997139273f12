package org.headwater.search;

import java.io.IOException;
import java.io.StringReader;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.Predicate;
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
import org.apache.lucene.search.FuzzyQuery;
import org.apache.lucene.search.MatchAllDocsQuery;
import org.apache.lucene.search.PrefixQuery;
import org.apache.lucene.search.Query;
import org.apache.lucene.search.TermQuery;
import org.apache.lucene.util.QueryBuilder;

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
    private static final float TIE_BREAKER = 0.2f;

    private final Analyzer identifiers = IdentifierAnalyzer.forQueries();
    private final Analyzer prose = new ProseAnalyzer();

    /** Whether the all-words or any-word form is built. */
    enum Mode { ALL_WORDS, ANY_WORD }

    /** The clause matching the whole text as an exact name: it puts exact matches first. */
    Query exactName(QueryText text) {
        return new BoostQuery(new ConstantScoreQuery(new TermQuery(new Term(Documents.NAME_EXACT,
                Documents.exactForm(text.plainText())))), EXACT_NAME_BOOST);
    }

    /** The text part of the query with prefix and typo clauses for every word; see {@link #text(QueryText, Mode, Predicate)}. */
    Query text(QueryText text, Mode mode) {
        return text(text, mode, part -> false);
    }

    /**
     * The text part of the query (words and phrases, no filters, no ranking), or null for a text of filters only.
     * A word the catalog holds ({@code known}) is matched as itself, by its stem and as a beginning; only an
     * unknown one, a half-typed word or a typo, also gets the typo clauses, which cost an automaton per field
     * and segment and widen every disjunction the search then scores.
     */
    Query text(QueryText text, Mode mode, Predicate<String> known) {
        if (!text.hasText()) {
            return null;
        }
        BooleanQuery.Builder query = new BooleanQuery.Builder();
        List<String> parts = wordParts(text.words());
        if (mode == Mode.ALL_WORDS) {
            for (String part : parts) {
                query.add(wordClause(part, known.test(part)), Occur.MUST);
            }
        } else {
            // Any typed word will do, but the parts of one identifier (merge_lab_results) still go together.
            for (String word : text.words()) {
                List<String> own = wordParts(List.of(word)).stream().filter(parts::contains).toList();
                if (own.isEmpty()) {
                    continue;
                }
                BooleanQuery.Builder together = new BooleanQuery.Builder();
                own.forEach(part -> together.add(wordClause(part, known.test(part)), Occur.MUST));
                query.add(together.build(), Occur.SHOULD);
            }
        }
        for (String word : text.words()) {
            // A whole identifier as typed (nitrate_mg_l) is indexed unsplit too: matching it is worth extra.
            String whole = word.toLowerCase(java.util.Locale.ROOT);
            if (!parts.contains(whole) && whole.length() > 1) {
                for (Map.Entry<String, Float> f : Documents.IDENTIFIER_FIELDS.entrySet()) {
                    query.add(new BoostQuery(new TermQuery(new Term(f.getKey(), whole)), f.getValue()), Occur.SHOULD);
                }
            }
        }
        for (String phrase : text.phrases()) {
            query.add(phraseClause(phrase), Occur.MUST);
        }
        if (parts.isEmpty() && text.phrases().isEmpty()) {
            return null;
        }
        query.add(exactName(text), Occur.SHOULD);
        return query.build();
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

    private Query wordClause(String part, boolean known) {
        List<Query> alternatives = new ArrayList<>();
        for (Map.Entry<String, Float> f : Documents.IDENTIFIER_FIELDS.entrySet()) {
            alternatives.add(new BoostQuery(new TermQuery(new Term(f.getKey(), part)), f.getValue()));
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
                alternatives.add(new BoostQuery(new PrefixQuery(new Term(f.getKey(), part)), f.getValue() * PREFIX_SHARE));
            }
        }
        if (edits > 0) {
            for (Map.Entry<String, Float> f : FUZZY_FIELDS.entrySet()) {
                alternatives.add(new BoostQuery(new FuzzyQuery(new Term(f.getKey(), part), edits, 1, 20, true),
                        f.getValue() * FUZZY_SHARE));
            }
        }
        return new DisjunctionMaxQuery(alternatives, TIE_BREAKER);
    }

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
