package org.headwater.bench;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.time.Duration;
import org.headwater.Catalog;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A 5-second version of {@link LoadBenchmark}: checks correctness under load (no timing is asserted). */
class ShortLoadTest {
    @TempDir
    Path temp;

    @Test
    void concurrentReadsRunPostsAndAHarvestGiveNoErrorsAndLoseNoRun() throws Exception {
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            LoadRun.Result result = LoadRun.run(temp, 8, 4, Duration.ofSeconds(5), catalog);
            assertThat(result.errors()).as(result.report()).isZero();
            assertThat(result.posts()).isPositive();
            // Every run the server acknowledged with 201 is in the store, exactly once (run ids are unique).
            assertThat(result.storedRuns()).as(result.report()).isEqualTo(result.acknowledged()).isEqualTo(result.posts());
            assertThat(result.reads()).isPositive();
        }
    }
}
