package org.headwater.search;

import org.apache.lucene.analysis.Analyzer;
import org.apache.lucene.analysis.LowerCaseFilter;
import org.apache.lucene.analysis.StopFilter;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.en.EnglishAnalyzer;
import org.apache.lucene.analysis.en.EnglishPossessiveFilter;
import org.apache.lucene.analysis.en.PorterStemFilter;
import org.apache.lucene.analysis.miscellaneous.ASCIIFoldingFilter;
import org.apache.lucene.analysis.standard.StandardTokenizer;

/**
 * Analysis of prose (descriptions, docstrings, comments, figure titles): Unicode word breaks, accents folded,
 * English stop words dropped and words reduced to their Porter stems, so "cleaned" finds "cleaning".
 */
final class ProseAnalyzer extends Analyzer {
    @Override
    protected TokenStreamComponents createComponents(String fieldName) {
        StandardTokenizer tokenizer = new StandardTokenizer();
        TokenStream stream = new EnglishPossessiveFilter(tokenizer);
        stream = new LowerCaseFilter(stream);
        stream = new ASCIIFoldingFilter(stream);
        stream = new StopFilter(stream, EnglishAnalyzer.ENGLISH_STOP_WORDS_SET);
        stream = new PorterStemFilter(stream);
        return new TokenStreamComponents(tokenizer, stream);
    }

    @Override
    protected TokenStream normalize(String fieldName, TokenStream in) {
        return new ASCIIFoldingFilter(new LowerCaseFilter(in));
    }
}
