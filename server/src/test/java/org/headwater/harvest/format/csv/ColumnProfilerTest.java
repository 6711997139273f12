package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

class ColumnProfilerTest {

  private static CsvSniff sniff(String text) throws NotDelimitedTextException {
    return Fixtures.sniff(text.getBytes(StandardCharsets.UTF_8));
  }

  @Test
  void estimatesManyDistinctValuesWithinTheSketchError() throws Exception {
    StringBuilder b = new StringBuilder("key,group\n");
    for (int i = 0; i < 20_000; i++) {
      b.append("k").append(i).append(',').append(i % 7).append('\n');
    }
    CsvSniff s = sniff(b.toString());
    // expected: HyperLogLog's relative standard error is 1.04 / sqrt(m) (Flajolet, Fusy,
    // Gandouet and Meunier, 2007); with m = 2^12 that is 1.6%, so 5% is over three errors
    assertThat(s.columns().get(0).distinctEstimate()).isBetween(19_000L, 21_000L);
    // small counts are exact in the sketch's list mode (DataSketches HLL documentation)
    assertThat(s.columns().get(1).distinctEstimate()).isEqualTo(7);
  }

  @Test
  void ordersNumbersByValueNotByText() throws Exception {
    CsvSniff s = sniff("n\n9\n10\n-2.5\n100\n");
    ColumnProfile n = s.columns().get(0);
    assertThat(n.type()).isEqualTo(LogicalType.DECIMAL);
    assertThat(n.min()).isEqualTo("-2.5");
    assertThat(n.max()).isEqualTo("100");
  }

  @Test
  void keepsLeadingZeroCodesAsText() throws Exception {
    CsvSniff s = sniff("zip,city\n08123,Anytown\n10115,Berlin\n");
    assertThat(s.columns().get(0).type()).isEqualTo(LogicalType.TEXT);
  }

  @Test
  void warnsWhenDayAndMonthOrderIsAmbiguous() throws Exception {
    CsvSniff s = sniff("id,day\n1,03/04/2021\n2,05/06/2021\n");
    assertThat(s.columns().get(1).datePattern()).isEqualTo("dd/MM/yyyy");
    assertThat(s.warnings()).contains(
        "column day: day and month order is ambiguous (no day above 12); assumed dd/MM/yyyy");
  }

  @Test
  void readsMonthFirstDatesWhenADayExceedsTwelve() throws Exception {
    CsvSniff s = sniff("id,day\n1,03/04/2021\n2,12/31/2021\n");
    assertThat(s.columns().get(1).datePattern()).isEqualTo("MM/dd/yyyy");
    assertThat(s.columns().get(1).max()).isEqualTo("12/31/2021");
  }

  @Test
  void reportsUnpaddedDateFieldsWithSingleLetters() throws Exception {
    CsvSniff s = sniff("id,day\n1,3.4.2021\n2,15.12.2021\n");
    String pattern = s.columns().get(1).datePattern();
    assertThat(pattern).isEqualTo("d.M.yyyy");
    // expected: java.time reads both values with it (DateTimeFormatter pattern letters)
    java.time.format.DateTimeFormatter f = java.time.format.DateTimeFormatter.ofPattern(pattern);
    assertThat(java.time.LocalDate.parse("3.4.2021", f)).isEqualTo("2021-04-03");
    assertThat(java.time.LocalDate.parse("15.12.2021", f)).isEqualTo("2021-12-15");
  }

  @Test
  void makesMixedDatesAndTimestampsText() throws Exception {
    CsvSniff s = sniff("id,when\n1,2021-01-01\n2,2021-01-01T10:00:00\n");
    assertThat(s.columns().get(1).type()).isEqualTo(LogicalType.TEXT);
    assertThat(s.columns().get(1).datePattern()).isNull();
  }

  @Test
  void countsCellsMissingFromShortRowsAsNulls() throws Exception {
    CsvSniff s = sniff("a,b,c\n1,2,3\n4,5\n6,7,8\n9,10,11\n");
    assertThat(s.columns().get(2).nullCount()).isEqualTo(1);
    assertThat(s.warnings()).contains("1 data row(s) do not have 3 cells");
  }

  @Test
  void leavingOutValuesOrDistinctCountsChangesNothingElse() throws Exception {
    // The sampling-off harvest skips reading numbers and dates a second time; everything else it
    // reports (types, nulls, sentinels, distinct counts, warnings) must equal the full profile.
    CsvSniffer sniffer = new CsvSniffer();
    List<byte[]> files = new java.util.ArrayList<>();
    try (Stream<Path> walk = Files.list(Fixtures.csvDir())) {
      for (Path file : walk.filter(Files::isRegularFile).sorted().toList()) {
        files.add(Files.readAllBytes(file));
      }
    }
    // Generated columns where only cells that do not start with a digit decide: sentinels in a
    // column never otherwise negative, sentinels beside real negatives, signs, leading dots,
    // decimal commas (invented data).
    Random random = new Random(20261202L);
    for (int f = 0; f < 60; f++) {
      boolean comma = f % 3 == 0;
      StringBuilder b = new StringBuilder(comma ? "depth;reading;level;on\n" : "depth,reading,level,on\n");
      for (int r = 0; r < 30 + random.nextInt(60); r++) {
        String depth = switch (random.nextInt(6)) {
          case 0 -> "-999";
          case 1 -> f % 2 == 0 ? "-9999" : "+" + random.nextInt(50);
          case 2 -> f % 4 == 1 ? "-" + random.nextInt(50) : "" + random.nextInt(50);
          default -> "" + random.nextInt(500);
        };
        String reading = (random.nextBoolean() ? "." : "0" + (comma ? "," : ".")) + random.nextInt(99);
        String level = random.nextInt(10) == 0 ? "NA" : "" + (random.nextInt(2000) - (f % 5 == 0 ? 1000 : 0));
        String on = "2026-0" + (1 + random.nextInt(9)) + "-1" + random.nextInt(10);
        b.append(String.join(comma ? ";" : ",", depth, reading, level, on)).append('\n');
      }
      files.add(b.toString().getBytes(StandardCharsets.UTF_8));
    }
    for (byte[] bytes : files) {
      CsvSniff full;
      try {
        full = sniffer.sniff(bytes, true, bytes.length, ShapeMemory.NONE, ColumnStats.ALL);
      } catch (NotDelimitedTextException e) {
        continue;
      }
      CsvSniff noValues = sniffer.sniff(bytes, true, bytes.length, ShapeMemory.NONE, ColumnStats.NO_VALUES);
      CsvSniff typesOnly =
          sniffer.sniff(bytes, true, bytes.length, ShapeMemory.NONE, ColumnStats.TYPES_AND_NULLS);
      assertThat(noValues.columns()).isEqualTo(full.columns().stream()
          .map(c -> new ColumnProfile(c.name(), c.type(), c.datePattern(), c.nullCount(), null, null,
              c.distinctEstimate(), c.nullable()))
          .toList());
      assertThat(typesOnly.columns()).isEqualTo(full.columns().stream()
          .map(c -> new ColumnProfile(c.name(), c.type(), c.datePattern(), c.nullCount(), null, null,
              -1, c.nullable()))
          .toList());
      for (CsvSniff lean : List.of(noValues, typesOnly)) {
        assertThat(lean.warnings()).isEqualTo(full.warnings());
        assertThat(lean.rowCount()).isEqualTo(full.rowCount());
      }
    }
    assertThat(files).hasSizeGreaterThan(70);
  }
}
