package org.headwater.analysis.script;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;
import org.headwater.model.Language;

/**
 * What one script reads and writes.
 *
 * @param script the script, relative to the workspace root
 * @param references every read and write found, in source order; unresolved ones included
 * @param flows column lineage of written data frames, where the code tracks them
 * @param invocations for a shell driver, the scripts it runs; empty for other languages
 * @param warnings what the analysis could not follow, for people
 */
public record ScriptAnalysis(Path script, Language language, List<DataReference> references,
        List<DatasetFlow> flows, List<ScriptInvocation> invocations, List<String> warnings) {
    public ScriptAnalysis {
        Objects.requireNonNull(script, "script");
        Objects.requireNonNull(language, "language");
        references = List.copyOf(references);
        flows = List.copyOf(flows);
        invocations = List.copyOf(invocations);
        warnings = List.copyOf(warnings);
    }

    public List<DataReference> reads() {
        return references.stream().filter(r -> r.direction() == Direction.READ).toList();
    }

    public List<DataReference> writes() {
        return references.stream().filter(r -> r.direction() == Direction.WRITE).toList();
    }
}
