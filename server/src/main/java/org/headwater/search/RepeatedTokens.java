package org.headwater.search;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.tokenattributes.CharTermAttribute;
import org.apache.lucene.analysis.tokenattributes.OffsetAttribute;
import org.apache.lucene.analysis.tokenattributes.PositionIncrementAttribute;
import org.apache.lucene.analysis.tokenattributes.PositionLengthAttribute;
import org.apache.lucene.document.Field;
import org.apache.lucene.document.TextField;

/**
 * The tokens of short texts that many documents repeat (a column's type, its dataset's name for each of its
 * columns, the same column names across thousands of files), analysed once and replayed into every document
 * that holds them. The analysis chain of identifiers was about half the time of an index build; a replay gives
 * the index writer the very tokens, positions and offsets the analyzer gives, at the cost of a copy.
 *
 * <p>Safe to share between indexing threads; bounded: beyond {@link #MAX_ENTRIES} texts, or for a text longer
 * than {@link #MAX_TEXT}, fields are analysed as usual.
 */
final class RepeatedTokens {

    /** Texts remembered (our choice: a few MiB at most for identifier-sized texts). */
    static final int MAX_ENTRIES = 20_000;
    /** Longer texts are rarely repeated verbatim (our choice). */
    static final int MAX_TEXT = 200;

    /** One token as the analyzer left it. */
    private record Token(String term, int positionIncrement, int positionLength, int start, int end) {}

    /** A text's tokens and the state {@code end()} leaves. */
    private record Tokens(Token[] tokens, int finalPositionIncrement, int finalOffset) {}

    private final Analyzer analyzer;
    private final ConcurrentHashMap<String, Tokens> byFieldAndText = new ConcurrentHashMap<>();
    /** Per indexing thread, the last text of each field not shared: a dataset's name, for its columns in a row. */
    private final ThreadLocal<java.util.Map<String, LastText>> last =
            ThreadLocal.withInitial(java.util.HashMap::new);

    /** The last text of a field on one thread, with its tokens. */
    private record LastText(String text, Tokens tokens) {}

    RepeatedTokens(Analyzer analyzer) {
        this.analyzer = analyzer;
    }

    /**
     * An indexed, not stored, text field of {@code name} holding {@code text}'s tokens. A {@code shared} text
     * is remembered for every document; another only for the next document of the same thread, which suits a
     * text repeated by a run of documents and then never again.
     */
    Field field(String name, String text, boolean shared) {
        if (text.length() > MAX_TEXT) {
            return new TextField(name, text, Field.Store.NO);
        }
        return new TextField(name, new Replay(shared ? sharedTokens(name, text) : lastTokens(name, text)));
    }

    private Tokens sharedTokens(String name, String text) {
        String key = name + '\u0000' + text;
        Tokens tokens = byFieldAndText.get(key);
        if (tokens == null) {
            tokens = analyse(name, text);
            if (byFieldAndText.size() < MAX_ENTRIES) {
                byFieldAndText.putIfAbsent(key, tokens);
            }
        }
        return tokens;
    }

    private Tokens lastTokens(String name, String text) {
        LastText entry = last.get().get(name);
        if (entry != null && entry.text().equals(text)) {
            return entry.tokens();
        }
        Tokens tokens = analyse(name, text);
        last.get().put(name, new LastText(text, tokens));
        return tokens;
    }

    private Tokens analyse(String field, String text) {
        try (TokenStream stream = analyzer.tokenStream(field, text)) {
            CharTermAttribute term = stream.addAttribute(CharTermAttribute.class);
            PositionIncrementAttribute increment = stream.addAttribute(PositionIncrementAttribute.class);
            PositionLengthAttribute length = stream.addAttribute(PositionLengthAttribute.class);
            OffsetAttribute offset = stream.addAttribute(OffsetAttribute.class);
            List<Token> out = new ArrayList<>();
            stream.reset();
            while (stream.incrementToken()) {
                out.add(new Token(term.toString(), increment.getPositionIncrement(), length.getPositionLength(),
                        offset.startOffset(), offset.endOffset()));
            }
            stream.end();
            return new Tokens(out.toArray(new Token[0]), increment.getPositionIncrement(), offset.endOffset());
        } catch (IOException e) {
            throw new UncheckedIOException(e); // analysing a String reads no file
        }
    }

    /** Plays back remembered tokens. */
    private static final class Replay extends TokenStream {
        private final Tokens tokens;
        private final CharTermAttribute term = addAttribute(CharTermAttribute.class);
        private final PositionIncrementAttribute increment = addAttribute(PositionIncrementAttribute.class);
        private final PositionLengthAttribute length = addAttribute(PositionLengthAttribute.class);
        private final OffsetAttribute offset = addAttribute(OffsetAttribute.class);
        private int next;

        Replay(Tokens tokens) {
            this.tokens = tokens;
        }

        @Override
        public boolean incrementToken() {
            if (next >= tokens.tokens().length) {
                return false;
            }
            clearAttributes();
            Token t = tokens.tokens()[next++];
            term.setEmpty().append(t.term());
            increment.setPositionIncrement(t.positionIncrement());
            length.setPositionLength(t.positionLength());
            offset.setOffset(t.start(), t.end());
            return true;
        }

        @Override
        public void end() throws IOException {
            super.end();
            increment.setPositionIncrement(tokens.finalPositionIncrement());
            offset.setOffset(tokens.finalOffset(), tokens.finalOffset());
        }

        @Override
        public void reset() throws IOException {
            super.reset();
            next = 0;
        }
    }
}
