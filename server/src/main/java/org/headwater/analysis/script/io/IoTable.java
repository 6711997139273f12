package org.headwater.analysis.script.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.headwater.analysis.script.Direction;

/** A language's read and write functions, loaded from its TSV resource. */
public final class IoTable {
    private final Map<String, List<IoRule>> byFunction = new LinkedHashMap<>();
    private final Map<String, List<IoRule>> anyReceiverBySimpleName = new LinkedHashMap<>();
    private final List<IoRule> rules;

    public IoTable(List<IoRule> rules) {
        this.rules = List.copyOf(rules);
        for (IoRule rule : rules) {
            if (rule.anyReceiver()) {
                anyReceiverBySimpleName.computeIfAbsent(rule.simpleName(), k -> new ArrayList<>()).add(rule);
            } else {
                byFunction.computeIfAbsent(rule.function(), k -> new ArrayList<>()).add(rule);
            }
        }
    }

    /** Loads a table from a class-path resource next to this class, for example {@code python-io.tsv}. */
    public static IoTable load(String resource) {
        try (InputStream in = IoTable.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("missing read/write table " + resource);
            }
            return new IoTable(parse(new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8)), resource));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Reads rows of a table; {@code name} is where they come from, for error messages. */
    public static List<IoRule> parse(BufferedReader reader, String name) throws IOException {
        List<IoRule> out = new ArrayList<>();
        String line;
        int number = 0;
        while ((line = reader.readLine()) != null) {
            number++;
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            String[] cells = line.split("\t", -1);
            if (cells.length < 7) {
                throw new IllegalStateException(name + ":" + number + ": expected 7 tab-separated cells, got " + cells.length);
            }
            out.add(row(cells, name + ":" + number));
        }
        return out;
    }

    private static IoRule row(String[] c, String where) {
        List<String> params = c[1].equals("-") ? List.of() : Arrays.stream(c[1].split(",")).map(String::trim).toList();
        String direction = c[3].trim();
        Direction fixed = null;
        String defaultMode = null;
        if (direction.startsWith("mode(") && direction.endsWith(")")) {
            defaultMode = direction.substring(5, direction.length() - 1);
        } else {
            fixed = Direction.valueOf(direction.toUpperCase(java.util.Locale.ROOT));
        }
        String path = c[2].trim();
        if (!path.equals("self") && !params.contains(path)) {
            throw new IllegalStateException(where + ": path parameter " + path + " is not among " + params);
        }
        return new IoRule(c[0].trim(), params, path, fixed, defaultMode, IoKind.of(c[4]),
                c[5].trim().equals("-") ? null : c[5].trim(), Double.parseDouble(c[6].trim()));
    }

    /** The rules for a qualified function or typed method. */
    public List<IoRule> rulesFor(String qualifiedName) {
        return byFunction.getOrDefault(qualifiedName, List.of());
    }

    /** The heuristic rules for a method called on a receiver of unknown type. */
    public List<IoRule> anyReceiverRules(String methodName) {
        return anyReceiverBySimpleName.getOrDefault(methodName, List.of());
    }

    public List<IoRule> rules() {
        return rules;
    }

    /** Every rule whose called name (last part) is this one: what a call written this way may be. */
    public boolean knowsSimpleName(String simpleName) {
        return rules.stream().anyMatch(r -> r.simpleName().equals(simpleName));
    }
}
