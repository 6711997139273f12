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
    boolean[] seen = new boolean[128];
    for (int i = from; i < to; i++) {
      char c = text.charAt(i);
      if (c < 128) {
        seen[c] = true;
      }
    }
    List<Character> delimiters = new ArrayList<>();
    if (forcedDelimiter != 0) {
      delimiters.add(forcedDelimiter);
    } else {
      for (char d : DELIMITERS.toCharArray()) {
        if (seen[d]) {
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
