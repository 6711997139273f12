package org.headwater.analysis.script.python;

import java.util.List;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;

/** The states of the Python objects the evaluator tracks, held in {@code Value.Obj}. */
final class PyObjects {
    static final String FUNCTION = "function";
    static final String LAMBDA = "lambda";
    static final String HANDLE = "handle";
    static final String MODULE = "module";
    static final String CLASS = "class";
    static final String SERIES = "pandas.Series";
    static final String GROUPBY = "pandas.GroupBy";
    static final String PARSER = "argparse.ArgumentParser";
    static final String NAMESPACE = "argparse.Namespace";

    private PyObjects() {
    }

    /** A function defined in the script or a workspace module ({@code module}), with the scope it closes over. */
    record Function(Node def, Scope closure, String module) {
    }

    record Lambda(Node node, Scope closure) {
    }

    /** What {@code open()} returned: the references it made already. */
    record Handle(List<DataReference> references) {
    }

    /** A module of the workspace, imported: its variables after running its top level. */
    record Module(String name, Scope scope) {
    }

    /** A frame column or a value computed from columns. */
    record Series(List<Origin> origins, boolean unknown) {
    }

    /** {@code df.groupby(keys)}, maybe with one column selected. */
    record GroupBy(Frame frame, List<String> keys, String column) {
    }

    record Namespace(java.util.Map<String, org.headwater.analysis.script.value.Value> values) {
    }
}
