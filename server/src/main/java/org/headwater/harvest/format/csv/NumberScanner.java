package org.headwater.harvest.format.csv;

/**
 * Recognises numbers written in a given {@link NumberConvention} by a single character scan
 * (no regular expressions: this runs for every cell of every candidate dialect).
 *
 * <p>Accepted: an optional sign, an integer part that is either plain digits or 1-3 digits
 * followed by groups of exactly three, an optional fraction, an optional exponent. Grouping
 * in threes is the usual Western convention (common practice, no source); the Indian 2-digit
 * grouping is not recognised.
 */
final class NumberScanner {

  /** Not a number. */
  static final int NONE = 0;
  /** An integer; see {@link #LEADING_ZERO} and {@link #GROUPED}. */
  static final int INTEGER = 1;
  /** A number with a fraction or exponent. */
  static final int DECIMAL = 2;
  /** Flag: the integer part has more than one digit and starts with 0 (an identifier?). */
  static final int LEADING_ZERO = 4;
  /** Flag: digit-group separators were used. */
  static final int GROUPED = 8;
  /** Flag: a fraction part was written with the decimal separator. */
  static final int FRACTION = 16;

  private NumberScanner() {}

  static int kind(int result) {
    return result & 3;
  }

  static boolean has(int result, int flag) {
    return (result & flag) != 0;
  }

  /** Scans {@code s[from, to)}; returns a kind with flags, or {@link #NONE}. */
  static int scan(CharSequence s, int from, int to, NumberConvention convention) {
    int i = from;
    if (i < to && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
      i++;
    }
    int intStart = i;
    int digits = 0;
    int groupDigits = 0;
    boolean grouped = false;
    while (i < to) {
      char c = s.charAt(i);
      if (c >= '0' && c <= '9') {
        digits++;
        groupDigits++;
        i++;
      } else if (convention.isGroup(c) && c != convention.decimal()) {
        // A group separator must follow 1-3 digits at first, exactly 3 afterwards, and be
        // followed by a digit.
        if (groupDigits == 0 || groupDigits > 3 || grouped && groupDigits != 3
            || i + 1 >= to || !isDigit(s.charAt(i + 1))) {
          return NONE;
        }
        grouped = true;
        groupDigits = 0;
        i++;
      } else {
        break;
      }
    }
    if (grouped && groupDigits != 3) {
      return NONE;
    }
    int flags = 0;
    if (grouped) {
      flags |= GROUPED;
    }
    if (digits > 1 && s.charAt(intStart) == '0') {
      flags |= LEADING_ZERO;
    }
    int kind = INTEGER;
    if (i < to && s.charAt(i) == convention.decimal()) {
      i++;
      int fraction = 0;
      while (i < to && isDigit(s.charAt(i))) {
        fraction++;
        i++;
      }
      if (digits == 0 && fraction == 0) {
        return NONE;
      }
      digits += fraction;
      kind = DECIMAL;
      flags |= FRACTION;
      flags &= ~LEADING_ZERO;
    }
    if (digits == 0) {
      return NONE;
    }
    if (i < to && (s.charAt(i) == 'e' || s.charAt(i) == 'E')) {
      i++;
      if (i < to && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
        i++;
      }
      int exponent = 0;
      while (i < to && isDigit(s.charAt(i))) {
        exponent++;
        i++;
      }
      if (exponent == 0) {
        return NONE;
      }
      kind = DECIMAL;
    }
    return i == to ? kind | flags : NONE;
  }

  /** The number in plain notation ('.' decimal, no groups) for {@link java.math.BigDecimal}. */
  static String normalize(CharSequence s, int from, int to, NumberConvention convention) {
    StringBuilder out = new StringBuilder(to - from);
    for (int i = from; i < to; i++) {
      char c = s.charAt(i);
      if (c == convention.decimal()) {
        out.append('.');
      } else if (!convention.isGroup(c)) {
        out.append(c);
      }
    }
    return out.toString();
  }

  static boolean isDigit(char c) {
    return c >= '0' && c <= '9';
  }
}
