package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import org.headwater.harvest.format.FileSniffer;
import org.junit.jupiter.api.Test;

/**
 * Traits of files in real folders that the held-out corpus (see {@link HeldOutCorpusScoreTest}) showed the
 * sniffer missing, one small fixture each under src/test/resources/csv. Expected values follow from how each
 * fixture was written.
 */
class FolderTraitsTest {

  private static CsvSniff sniff(String fixture) throws NotDelimitedTextException {
    return Fixtures.sniff(Fixtures.bytes(fixture));
  }

  private static List<String> names(CsvSniff s) {
    return s.columns().stream().map(ColumnProfile::name).toList();
  }

  private static List<LogicalType> types(CsvSniff s) {
    return s.columns().stream().map(ColumnProfile::type).toList();
  }

  @Test
  void readsTheHeaderOfRsWriteTableThatIsOneCellShortOverTheRowNames() throws Exception {
    // Written by R 4.2 with write.table(d, "r_write_table.txt") and its defaults: sep=" ", quote=TRUE,
    // row.names=TRUE, col.names=TRUE, which puts no name above the row names (R's documentation of
    // write.table: col.names=NA adds a blank one, as write.csv does; from memory).
    CsvSniff s = sniff("r_write_table.txt");
    assertThat(s.dialect()).isEqualTo(new Dialect(' ', '"', Escape.DOUBLE));
    assertThat(s.header()).isTrue();
    assertThat(s.skipLines()).isZero();
    assertThat(names(s)).containsExactly("column_1", "keeper", "depth", "visits", "seen");
    assertThat(types(s)).containsExactly(LogicalType.INTEGER, LogicalType.TEXT, LogicalType.DECIMAL,
        LogicalType.INTEGER, LogicalType.DATE);
    assertThat(s.rowCount()).isEqualTo(5);
    assertThat(s.columns().get(2).nullCount()).isEqualTo(1); // R writes NA for a missing number
    assertThat(s.warnings()).anyMatch(w -> w.startsWith("the header names 4 of 5 columns"));
  }

  @Test
  void leavesAUnitsRowUnderTheHeaderOutOfTheData() throws Exception {
    CsvSniff s = sniff("units_row.csv");
    assertThat(s.header()).isTrue();
    assertThat(names(s)).containsExactly("keeper", "depth", "temperature", "count");
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.DECIMAL, LogicalType.DECIMAL,
        LogicalType.INTEGER);
    assertThat(s.rowCount()).isEqualTo(4);
    assertThat(s.warnings()).anyMatch(w -> w.equals("line 2 gives units (, m, degC, n), not data"));
  }

  @Test
  void anOddValueInTheFirstRowIsNoUnitsRow() throws Exception {
    // One non-number above a number column is an odd value: the row stays data and the column text.
    byte[] bytes = "keeper,depth,count\nIlsa,deep,3\nTavi,2.75,10\nQuen,0.5,7\nVang,4.25,1\n"
        .getBytes(StandardCharsets.UTF_8);
    CsvSniff s = Fixtures.sniff(bytes);
    assertThat(s.rowCount()).isEqualTo(4);
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.TEXT, LogicalType.INTEGER);
  }

  @Test
  void dropsTheEmptyColumnThatATrailingDelimiterOnEveryLineMakes() throws Exception {
    CsvSniff s = sniff("trailing_delimiter.csv");
    assertThat(s.dialect().delimiter()).isEqualTo(';');
    assertThat(names(s)).containsExactly("keeper", "depth", "visits");
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.DECIMAL, LogicalType.INTEGER);
    assertThat(s.decimalSeparator()).isEqualTo(',');
    assertThat(s.rowCount()).isEqualTo(4);
  }

  @Test
  void keepsANamedLastColumnThatIsEmpty() throws Exception {
    byte[] bytes = "keeper,visits,note\nIlsa,3,\nTavi,10,\nQuen,7,\n".getBytes(StandardCharsets.UTF_8);
    assertThat(names(Fixtures.sniff(bytes))).containsExactly("keeper", "visits", "note");
  }

  @Test
  void readsOneColumnOfValuesWithSpacesAsOneColumnNotSplitAtSpaces() throws Exception {
    // A category column: its few labels repeat, its name does not (the header rule of HeaderDetector).
    CsvSniff s = sniff("one_column.csv");
    assertThat(s.columns()).hasSize(1);
    assertThat(s.header()).isTrue();
    assertThat(names(s)).containsExactly("pond");
    assertThat(s.rowCount()).isEqualTo(8);
    assertThat(s.dialect().delimiter()).isEqualTo(','); // the first of , ; tab | absent from the file
  }

  @Test
  void countsMissingTokensInAnyCaseAndALoneDotAsMissing() throws Exception {
    // na, n/a, Na, NULL, nan and "." are placeholders for missing values that spreadsheets, R, pandas and
    // statistics packages write (SAS and Stata print "." for a missing number): common practice, no source.
    CsvSniff s = sniff("missing_mixed.csv");
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.INTEGER, LogicalType.DECIMAL);
    assertThat(s.columns().get(1).nullCount()).isEqualTo(4);
    assertThat(s.columns().get(2).nullCount()).isEqualTo(3);
  }

  @Test
  void aFirstRowWithATimestampWhereANameWouldBeIsData() throws Exception {
    CsvSniff s = sniff("headerless_timestamps.csv");
    assertThat(s.header()).isFalse();
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.TIMESTAMP, LogicalType.TIMESTAMP);
    assertThat(s.rowCount()).isEqualTo(5);
  }

  @Test
  void aHeaderOfYearsAboveNumbersIsStillAHeader() throws Exception {
    // "keeper,2020": a whole number may name a column (a tie of votes stays a header).
    byte[] bytes = "keeper,2020\nIlsa,3\nTavi,10\nQuen,7\n".getBytes(StandardCharsets.UTF_8);
    CsvSniff s = Fixtures.sniff(bytes);
    assertThat(s.header()).isTrue();
    assertThat(names(s)).containsExactly("keeper", "2020");
  }

  @Test
  void takesAHeaderlessTextOnlyTxtSplitAtBarsForATable() {
    byte[] bytes = Fixtures.bytes("pipes_text_only.txt");
    Map<String, Object> r = FileSniffer.sniff("pipes_text_only.txt", bytes, true, bytes.length);
    assertThat(r.get("format")).isEqualTo("csv");
    assertThat(r.get("delimiter")).isEqualTo("|");
    assertThat(r.get("header")).isEqualTo(false);
    assertThat(r.get("row_count")).isEqualTo(5L);
  }

  @Test
  void leavesAHeaderlessTextOnlyTxtSplitAtCommasAsText() {
    byte[] bytes = ("Hild, outer sluice, reed bed\nTavi, weed mat, north inlet\nQuen, gravel, east pond\n")
        .getBytes(StandardCharsets.UTF_8);
    assertThat(FileSniffer.sniff("notes.txt", bytes, true, bytes.length).get("format")).isEqualTo("text");
  }
}
