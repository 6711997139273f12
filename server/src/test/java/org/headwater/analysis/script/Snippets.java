package org.headwater.analysis.script;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/** Writes small scripts into a temporary workspace and analyses them. */
final class Snippets {
    private final Path root;

    Snippets(Path root) {
        this.root = root;
    }

    Snippets file(String rel, String... lines) {
        try {
            Path p = root.resolve(rel);
            Files.createDirectories(p.getParent());
            Files.writeString(p, String.join("\n", lines) + "\n");
            return this;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    ScriptAnalysis analyze(String rel) throws IOException {
        return new ScriptAnalyzer().analyze(root, Path.of(rel), AnalysisContext.defaults());
    }

    ScriptAnalysis analyze(String rel, List<String> args) throws IOException {
        ScriptInvocation run = new ScriptInvocation(Path.of(rel), args, null, Path.of("drive.sh"), 1);
        return new ScriptAnalyzer().analyze(root, Path.of(rel), AnalysisContext.defaults().withInvocations(List.of(run)));
    }
}
