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
}
