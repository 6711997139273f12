package org.headwater.harvest.format.csv;

/**
 * The type test of the dialect score: whether a cell is of a type we recognise. Following van
 * den Burg, Nazabal and Sutton (2019), a cell is "known" when it is empty, a missing-value
 * token, a number in any common notation (decimal comma, digit groups, sign, exponent,
 * percent, currency symbol), a date, time or timestamp, a boolean, a URL or an e-mail
 * address. Written from our reading of the paper, from memory; their exact list of types may
 * differ (we recognise, for instance, no IP addresses or file paths). Plain words are not
 * known types: the score rewards dialects whose cells are values rather than fragments.
 */
final class KnownTypes {

  private KnownTypes() {}

  static boolean isKnown(String cell) {
    int from = Cells.trimStart(cell);
    int to = Cells.trimEnd(cell, from);
    if (from == to) {
      return true;
    }
    char c = cell.charAt(from);
    if (NumberScanner.isDigit(c) || c == '-' || c == '+' || c == '.' || isCurrency(c)) {
      return isNumberLike(cell, from, to) || TemporalScanner.scan(cell, from, to) != null
          || MissingValues.isMissing(cell, from, to);
    }
    if (MissingValues.isMissing(cell, from, to) || Cells.booleanValue(cell, from, to) != null) {
      return true;
    }
    return isUrl(cell, from, to) || isEmail(cell, from, to);
  }

  private static boolean isCurrency(char c) {
    return c == '$' || c == '\u20AC' || c == '\u00A3' || c == '\u00A5';
  }

  /** A number in any candidate convention, with an optional currency prefix or suffix or %. */
  private static boolean isNumberLike(CharSequence s, int from, int to) {
    if (isCurrency(s.charAt(from))) {
      from++;
    }
    if (to > from && (s.charAt(to - 1) == '%' || isCurrency(s.charAt(to - 1)))) {
      to--;
      while (to > from && s.charAt(to - 1) == ' ') {
        to--;
      }
    }
    if (from >= to) {
      return false;
    }
    // One pass finds the separators present; only conventions that explain all of them are
    // scanned (the scan would reject the others anyway), and most cells need one scan.
    boolean dot = false;
    boolean comma = false;
    boolean space = false;
    boolean apostrophe = false;
    for (int i = from; i < to; i++) {
      char c = s.charAt(i);
      switch (c) {
        case '.' -> dot = true;
        case ',' -> comma = true;
        case ' ', '\u00A0', '\u202F' -> space = true;
        case '\'' -> apostrophe = true;
        case '+', '-', 'e', 'E' -> { }
        default -> {
          if (!NumberScanner.isDigit(c)) {
            return false;
          }
        }
      }
    }
    for (NumberConvention convention : NumberConvention.CANDIDATES) {
      if (explains(convention, dot, comma, space, apostrophe)
          && NumberScanner.scan(s, from, to, convention) != NumberScanner.NONE) {
        return true;
      }
    }
    return false;
  }

  private static boolean explains(NumberConvention convention, boolean dot, boolean comma,
      boolean space, boolean apostrophe) {
    char decimal = convention.decimal();
    Character group = convention.group();
    return (!dot || decimal == '.' || group != null && group == '.')
        && (!comma || decimal == ',' || group != null && group == ',')
        && (!space || group != null && group == ' ')
        && (!apostrophe || group != null && group == '\'');
  }

  private static boolean isUrl(CharSequence s, int from, int to) {
    return startsWith(s, from, to, "http://") || startsWith(s, from, to, "https://")
        || startsWith(s, from, to, "ftp://") || startsWith(s, from, to, "www.");
  }

  /** local@domain.tld with no spaces: a loose test, enough to tell a value from a fragment. */
  private static boolean isEmail(CharSequence s, int from, int to) {
    int at = -1;
    for (int i = from; i < to; i++) {
      char c = s.charAt(i);
      if (c == ' ') {
        return false;
      }
      if (c == '@') {
        if (at >= 0) {
          return false;
        }
        at = i;
      }
    }
    if (at <= from) {
      return false;
    }
    for (int i = at + 2; i < to - 1; i++) {
      if (s.charAt(i) == '.') {
        return true;
      }
    }
    return false;
  }

  private static boolean startsWith(CharSequence s, int from, int to, String prefix) {
    if (to - from < prefix.length()) {
      return false;
    }
    for (int k = 0; k < prefix.length(); k++) {
      if (Character.toLowerCase(s.charAt(from + k)) != prefix.charAt(k)) {
        return false;
      }
    }
    return true;
  }
}
