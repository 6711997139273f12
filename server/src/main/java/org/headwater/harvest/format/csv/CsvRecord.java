package org.headwater.harvest.format.csv;

import java.util.List;

/**
 * One record as split by {@link CsvParser}.
 *
 * @param cells the unquoted, unescaped cell values
 * @param start offset of the record's first character in the parsed text
 * @param end offset just past the record's terminator
 */
public record CsvRecord(List<String> cells, int start, int end) {

  public CsvRecord {
    cells = cells instanceof CellArray ? cells : List.copyOf(cells);
  }

  public int width() {
    return cells.size();
  }
}
