package org.headwater.analysis.script.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.HashMap;
import java.util.Map;
import java.util.Optional;

/** What calls and attributes return, loaded from a TSV resource such as {@code python-types.tsv}. */
public final class TypeTable {
    private final Map<String, String> returns;

    public TypeTable(Map<String, String> returns) {
        this.returns = Map.copyOf(returns);
    }

    public static TypeTable load(String resource) {
        Map<String, String> out = new HashMap<>();
        try (InputStream in = TypeTable.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("missing type table " + resource);
            }
            BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            String line;
            while ((line = reader.readLine()) != null) {
                if (line.isBlank() || line.startsWith("#")) {
                    continue;
                }
                String[] cells = line.split("\t");
                out.put(cells[0].trim(), cells[1].trim());
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return new TypeTable(out);
    }

    /** The type a callable or member returns: its own row, else its type's {@code .*} row. */
    public Optional<String> returnOf(String qualified) {
        String exact = returns.get(qualified);
        if (exact != null) {
            return Optional.of(exact);
        }
        int dot = qualified.lastIndexOf('.');
        return dot < 0 ? Optional.empty() : Optional.ofNullable(returns.get(qualified.substring(0, dot) + ".*"));
    }

    /** Only a member's own row: attributes do not fall back to the {@code .*} method rule. */
    public Optional<String> exactly(String qualified) {
        return Optional.ofNullable(returns.get(qualified));
    }
}
