package org.headwater.analysis.script;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.headwater.analysis.script.document.CodePiece;
import org.headwater.analysis.script.document.MarkdownChunks;
import org.headwater.analysis.script.document.NotebookCells;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.python.PythonEvaluator;
import org.headwater.analysis.script.r.REvaluator;
import org.headwater.analysis.script.syntax.Grammar;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.syntax.Parsing;
import org.headwater.model.Language;

/**
 * Finds what a script reads and writes by parsing and evaluating its code without running it.
 * Thread-safe: every call keeps its state to itself.
 */
public final class ScriptAnalyzer {

    /**
     * Analyses one script.
     *
     * @param workspaceRoot the folder relative paths in references are given against
     * @param script the script, relative to the workspace root or absolute inside it
     * @throws IOException when the script cannot be read
     * @throws IllegalArgumentException when the file is not a script Headwater analyses
     */
    public ScriptAnalysis analyze(Path workspaceRoot, Path script, AnalysisContext ctx) throws IOException {
        Path root = workspaceRoot.toAbsolutePath().normalize();
        Path rel = script.isAbsolute() ? root.relativize(script.normalize()) : script.normalize();
        String name = rel.getFileName().toString();
        Language language = Language.ofFileName(name)
                .orElseThrow(() -> new IllegalArgumentException(name + " is not a script Headwater analyses"));
        String text = Files.readString(root.resolve(rel), StandardCharsets.UTF_8);
        if (language == Language.SHELL) {
            List<ScriptInvocation> invocations = new ShellDriverAnalyzer().invocations(root, rel, text);
            return new ScriptAnalysis(rel, language, List.of(), List.of(), invocations, List.of());
        }
        if (language == Language.SQL) {
            throw new IllegalArgumentException(name + ": SQL scripts are not analysed here");
        }
        List<CodePiece> pieces = pieces(name, language, text);
        Findings findings = new Findings();
        List<ScriptInvocation> invocations = ctx.invocationsOf(rel);
        String lower = name.toLowerCase(Locale.ROOT);
        boolean document = language == Language.NOTEBOOK || lower.endsWith(".rmd") || lower.endsWith(".qmd");
        if (invocations.isEmpty()) {
            runOnce(pieces, setting(root, rel, ctx, document, null, null), findings);
        }
        for (ScriptInvocation inv : invocations) {
            runOnce(pieces, setting(root, rel, ctx, document, inv.workingDir(), inv.args()), findings);
        }
        return new ScriptAnalysis(rel, language, findings.references(), findings.flows(), List.of(), findings.warnings());
    }

    private static List<CodePiece> pieces(String name, Language language, String text) throws IOException {
        String lower = name.toLowerCase(Locale.ROOT);
        return switch (language) {
            case NOTEBOOK -> NotebookCells.read(text);
            case R -> lower.endsWith(".rmd") || lower.endsWith(".qmd") ? MarkdownChunks.read(text) : List.of(new CodePiece("r", text, 0, null));
            default -> List.of(new CodePiece("python", text, 0, null));
        };
    }

    private static RunSetting setting(Path root, Path rel, AnalysisContext ctx, boolean document, Path driverDir, List<String> argv) {
        Path cwd;
        if (driverDir != null) {
            cwd = root.resolve(driverDir).normalize();
        } else {
            WorkingDirectory policy = document ? ctx.documents() : ctx.scripts();
            Path parent = rel.getParent();
            cwd = policy == WorkingDirectory.SCRIPT_FOLDER && parent != null ? root.resolve(parent) : root;
        }
        return new RunSetting(root, rel, cwd, argv);
    }

    private static void runOnce(List<CodePiece> pieces, RunSetting run, Findings findings) {
        List<Node> python = new ArrayList<>();
        List<Node> r = new ArrayList<>();
        for (CodePiece piece : pieces) {
            switch (piece.language()) {
                case "python", "python3", "py" -> python.add(Parsing.parse(Grammar.PYTHON, piece.code(), piece.lineOffset(), piece.cell()));
                case "r" -> r.add(Parsing.parse(Grammar.R, piece.code(), piece.lineOffset(), piece.cell()));
                default -> findings.warn("code in " + piece.language() + " is not analysed"
                        + (piece.cell() != null ? " (cell " + piece.cell() + ")" : " (line " + (piece.lineOffset() + 1) + ")"));
            }
        }
        for (List<Node> parsed : List.of(python, r)) {
            parsed.stream().filter(Node::hasError).findFirst().ifPresent(n ->
                    findings.warn("syntax errors: the parser recovered, references near them may be missing"));
        }
        try {
            if (!python.isEmpty()) {
                PythonEvaluator.main(run, findings).run(python);
            }
            if (!r.isEmpty()) {
                REvaluator.main(run, findings).run(r);
            }
        } catch (RuntimeException e) {
            // A construct the evaluator mishandles must not cost the references already found.
            findings.warn("analysis stopped early: " + e);
        }
    }
}
