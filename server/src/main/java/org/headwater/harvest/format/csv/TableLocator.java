package org.headwater.harvest.format.csv;

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
    int tableStart = first < records.size() ? records.get(first).start() : text.length();
    int skipLines = LayoutDetector.physicalLines(text, tableStart);
    if (!header) {
      return new TableLayout(width, false, skipLines, tableStart, ColumnNames.generated(width));
    }
    CsvRecord headerRecord = records.get(first);
    if (headerRecord.width() > width) {
      warnings.add("header has " + headerRecord.width() + " names for " + width + " columns");
    }
    return new TableLayout(width, true, skipLines, headerRecord.end(),
        ColumnNames.fromHeader(headerRecord.cells(), width));
  }
}
