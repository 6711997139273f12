package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.BufferedReader;
import java.io.StringReader;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.eval.SqlTables;
import org.headwater.analysis.script.eval.WorkspacePaths;
import org.headwater.analysis.script.io.IoRule;
import org.headwater.analysis.script.io.IoTable;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;
import org.junit.jupiter.api.Test;

/** The parts the evaluators are built from. */
class BuildingBlocksTest {
    private static final RunSetting RUN = new RunSetting(Path.of("/ws"), Path.of("s/job.py"), Path.of("/ws/s"), null);

    @Test
    void pathsResolveAgainstTheWorkingDirectoryAndComeBackWorkspaceRelative() {
        // reference: POSIX pathname resolution of . and .. (from memory)
        assertThat(List.of(WorkspacePaths.resolve("a/./b/../c.csv", RUN), WorkspacePaths.resolve("../raw/x.csv", RUN),
                WorkspacePaths.resolve("../../elsewhere/y.csv", RUN), WorkspacePaths.resolve("/ws/z.csv", RUN),
                WorkspacePaths.resolve("s3://bucket/k.csv", RUN), WorkspacePaths.resolve("~/h.csv", RUN)))
                .containsExactly("s/a/c.csv", "raw/x.csv", "/elsewhere/y.csv", "z.csv", "s3://bucket/k.csv", "~/h.csv");
    }

    @Test
    void sqlTablesComeFromFromAndJoinButNotFromCommonTableExpressions() {
        // common practice, no source: FROM and JOIN name the tables a SELECT reads
        assertThat(SqlTables.tablesRead("WITH recent AS (SELECT * FROM inspections) SELECT h.id FROM recent r JOIN coop.hives h ON r.id = h.id"))
                .containsExactly("inspections", "coop.hives");
        assertThat(SqlTables.tablesRead("\"hive_weights\"")).containsExactly("hive_weights");
        assertThat(SqlTables.tablesRead("SELECT * FROM (SELECT 1) AS t")).isEmpty();
    }

    @Test
    void tablesLoadAndEveryRowNamesItsPathAmongItsParameters() {
        assertThat(IoTable.load("python-io.tsv").rules()).hasSizeGreaterThan(100);
        assertThat(IoTable.load("r-io.tsv").rules()).hasSizeGreaterThan(55);
        assertThatThrownBy(() -> IoTable.parse(new BufferedReader(new StringReader("x.read\ta\tb\tread\tfile\t-\t1.0\n")), "t.tsv"))
                .hasMessage("t.tsv:1: path parameter b is not among [a]");
    }

    @Test
    void modeStringsGiveDirections() {
        // reference: Python 3 docs of open(), mode characters r w a x +
        assertThat(List.of(IoRule.directionsOfMode("r"), IoRule.directionsOfMode("wb"), IoRule.directionsOfMode("a"),
                IoRule.directionsOfMode("x"), IoRule.directionsOfMode("r+b")))
                .containsExactly(List.of(Direction.READ), List.of(Direction.WRITE), List.of(Direction.WRITE),
                        List.of(Direction.WRITE), List.of(Direction.READ, Direction.WRITE));
    }

    @Test
    void choicesFlattenAndGiveWayToUnknownPastTheLimit() {
        assertThat(Values.oneOf(List.of(Values.lit("a"), Values.oneOf(List.of(Values.lit("a"), Values.lit("b"))))))
                .isEqualTo(new Value.OneOf(List.of(Values.lit("a"), Values.lit("b"))));
        List<Value> many = java.util.stream.IntStream.range(0, Values.MAX_OPTIONS + 1).mapToObj(i -> (Value) Values.lit("p" + i)).toList();
        assertThat(Values.oneOf(many)).isInstanceOf(Value.Unknown.class);
    }

    @Test
    void mergedFramesDoNotGuessWhichSideAnUnlistedColumnCameFrom() {
        Frame merged = Frame.read("a.csv").merge(Frame.read("b.csv"), List.of("k"));
        assertThat(merged.origins("k")).extracting(o -> o.source() + "#" + o.column()).containsExactly("a.csv#k", "b.csv#k");
        assertThat(merged.origins("other")).isNull();
        assertThat(Frame.read("a.csv").rename(Map.of("x", "y")).origins("y")).extracting(o -> o.column()).containsExactly("x");
    }
}
