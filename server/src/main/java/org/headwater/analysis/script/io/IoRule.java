package org.headwater.analysis.script.io;

import java.util.List;
import java.util.Objects;
import org.headwater.analysis.script.Direction;

/**
 * One row of a read/write table.
 *
 * @param function the qualified name ({@code pandas.read_csv}), a typed method
 *     ({@code pandas.DataFrame.to_csv}), or {@code *.name} for a method on any receiver (a heuristic)
 * @param params the call's parameters in positional order (receiver excluded), as far as the path
 *     needs; R's {@code ...} swallows positional arguments, so what follows it is matched by name only
 * @param pathParam the parameter that holds the path, or {@code self} for the receiver
 * @param direction read or write; {@code null} when a mode argument decides
 * @param defaultMode the mode when the call gives none (for mode-decided rules)
 * @param kind what the path argument holds
 * @param returns the type of object the call returns, or {@code null}
 * @param confidence how sure a match of this row is
 */
public record IoRule(String function, List<String> params, String pathParam, Direction direction,
        String defaultMode, IoKind kind, String returns, double confidence) {
    public IoRule {
        Objects.requireNonNull(function, "function");
        params = List.copyOf(params);
        Objects.requireNonNull(pathParam, "pathParam");
        Objects.requireNonNull(kind, "kind");
    }

    public boolean anyReceiver() {
        return function.startsWith("*.");
    }

    /** The last part of the name: the method or function as a call writes it. */
    public String simpleName() {
        int colons = function.lastIndexOf("::");
        if (colons >= 0) {
            return function.substring(colons + 2); // R names keep their dots: utils::read.csv
        }
        return function.substring(function.lastIndexOf('.') + 1);
    }

    /**
     * Direction from a mode string: {@code w}, {@code a} and {@code x} write, {@code +} reads and writes.
     * // reference: Python 3 docs of built-in open(), mode characters
     */
    public static List<Direction> directionsOfMode(String mode) {
        boolean write = mode.contains("w") || mode.contains("a") || mode.contains("x");
        if (mode.contains("+")) {
            return List.of(Direction.READ, Direction.WRITE);
        }
        return List.of(write ? Direction.WRITE : Direction.READ);
    }
}
