package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.math.BigDecimal;
import java.util.Random;
import org.junit.jupiter.api.Test;

class NumberShortcutsTest {

    private static final String ALPHABET = "0123456789-+.,e' \u00A0:/x";

    private static String random(Random random) {
        StringBuilder b = new StringBuilder();
        for (int i = 0, n = 1 + random.nextInt(22); i < n; i++) {
            b.append(random.nextInt(3) == 0 ? ALPHABET.charAt(random.nextInt(ALPHABET.length())) : (char) ('0' + random.nextInt(10)));
        }
        return b.toString();
    }

    @Test
    void theQuickDecimalEqualsTheJdksStringConstructorInValueAndScale() {
        // expected: java.math.BigDecimal(String), the JDK's own reading of a decimal string (its Javadoc grammar).
        Random random = new Random(5);
        int read = 0;
        for (int i = 0; i < 300_000; i++) {
            String s = random(random);
            BigDecimal quick = ColumnProfiler.smallDecimal(s);
            if (quick == null) {
                continue;
            }
            read++;
            BigDecimal jdk = new BigDecimal(s);
            assertThat(quick).as(s).isEqualTo(jdk);
            assertThat(quick.scale()).as(s).isEqualTo(jdk.scale());
        }
        assertThat(read).isGreaterThan(10_000);
        assertThat(ColumnProfiler.smallDecimal("1234567890123456789")).as("19 digits: left to the JDK").isNull();
        assertThat(ColumnProfiler.smallDecimal("1e5")).isNull();
        assertThat(ColumnProfiler.smallDecimal("-")).isNull();
        assertThat(ColumnProfiler.smallDecimal("-.50")).isEqualTo(new BigDecimal("-.50"));
    }

    @Test
    void aCellNoConventionCanReadIsOneThatEveryConventionRefuses() {
        // expected: NumberScanner.scan under each candidate convention, the detector's own reading, on random cells.
        Random random = new Random(6);
        int refused = 0;
        for (int i = 0; i < 300_000; i++) {
            String s = random(random);
            if (NumberFormatDetector.readableByAny(s, 0, s.length())) {
                continue;
            }
            refused++;
            for (NumberConvention convention : NumberConvention.CANDIDATES) {
                assertThat(NumberScanner.scan(s, 0, s.length(), convention)).as("%s under %s", s, convention)
                        .isEqualTo(NumberScanner.NONE);
            }
        }
        assertThat(refused).isGreaterThan(50_000);
        assertThat(NumberFormatDetector.readableByAny("2026-01-10", 0, 10)).isFalse();
        assertThat(NumberFormatDetector.readableByAny("-1.5e-3", 0, 7)).isTrue();
    }

    @Test
    void cellsOfOneShapeReuseTheirScansAndScanTheSameUnderEveryConvention() {
        // expected: NumberScanner.scan of every cell under each candidate convention, with no reuse.
        Random random = new Random(8);
        int same = 0;
        for (int i = 0; i < 300_000; i++) {
            String a = random(random);
            String b = reshaped(random, a);
            if (!NumberFormatDetector.sameShape(a, 0, a.length(), b, 0, b.length())) {
                continue;
            }
            same++;
            for (NumberConvention convention : NumberConvention.CANDIDATES) {
                int x = NumberScanner.scan(a, 0, a.length(), convention);
                int y = NumberScanner.scan(b, 0, b.length(), convention);
                // Only the leading-zero mark may differ (0.5 against 1.5); the detector reads the others.
                assertThat(x == NumberScanner.NONE).as("%s and %s under %s", a, b, convention).isEqualTo(y == NumberScanner.NONE);
                int marks = NumberScanner.GROUPED | NumberScanner.FRACTION;
                assertThat(x & marks).as("%s and %s under %s", a, b, convention).isEqualTo(y & marks);
            }
            assertThat(NumberFormatDetector.readableByAny(a, 0, a.length())).isEqualTo(NumberFormatDetector.readableByAny(b, 0, b.length()));
        }
        assertThat(same).isGreaterThan(100_000);
        assertThat(NumberFormatDetector.sameShape("12,5", 0, 4, "98,1", 0, 4)).isTrue();
        assertThat(NumberFormatDetector.sameShape("12,5", 0, 4, "12.5", 0, 4)).isFalse();
        assertThat(NumberFormatDetector.sameShape("1,234", 0, 5, "12,34", 0, 5)).isFalse();
    }

    @Test
    void theDetectorChoosesAsScanningEveryCellUnderEveryConventionDoes() {
        // expected: the convention with the most readable cells, ties to the plain one, counted cell by cell
        // with NumberScanner under each candidate convention and no reuse of a shape's scans.
        Random random = new Random(9);
        for (int table = 0; table < 2_000; table++) {
            java.util.List<CsvRecord> rows = new java.util.ArrayList<>();
            int width = 1 + random.nextInt(4);
            String[] seeds = new String[width];
            for (int c = 0; c < width; c++) {
                seeds[c] = random(random);
            }
            for (int r = 0, n = 1 + random.nextInt(30); r < n; r++) {
                java.util.List<String> cells = new java.util.ArrayList<>();
                for (int c = 0; c < width; c++) {
                    cells.add(random.nextInt(4) == 0 ? random(random) : reshaped(random, seeds[c]));
                }
                rows.add(new CsvRecord(cells, 0, 0));
            }
            NumberFormat chosen = NumberFormatDetector.detect(rows, ';');
            assertThat(chosen).as("table %d", table).isEqualTo(byEveryScan(rows));
        }
    }

    private static NumberFormat byEveryScan(java.util.List<CsvRecord> rows) {
        var candidates = NumberConvention.CANDIDATES;
        int[] counts = new int[candidates.size()];
        boolean[] grouped = new boolean[candidates.size()];
        boolean[] fraction = new boolean[candidates.size()];
        for (CsvRecord row : rows) {
            for (String cell : row.cells()) {
                int from = Cells.trimStart(cell);
                int to = Cells.trimEnd(cell, from);
                boolean digitsOnly = cell.substring(from, to).chars().allMatch(ch -> ch >= '0' && ch <= '9');
                if (from == to || digitsOnly) {
                    continue;
                }
                for (int k = 0; k < counts.length; k++) {
                    int result = NumberScanner.scan(cell, from, to, candidates.get(k));
                    if (result != NumberScanner.NONE) {
                        counts[k]++;
                        grouped[k] |= (result & NumberScanner.GROUPED) != 0;
                        fraction[k] |= (result & NumberScanner.FRACTION) != 0;
                    }
                }
            }
        }
        int best = 0;
        for (int k = 1; k < counts.length; k++) {
            if (counts[k] > counts[best]) {
                best = k;
            }
        }
        return new NumberFormat(candidates.get(best), grouped[best], fraction[best]);
    }

    /** The cell with each digit replaced by a random digit: the same shape. */
    private static String reshaped(Random random, String cell) {
        char[] c = cell.toCharArray();
        for (int i = 0; i < c.length; i++) {
            if (c[i] >= '0' && c[i] <= '9') {
                c[i] = (char) ('0' + random.nextInt(10));
            }
        }
        return new String(c);
    }
}
