package org.headwater.impact;

import java.util.EnumMap;
import java.util.Map;

/** The sentence that says what a change does to each affected thing: a table, change kind by relation. */
final class Why {
    /** How an affected thing relates to the changed target. */
    enum Relation { COPY, COMPUTE, ROWS, READER, NAMED, NAMED_OUTPUT, HOLDER, WHOLE, UNKNOWN_COLUMNS, MADE_FROM, DOWNSTREAM_READER }

    private static final Map<ChangeKind, Map<Relation, String>> TABLE = new EnumMap<>(ChangeKind.class);

    static {
        put(ChangeKind.DROP,
                Relation.COPY, "copied from the dropped column: loses its values",
                Relation.COMPUTE, "computed from the dropped column: can no longer be computed",
                Relation.ROWS, "its rows are chosen, joined or grouped by the dropped column",
                Relation.READER, "reads the dropped column: fails or changes meaning",
                Relation.NAMED, "its code names the dropped column (a use such as a filter, not traced as a flow): fails or changes meaning",
                Relation.NAMED_OUTPUT, "written by a script whose code names the dropped column: may change",
                Relation.HOLDER, "holds columns made from the dropped column",
                Relation.WHOLE, "made using the dropped column",
                Relation.UNKNOWN_COLUMNS, "reads the dataset; which of its columns is not known");
        put(ChangeKind.RENAME,
                Relation.COPY, "copied from the renamed column, which its script names by the old name",
                Relation.COMPUTE, "computed from the renamed column, which its script names by the old name",
                Relation.ROWS, "its rows are chosen, joined or grouped by the renamed column",
                Relation.READER, "names the column by its old name: must be updated",
                Relation.NAMED, "its code names the column by its old name: must be updated",
                Relation.NAMED_OUTPUT, "written by a script whose code names the renamed column",
                Relation.HOLDER, "holds columns made from the renamed column",
                Relation.WHOLE, "made using the renamed column",
                Relation.UNKNOWN_COLUMNS, "reads the dataset; which of its columns is not known");
        put(ChangeKind.RETYPE,
                Relation.COPY, "copied from the column: takes on its new type",
                Relation.COMPUTE, "computed from the column: may fail or change under the new type",
                Relation.ROWS, "filtered, joined or grouped by the column: comparisons may change under the new type",
                Relation.READER, "reads the column: must accept the new type",
                Relation.NAMED, "its code names the column: must accept the new type",
                Relation.NAMED_OUTPUT, "written by a script whose code names the retyped column: may change",
                Relation.HOLDER, "holds columns made from the retyped column",
                Relation.WHOLE, "made using the retyped column",
                Relation.UNKNOWN_COLUMNS, "reads the dataset; which of its columns is not known");
        put(ChangeKind.DELETE,
                Relation.MADE_FROM, "made from the deleted or moved dataset: can no longer be rebuilt",
                Relation.READER, "reads the deleted or moved dataset: fails",
                Relation.DOWNSTREAM_READER, "reads a dataset made from the deleted or moved one: fails once that is rebuilt");
        put(ChangeKind.STALE,
                Relation.MADE_FROM, "made from the late dataset: stale until rebuilt after it arrives",
                Relation.READER, "reads the late dataset: must run again once it arrives",
                Relation.DOWNSTREAM_READER, "reads a dataset made from the late one: must run again after it");
    }

    private Why() {
    }

    private static void put(ChangeKind change, Object... relationThenText) {
        Map<Relation, String> row = new EnumMap<>(Relation.class);
        for (int i = 0; i < relationThenText.length; i += 2) {
            row.put((Relation) relationThenText[i], (String) relationThenText[i + 1]);
        }
        TABLE.put(change, row);
    }

    static String of(ChangeKind change, Relation relation) {
        String text = TABLE.get(change).get(relation);
        if (text == null) {
            throw new IllegalArgumentException("No wording for " + relation + " under " + change);
        }
        return text;
    }
}
