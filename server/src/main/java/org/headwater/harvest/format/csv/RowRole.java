package org.headwater.harvest.format.csv;

/** What the first record after the preamble is. */
enum RowRole {
  /** Names the columns. */
  HEADER,
  /** Is the first data row. */
  DATA,
  /** Neither: a line of file-level facts (counts, labels) that happens to fit the width. */
  METADATA
}
