package org.headwater.harvest.format.csv;

import java.util.Locale;
import java.util.Set;

/**
 * Decides which cells stand for a missing value.
 *
 * <p>Tokens: the empty cell (after trimming spaces), NA, N/A, NULL, NaN and #N/A in any mix of
 * case (na, n/a, Null, nan), "-" and ".": the placeholders that spreadsheets, R, pandas and
 * statistics packages write by hand or by default (SAS and Stata print a lone "." for a
 * missing number; common practice, no source). They count as missing in every column, text
 * columns included; a column of country codes that holds Namibia's "NA", or of element
 * symbols holding sodium's "Na", will be mis-counted, which we accept.
 *
 * <p>Numeric sentinels (-999, -9999) are not tokens: -999 is an ordinary number in many
 * columns. {@link ColumnProfiler} treats them as missing only in a column whose other values
 * are never below zero, and then says so in a warning.
 */
final class MissingValues {

  private static final Set<String> TOKENS =
      Set.of("NA", "N/A", "NULL", "NAN", "#N/A", "-", ".");

  private MissingValues() {}

  /** Whether {@code s[from, to)} (already trimmed) is missing. */
  static boolean isMissing(CharSequence s, int from, int to) {
    int length = to - from;
    if (length == 0) {
      return true;
    }
    if (length > 4 || !mayStartToken(s.charAt(from))) {
      return false;
    }
    return TOKENS.contains(s.subSequence(from, to).toString().toUpperCase(Locale.ROOT));
  }

  /** Whether a trimmed cell is missing. */
  static boolean isMissing(String trimmed) {
    return trimmed.isEmpty()
        || trimmed.length() <= 4 && mayStartToken(trimmed.charAt(0))
        && TOKENS.contains(trimmed.toUpperCase(Locale.ROOT));
  }

  /** Every token starts with N, n, #, - or '.': a cheap test before the set look-up. */
  private static boolean mayStartToken(char c) {
    return c == 'N' || c == 'n' || c == '#' || c == '-' || c == '.';
  }

  /** Whether a normalized number is one of the sentinels -999 or -9999 (any zero fraction). */
  static boolean isSentinel(java.math.BigDecimal value) {
    return value.compareTo(MINUS_999) == 0 || value.compareTo(MINUS_9999) == 0;
  }

  private static final java.math.BigDecimal MINUS_999 = java.math.BigDecimal.valueOf(-999);
  private static final java.math.BigDecimal MINUS_9999 = java.math.BigDecimal.valueOf(-9999);
}
