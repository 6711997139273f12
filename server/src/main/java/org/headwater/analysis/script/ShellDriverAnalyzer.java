package org.headwater.analysis.script;

import java.nio.file.Path;
import java.util.List;

/** Placeholder while the shell driver analysis is written. */
public final class ShellDriverAnalyzer {
    public List<ScriptInvocation> invocations(Path root, Path rel, String text) {
        return List.of();
    }
}
