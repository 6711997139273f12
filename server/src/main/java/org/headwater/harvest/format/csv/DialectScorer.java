package org.headwater.harvest.format.csv;

import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Computes the data-consistency measure Q = P x T of van den Burg, Nazabal and Sutton,
 * "Wrangling messy CSV files by detecting row and type patterns" (Data Mining and Knowledge
 * Discovery 33, 2019), written from the paper's description, from memory; no code of theirs
 * was consulted.
 *
 * <p>Pattern score: parse the sample with the dialect; the row pattern of a record is its
 * cell count L. With K distinct patterns, pattern k seen N_k times,
 * P = (1/K) * sum_k N_k * max(alpha, (L_k - 1) / L_k). The small alpha (as we remember the
 * paper, 0.001) keeps single-column parses comparable instead of all scoring zero.
 *
 * <p>Type score: T = (cells of a known type, see {@link KnownTypes}) / (all cells); when no
 * cell is known T is replaced by a tiny epsilon so that P still ranks the dialects.
 */
final class DialectScorer {

  static final double ALPHA = 1e-3;
  static final double EPSILON = 1e-10;

  private DialectScorer() {}

  /**
   * Scores {@code dialect} on {@code sample}; when {@code bestSoFar} is already at least P
   * (Q can never exceed P, since T is at most 1), T is not computed and Q is returned as P
   * times zero, which marks the candidate as beaten.
   */
  static DialectScore score(CharSequence sample, boolean endOfFile, int maxRows,
      Dialect dialect, double bestSoFar) {
    return score(sample, 0, sample.length(), endOfFile, maxRows, dialect, bestSoFar);
  }

  /** Scores {@code dialect} on {@code text[from, to)}. */
  static DialectScore score(CharSequence text, int from, int to, boolean endOfFile,
      int maxRows, Dialect dialect, double bestSoFar) {
    CsvParser parser = new CsvParser(dialect);
    double p = patternScore(parser.widths(text, from, to, maxRows, endOfFile));
    if (p < bestSoFar) {
      return new DialectScore(dialect, p, Double.NaN, 0.0, null);
    }
    ParsedRecords parsed = parser.parse(text, from, to, maxRows, endOfFile);
    double t = typeScore(parsed.records());
    return new DialectScore(dialect, p, t, p * t, parsed);
  }

  static double patternScore(List<CsvRecord> records) {
    return patternScore(records.stream().mapToInt(CsvRecord::width).toArray());
  }

  static double patternScore(int[] widths) {
    if (widths.length == 0) {
      return 0.0;
    }
    Map<Integer, Integer> rowsByWidth = new HashMap<>();
    for (int width : widths) {
      rowsByWidth.merge(width, 1, Integer::sum);
    }
    double sum = 0.0;
    for (Map.Entry<Integer, Integer> pattern : rowsByWidth.entrySet()) {
      int length = pattern.getKey();
      sum += pattern.getValue() * Math.max(ALPHA, (length - 1) / (double) length);
    }
    return sum / rowsByWidth.size();
  }

  static double typeScore(List<CsvRecord> records) {
    long cells = 0;
    long known = 0;
    for (CsvRecord record : records) {
      for (String cell : record.cells()) {
        cells++;
        if (KnownTypes.isKnown(cell)) {
          known++;
        }
      }
    }
    if (cells == 0 || known == 0) {
      return EPSILON;
    }
    return known / (double) cells;
  }
}
