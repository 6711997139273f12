package org.headwater.testing;

import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;

/**
 * Seeded random cases for the fuzz tests, as JUnit 5 dynamic tests: case {@code i} draws from
 * {@code new SplittableRandom(base + i)}, and its display name carries that seed, so a failure is rerun
 * exactly by its number. {@code -Dheadwater.fuzzSeed=N} moves the base to explore other inputs.
 */
public final class Fuzz {
    private Fuzz() {
    }

    /** The body of one case. */
    @FunctionalInterface
    public interface Case {
        void run(SplittableRandom random) throws Throwable;
    }

    public static Stream<DynamicTest> cases(String what, int count, long base, Case body) {
        long start = Long.getLong("headwater.fuzzSeed", base);
        return IntStream.range(0, count).mapToObj(i -> {
            long seed = start + i;
            return DynamicTest.dynamicTest(what + " #" + i + " (seed " + seed + ")", () -> body.run(new SplittableRandom(seed)));
        });
    }

    /** One element of a non-empty list, uniformly. */
    public static <T> T pick(SplittableRandom random, List<T> items) {
        return items.get(random.nextInt(items.size()));
    }

    /** Up to {@code max} random bytes. */
    public static byte[] bytes(SplittableRandom random, int max) {
        byte[] bytes = new byte[random.nextInt(max + 1)];
        random.nextBytes(bytes);
        return bytes;
    }
}
