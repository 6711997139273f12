package org.headwater.harvest.format.csv;

/** Small character tests on cells shared by the scanners. */
final class Cells {

  private Cells() {}

  /** First index in {@code s} that is not a space or tab. */
  static int trimStart(CharSequence s) {
    int i = 0;
    int n = s.length();
    while (i < n && isBlank(s.charAt(i))) {
      i++;
    }
    return i;
  }

  /** Index just past the last character of {@code s} that is not a space or tab. */
  static int trimEnd(CharSequence s, int start) {
    int j = s.length();
    while (j > start && isBlank(s.charAt(j - 1))) {
      j--;
    }
    return j;
  }

  static String trim(String s) {
    int start = trimStart(s);
    int end = trimEnd(s, start);
    return start == 0 && end == s.length() ? s : s.substring(start, end);
  }

  private static boolean isBlank(char c) {
    return c == ' ' || c == '\t';
  }

  /** true, false, yes, no, t, f, y, n in any letter case; null when not a boolean. */
  static Boolean booleanValue(CharSequence s, int from, int to) {
    int length = to - from;
    if (length == 0 || length > 5) {
      return null;
    }
    char c = Character.toLowerCase(s.charAt(from));
    String word = s.subSequence(from, to).toString();
    switch (c) {
      case 't':
        return length == 1 || word.equalsIgnoreCase("true") ? Boolean.TRUE : null;
      case 'y':
        return length == 1 || word.equalsIgnoreCase("yes") ? Boolean.TRUE : null;
      case 'f':
        return length == 1 || word.equalsIgnoreCase("false") ? Boolean.FALSE : null;
      case 'n':
        return length == 1 || word.equalsIgnoreCase("no") ? Boolean.FALSE : null;
      default:
        return null;
    }
  }
}
