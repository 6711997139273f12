package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

class RowCountTest {

  /** A header and {@code rows} invented rows of similar length, then an optional footer. */
  private static String table(int rows, String footer) {
    StringBuilder b = new StringBuilder("id;city;value\n");
    for (int i = 1; i <= rows; i++) {
      b.append(String.format("%06d", i)).append(';').append(i % 2 == 0 ? "K\u00f6ln" : "Graz").append(';')
          .append(i % 100).append(",5\n");
    }
    return b.append(footer).toString();
  }

  @Test
  void countsEveryRowOfAWholeFile() throws Exception {
    byte[] bytes = table(3000, "").getBytes(StandardCharsets.UTF_8);
    CsvSniff s = new CsvSniffer().sniff(bytes, true, bytes.length);
    assertThat(s.rowCount()).isEqualTo(3000);
    assertThat(s.rowCountExact()).isTrue();
    assertThat(s.profiledRows()).isEqualTo(3000);
  }

  @Test
  void countsBeyondTheProfileLimitAndFindsTheFooterAtTheEnd() throws Exception {
    SniffLimits small = new SniffLimits(64 * 1024, 2000, 8 << 20, 100);
    for (Charset charset : new Charset[] {StandardCharsets.UTF_8, StandardCharsets.UTF_16LE}) {
      byte[] bytes = table(5000, "Total;;250000\n").getBytes(charset);
      CsvSniff s = new CsvSniffer(small).sniff(bytes, true, bytes.length);
      assertThat(s.rowCount()).as(charset.name()).isEqualTo(5000);
      assertThat(s.rowCountExact()).isTrue();
      assertThat(s.footerLines()).isEqualTo(1);
      assertThat(s.profiledRows()).isEqualTo(100);
    }
  }

  @Test
  void estimatesTheRowCountFromAHead() throws Exception {
    byte[] all = table(20000, "").getBytes(StandardCharsets.UTF_8);
    byte[] head = Arrays.copyOf(all, 64 * 1024);
    CsvSniff s = new CsvSniffer().sniff(head, false, all.length);
    assertThat(s.rowCountExact()).isFalse();
    // Fixed-width ids and alternating city names keep rows alike in length (the Köln rows one
    // byte longer in UTF-8), so the byte-based estimate lands within 2%.
    assertThat(s.rowCount()).isBetween(19600L, 20400L);
  }

  @Test
  void usesTheSampleRowsWhenTheFileSizeIsUnknown() throws Exception {
    byte[] all = table(50, "").getBytes(StandardCharsets.UTF_8);
    byte[] head = Arrays.copyOf(all, all.length - 3); // cuts the last row
    CsvSniff s = new CsvSniffer().sniff(head, false, -1);
    assertThat(s.rowCount()).isEqualTo(49);
    assertThat(s.rowCountExact()).isFalse();
    assertThat(s.warnings()).contains("row count is the sample's: file size unknown");
  }
}
