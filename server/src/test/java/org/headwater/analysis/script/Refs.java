package org.headwater.analysis.script;

import java.net.URISyntaxException;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.function.Function;
import java.util.stream.Collectors;

/** Compact forms of analysis results that exact assertions read well in. */
final class Refs {
    private Refs() {
    }

    /** {@code READ raw/hives.csv @39}; cells as {@code @cell2:1}; unresolved as {@code READ ? @37 [expression]}. */
    static List<String> of(ScriptAnalysis a) {
        return a.references().stream().map(Refs::of).toList();
    }

    static String of(DataReference r) {
        String where = r.cell() == null ? "@" + r.line() : "@cell" + r.cell() + ":" + r.line();
        if (!r.resolved()) {
            return r.direction() + " ? " + where + " [" + r.expressionText() + "]";
        }
        return r.direction() + " " + r.target() + " " + where;
    }

    static Map<Path, ScriptAnalysis> byScript(List<ScriptAnalysis> all) {
        return all.stream().collect(Collectors.toMap(ScriptAnalysis::script, Function.identity()));
    }

    static DataReference find(ScriptAnalysis a, String target) {
        return a.references().stream().filter(r -> target.equals(r.target())).findFirst()
                .orElseThrow(() -> new AssertionError("no reference to " + target + " in " + of(a)));
    }

    static List<String> flowsInto(ScriptAnalysis a, String target) {
        DatasetFlow flow = a.flows().stream().filter(f -> target.equals(f.target().target())).findFirst()
                .orElseThrow(() -> new AssertionError("no flow into " + target));
        return flow.columns().stream()
                .map(c -> c.targetColumn() + " <- " + c.source() + "#" + c.sourceColumn() + (c.derived() ? " (derived)" : " (direct)"))
                .toList();
    }

    static Path resource(String name) {
        try {
            return Path.of(Refs.class.getResource(name).toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }
}
