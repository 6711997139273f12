package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The consistency measure of van den Burg, Nazabal and Sutton (2019), from its formulas:
 * P = (1/K) sum_k N_k (L_k - 1) / L_k, T = known cells / cells, Q = P T. The expected numbers
 * are worked by hand from those formulas.
 */
class DialectScorerTest {

  private static List<CsvRecord> parse(String text, Dialect dialect) {
    return new CsvParser(dialect).parse(text, 0, 100, true).records();
  }

  @Test
  void patternScoreOfAConsistentTableIsRowsTimesCellShare() {
    // 3 rows of 3 cells, one pattern: P = 3 * 2/3 = 2
    List<CsvRecord> rows = parse("a,b,c\n1,2,3\n4,5,6\n", Dialect.RFC_4180);
    assertThat(DialectScorer.patternScore(rows)).isCloseTo(2.0, within(1e-12));
  }

  @Test
  void patternScoreAveragesOverDistinctPatterns() {
    // patterns: 3 cells x 2 rows, 2 cells x 1 row: P = (2 * 2/3 + 1 * 1/2) / 2 = 11/12
    List<CsvRecord> rows = parse("a,b,c\n1,2,3\n4,5\n", Dialect.RFC_4180);
    assertThat(DialectScorer.patternScore(rows)).isCloseTo(11.0 / 12, within(1e-12));
  }

  @Test
  void patternScoreOfSingleCellRowsUsesAlpha() {
    // one pattern of length 1: (L - 1) / L = 0 is replaced by alpha = 0.001: P = 2 * 0.001
    List<CsvRecord> rows = parse("abc\ndef\n", Dialect.RFC_4180);
    assertThat(DialectScorer.patternScore(rows)).isCloseTo(0.002, within(1e-12));
  }

  @Test
  void typeScoreIsTheShareOfKnownCells() {
    // known: 1, 2.5, empty, 2023-01-02, NA, true, https://..., x@y.org = 8 of 10 (a, b words)
    List<CsvRecord> rows = parse("a,1,2.5,,2023-01-02\nb,NA,true,https://e.org,x@y.org\n",
        Dialect.RFC_4180);
    assertThat(DialectScorer.typeScore(rows)).isCloseTo(0.8, within(1e-12));
  }

  @Test
  void typeScoreFallsBackToEpsilonWhenNothingIsKnown() {
    assertThat(DialectScorer.typeScore(parse("a,b\nc,d\n", Dialect.RFC_4180)))
        .isEqualTo(DialectScorer.EPSILON);
  }

  @Test
  void consistencyIsPatternTimesType() {
    Dialect semicolon = new Dialect(';', '"', Escape.DOUBLE);
    DialectScore score = DialectScorer.score("p;1,5\nq;2,25\n", true, 100, semicolon, 0.0);
    // P = 2 * 1/2 = 1; T = 2 of 4 (1,5 and 2,25 are decimal-comma numbers) = 0.5; Q = 0.5
    assertThat(score.pattern()).isCloseTo(1.0, within(1e-12));
    assertThat(score.type()).isCloseTo(0.5, within(1e-12));
    assertThat(score.consistency()).isCloseTo(0.5, within(1e-12));
  }

  @Test
  void skipsTheTypeScoreWhenThePatternScoreCannotWin() {
    DialectScore score = DialectScorer.score("a,b\n", true, 100, Dialect.RFC_4180, 10.0);
    assertThat(score.type()).isNaN();
    assertThat(score.consistency()).isZero();
  }
}
