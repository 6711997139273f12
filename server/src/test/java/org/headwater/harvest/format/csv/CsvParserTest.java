package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;

class CsvParserTest {

  private final CsvParser rfc = new CsvParser(Dialect.RFC_4180);

  @Test
  void splitsRecordsOnCrlf() {
    // expected: RFC 4180 section 2, rule 1 example
    assertThat(rfc.parseAll("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n"))
        .containsExactly(List.of("aaa", "bbb", "ccc"), List.of("zzz", "yyy", "xxx"));
  }

  @Test
  void acceptsLastRecordWithoutLineBreak() {
    // expected: RFC 4180 section 2, rule 2 example
    assertThat(rfc.parseAll("aaa,bbb,ccc\r\nzzz,yyy,xxx"))
        .containsExactly(List.of("aaa", "bbb", "ccc"), List.of("zzz", "yyy", "xxx"));
  }

  @Test
  void keepsSpacesAsPartOfFields() {
    // expected: RFC 4180 section 2, rule 4: "Spaces are considered part of a field"
    assertThat(rfc.parseAll(" aaa , bbb\r\n")).containsExactly(List.of(" aaa ", " bbb"));
  }

  @Test
  void removesEnclosingQuotes() {
    // expected: RFC 4180 section 2, rule 5 example
    assertThat(rfc.parseAll("\"aaa\",\"bbb\",\"ccc\"\r\nzzz,yyy,xxx"))
        .containsExactly(List.of("aaa", "bbb", "ccc"), List.of("zzz", "yyy", "xxx"));
  }

  @Test
  void keepsCrlfInsideQuotedField() {
    // expected: RFC 4180 section 2, rule 6 example
    assertThat(rfc.parseAll("\"aaa\",\"b\r\nbb\",\"ccc\"\r\nzzz,yyy,xxx"))
        .containsExactly(List.of("aaa", "b\r\nbb", "ccc"), List.of("zzz", "yyy", "xxx"));
  }

  @Test
  void unescapesDoubledQuotes() {
    // expected: RFC 4180 section 2, rule 7 example
    assertThat(rfc.parseAll("\"aaa\",\"b\"\"bb\",\"ccc\""))
        .containsExactly(List.of("aaa", "b\"bb", "ccc"));
  }

  @Test
  void keepsCommaInsideQuotedField() {
    // expected: RFC 4180 section 2, rule 6 (commas in fields are enclosed in double quotes)
    assertThat(rfc.parseAll("a,\"b,c\"\n")).containsExactly(List.of("a", "b,c"));
  }

  @Test
  void readsEmptyFieldsIncludingATrailingOne() {
    // expected: RFC 4180 section 2, rule 4 grammar: field = (escaped / non-escaped), and
    // non-escaped may be empty, so "a,,b," has four fields
    assertThat(rfc.parseAll("a,,b,\n")).containsExactly(List.of("a", "", "b", ""));
  }

  @Test
  void endsRecordsOnLoneCarriageReturn() {
    // common practice, no source: old Mac OS files end lines with CR alone
    ParsedRecords parsed = rfc.parse("a,b\r1,2\r", 0, 10, true);
    assertThat(parsed.records()).extracting(CsvRecord::cells)
        .containsExactly(List.of("a", "b"), List.of("1", "2"));
    assertThat(parsed.terminators()).isEqualTo(new TerminatorCounts(0, 0, 2));
  }

  @Test
  void countsTerminatorsOutsideQuotesOnly() {
    ParsedRecords parsed = rfc.parse("a,\"x\ny\"\r\nb,c\n", 0, 10, true);
    assertThat(parsed.terminators()).isEqualTo(new TerminatorCounts(1, 1, 0));
  }

  @Test
  void unescapesBackslashInsideAndOutsideQuotes() {
    // expected: Python csv module, escapechar: "removes any special meaning from the
    // following character" (docs of csv.Dialect.escapechar)
    CsvParser parser = new CsvParser(new Dialect(',', '"', Escape.BACKSLASH));
    assertThat(parser.parseAll("\"say \\\"hi\\\"\",a\\,b,c:\\\\d\n"))
        .containsExactly(List.of("say \"hi\"", "a,b", "c:\\d"));
  }

  @Test
  void treatsBackslashLiterallyWhenDoubledQuotesAreTheEscape() {
    assertThat(rfc.parseAll("\"C:\\temp\",x\n")).containsExactly(List.of("C:\\temp", "x"));
  }

  @Test
  void readsSingleQuotedFieldsWithDoubledSingleQuotes() {
    CsvParser parser = new CsvParser(new Dialect(',', '\'', Escape.DOUBLE));
    assertThat(parser.parseAll("'it''s','a,b'\n")).containsExactly(List.of("it's", "a,b"));
  }

  @Test
  void keepsQuotesLiterallyWithoutQuoteCharacter() {
    CsvParser parser = new CsvParser(new Dialect(';', null, Escape.NONE));
    assertThat(parser.parseAll("\"a\";b\"c\n")).containsExactly(List.of("\"a\"", "b\"c"));
  }

  @Test
  void skipsBlankLines() {
    assertThat(rfc.parseAll("a,b\n\n\r\n1,2\n\n"))
        .containsExactly(List.of("a", "b"), List.of("1", "2"));
  }

  @Test
  void countsQuoteInsideUnquotedFieldAsIrregular() {
    // expected: RFC 4180 section 2, rule 5: "double quotes may not appear inside the fields"
    ParsedRecords parsed = rfc.parse("a,5\"3\n", 0, 10, true);
    assertThat(parsed.records().get(0).cells()).containsExactly("a", "5\"3");
    assertThat(parsed.irregularities()).isEqualTo(1);
  }

  @Test
  void keepsTextAfterClosingQuoteAndCountsItIrregular() {
    ParsedRecords parsed = rfc.parse("\"ab\"cd,e\n", 0, 10, true);
    assertThat(parsed.records().get(0).cells()).containsExactly("abcd", "e");
    assertThat(parsed.irregularities()).isEqualTo(1);
  }

  @Test
  void closesUnterminatedQuoteAtEndOfFile() {
    ParsedRecords parsed = rfc.parse("a,\"bc\nd", 0, 10, true);
    assertThat(parsed.records().get(0).cells()).containsExactly("a", "bc\nd");
    assertThat(parsed.irregularities()).isEqualTo(1);
  }

  @Test
  void leavesOutARecordCutByTheEndOfASample() {
    ParsedRecords parsed = rfc.parse("a,b\n1,\"open\n2", 0, 10, false);
    assertThat(parsed.records()).extracting(CsvRecord::cells).containsExactly(List.of("a", "b"));
    assertThat(parsed.truncated()).isTrue();
    assertThat(parsed.end()).isEqualTo(4);
  }

  @Test
  void forgetsWhatItCountedInARecordCutByTheEndOfASample() {
    ParsedRecords parsed = rfc.parse("a,b\n\"x\"y,\"open", 0, 10, false);
    assertThat(parsed.records()).hasSize(1);
    assertThat(parsed.irregularities()).isZero();
    assertThat(parsed.quotedFields()).isZero();
  }

  @Test
  void countsQuotedFieldsAndNeededEscapes() {
    CsvParser parser = new CsvParser(new Dialect(',', '"', Escape.BACKSLASH));
    ParsedRecords parsed = parser.parse("\"a\\\"b\",c\\d,e\\,f\n", 0, 10, true);
    assertThat(parsed.records().get(0).cells()).containsExactly("a\"b", "cd", "e,f");
    assertThat(parsed.quotedFields()).isEqualTo(1);
    assertThat(parsed.escapes()).isEqualTo(3);
    assertThat(parsed.specialEscapes()).isEqualTo(2); // \" and \, but not \d
  }

  @Test
  void leavesOutALastLineWithoutTerminatorInASample() {
    ParsedRecords parsed = rfc.parse("a,b\n1,2", 0, 10, false);
    assertThat(parsed.records()).hasSize(1);
    assertThat(parsed.truncated()).isTrue();
  }

  @Test
  void stopsAfterMaxRecords() {
    ParsedRecords parsed = rfc.parse("1\n2\n3\n", 0, 2, true);
    assertThat(parsed.records()).extracting(CsvRecord::cells)
        .containsExactly(List.of("1"), List.of("2"));
    assertThat(parsed.end()).isEqualTo(4);
  }

  @Test
  void countsRecordsWithEmbeddedLineBreaksOnce() {
    CsvParser.RecordCount count = rfc.count("h\n\"a\nb\"\nc\n\nd", 0, 2);
    assertThat(count.records()).isEqualTo(4);
    assertThat(count.lastStarts()).containsExactly(8, 11);
  }
}
