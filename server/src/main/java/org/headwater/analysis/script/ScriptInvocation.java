package org.headwater.analysis.script;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;

/**
 * A shell driver's command line that runs a script.
 *
 * @param script the script, relative to the workspace root
 * @param args the arguments after the script, as the shell would pass them; an argument the driver
 *     computes at run time is {@code null}
 * @param workingDir the directory the driver runs it in, relative to the workspace root, or
 *     {@code null} when the driver does not show it
 * @param driver the shell script, relative to the workspace root
 * @param line the 1-based line of the command in the driver
 */
public record ScriptInvocation(Path script, List<String> args, Path workingDir, Path driver, int line) {
    public ScriptInvocation {
        Objects.requireNonNull(script, "script");
        Objects.requireNonNull(driver, "driver");
        args = java.util.Collections.unmodifiableList(new java.util.ArrayList<>(args));
    }
}
