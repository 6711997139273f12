package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.headwater.analysis.sql.SchemaLookup;
import org.headwater.analysis.sql.SqlLineageAnalyzer;
import org.headwater.testing.Fuzz;
import org.headwater.testing.Mutations;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;

/**
 * Mutated real scripts (Python, R, R Markdown, notebooks, shell, SQL) for the script analysers: each
 * input gives an analysis, or the documented {@link IOException} for text that is not UTF-8 or a notebook
 * that is not JSON, within a
 * time budget.
 */
class ScriptFuzzTest {
    // Generous: a mutated R script found by this test still takes about 7 s on a loaded machine (see MAX_STEPS).
    private static final Duration BUDGET = Duration.ofSeconds(30);
    private static final List<Seed> SEEDS = new ArrayList<>();
    private static Path workspace;

    record Seed(String name, byte[] bytes) {
        @Override
        public String toString() {
            return name;
        }
    }

    @BeforeAll
    static void seeds() throws IOException {
        Path root = Workspaces.repoRoot();
        List<Path> files = new ArrayList<>(Mutations.files(root.resolve("server/src/test/resources/scripts"),
                ".py", ".r", ".rmd", ".ipynb", ".sh", ".sql"));
        files.addAll(Mutations.files(root.resolve("examples"), ".py", ".r", ".ipynb", ".sh", ".sql"));
        for (Path f : files) {
            SEEDS.add(new Seed(f.getFileName().toString(), Files.readAllBytes(f)));
        }
        workspace = Files.createTempDirectory("headwater-script-fuzz");
    }

    @AfterAll
    static void clean() throws IOException {
        try (var walk = Files.walk(workspace)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    private static List<Seed> seeds(boolean sql) {
        return SEEDS.stream().filter(s -> s.name().endsWith(".sql") == sql).toList();
    }

    @TestFactory
    java.util.stream.Stream<DynamicTest> mutatedScriptsAreAnalysedOrRefusedAsNotUtf8() {
        return Fuzz.cases("mutated script", 250, 3_000_000L, random ->
                analyseMutated(Fuzz.pick(random, seeds(false)), random.nextLong()));
    }

    private static void analyseMutated(Seed seed, long noise) throws IOException {
        Path file = workspace.resolve(seed.name());
        Files.write(file, Mutations.mutate(seed.bytes(), noise));
        Assertions.assertTimeoutPreemptively(BUDGET, () -> {
            try {
                ScriptAnalysis analysis = new ScriptAnalyzer().analyze(workspace, file, AnalysisContext.defaults());
                assertThat(analysis).isNotNull();
            } catch (CharacterCodingException | com.fasterxml.jackson.core.JsonProcessingException e) {
                // documented (ScriptAnalyzer.analyze): IOException when the script cannot be read, here text
                // that is not UTF-8 or a notebook that is not JSON; WorkspaceAnalysis then skips just that script
                assertThat(e).isInstanceOf(IOException.class);
            }
        }, () -> seed.name() + " mutated with " + noise + " took longer than " + BUDGET);
    }

    @TestFactory
    java.util.stream.Stream<DynamicTest> mutatedSqlIsAnalysedWithoutAnException() {
        return Fuzz.cases("mutated SQL", 150, 4_000_000L, random ->
                analyseMutatedSql(Fuzz.pick(random, seeds(true)), random.nextLong()));
    }

    private static void analyseMutatedSql(Seed seed, long noise) {
        String text = new String(Mutations.mutate(seed.bytes(), noise), StandardCharsets.UTF_8);
        Assertions.assertTimeoutPreemptively(BUDGET, () ->
                assertThat(new SqlLineageAnalyzer().analyze(text, SchemaLookup.none())).isNotNull(),
                () -> seed.name() + " mutated with " + noise + " took longer than " + BUDGET);
    }
}
