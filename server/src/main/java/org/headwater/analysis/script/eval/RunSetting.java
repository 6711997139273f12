package org.headwater.analysis.script.eval;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;

/**
 * How one analysed run of a script is set up.
 *
 * @param workspaceRoot absolute and normalised
 * @param script relative to the workspace root
 * @param workingDir absolute: relative paths in the code are relative to it
 * @param argv the arguments after the script, from a shell driver, or {@code null} when no driver runs it
 */
public record RunSetting(Path workspaceRoot, Path script, Path workingDir, List<String> argv) {
    public RunSetting {
        Objects.requireNonNull(workspaceRoot, "workspaceRoot");
        Objects.requireNonNull(script, "script");
        Objects.requireNonNull(workingDir, "workingDir");
        argv = argv == null ? null : java.util.Collections.unmodifiableList(new java.util.ArrayList<>(argv));
    }

    /** The script's absolute path, as {@code __file__} holds it. */
    public Path scriptFile() {
        return workspaceRoot.resolve(script).normalize();
    }

    /** A sibling script's setting, for modules imported from the workspace: same run, other file. */
    public RunSetting forModule(Path otherScript) {
        return new RunSetting(workspaceRoot, otherScript, workingDir, argv);
    }
}
