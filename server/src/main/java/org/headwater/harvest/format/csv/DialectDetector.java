package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.function.Predicate;

/**
 * Picks the dialect with the highest data-consistency score (see {@link DialectScorer}).
 *
 * <p>Ties (scores equal to 1e-9 relative) are common: a file without quotes parses the same
 * with or without a quote character. The paper breaks them with rules on which characters
 * actually act in the parse; ours, in the same spirit: first the dialect whose parse broke
 * fewer quoting rules (a quote that only ever appears mid-field is no quote), then the one
 * whose quote character quotes more fields, then a backslash escape only where every backslash
 * protects a special character (see {@link #escapeEvidence}), then the usual delimiter order
 * (, ; tab | : ^ ~ space), then the double quote before none before the single quote, then
 * doubled quotes before backslash escapes.
 *
 * <p>A sample without any double quote parses the same with the RFC 4180 quote as without
 * one; we then report the double quote, which keeps rows beyond the sample readable should
 * they quote a field.
 */
final class DialectDetector {

  private static final double TIE = 1e-9;
  /** Below this share of typed cells a table is names and labels only (our threshold). */
  private static final double WORDS_ONLY = 0.05;

  private DialectDetector() {}

  static DialectScore detect(CharSequence sample, boolean endOfFile, int maxRows,
      char forcedDelimiter) {
    return detect(sample, 0, sample.length(), endOfFile, maxRows, forcedDelimiter);
  }

  /** Detects the dialect of {@code text[from, to)}; record offsets are offsets in text. */
  static DialectScore detect(CharSequence text, int from, int to, boolean endOfFile,
      int maxRows, char forcedDelimiter) {
    List<DialectScore> scores = new ArrayList<>();
    double best = 0.0;
    for (Dialect dialect : DialectCandidates.of(text, from, to, forcedDelimiter)) {
      // Pruning on P alone is only safe strictly below the best: an equal P may tie.
      DialectScore score = DialectScorer.score(text, from, to, endOfFile, maxRows, dialect,
          best * (1 - TIE));
      scores.add(score);
      best = Math.max(best, score.consistency());
    }
    double max = best;
    DialectScore chosen = pick(scores, s -> s.consistency() >= max * (1 - TIE));
    if (chosen.type() < WORDS_ONLY) {
      // Almost no cell is of a known type under the best dialect: a table of names and labels. T then
      // measures only which delimiter chops a stray digit off a label ("pool 3"), so the row pattern
      // alone decides (our rule; the paper's score has no case for tables without typed cells).
      double bestPattern = scores.stream().filter(s -> s.parsed() != null)
          .mapToDouble(DialectScore::pattern).max().orElse(0.0);
      chosen = pick(scores, s -> s.pattern() >= bestPattern * (1 - TIE));
    }
    Dialect dialect = chosen.dialect();
    if (dialect.quote() == null && dialect.delimiter() != '"' && !contains(text, from, to, '"')) {
      Escape escape = dialect.escape() == Escape.BACKSLASH ? Escape.BACKSLASH : Escape.DOUBLE;
      return new DialectScore(new Dialect(dialect.delimiter(), '"', escape), chosen.pattern(),
          chosen.type(), chosen.consistency(), chosen.parsed());
    }
    return chosen;
  }

  /** Among the candidates {@code best} admits, the one the tie rules of the class comment prefer. */
  private static DialectScore pick(List<DialectScore> scores, Predicate<DialectScore> best) {
    return scores.stream()
        .filter(s -> s.parsed() != null && best.test(s))
        .min(Comparator
            .comparingInt((DialectScore s) -> s.parsed().irregularities())
            .thenComparingInt(s -> -s.parsed().quotedFields())
            .thenComparingInt(DialectDetector::escapeEvidence)
            .thenComparingInt(s -> DialectCandidates.delimiterRank(s.dialect().delimiter()))
            .thenComparingInt(s -> DialectCandidates.quoteRank(s.dialect().quote()))
            .thenComparingInt(s -> DialectCandidates.escapeRank(s.dialect().escape())))
        .orElseThrow();
  }

  /**
   * 0 for a backslash dialect whose every escape protects a quote, delimiter, line break or
   * backslash (what an escaping writer emits), 2 for one with escapes before ordinary
   * characters (a Windows path, a regular expression: the backslash is literal there), 1 for
   * the rest.
   */
  private static int escapeEvidence(DialectScore score) {
    ParsedRecords parsed = score.parsed();
    if (score.dialect().escape() != Escape.BACKSLASH) {
      return 1;
    }
    return parsed.escapes() > 0 && parsed.escapes() == parsed.specialEscapes() ? 0 : 2;
  }

  private static boolean contains(CharSequence text, int from, int to, char c) {
    for (int i = from; i < to; i++) {
      if (text.charAt(i) == c) {
        return true;
      }
    }
    return false;
  }
}
