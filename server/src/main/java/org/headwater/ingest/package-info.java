/**
 * The single path by which metadata enters the catalog. Every source (folder harvests, script analysis,
 * runtime connectors, edits through the API) describes what it saw as {@link org.headwater.ingest.Observation}s;
 * the {@link org.headwater.ingest.Ingestor} applies a batch of them in one transaction, idempotently,
 * keeps their history as validity intervals, appends to the change log, and then tells its listeners
 * (the search index, the lineage graph) what changed. On a shared store the
 * {@link org.headwater.ingest.ChangeFollower} brings other processes' changes from the change log to the
 * same listeners.
 */
package org.headwater.ingest;
