package org.headwater.harvest.format.csv;

/** How a quote character is written inside a quoted field. */
public enum Escape {
  /** The quote is doubled, as in RFC 4180 section 2 rule 7. */
  DOUBLE,
  /** A backslash makes the next character literal, inside or outside quotes. */
  BACKSLASH,
  /** No escaping: a quote always ends a quoted field. */
  NONE
}
