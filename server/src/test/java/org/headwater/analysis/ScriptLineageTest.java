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

    @Test
    void theSuffixIndexAnswersAsTheScanOverAllNames() {
        // expected: the same answers as the plain scan above, for every ending of every name and a few misses
        ScriptLineage.SuffixIndex index = new ScriptLineage.SuffixIndex(NAMES);
        for (String path : java.util.List.of("raw/flows.csv", "../raw/flows.csv", "../../raw/levels.csv", "levels.csv",
                "flows.csv", "lab/raw/flows.csv", "w/lab/raw/flows.csv", "aw/flows.csv", "other.csv", "field/levels.csv")) {
            assertThat(index.uniqueMatch(path)).as(path).isEqualTo(ScriptLineage.uniqueSuffixMatch(NAMES, path));
        }
        assertThat(index.uniqueMatch("aw/flows.csv")).isNull(); // a match must start at a folder boundary
        assertThat(index.uniqueMatch("flows.csv")).isEqualTo("file:///w/lab/raw/flows.csv");
    }
}
