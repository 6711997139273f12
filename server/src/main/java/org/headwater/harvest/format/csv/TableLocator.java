package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.List;

/**
 * Finds the header and the first data row among the records of the scored sample: passes over
 * the preamble ({@link LayoutDetector}), then over up to three metadata lines, and asks
 * {@link HeaderDetector} about the record it stops at.
 */
final class TableLocator {

  /** How many metadata lines may stand between a preamble and the table (our choice). */
  private static final int METADATA_RETRIES = 3;

  private TableLocator() {}

  /**
   * @param text the decoded text
   * @param records the sample's records under the chosen dialect, with offsets in text
   */
  static TableLayout locate(String text, List<CsvRecord> records, int width,
      NumberConvention convention, List<String> warnings) {
    int first = LayoutDetector.preambleRecords(records, width);
    boolean header = false;
    for (int retry = 0; retry <= METADATA_RETRIES && first < records.size(); retry++) {
      RowRole role = HeaderDetector.classify(records.get(first),
          records.subList(first + 1, records.size()), width, convention);
      if (role == RowRole.METADATA && retry < METADATA_RETRIES) {
        first++;
        continue;
      }
      header = role == RowRole.HEADER;
      break;
    }
    CsvRecord shortHeader = header ? null : rowNamesHeader(records, first, width, convention);
    if (shortHeader != null) {
      warnings.add("the header names " + shortHeader.width() + " of " + width + " columns: the "
          + "first column, unnamed, holds row names (as R's write.table writes them)");
      int skipLines = LayoutDetector.physicalLines(text, shortHeader.start());
      List<String> cells = new ArrayList<>(width);
      cells.add("");
      cells.addAll(shortHeader.cells());
      return new TableLayout(width, true, skipLines, shortHeader.end(),
          ColumnNames.fromHeader(cells, width));
    }
    int tableStart = first < records.size() ? records.get(first).start() : text.length();
    int skipLines = LayoutDetector.physicalLines(text, tableStart);
    if (!header) {
      return new TableLayout(width, false, skipLines, tableStart, ColumnNames.generated(width));
    }
    CsvRecord headerRecord = records.get(first);
    if (headerRecord.width() > width) {
      warnings.add("header has " + headerRecord.width() + " names for " + width + " columns");
    }
    int dataStart = headerRecord.end();
    if (first + 1 < records.size() && HeaderDetector.isUnitsRow(records.get(first + 1),
        records.subList(first + 2, records.size()), width, convention)) {
      // Units under the names belong to the header, not to the data.
      warnings.add("line " + (LayoutDetector.physicalLines(text, records.get(first + 1).start()) + 1)
          + " gives units (" + String.join(", ", records.get(first + 1).cells())
          + "), not data");
      dataStart = records.get(first + 1).end();
    }
    return new TableLayout(width, true, skipLines, dataStart,
        ColumnNames.fromHeader(headerRecord.cells(), width));
  }

  /**
   * The record just before the table when it is one cell short and, shifted one column to the
   * right, names the columns: R's write.table with row and column names writes no name above
   * the row names (R's documentation of write.table, col.names; from memory). Null otherwise.
   */
  private static CsvRecord rowNamesHeader(List<CsvRecord> records, int first, int width,
      NumberConvention convention) {
    if (first == 0 || first >= records.size() || width < 2) {
      return null;
    }
    CsvRecord candidate = records.get(first - 1);
    if (candidate.width() != width - 1) {
      return null;
    }
    List<String> shifted = new ArrayList<>(width);
    shifted.add("");
    shifted.addAll(candidate.cells());
    CsvRecord padded = new CsvRecord(shifted, candidate.start(), candidate.end());
    RowRole role = HeaderDetector.classify(padded, records.subList(first, records.size()), width,
        convention);
    return role == RowRole.HEADER && HeaderDetector.looksLikeNames(candidate) ? candidate : null;
  }
}
