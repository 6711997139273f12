/**
 * The lineage graph in memory: which datasets and columns are upstream and downstream of which, with
 * distances and one shortest path each, answered by breadth-first walks over int arrays.
 *
 * <p>{@link org.headwater.lineage.LineageGraph} is the entry point. It is derived data, like the search
 * index: built from the store's {@code lineage_edge} and {@code column_lineage} rows by
 * {@link org.headwater.lineage.LineageLoader}, kept current as an
 * {@link org.headwater.ingest.ChangeListener}, and rebuilt at every start. Questions about the past
 * build a temporary graph {@linkplain org.headwater.lineage.LineageGraph#loadAsOf as of an instant}.
 */
package org.headwater.lineage;
