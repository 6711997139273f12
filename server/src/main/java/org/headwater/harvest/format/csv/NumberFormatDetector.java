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
    // Per column, the last cell looked at and what each convention made of it (null: skipped). What a
    // convention makes of a cell depends only on where its digits are and what its other characters are,
    // and a column's cells mostly share that shape (12.5, 13.0, 11.2): those reuse the results, where each
    // used to be scanned once per convention (a fifth of sniffing a delimited file).
    String[] lastCell = new String[0];
    int[] lastFrom = new int[0];
    int[] lastTo = new int[0];
    int[][] lastResults = new int[0][];
    for (CsvRecord row : rows.subList(0, Math.min(rows.size(), MAX_ROWS))) {
      List<String> cells = row.cells();
      if (cells.size() > lastCell.length) {
        lastCell = java.util.Arrays.copyOf(lastCell, cells.size());
        lastFrom = java.util.Arrays.copyOf(lastFrom, cells.size());
        lastTo = java.util.Arrays.copyOf(lastTo, cells.size());
        lastResults = java.util.Arrays.copyOf(lastResults, cells.size());
      }
      for (int col = 0; col < cells.size(); col++) {
        String cell = cells.get(col);
        int from = Cells.trimStart(cell);
        int to = Cells.trimEnd(cell, from);
        int[] results;
        if (lastCell[col] != null && sameShape(lastCell[col], lastFrom[col], lastTo[col], cell, from, to)) {
          results = lastResults[col];
        } else {
          results = results(cell, from, to, candidates);
          lastCell[col] = cell;
          lastFrom[col] = from;
          lastTo[col] = to;
          lastResults[col] = results;
        }
        if (results == null) {
          continue;
        }
        for (int k = 0; k < counts.length; k++) {
          int result = results[k];
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

  /** Each convention's scan of the cell, or null for a cell that cannot decide. */
  private static int[] results(String cell, int from, int to, List<NumberConvention> candidates) {
    // Cells of digits alone read the same in every convention: they cannot decide.
    if (from == to || !looksNumeric(cell, from, to) || digitsOnly(cell, from, to) || !readableByAny(cell, from, to)) {
      return null;
    }
    int[] out = new int[candidates.size()];
    for (int k = 0; k < out.length; k++) {
      out[k] = NumberScanner.scan(cell, from, to, candidates.get(k));
    }
    return out;
  }

  /**
   * Whether {@code cell[from, to)} has the shape of {@code last[lastFrom, lastTo)}: the same length, digits
   * where it has digits and the same character everywhere else.
   */
  static boolean sameShape(String last, int lastFrom, int lastTo, String cell, int from, int to) {
    if (lastTo - lastFrom != to - from) {
      return false;
    }
    for (int i = 0; i < to - from; i++) {
      char a = last.charAt(lastFrom + i);
      char b = cell.charAt(from + i);
      if (a != b && !(NumberScanner.isDigit(a) && NumberScanner.isDigit(b))) {
        return false;
      }
    }
    return true;
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
