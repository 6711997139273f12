package org.headwater.analysis.script.shell;

import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * A command that runs a script, and how to find the script among its words.
 *
 * @param names command names that start it ({@code python3.11} matches {@code python3} by prefix)
 * @param leading words that come before the script (a sub-command such as {@code nbconvert})
 * @param optionsWithValue options of the command that take the next word as their value
 * @param inlineCode options that make the command run code given inline or a module, not a script file
 * @param scriptEndings the script file endings it runs
 * @param runsInScriptFolder whether it runs the script with the script's folder as working directory
 */
public record Interpreter(List<String> names, List<String> leading, Set<String> optionsWithValue,
        Set<String> inlineCode, List<String> scriptEndings, boolean runsInScriptFolder) {

    // reference: python3 --help (options -W, -X take values; -m, -c end option parsing), Rscript --help
    // (-e takes an expression), jupyter nbconvert --help (--to takes a value), from memory
    public static final List<Interpreter> TABLE = List.of(
            new Interpreter(List.of("python", "python3"), List.of(), Set.of("-W", "-X", "--check-hash-based-pycs"), Set.of("-m", "-c"), List.of(".py"), false),
            new Interpreter(List.of("Rscript"), List.of(), Set.of("--default-packages"), Set.of("-e"), List.of(".R", ".r"), false),
            new Interpreter(List.of("jupyter"), List.of("nbconvert"), Set.of("--to", "--output", "--output-dir", "--template",
                    "--ExecutePreprocessor.timeout", "--ExecutePreprocessor.kernel_name"), Set.of(), List.of(".ipynb"), true),
            new Interpreter(List.of("jupyter-nbconvert"), List.of(), Set.of("--to", "--output", "--output-dir", "--template"), Set.of(), List.of(".ipynb"), true));

    /** The interpreter a command name starts, if any. */
    public static Optional<Interpreter> of(String command) {
        String base = command.substring(command.lastIndexOf('/') + 1);
        for (Interpreter i : TABLE) {
            for (String n : i.names()) {
                if (base.equals(n) || base.startsWith(n) && base.substring(n.length()).matches("[0-9.]+")) {
                    return Optional.of(i);
                }
            }
        }
        return Optional.empty();
    }

    public boolean runsScript(String word) {
        return scriptEndings.stream().anyMatch(word::endsWith);
    }
}
