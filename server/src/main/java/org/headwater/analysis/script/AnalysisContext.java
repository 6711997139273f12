package org.headwater.analysis.script;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;

/**
 * What the analysis assumes about how scripts run.
 *
 * @param scripts working directory of Python and R scripts when no driver says
 * @param documents working directory of notebooks, R Markdown and Quarto documents when no driver says
 * @param invocations command lines of shell drivers; they supply {@code sys.argv},
 *     {@code commandArgs()} and argparse values, and a working directory when the driver changes to one
 */
public record AnalysisContext(WorkingDirectory scripts, WorkingDirectory documents, List<ScriptInvocation> invocations) {
    public AnalysisContext {
        Objects.requireNonNull(scripts, "scripts");
        Objects.requireNonNull(documents, "documents");
        invocations = List.copyOf(invocations);
    }

    /**
     * Scripts from the workspace root (as a top-level driver runs them); notebooks and R Markdown from
     * their own folder, as Jupyter starts a kernel and knitr renders a document there; no drivers.
     */
    public static AnalysisContext defaults() {
        return new AnalysisContext(WorkingDirectory.WORKSPACE_ROOT, WorkingDirectory.SCRIPT_FOLDER, List.of());
    }

    public AnalysisContext withInvocations(List<ScriptInvocation> more) {
        return new AnalysisContext(scripts, documents, more);
    }

    /** The driver command lines that run this script (relative to the workspace root). */
    public List<ScriptInvocation> invocationsOf(Path script) {
        Path wanted = script.normalize();
        return invocations.stream().filter(i -> i.script().normalize().equals(wanted)).toList();
    }
}
