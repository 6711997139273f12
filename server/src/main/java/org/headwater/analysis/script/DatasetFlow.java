package org.headwater.analysis.script;

import java.util.List;
import java.util.Objects;

/**
 * How a written data frame came from the datasets the script read.
 *
 * @param target the write
 * @param sources the datasets read that reach the written frame (path patterns or {@code table:name})
 * @param columns per output column, where the code shows it
 * @param datasetLevelOnly true when the code does not show every output column's origin: then
 *     {@code columns} lists only what is known, and the flow holds at dataset level
 */
public record DatasetFlow(DataReference target, List<String> sources, List<ColumnFlow> columns,
        boolean datasetLevelOnly) {
    public DatasetFlow {
        Objects.requireNonNull(target, "target");
        sources = List.copyOf(sources);
        columns = List.copyOf(columns);
    }
}
