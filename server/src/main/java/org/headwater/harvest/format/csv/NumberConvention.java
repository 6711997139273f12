package org.headwater.harvest.format.csv;

import java.util.List;

/**
 * How numbers are written: the decimal separator and the digit-group separator.
 *
 * @param decimal '.' or ','
 * @param group the thousands separator, or {@code null} for none; ' ' stands for the space
 *     family (space, no-break space U+00A0, narrow no-break space U+202F)
 */
public record NumberConvention(char decimal, Character group) {

  public static final NumberConvention PLAIN = new NumberConvention('.', null);
  public static final NumberConvention DECIMAL_COMMA = new NumberConvention(',', null);

  /** The conventions tried, in the order that wins ties when the delimiter is not a comma. */
  static final List<NumberConvention> CANDIDATES = List.of(
      PLAIN,
      DECIMAL_COMMA,
      new NumberConvention('.', ','),
      new NumberConvention(',', '.'),
      new NumberConvention('.', ' '),
      new NumberConvention(',', ' '),
      new NumberConvention('.', '\''));

  boolean isGroup(char c) {
    if (group == null) {
      return false;
    }
    if (group == ' ') {
      return c == ' ' || c == '\u00A0' || c == '\u202F';
    }
    return c == group;
  }
}
