package org.headwater.search;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.apache.lucene.index.IndexReader;
import org.apache.lucene.index.MultiTerms;
import org.apache.lucene.index.Term;
import org.apache.lucene.index.Terms;
import org.apache.lucene.search.FuzzyTermsEnum;
import org.apache.lucene.util.BytesRef;

/**
 * The words the catalog holds, from the index's dictionary of every word: whether a typed word is one of
 * them, and which ones a word that is not might have meant. Asking once here, rather than once per field
 * searched, builds each typo automaton once per query.
 */
interface Vocabulary {
    /** The most words a typo stands for, as a typo query in Lucene expands to by default here. */
    int MOST_NEAR = 20;

    boolean has(String word);

    /** Words at most {@code edits} away (sharing the first letter), closest first, then the most used. */
    List<Near> near(String word, int edits);

    /** A word near a typed one, and how near: 1 − edits ÷ the shorter length, as Lucene's typo queries weigh it. */
    record Near(String word, float closeness) {
    }

    /** A vocabulary that holds nothing: every word is a typo and nothing is near it. */
    Vocabulary EMPTY = new Vocabulary() {
        @Override
        public boolean has(String word) {
            return false;
        }

        @Override
        public List<Near> near(String word, int edits) {
            return List.of();
        }
    };

    /**
     * The vocabulary of an index reader's {@code words} field, remembering its answers: one search asks about
     * the same word while building its query and again for its "did you mean". Not for sharing across threads.
     */
    static Vocabulary of(IndexReader reader) {
        Vocabulary direct = direct(reader);
        java.util.Map<String, Boolean> known = new java.util.HashMap<>();
        java.util.Map<String, List<Near>> near = new java.util.HashMap<>();
        return new Vocabulary() {
            @Override
            public boolean has(String word) {
                return known.computeIfAbsent(word, direct::has);
            }

            @Override
            public List<Near> near(String word, int edits) {
                return near.computeIfAbsent(edits + ":" + word, k -> direct.near(word, edits));
            }
        };
    }

    private static Vocabulary direct(IndexReader reader) {
        return new Vocabulary() {
            @Override
            public boolean has(String word) {
                try {
                    return reader.docFreq(new Term(Documents.WORDS, word)) > 0;
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            }

            @Override
            public List<Near> near(String word, int edits) {
                record Candidate(String word, float closeness, int docFreq) {
                }
                try {
                    Terms terms = MultiTerms.getTerms(reader, Documents.WORDS);
                    if (terms == null) {
                        return List.of();
                    }
                    FuzzyTermsEnum e = new FuzzyTermsEnum(terms, new Term(Documents.WORDS, word), edits, 1, true);
                    List<Candidate> all = new ArrayList<>();
                    for (BytesRef t = e.next(); t != null; t = e.next()) {
                        all.add(new Candidate(t.utf8ToString(), e.getBoost(), e.docFreq()));
                    }
                    all.sort(Comparator.comparing(Candidate::closeness).reversed()
                            .thenComparing(Comparator.comparing(Candidate::docFreq).reversed())
                            .thenComparing(Candidate::word));
                    return all.stream().limit(MOST_NEAR).map(c -> new Near(c.word(), c.closeness())).toList();
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            }
        };
    }
}
