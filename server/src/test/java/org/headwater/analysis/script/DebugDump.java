package org.headwater.analysis.script;

import java.nio.file.Path;

/** Prints the analysis of a whole workspace, for looking at while developing. */
final class DebugDump {
    public static void main(String[] args) throws Exception {
        for (ScriptAnalysis a : new WorkspaceAnalysis().analyze(Path.of(args[0]), AnalysisContext.defaults())) {
            System.out.println("== " + a.script() + " " + a.language());
            a.references().forEach(r -> System.out.println("  " + r.direction() + " " + r.target() + " glob=" + r.isGlob() + " " + r.instances()
                    + " " + r.function() + " L" + r.line() + ":" + r.column() + (r.cell() != null ? " cell " + r.cell() : "") + " c=" + r.confidence() + " resolved=" + r.resolved() + " [" + r.expressionText() + "]"));
            a.flows().forEach(f -> {
                System.out.println("  FLOW -> " + f.target().target() + " from " + f.sources() + " datasetLevelOnly=" + f.datasetLevelOnly());
                f.columns().forEach(c -> System.out.println("      " + c));
            });
            a.invocations().forEach(v -> System.out.println("  RUNS " + v));
            a.warnings().forEach(w -> System.out.println("  ! " + w));
        }
    }
}
