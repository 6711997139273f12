package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Decides whether a record names the columns, by comparing each of its cells with the column
 * below it.
 *
 * <p>A cell votes "header" when its column's values are numbers, booleans or dates and the
 * cell is not; and, for text columns, when every value below has one length and the cell
 * another (the test of Python's {@code csv.Sniffer.has_header}, from memory). It votes "data"
 * when it fits its column's type, or repeats a value of its text column. Header votes alone
 * make a header; data votes alone make data. Both at once is what a line of file-level facts
 * looks like, such as "150,4,setosa,versicolor,virginica" above the iris measurements: more
 * header than data votes make it {@link RowRole#METADATA}, to be skipped; a tie is read as a
 * header with numeric names ("id,2020") when those data-like cells are whole numbers, fewer
 * header votes (or a tie with a date or fraction) as a data row with an odd value (our rules).
 */
final class HeaderDetector {

  /** Body rows compared with the candidate: enough for stable types, cheap. */
  private static final int BODY_ROWS = 200;

  /** Values a text column needs before its repetitions say anything about the cell above it. */
  private static final int REPEATED_LABELS_MIN = 8;

  private HeaderDetector() {}

  static RowRole classify(CsvRecord first, List<CsvRecord> following, int width,
      NumberConvention convention) {
    List<CsvRecord> body = new ArrayList<>();
    for (CsvRecord row : following) {
      if (row.width() == width) {
        body.add(row);
        if (body.size() == BODY_ROWS) {
          break;
        }
      }
    }
    if (body.isEmpty()) {
      return looksLikeNames(first) ? RowRole.HEADER : RowRole.DATA;
    }
    int headerVotes = 0;
    int dataVotes = 0;
    int valueVotes = 0;
    for (int column = 0; column < Math.min(first.width(), width); column++) {
      String cell = Cells.trim(first.cells().get(column));
      if (MissingValues.isMissing(cell)) {
        continue;
      }
      ColumnTypeInference inference = new ColumnTypeInference(convention);
      for (CsvRecord row : body) {
        inference.add(row.cells().get(column));
      }
      LogicalType type = inference.type();
      if (type != LogicalType.TEXT) {
        if (ColumnTypeInference.fits(cell, type, convention)) {
          dataVotes++;
          LogicalType own = ColumnTypeInference.typeOf(cell, convention);
          if (own != LogicalType.INTEGER) {
            valueVotes++;
          }
        } else {
          headerVotes++;
        }
        continue;
      }
      if (!inference.hasValues()) {
        headerVotes++; // a name above an empty column
        continue;
      }
      int vote = textVote(cell, column, body);
      if (vote > 0) {
        headerVotes++;
      } else if (vote < 0) {
        dataVotes++;
      }
    }
    if (headerVotes > 0 && dataVotes == 0) {
      return RowRole.HEADER;
    }
    if (headerVotes == 0) {
      return RowRole.DATA;
    }
    if (headerVotes > dataVotes) {
      return RowRole.METADATA;
    }
    // A tie is a header with numeric names ("id,2020") only when the cells that look like
    // data are whole numbers: a date, a time or a fraction is no column name.
    return headerVotes == dataVotes && valueVotes == 0 ? RowRole.HEADER : RowRole.DATA;
  }

  /**
   * +1 header-like, -1 data-like, 0 no opinion, for a cell above a text column. Besides the
   * constant-length test, a cell above a column of repeated labels (at least 8 values, at most
   * half of them distinct) that is not itself one of those labels votes header: a category
   * column names its few values again and again, its name never (our rule).
   */
  private static int textVote(String cell, int column, List<CsvRecord> body) {
    int length = -1;
    boolean constantLength = true;
    Set<String> distinct = new HashSet<>();
    int values = 0;
    for (CsvRecord row : body) {
      String value = Cells.trim(row.cells().get(column));
      if (MissingValues.isMissing(value)) {
        continue;
      }
      if (value.equals(cell)) {
        return -1;
      }
      values++;
      distinct.add(value);
      if (length < 0) {
        length = value.length();
      } else if (value.length() != length) {
        constantLength = false;
      }
    }
    if (constantLength && length >= 0 && cell.length() != length) {
      return 1;
    }
    return values >= REPEATED_LABELS_MIN && distinct.size() * 2 <= values ? 1 : 0;
  }

  /**
   * Whether the record under a header gives units ("m", "degC", "mg/l") rather than data: at
   * least two of its cells stand above columns of numbers or dates without being one, none of
   * them fits its column, and every filled cell is short (at most 16 characters) and no number
   * or date ("n" may pass for a boolean). One odd cell is an odd value, not a units row (our rule).
   */
  static boolean isUnitsRow(CsvRecord candidate, List<CsvRecord> following, int width,
      NumberConvention convention) {
    if (candidate.width() != width) {
      return false;
    }
    List<CsvRecord> body = new ArrayList<>();
    for (CsvRecord row : following) {
      if (row.width() == width) {
        body.add(row);
        if (body.size() == BODY_ROWS) {
          break;
        }
      }
    }
    if (body.size() < 3) {
      return false;
    }
    int unitCells = 0;
    for (int column = 0; column < width; column++) {
      String cell = Cells.trim(candidate.cells().get(column));
      if (cell.isEmpty()) {
        continue;
      }
      ColumnTypeInference own = new ColumnTypeInference(convention);
      own.add(cell);
      if (cell.length() > 16
          || own.type() != LogicalType.TEXT && own.type() != LogicalType.BOOLEAN) {
        return false;
      }
      ColumnTypeInference inference = new ColumnTypeInference(convention);
      for (CsvRecord row : body) {
        inference.add(row.cells().get(column));
      }
      LogicalType type = inference.type();
      if (type == LogicalType.TEXT || type == LogicalType.BOOLEAN) {
        continue;
      }
      if (ColumnTypeInference.fits(cell, type, convention)) {
        return false;
      }
      unitCells++;
    }
    return unitCells >= 2;
  }

  /** A lone record is a header when all its cells are distinct, non-empty and not values. */
  static boolean looksLikeNames(CsvRecord record) {
    Set<String> seen = new HashSet<>();
    for (String raw : record.cells()) {
      String cell = Cells.trim(raw);
      if (cell.isEmpty() || KnownTypes.isKnown(cell) || !seen.add(cell)) {
        return false;
      }
    }
    return !seen.isEmpty();
  }
}
