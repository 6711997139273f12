package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.time.format.DateTimeFormatter;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The sniffer on small invented files under src/test/resources/csv, each with one kind of
 * mess. The expected values follow from how each fixture was written (its preamble, its
 * separators, its dates), not from running the sniffer.
 */
class MessyFilesTest {

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
  void skipsTitleLinesBeforeTheHeader() throws Exception {
    CsvSniff s = sniff("preamble.csv");
    assertThat(s.dialect()).isEqualTo(new Dialect(',', '"', Escape.DOUBLE));
    assertThat(s.skipLines()).isEqualTo(3); // two title lines and a blank line
    assertThat(s.header()).isTrue();
    assertThat(names(s)).containsExactly("region", "quarter", "revenue");
    assertThat(types(s)).containsExactly(LogicalType.TEXT, LogicalType.TEXT, LogicalType.DECIMAL);
    assertThat(s.rowCount()).isEqualTo(4);
    assertThat(s.rowCountExact()).isTrue();
  }

  @Test
  void takesTheDelimiterFromAnExcelSepLine() throws Exception {
    CsvSniff s = sniff("sep_line.csv");
    assertThat(s.dialect().delimiter()).isEqualTo(';');
    assertThat(s.skipLines()).isEqualTo(1);
    assertThat(s.header()).isTrue();
    assertThat(s.decimalSeparator()).isEqualTo(',');
    ColumnProfile score = s.columns().get(2);
    assertThat(score.type()).isEqualTo(LogicalType.DECIMAL);
    assertThat(score.min()).isEqualTo("6,25");
    assertThat(score.max()).isEqualTo("8,0");
  }

  @Test
  void namesColumnsOfAHeaderlessNumericFile() throws Exception {
    CsvSniff s = sniff("headerless.csv");
    assertThat(s.header()).isFalse();
    assertThat(s.skipLines()).isZero();
    assertThat(names(s)).containsExactly("column_1", "column_2", "column_3");
    assertThat(types(s)).containsExactly(LogicalType.INTEGER, LogicalType.DECIMAL, LogicalType.DATE);
    assertThat(s.columns().get(2).datePattern()).isEqualTo("yyyy-MM-dd");
    assertThat(s.rowCount()).isEqualTo(4);
  }

  @Test
  void detectsSemicolonDelimiterWithDecimalCommasAndDotThousands() throws Exception {
    CsvSniff s = sniff("decimal_comma.csv");
    assertThat(s.dialect().delimiter()).isEqualTo(';');
    assertThat(s.decimalSeparator()).isEqualTo(',');
    assertThat(s.thousandsSeparator()).isEqualTo('.');
    assertThat(types(s)).containsExactly(
        LogicalType.DATE, LogicalType.TEXT, LogicalType.INTEGER, LogicalType.DECIMAL);
    assertThat(s.columns().get(0).datePattern()).isEqualTo("dd.MM.yyyy");
    ColumnProfile quantity = s.columns().get(2);
    assertThat(quantity.min()).isEqualTo("40");
    assertThat(quantity.max()).isEqualTo("2.500");
    assertThat(s.columns().get(0).min()).isEqualTo("01.02.2023");
    assertThat(s.columns().get(0).max()).isEqualTo("13.03.2023");
  }

  @Test
  void readsQuotedThousandsSeparatorsInACommaFile() throws Exception {
    CsvSniff s = sniff("thousands.csv");
    assertThat(s.dialect()).isEqualTo(Dialect.RFC_4180);
    assertThat(s.decimalSeparator()).isEqualTo('.');
    assertThat(s.thousandsSeparator()).isEqualTo(',');
    ColumnProfile population = s.columns().get(1);
    assertThat(population.type()).isEqualTo(LogicalType.INTEGER);
    assertThat(population.min()).isEqualTo("12,000");
    assertThat(population.max()).isEqualTo("1,234,567");
  }

  @Test
  void detectsCarriageReturnOnlyLineEndings() throws Exception {
    CsvSniff s = Fixtures.sniff(Fixtures.withTerminator("headerless.csv", "\r"));
    assertThat(s.lineTerminator()).isEqualTo(LineTerminator.CR);
    assertThat(s.rowCount()).isEqualTo(4);
    assertThat(s.columns()).hasSize(3);
  }

  @Test
  void detectsCrlfLineEndings() throws Exception {
    CsvSniff s = Fixtures.sniff(Fixtures.withTerminator("preamble.csv", "\r\n"));
    assertThat(s.lineTerminator()).isEqualTo(LineTerminator.CRLF);
    assertThat(s.skipLines()).isEqualTo(3);
  }

  @Test
  void readsUtf16WithBom() throws Exception {
    for (Charset charset : List.of(StandardCharsets.UTF_16LE, StandardCharsets.UTF_16BE)) {
      CsvSniff s = Fixtures.sniff(Fixtures.encoded("decimal_comma.csv", charset, true));
      assertThat(s.encodingName()).isEqualTo(charset.name().toLowerCase(java.util.Locale.ROOT));
      assertThat(s.bom()).isTrue();
      assertThat(s.dialect().delimiter()).isEqualTo(';');
      assertThat(s.columns().get(1).max()).isEqualTo("Winkel");
      assertThat(s.rowCount()).isEqualTo(4);
    }
  }

  @Test
  void readsLatin1Accents() throws Exception {
    CsvSniff s = Fixtures.sniff(Fixtures.encoded("accents.csv", StandardCharsets.ISO_8859_1, false));
    assertThat(s.encodingName()).isEqualTo("iso-8859-1");
    assertThat(names(s)).containsExactly("nom", "ville", "n\u00e9_le");
    assertThat(s.columns().get(0).min()).isEqualTo("Fran\u00e7ois");
    assertThat(s.columns().get(0).max()).isEqualTo("Zo\u00eb");
    assertThat(s.warnings()).anyMatch(w -> w.startsWith("encoding iso-8859-1 is a guess"));
  }

  @Test
  void detectsTabsInATxtFile() throws Exception {
    CsvSniff s = sniff("measurements.txt");
    assertThat(s.dialect().delimiter()).isEqualTo('\t');
    assertThat(s.header()).isTrue();
    assertThat(names(s)).containsExactly("station", "date", "temp_c", "wind");
    assertThat(types(s)).containsExactly(
        LogicalType.TEXT, LogicalType.DATE, LogicalType.DECIMAL, LogicalType.TEXT);
  }

  @Test
  void detectsSingleQuoteAsQuoteCharacter() throws Exception {
    CsvSniff s = sniff("single_quote.csv");
    assertThat(s.dialect()).isEqualTo(new Dialect(',', '\'', Escape.DOUBLE));
    assertThat(new CsvParser(s.dialect()).parseAll(Fixtures.text("single_quote.csv")).get(2))
        .containsExactly("2", "blue", "it's");
  }

  @Test
  void detectsBackslashEscapes() throws Exception {
    CsvSniff s = sniff("backslash.csv");
    assertThat(s.dialect()).isEqualTo(new Dialect(',', '"', Escape.BACKSLASH));
    List<List<String>> rows = new CsvParser(s.dialect()).parseAll(Fixtures.text("backslash.csv"));
    assertThat(rows.get(1)).containsExactly("1", "He said \"hi\"");
    assertThat(rows.get(2)).containsExactly("2", "path C:\\temp");
  }

  @Test
  void separatesTotalAndCommentFooterLines() throws Exception {
    CsvSniff s = sniff("footer.csv");
    assertThat(s.footerLines()).isEqualTo(2);
    assertThat(s.rowCount()).isEqualTo(3);
    assertThat(s.columns().get(1).max()).isEqualTo("5"); // the total, 10, is not data
  }

  @Test
  void treatsMinus999AsMissingOnlyInAColumnNeverOtherwiseNegative() throws Exception {
    CsvSniff s = sniff("sentinel.csv");
    ColumnProfile depth = s.columns().get(1);
    assertThat(depth.nullCount()).isEqualTo(1);
    assertThat(depth.min()).isEqualTo("10");
    assertThat(depth.max()).isEqualTo("40");
    ColumnProfile temp = s.columns().get(2);
    assertThat(temp.nullCount()).isZero();
    assertThat(temp.min()).isEqualTo("-999");
    assertThat(s.warnings()).anyMatch(w -> w.startsWith("column depth_m: 1 cell(s) [-999]"));
    assertThat(s.warnings()).noneMatch(w -> w.startsWith("column temp"));
  }

  @Test
  void countsMissingValueTokensAsNulls() throws Exception {
    CsvSniff s = sniff("missing_tokens.csv");
    ColumnProfile value = s.columns().get(1);
    assertThat(value.type()).isEqualTo(LogicalType.INTEGER);
    assertThat(value.nullCount()).isEqualTo(4);
    assertThat(value.nullable()).isTrue();
    assertThat(value.min()).isEqualTo("7");
    assertThat(value.distinctEstimate()).isEqualTo(1);
    ColumnProfile flag = s.columns().get(2);
    assertThat(flag.type()).isEqualTo(LogicalType.BOOLEAN);
    assertThat(flag.nullCount()).isEqualTo(1);
    assertThat(flag.min()).isEqualTo("false");
    assertThat(flag.max()).isEqualTo("true");
    assertThat(s.columns().get(0).nullable()).isFalse();
  }

  @Test
  void deduplicatesRepeatedAndEmptyHeaderNames() throws Exception {
    CsvSniff s = sniff("duplicate_names.csv");
    assertThat(names(s)).containsExactly("id", "name", "name_2", "column_4", "value");
  }

  @Test
  void findsTimestampAndDayFirstDatePatternsThatJavaTimeParses() throws Exception {
    CsvSniff s = sniff("temporal.csv");
    ColumnProfile created = s.columns().get(1);
    ColumnProfile day = s.columns().get(2);
    assertThat(created.type()).isEqualTo(LogicalType.TIMESTAMP);
    assertThat(created.datePattern()).isEqualTo("yyyy-MM-dd'T'HH:mm:ssXXX");
    assertThat(day.type()).isEqualTo(LogicalType.DATE);
    assertThat(day.datePattern()).isEqualTo("dd/MM/yyyy");
    // expected: java.time, the JDK's reference implementation of these patterns, reads every
    // value with the reported pattern
    List<List<String>> rows = new CsvParser(s.dialect()).parseAll(Fixtures.text("temporal.csv"));
    for (List<String> row : rows.subList(1, rows.size())) {
      DateTimeFormatter.ofPattern(created.datePattern()).parse(row.get(1));
      DateTimeFormatter.ofPattern(day.datePattern()).parse(row.get(2));
    }
    // 2023-01-04T09:05:00-05:00 is 14:05Z, the latest instant of the three
    assertThat(created.max()).isEqualTo("2023-01-04T09:05:00-05:00");
    assertThat(created.min()).isEqualTo("2023-01-02T10:15:30Z");
    assertThat(day.min()).isEqualTo("25/12/2020");
    assertThat(day.max()).isEqualTo("01/02/2021");
  }
}
