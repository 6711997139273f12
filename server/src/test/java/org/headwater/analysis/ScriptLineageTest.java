package org.headwater.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Map;
import org.junit.jupiter.api.Test;

class ScriptLineageTest {
    private static final Map<String, String> NAMES = Map.of(
            "lab/raw/levels.csv", "file:///w/lab/raw/levels.csv",
            "field/levels.csv", "file:///w/field/levels.csv",
            "lab/raw/flows.csv", "file:///w/lab/raw/flows.csv");

    @Test
    void aPathIsMatchedByItsEndOnlyWhenExactlyOneDatasetEndsSo() {
        // common practice, no source: a script run from its own folder names files relative to it.
        assertThat(ScriptLineage.uniqueSuffixMatch(NAMES, "raw/flows.csv")).isEqualTo("file:///w/lab/raw/flows.csv");
        assertThat(ScriptLineage.uniqueSuffixMatch(NAMES, "../raw/flows.csv")).isEqualTo("file:///w/lab/raw/flows.csv");
        assertThat(ScriptLineage.uniqueSuffixMatch(NAMES, "levels.csv")).isNull(); // two candidates: no guess
        assertThat(ScriptLineage.uniqueSuffixMatch(NAMES, "other.csv")).isNull();
    }
}
