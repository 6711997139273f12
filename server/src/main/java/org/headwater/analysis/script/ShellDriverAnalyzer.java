package org.headwater.analysis.script;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.headwater.analysis.script.shell.CommandWalker;
import org.headwater.analysis.script.syntax.Grammar;
import org.headwater.analysis.script.syntax.Parsing;

/**
 * Finds the command lines of a shell driver that run scripts ({@code python3 x.py ARGS},
 * {@code Rscript x.R ARGS}, {@code jupyter nbconvert --execute x.ipynb}). Paths are relative to the
 * workspace root: the driver is assumed to start there, and a {@code cd} (literal, or to
 * {@code $(dirname "$0")}) moves it. Their arguments feed {@code sys.argv}, argparse and
 * {@code commandArgs()} in the analysis of the scripts.
 */
public final class ShellDriverAnalyzer {

    /** The invocations in a driver file. */
    public List<ScriptInvocation> analyze(Path workspaceRoot, Path driver) throws IOException {
        Path root = workspaceRoot.toAbsolutePath().normalize();
        Path rel = driver.isAbsolute() ? root.relativize(driver.normalize()) : driver.normalize();
        return invocations(root, rel, Files.readString(root.resolve(rel), StandardCharsets.UTF_8));
    }

    List<ScriptInvocation> invocations(Path root, Path driver, String text) {
        return new CommandWalker(driver).walk(Parsing.parse(Grammar.BASH, text));
    }
}
