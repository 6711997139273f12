package org.headwater.harvest.format.csv;

/** The line break that ends records outside quoted fields. */
public enum LineTerminator {
  LF("\n"),
  CRLF("\r\n"),
  CR("\r"),
  /** The sample held a single line without any line break. */
  NONE("");

  private final String chars;

  LineTerminator(String chars) {
    this.chars = chars;
  }

  /** The characters of this terminator. */
  public String chars() {
    return chars;
  }
}
