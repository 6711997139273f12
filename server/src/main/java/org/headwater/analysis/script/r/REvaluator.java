package org.headwater.analysis.script.r;

import java.util.List;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.syntax.Node;

/** Placeholder while the R evaluator is written. */
public final class REvaluator {
    private REvaluator() {
    }

    public static REvaluator main(RunSetting run, Findings findings) {
        return new REvaluator();
    }

    public void run(List<Node> programs) {
    }
}
