package org.headwater.analysis.script.eval;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.DatasetFlow;
import org.headwater.analysis.script.lineage.Frame;

/** What one analysed run collects: references in the order found, flows of written frames, warnings. */
public final class Findings {
    private final Set<DataReference> references = new LinkedHashSet<>();
    private final List<DatasetFlow> flows = new ArrayList<>();
    private final Set<String> warnings = new LinkedHashSet<>();

    public void add(List<DataReference> found) {
        references.addAll(found);
    }

    /** Records what a written frame shows of its origins. */
    public void written(DataReference target, Frame frame) {
        List<String> sources = frame.sources().stream().filter(s -> !s.equals(target.target())).toList();
        if (sources.isEmpty()) {
            return; // a frame made in the code from literals: no dataset flows into the write
        }
        DatasetFlow flow = new DatasetFlow(target, sources, frame.flows(), !frame.complete());
        if (!flows.contains(flow)) {
            flows.add(flow);
        }
    }

    public void warn(String message) {
        warnings.add(message);
    }

    public List<DataReference> references() {
        return List.copyOf(references);
    }

    public List<DatasetFlow> flows() {
        return List.copyOf(flows);
    }

    public List<String> warnings() {
        return List.copyOf(warnings);
    }
}
