package org.headwater.harvest.format.csv;

import java.util.List;

/**
 * Chooses the number convention under which the most cells read as numbers.
 *
 * <p>"1,234" is 1234 in English notation and 1.234 in German; only the rest of the file can
 * tell. Each candidate convention counts the cells it reads; the most wins. On a tie a plain
 * convention beats one with groups, and between decimal comma and comma grouping the
 * delimiter decides: in a comma-delimited file a comma inside a number had to be quoted, which
 * exporters do for grouped thousands, while semicolon files come from locales with decimal
 * commas (common practice, no source).
 */
final class NumberFormatDetector {

  /** Rows examined: plenty of evidence, bounded cost (our choice). */
  static final int MAX_ROWS = 500;

  private NumberFormatDetector() {}

  static NumberFormat detect(List<CsvRecord> rows, char delimiter) {
    List<NumberConvention> candidates = NumberConvention.CANDIDATES;
    int[] counts = new int[candidates.size()];
    boolean[] grouped = new boolean[candidates.size()];
    boolean[] fraction = new boolean[candidates.size()];
    for (CsvRecord row : rows.subList(0, Math.min(rows.size(), MAX_ROWS))) {
      for (String cell : row.cells()) {
        int from = Cells.trimStart(cell);
        int to = Cells.trimEnd(cell, from);
        // Cells of digits alone read the same in every convention: they cannot decide.
        if (from == to || !looksNumeric(cell, from, to) || digitsOnly(cell, from, to)
            || !readableByAny(cell, from, to)) {
          continue;
        }
        for (int k = 0; k < counts.length; k++) {
          int result = NumberScanner.scan(cell, from, to, candidates.get(k));
          if (result != NumberScanner.NONE) {
            counts[k]++;
            grouped[k] |= NumberScanner.has(result, NumberScanner.GROUPED);
            fraction[k] |= NumberScanner.has(result, NumberScanner.FRACTION);
          }
        }
      }
    }
    int best = 0;
    for (int k = 1; k < counts.length; k++) {
      if (counts[k] > counts[best] || counts[k] == counts[best] && prefer(k, best, delimiter)) {
        best = k;
      }
    }
    return new NumberFormat(candidates.get(best), grouped[best], fraction[best]);
  }

  /** Whether candidate {@code k} should win a tie against {@code best}. */
  private static boolean prefer(int k, int best, char delimiter) {
    // Index 1 is decimal comma, index 2 is '.' with ',' groups (see CANDIDATES).
    return delimiter == ',' && k == 2 && best == 1;
  }

  private static boolean digitsOnly(CharSequence s, int from, int to) {
    for (int i = from; i < to; i++) {
      if (!NumberScanner.isDigit(s.charAt(i))) {
        return false;
      }
    }
    return true;
  }

  /**
   * Whether some candidate convention could read the cell: {@link NumberScanner} takes only digits,
   * the separators of the candidates ({@code . , ' } and the space family), an exponent mark, and a sign at the
   * start or after the exponent mark. A date ({@code 2026-01-10}) or a code fails here once instead
   * of once per convention.
   */
  static boolean readableByAny(CharSequence s, int from, int to) {
    for (int i = from; i < to; i++) {
      char c = s.charAt(i);
      if (c >= '0' && c <= '9' || c == '.' || c == ',' || c == '\'' || c == ' ' || c == '\u00A0'
          || c == '\u202F' || c == 'e' || c == 'E') {
        continue;
      }
      boolean sign = c == '-' || c == '+';
      if (!sign || i != from && s.charAt(i - 1) != 'e' && s.charAt(i - 1) != 'E') {
        return false;
      }
    }
    return true;
  }

  private static boolean looksNumeric(CharSequence s, int from, int to) {
    char c = s.charAt(from);
    return NumberScanner.isDigit(c) || c == '-' || c == '+' || c == '.' || c == ',';
  }
}
