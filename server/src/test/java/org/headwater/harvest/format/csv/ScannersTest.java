package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class ScannersTest {

  private static int number(String s, NumberConvention c) {
    return NumberScanner.scan(s, 0, s.length(), c);
  }

  private static final NumberConvention COMMA_GROUPS = new NumberConvention('.', ',');
  private static final NumberConvention GERMAN = new NumberConvention(',', '.');

  @Test
  void readsIntegersDecimalsAndExponents() {
    assertThat(NumberScanner.kind(number("42", NumberConvention.PLAIN))).isEqualTo(NumberScanner.INTEGER);
    assertThat(NumberScanner.kind(number("-0.5", NumberConvention.PLAIN))).isEqualTo(NumberScanner.DECIMAL);
    assertThat(NumberScanner.kind(number("+.5", NumberConvention.PLAIN))).isEqualTo(NumberScanner.DECIMAL);
    // expected: Java's Double.parseDouble grammar (JLS 3.10.2) accepts 6.02e23 and 1E-9
    assertThat(NumberScanner.kind(number("6.02e23", NumberConvention.PLAIN))).isEqualTo(NumberScanner.DECIMAL);
    assertThat(NumberScanner.kind(number("1E-9", NumberConvention.PLAIN))).isEqualTo(NumberScanner.DECIMAL);
    assertThat(number("1e", NumberConvention.PLAIN)).isEqualTo(NumberScanner.NONE);
    assertThat(number("-", NumberConvention.PLAIN)).isEqualTo(NumberScanner.NONE);
    assertThat(number("1.2.3", NumberConvention.PLAIN)).isEqualTo(NumberScanner.NONE);
  }

  @Test
  void acceptsDigitGroupsOnlyInThrees() {
    assertThat(NumberScanner.has(number("1,234,567.5", COMMA_GROUPS), NumberScanner.GROUPED)).isTrue();
    assertThat(number("12,34", COMMA_GROUPS)).isEqualTo(NumberScanner.NONE);
    assertThat(number("1234,567", COMMA_GROUPS)).isEqualTo(NumberScanner.NONE);
    assertThat(number(",123", COMMA_GROUPS)).isEqualTo(NumberScanner.NONE);
    assertThat(NumberScanner.kind(number("1.234,5", GERMAN))).isEqualTo(NumberScanner.DECIMAL);
    assertThat(NumberScanner.normalize("-1.234,5", 0, 8, GERMAN)).isEqualTo("-1234.5");
    NumberConvention spaces = new NumberConvention(',', ' ');
    // common practice, no source: French typography groups with a narrow no-break space
    assertThat(NumberScanner.kind(number("1\u202F234,5", spaces))).isEqualTo(NumberScanner.DECIMAL);
  }

  @Test
  void flagsLeadingZeroIntegersButNotFractions() {
    assertThat(NumberScanner.has(number("08123", NumberConvention.PLAIN), NumberScanner.LEADING_ZERO)).isTrue();
    assertThat(NumberScanner.has(number("0.5", NumberConvention.PLAIN), NumberScanner.LEADING_ZERO)).isFalse();
    assertThat(NumberScanner.has(number("0", NumberConvention.PLAIN), NumberScanner.LEADING_ZERO)).isFalse();
  }

  private static TemporalShape temporal(String s) {
    return TemporalScanner.scan(s, 0, s.length());
  }

  @Test
  void readsIsoDatesAndRejectsImpossibleOnes() {
    // expected: ISO 8601 calendar dates; 2024 is a leap year, 2023 is not (Gregorian rule)
    assertThat(temporal("2024-02-29").orders()).isEqualTo(TemporalShape.YMD);
    assertThat(temporal("2023-02-29")).isNull();
    assertThat(temporal("2023-13-01")).isNull();
    assertThat(temporal("2023-1-5").kind()).isEqualTo(TemporalShape.DATE);
  }

  @Test
  void keepsBothOrdersForAmbiguousDayMonthDates() {
    assertThat(temporal("03/04/2021").orders()).isEqualTo(TemporalShape.DMY | TemporalShape.MDY);
    assertThat(temporal("13/04/2021").orders()).isEqualTo(TemporalShape.DMY);
    assertThat(temporal("04/13/2021").orders()).isEqualTo(TemporalShape.MDY);
  }

  @Test
  void readsIso8601TimestampsWithFractionsAndOffsets() {
    // expected: ISO 8601 / RFC 3339 section 5.6 date-time forms
    TemporalShape t = temporal("2023-01-02T10:15:30.125+01:00");
    assertThat(t.kind()).isEqualTo(TemporalShape.TIMESTAMP);
    assertThat(t.fractionDigits()).isEqualTo(3);
    assertThat(t.nanos()).isEqualTo(125_000_000);
    assertThat(t.offsetSeconds()).isEqualTo(3600);
    assertThat(temporal("2023-01-02 10:15").kind()).isEqualTo(TemporalShape.TIMESTAMP);
    assertThat(temporal("2023-01-02T25:00")).isNull();
    assertThat(temporal("10:15:00").kind()).isEqualTo(TemporalShape.TIME);
    assertThat(temporal("2023-01-02X")).isNull();
  }

  @Test
  void recognisesMissingValueTokens() {
    for (String token : new String[] {"", "NA", "N/A", "n/a", "NULL", "null", "NaN", "#N/A", "-"}) {
      assertThat(MissingValues.isMissing(token)).as(token).isTrue();
    }
    assertThat(MissingValues.isMissing("none")).isFalse();
    assertThat(MissingValues.isMissing("-999")).isFalse();
  }

  @Test
  void recognisesBooleanWords() {
    assertThat(Cells.booleanValue("TRUE", 0, 4)).isTrue();
    assertThat(Cells.booleanValue("no", 0, 2)).isFalse();
    assertThat(Cells.booleanValue("nope", 0, 4)).isNull();
  }

  @Test
  void deduplicatesNamesWithoutCollidingWithExistingOnes() {
    assertThat(ColumnNames.fromHeader(java.util.List.of("a", "a", "a_2", " ", "a"), 6))
        .containsExactly("a", "a_3", "a_2", "column_4", "a_4", "column_6");
  }
}
