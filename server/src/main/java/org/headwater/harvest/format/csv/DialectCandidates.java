package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.List;

/**
 * The dialects worth scoring for a sample: only delimiters, quotes and the backslash that occur
 * in it, so a plain file costs a handful of parses, not the full cross product.
 */
final class DialectCandidates {

  /** Usual delimiters first, then rarer ones; the order also breaks score ties. */
  static final String DELIMITERS = ",;\t|:^~ ";
  /** Quote preference on ties: double quote (RFC 4180), none, single quote. */
  private static final Character[] QUOTES = {'"', null, '\''};

  private DialectCandidates() {}

  /**
   * @param sample the text the dialect will be scored on
   * @param forcedDelimiter a delimiter fixed by a {@code sep=} line, or 0
   */
  static List<Dialect> of(CharSequence sample, char forcedDelimiter) {
    return of(sample, 0, sample.length(), forcedDelimiter);
  }

  /** The candidates for {@code text[from, to)}. */
  static List<Dialect> of(CharSequence text, int from, int to, char forcedDelimiter) {
    boolean[] seen = seen(text, from, to);
    List<Character> delimiters = new ArrayList<>();
    if (forcedDelimiter != 0) {
      delimiters.add(forcedDelimiter);
    } else {
      for (char d : DELIMITERS.toCharArray()) {
        if (seen[d] && !(d == ':' && onlyInClockTimes(text, from, to))) {
          delimiters.add(d);
        }
      }
      if (delimiters.isEmpty()) {
        // One column: the delimiter is never used, report the RFC 4180 one.
        delimiters.add(',');
      }
    }
    List<Dialect> dialects = new ArrayList<>();
    for (char delimiter : delimiters) {
      for (Character quote : QUOTES) {
        if (quote != null && (!seen[quote] || quote == delimiter)) {
          continue;
        }
        dialects.add(new Dialect(delimiter, quote, quote == null ? Escape.NONE : Escape.DOUBLE));
        if (seen['\\']) {
          dialects.add(new Dialect(delimiter, quote, Escape.BACKSLASH));
        }
      }
    }
    return dialects;
  }

  /** Which ASCII characters occur in {@code text[from, to)}, by code. */
  static boolean[] seen(CharSequence text, int from, int to) {
    boolean[] seen = new boolean[128];
    for (int i = from; i < to; i++) {
      char c = text.charAt(i);
      if (c < 128) {
        seen[c] = true;
      }
    }
    return seen;
  }

  /**
   * Whether every ':' sits inside a clock time, two digits on its right and one or two on its left
   * ({@code 9:05}, {@code 10:11:12}). Such a colon separates hours from minutes; scored as a
   * delimiter it cuts each timestamp into numbers, which the type score rewards, and a table with a
   * time column or two would be read as colon-separated (our rule; ISO 8601 section 4.2.2.2 writes
   * hh:mm:ss so).
   */
  static boolean onlyInClockTimes(CharSequence text, int from, int to) {
    boolean any = false;
    for (int i = from; i < to; i++) {
      if (text.charAt(i) != ':') {
        continue;
      }
      any = true;
      boolean right = i + 2 < to && isDigit(text.charAt(i + 1)) && isDigit(text.charAt(i + 2))
          && (i + 3 >= to || !isDigit(text.charAt(i + 3)));
      int left = 0;
      while (left < 3 && i - left - 1 >= from && isDigit(text.charAt(i - left - 1))) {
        left++;
      }
      if (!right || left == 0 || left > 2) {
        return false;
      }
    }
    return any;
  }

  private static boolean isDigit(char c) {
    return c >= '0' && c <= '9';
  }

  static int delimiterRank(char delimiter) {
    int rank = DELIMITERS.indexOf(delimiter);
    return rank < 0 ? DELIMITERS.length() : rank;
  }

  static int quoteRank(Character quote) {
    for (int i = 0; i < QUOTES.length; i++) {
      if (java.util.Objects.equals(QUOTES[i], quote)) {
        return i;
      }
    }
    return QUOTES.length;
  }

  static int escapeRank(Escape escape) {
    return escape == Escape.BACKSLASH ? 1 : 0;
  }
}
