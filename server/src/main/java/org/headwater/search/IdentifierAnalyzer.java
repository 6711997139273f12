package org.headwater.search;

import java.util.regex.Pattern;
import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.LowerCaseFilter;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.Tokenizer;
import org.apache.lucene.analysis.core.FlattenGraphFilter;
import org.apache.lucene.analysis.miscellaneous.ASCIIFoldingFilter;
import org.apache.lucene.analysis.miscellaneous.WordDelimiterGraphFilter;
import org.apache.lucene.analysis.pattern.PatternTokenizer;

/**
 * Splits the way people name things in data work: path segments, snake_case, camelCase, dots and digits
 * become separate words ({@code stations/monthlyReadings_2025.csv} gives stations, monthly, readings,
 * 2025, csv). When indexing, the unsplit identifier is kept as well, so an exact identifier still matches.
 */
public final class IdentifierAnalyzer extends Analyzer {
    // Identifiers are runs of letters, digits, underscores, dots and hyphens; everything else separates.
    private static final Pattern SEPARATORS = Pattern.compile("[^\\p{L}\\p{N}_.\\-]+");

    private final boolean keepOriginal;
    private final boolean stem;

    private IdentifierAnalyzer(boolean keepOriginal, boolean stem) {
        this.keepOriginal = keepOriginal;
        this.stem = stem;
    }

    /** Word parts reduced to their English (Porter) stems, for matching names against inflected words. */
    public static IdentifierAnalyzer stemming() {
        return new IdentifierAnalyzer(false, true);
    }

    /** For documents: word parts plus the whole identifier. */
    public static IdentifierAnalyzer forIndexing() {
        return new IdentifierAnalyzer(true, false);
    }

    /** For queries: word parts only, so {@code nitrateMgL} asks for nitrate, mg and l. */
    public static IdentifierAnalyzer forQueries() {
        return new IdentifierAnalyzer(false, false);
    }

    @Override
    protected TokenStreamComponents createComponents(String fieldName) {
        Tokenizer tokenizer = new PatternTokenizer(SEPARATORS, -1);
        int flags = WordDelimiterGraphFilter.GENERATE_WORD_PARTS
                | WordDelimiterGraphFilter.GENERATE_NUMBER_PARTS
                | WordDelimiterGraphFilter.SPLIT_ON_CASE_CHANGE
                | WordDelimiterGraphFilter.SPLIT_ON_NUMERICS
                | WordDelimiterGraphFilter.STEM_ENGLISH_POSSESSIVE;
        if (keepOriginal) {
            flags |= WordDelimiterGraphFilter.PRESERVE_ORIGINAL;
        }
        TokenStream stream = new WordDelimiterGraphFilter(tokenizer, flags, null);
        if (keepOriginal) {
            // The index stores a flat token stream; the graph filter's alternatives must be flattened.
            stream = new FlattenGraphFilter(stream);
        }
        stream = new LowerCaseFilter(stream);
        stream = new ASCIIFoldingFilter(stream);
        if (stem) {
            stream = new org.apache.lucene.analysis.en.PorterStemFilter(stream);
        }
        return new TokenStreamComponents(tokenizer, stream);
    }

    @Override
    protected TokenStream normalize(String fieldName, TokenStream in) {
        return new ASCIIFoldingFilter(new LowerCaseFilter(in));
    }
}
