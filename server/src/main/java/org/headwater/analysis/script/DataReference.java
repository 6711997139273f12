package org.headwater.analysis.script;

import java.util.List;
import java.util.Objects;
import org.headwater.model.DatasetKind;

/**
 * One dataset a script reads or writes, as the code shows it.
 *
 * @param pathPattern the path relative to the workspace root (or absolute, or a URL, when it lies
 *     outside), with {@code *} where a loop variable or glob stands; {@code null} when nothing of it is
 *     known or the reference is to a table. When {@code resolved} is false but a pattern is given, the
 *     pattern is only a shape: its {@code *} also stand for parts the analysis could not know.
 * @param isGlob whether the pattern stands for several files
 * @param instances the paths a glob stands for when its loop is over literal values, else empty
 * @param tableName the database table, for SQL reads and writes, else {@code null}
 * @param kind what sort of dataset the function suggests (file, file set, table, figure)
 * @param function the qualified function that reads or writes, for example {@code pandas.read_csv}
 * @param expressionText the code of the path argument (or of the whole call when there is none)
 * @param line 1-based line in the file; inside a notebook, in the cell
 * @param column 1-based column in characters
 * @param cell the 0-based index in the notebook's {@code cells} array, or {@code null} outside notebooks
 * @param confidence how sure the analysis is, 0 to 1: lower for heuristics and guessed receivers
 * @param resolved whether the path or table name is known (a pattern from a literal loop counts as known)
 */
public record DataReference(Direction direction, String pathPattern, boolean isGlob, List<String> instances,
        String tableName, DatasetKind kind, String function, String expressionText, int line, int column,
        Integer cell, double confidence, boolean resolved) {
    public DataReference {
        Objects.requireNonNull(direction, "direction");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(function, "function");
        Objects.requireNonNull(expressionText, "expressionText");
        instances = instances == null ? List.of() : List.copyOf(instances);
        if (!(confidence >= 0.0 && confidence <= 1.0)) {
            throw new IllegalArgumentException("confidence must be within [0, 1]: " + confidence);
        }
    }

    /** The path or table name, whichever this reference names, for messages and tests. */
    public String target() {
        return tableName != null ? "table:" + tableName : pathPattern;
    }
}
