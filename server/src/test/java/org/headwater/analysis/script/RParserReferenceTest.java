package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.headwater.analysis.script.io.IoRule;
import org.headwater.analysis.script.io.IoTable;
import org.junit.jupiter.api.Test;

/**
 * Recall against R's own parser. A small R script using only {@code parse} and {@code getParseData}
 * lists every call whose first argument is a string literal; every such call that is a read or write
 * in Headwater's R table must be among Headwater's references, at the same line, with the same function.
 * // reference: R 4 parser, getParseData (src/test/resources/scripts/r_string_calls.R)
 */
class RParserReferenceTest {
    private static final IoTable TABLE = IoTable.load("r-io.tsv");

    @Test
    void everyLiteralPathCallInTheTableIsFound() throws Exception {
        External.need(External.onPath("Rscript"), "Rscript");
        List<Path> roots = new ArrayList<>(List.of(Refs.resource("/scripts/workspace"), Refs.resource("/scripts/idioms")));
        Path demo = External.demoWorkspace();
        if (Files.isDirectory(demo.resolve("models"))) {
            roots.add(demo);
        }
        int expected = 0;
        List<String> missing = new ArrayList<>();
        for (Path root : roots) {
            Map<Path, ScriptAnalysis> analysed = Refs.byScript(new WorkspaceAnalysis().analyze(root, AnalysisContext.defaults()));
            for (String[] call : literalCalls(root)) {
                String written = call[2];
                String simple = written.contains("::") ? written.substring(written.lastIndexOf(':') + 1) : written;
                boolean inTable = written.contains("::") ? !TABLE.rulesFor(written).isEmpty()
                        : TABLE.rules().stream().map(IoRule::simpleName).anyMatch(simple::equals);
                if (!inTable || written.equals("jsonlite::fromJSON") && call[3].startsWith("[")) {
                    continue;
                }
                expected++;
                int line = Integer.parseInt(call[1]);
                ScriptAnalysis a = analysed.get(Path.of(call[0]));
                boolean found = a != null && a.references().stream()
                        .anyMatch(r -> r.line() == line && r.function().endsWith("::" + simple));
                if (!found) {
                    missing.add(root.getFileName() + "/" + call[0] + ":" + line + " " + written);
                }
            }
        }
        System.out.printf("R parser reference: %d literal-path read/write calls, %d found%n", expected, expected - missing.size());
        assertThat(expected).isGreaterThanOrEqualTo(35);
        assertThat(missing).as("calls R's parser lists that Headwater missed").isEmpty();
    }

    /** (file, line, function as written, first argument text) per call. */
    private static List<String[]> literalCalls(Path root) throws IOException, InterruptedException {
        List<String> command = new ArrayList<>(List.of("Rscript", Refs.resource("/scripts/r_string_calls.R").toString()));
        try (Stream<Path> files = Files.walk(root)) {
            files.filter(p -> p.toString().endsWith(".R")).map(p -> root.relativize(p).toString()).sorted().forEach(command::add);
        }
        List<String[]> out = new ArrayList<>();
        for (String line : External.run(root, command, Map.of()).split("\n")) {
            if (!line.isBlank()) {
                out.add(line.split("\t", -1));
            }
        }
        return out;
    }
}
