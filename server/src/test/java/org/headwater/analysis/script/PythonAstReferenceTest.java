package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
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
 * Recall against Python's own parser. A small script using only Python's {@code ast} module lists
 * every call whose first argument is a string literal (function as written, import aliases followed,
 * line); every such call that is a read or write in Headwater's table must be among Headwater's
 * references, at the same line (and notebook cell) and with the same function name.
 * // reference: Python 3 ast module (src/test/resources/scripts/ast_string_calls.py)
 */
class PythonAstReferenceTest {
    private static final IoTable TABLE = IoTable.load("python-io.tsv");
    private static final ObjectMapper JSON = new ObjectMapper();

    record Call(Path file, Integer cell, int line, String written, String method) {
    }

    @Test
    void everyLiteralPathCallInTheTableIsFound() throws Exception {
        External.need(External.onPath("python3"), "python3");
        List<Path> roots = new ArrayList<>(List.of(Refs.resource("/scripts/workspace"), Refs.resource("/scripts/idioms")));
        Path demo = External.demoWorkspace();
        if (Files.isDirectory(demo.resolve("scripts"))) {
            roots.add(demo);
        }
        int expected = 0;
        List<String> missing = new ArrayList<>();
        for (Path root : roots) {
            Map<Path, ScriptAnalysis> analysed = Refs.byScript(new WorkspaceAnalysis().analyze(root, AnalysisContext.defaults()));
            for (Call call : literalCalls(root)) {
                if (!inTable(call)) {
                    continue;
                }
                expected++;
                ScriptAnalysis a = analysed.get(call.file());
                boolean found = a != null && a.references().stream().anyMatch(r -> r.line() == call.line()
                        && java.util.Objects.equals(r.cell(), call.cell()) && simple(r.function()).equals(call.method()));
                if (!found) {
                    missing.add(root.getFileName() + "/" + call.file() + ":" + call.line() + " " + call.written());
                }
            }
        }
        double recall = expected == 0 ? 0 : (expected - missing.size()) / (double) expected;
        System.out.printf("ast reference: %d literal-path read/write calls, %d found, recall %.3f%n", expected, expected - missing.size(), recall);
        assertThat(expected).isGreaterThanOrEqualTo(60);
        assertThat(missing).as("calls Python's ast lists that Headwater missed").isEmpty();
    }

    private static List<Call> literalCalls(Path root) throws IOException, InterruptedException {
        List<String> command = new ArrayList<>(List.of("python3", Refs.resource("/scripts/ast_string_calls.py").toString()));
        try (Stream<Path> files = Files.walk(root)) {
            files.filter(p -> p.toString().endsWith(".py") || p.toString().endsWith(".ipynb"))
                    .map(p -> root.relativize(p).toString()).sorted().forEach(command::add);
        }
        List<Call> out = new ArrayList<>();
        for (String line : External.run(root, command, Map.of()).split("\n")) {
            if (line.isBlank()) {
                continue;
            }
            JsonNode row = JSON.readTree(line);
            String qualified = row.path("qualified").isNull() ? null : row.path("qualified").asText();
            String method = qualified != null ? simple(qualified) : row.path("method").asText();
            out.add(new Call(Path.of(row.path("file").asText()), row.path("cell").isNull() ? null : row.path("cell").asInt(),
                    row.path("line").asInt(), row.path("written").asText() + (qualified != null ? " = " + qualified : ""), method));
        }
        return out;
    }

    /** A call is a read or write of the table when its qualified name is a row, or its method is one of a row's. */
    private static boolean inTable(Call call) {
        String written = call.written();
        int eq = written.indexOf(" = ");
        if (eq >= 0) {
            return !TABLE.rulesFor(written.substring(eq + 3)).isEmpty();
        }
        return written.contains(".") && TABLE.rules().stream().map(IoRule::simpleName).anyMatch(call.method()::equals);
    }

    private static String simple(String function) {
        return function.substring(function.lastIndexOf('.') + 1);
    }
}
