package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.HashMap;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;

// Reference: java.util.HashMap, driven by the same random operations.
class LongIntMapTest {

    @Test
    void agreesWithHashMapOverRandomPutsAndRemovesThatCrowdFewBuckets() {
        Random random = new Random(20260301);
        LongIntMap map = new LongIntMap(4);
        Map<Long, Integer> reference = new HashMap<>();
        for (int step = 0; step < 200_000; step++) {
            // Keys from a small range with large strides collide often, exercising probe chains and removal.
            long key = (random.nextInt(5_000) * 1_048_576L) - 7;
            switch (random.nextInt(3)) {
                case 0, 1 -> {
                    int value = random.nextInt(1_000_000);
                    map.put(key, value);
                    reference.put(key, value);
                }
                default -> {
                    Integer removed = reference.remove(key);
                    assertThat(map.remove(key)).isEqualTo(removed == null ? LongIntMap.MISSING : removed);
                }
            }
            if (step % 997 == 0) {
                assertThat(map.size()).isEqualTo(reference.size());
            }
        }
        for (long k = 0; k < 5_000; k++) {
            long key = k * 1_048_576L - 7;
            assertThat(map.get(key)).isEqualTo(reference.getOrDefault(key, LongIntMap.MISSING));
        }
        assertThat(map.size()).isEqualTo(reference.size());
    }
}
