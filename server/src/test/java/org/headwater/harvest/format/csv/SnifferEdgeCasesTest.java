package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

class SnifferEdgeCasesTest {

  private static CsvSniff sniff(String text) throws NotDelimitedTextException {
    return Fixtures.sniff(text.getBytes(StandardCharsets.UTF_8));
  }

  @Test
  void readsAHeaderOnlyFileAsHeaderWithNoRows() throws Exception {
    CsvSniff s = sniff("id;name;created\n");
    assertThat(s.header()).isTrue();
    assertThat(s.rowCount()).isZero();
    assertThat(s.columns()).extracting(ColumnProfile::name)
        .containsExactly("id", "name", "created");
  }

  @Test
  void findsTheHeaderOfASingleNumericColumn() throws Exception {
    CsvSniff s = sniff("count\n3\n14\n15\n");
    assertThat(s.header()).isTrue();
    assertThat(s.columns().get(0).type()).isEqualTo(LogicalType.INTEGER);
    assertThat(s.warnings()).contains("one column: no delimiter found");
  }

  @Test
  void sniffsTheRfc4180ExampleWithEmbeddedCrlf() throws Exception {
    // expected: RFC 4180 section 2, rules 3, 6 and 7 together: a header, a quoted CRLF, a
    // doubled quote; two records after the header
    CsvSniff s = sniff("field_name,field_name2,field_name3\r\n\"aaa\",\"b\r\nbb\",\"ccc\"\r\n"
        + "zzz,\"y\"\"y\",xxx\r\n");
    assertThat(s.dialect()).isEqualTo(Dialect.RFC_4180);
    assertThat(s.lineTerminator()).isEqualTo(LineTerminator.CRLF);
    assertThat(s.rowCount()).isEqualTo(2);
    assertThat(s.warnings()).isEmpty();
  }

  @Test
  void sniffsAHeadCutInsideAQuotedField() throws Exception {
    String text = "id,comment\n1,\"fine\"\n2,\"also fine\"\n3,\"long, and cut";
    byte[] head = text.getBytes(StandardCharsets.UTF_8);
    CsvSniff s = new CsvSniffer().sniff(head, false, head.length * 10L);
    assertThat(s.dialect()).isEqualTo(Dialect.RFC_4180);
    assertThat(s.profiledRows()).isEqualTo(2);
    assertThat(s.rowCountExact()).isFalse();
  }

  @Test
  void treatsAHeadAsWholeWhenItIsAsLongAsTheFile() throws Exception {
    byte[] bytes = "a,b\n1,2\n3,4".getBytes(StandardCharsets.UTF_8);
    CsvSniff s = new CsvSniffer().sniff(bytes, false, bytes.length);
    assertThat(s.rowCountExact()).isTrue();
    assertThat(s.rowCount()).isEqualTo(2);
  }

  @Test
  void skipsPaddedTitleRowsExportedFromSpreadsheets() throws Exception {
    CsvSniff s = sniff("Sales report;;;\n;;;\nregion;q1;q2;q3\nNorth;1;2;3\nSouth;4;5;6\n");
    assertThat(s.skipLines()).isEqualTo(2);
    assertThat(s.header()).isTrue();
    assertThat(s.columns().get(0).name()).isEqualTo("region");
  }

  @Test
  void acceptsAPreambleLongerThanTheTable() throws Exception {
    StringBuilder b = new StringBuilder();
    for (int i = 1; i <= 10; i++) {
      b.append("Note ").append(i).append(": invented remarks about the survey\n");
    }
    b.append("site,count\nA,1\nB,2\nC,3\nD,4\n");
    CsvSniff s = sniff(b.toString());
    assertThat(s.skipLines()).isEqualTo(10);
    assertThat(s.header()).isTrue();
    assertThat(s.rowCount()).isEqualTo(4);
  }

  @Test
  void skipsHashCommentLinesBeforeTheTable() throws Exception {
    CsvSniff s = sniff("# source: invented\n# units: metres\nx|y\n1|2\n3|4\n");
    assertThat(s.skipLines()).isEqualTo(2);
    assertThat(s.dialect().delimiter()).isEqualTo('|');
    assertThat(s.header()).isTrue();
  }

  @Test
  void boundsTheScoringSampleOfALongLine() throws Exception {
    char[] wide = new char[200_000];
    Arrays.fill(wide, 'x');
    byte[] head = ("a,b\n1," + new String(wide) + "\n2,y\n").getBytes(StandardCharsets.US_ASCII);
    CsvSniff s = new CsvSniffer().sniff(head, true, head.length);
    assertThat(s.rowCount()).isEqualTo(2);
    assertThat(s.columns().get(1).max()).isEqualTo("y");
  }
}
