package org.headwater.harvest.format.csv;

/** The bytes are not delimited text (empty, binary, or no consistent table in them). */
public final class NotDelimitedTextException extends Exception {

  /** Why the input was refused. */
  public enum Reason {
    /** No bytes, or only blank lines. */
    EMPTY,
    /** Zero bytes or control characters that text does not have. */
    BINARY,
    /** Text, but no dialect splits it into rows of a steady width. */
    NOT_TABULAR,
    /** A fault in the detector itself; reported so that one file cannot stop a harvest. */
    UNEXPECTED
  }

  private final Reason reason;

  public NotDelimitedTextException(Reason reason, String message) {
    super(message);
    this.reason = reason;
  }

  public NotDelimitedTextException(Reason reason, String message, Throwable cause) {
    super(message, cause);
    this.reason = reason;
  }

  public Reason reason() {
    return reason;
  }
}
