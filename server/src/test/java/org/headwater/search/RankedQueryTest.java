package org.headwater.search;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;

class RankedQueryTest {
    // The property checked is IEEE 754 single-precision multiplication, which Java's float product follows
    // (Java Language Specification 15.17.1): the threshold passed on is the least text score whose product
    // with the factor reaches the collector's minimum, so nothing at or above it is skipped and nothing below
    // it could have competed.
    @Test
    void thresholdIsTheLeastTextScoreWhoseProductReachesTheMinimum() {
        Random random = new Random(20261203);
        for (int i = 0; i < 200_000; i++) {
            float minScore = (float) Math.scalb(1 + random.nextDouble(), random.nextInt(30) - 10);
            float factor = (float) (0.05 + 2 * random.nextDouble());
            float t = RankedQuery.leastCompeting(minScore, factor);
            assertTrue(t * factor >= minScore, () -> minScore + " / " + factor + " gave " + t);
            assertTrue(Math.nextDown(t) * factor < minScore, () -> minScore + " / " + factor + " gave " + t);
        }
    }

    @Test
    void tiedScoreIsBelowTheThresholdForTheNextFloatAboveItsProduct() {
        // The collector's minimum is the float above its last hit's score, as Lucene 9.12's TopScoreDocCollector
        // asks (its source); the text score and factor are a tie seen on the benchmark's invented catalog.
        float text = 1025.093f;
        float factor = 0.6f;
        float threshold = RankedQuery.leastCompeting(Math.nextUp(text * factor), factor);
        assertTrue(threshold > text);
        assertEquals(Math.nextUp(text), threshold);
    }
}
