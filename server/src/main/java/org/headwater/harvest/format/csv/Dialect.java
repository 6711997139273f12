package org.headwater.harvest.format.csv;

/**
 * The three choices that decide how delimited text splits into cells.
 *
 * @param delimiter the field separator
 * @param quote the quote character, or {@code null} when fields are never quoted
 * @param escape how a quote (or any character, for backslash) is escaped
 */
public record Dialect(char delimiter, Character quote, Escape escape) {

  /** RFC 4180: comma, double quote, doubled quotes. */
  public static final Dialect RFC_4180 = new Dialect(',', '"', Escape.DOUBLE);

  public Dialect {
    if (escape == null) {
      throw new IllegalArgumentException("escape must not be null; use Escape.NONE");
    }
    if (quote != null && quote == delimiter) {
      throw new IllegalArgumentException("quote and delimiter must differ");
    }
  }

  boolean isQuote(char c) {
    return quote != null && quote == c;
  }
}
