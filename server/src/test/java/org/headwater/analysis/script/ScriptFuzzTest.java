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
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.lifecycle.AfterContainer;
import net.jqwik.api.lifecycle.BeforeContainer;
import org.headwater.analysis.sql.SchemaLookup;
import org.headwater.analysis.sql.SqlLineageAnalyzer;
import org.headwater.testing.Mutations;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Assertions;

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

    @BeforeContainer
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

    @AfterContainer
    static void clean() throws IOException {
        try (var walk = Files.walk(workspace)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    @Provide
    Arbitrary<Seed> seed() {
        return Arbitraries.of(SEEDS).filter(s -> !s.name().endsWith(".sql"));
    }

    @Provide
    Arbitrary<Seed> sql() {
        return Arbitraries.of(SEEDS).filter(s -> s.name().endsWith(".sql"));
    }

    @Property(tries = 250)
    void mutatedScriptsAreAnalysedOrRefusedAsNotUtf8(@ForAll("seed") Seed seed, @ForAll long noise) throws Exception {
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

    @Property(tries = 150)
    void mutatedSqlIsAnalysedWithoutAnException(@ForAll("sql") Seed seed, @ForAll long noise) {
        String text = new String(Mutations.mutate(seed.bytes(), noise), StandardCharsets.UTF_8);
        Assertions.assertTimeoutPreemptively(BUDGET, () ->
                assertThat(new SqlLineageAnalyzer().analyze(text, SchemaLookup.none())).isNotNull(),
                () -> seed.name() + " mutated with " + noise + " took longer than " + BUDGET);
    }
}
