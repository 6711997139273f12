package org.headwater.harvest.format.csv;

/** How many line breaks of each kind ended records (never those inside quoted fields). */
public record TerminatorCounts(long lf, long crlf, long cr) {

  /** The most frequent terminator; LF wins ties with CRLF, CRLF with CR. */
  public LineTerminator dominant() {
    if (lf == 0 && crlf == 0 && cr == 0) {
      return LineTerminator.NONE;
    }
    if (lf >= crlf && lf >= cr) {
      return LineTerminator.LF;
    }
    return crlf >= cr ? LineTerminator.CRLF : LineTerminator.CR;
  }

  public boolean mixed() {
    int kinds = (lf > 0 ? 1 : 0) + (crlf > 0 ? 1 : 0) + (cr > 0 ? 1 : 0);
    return kinds > 1;
  }
}
