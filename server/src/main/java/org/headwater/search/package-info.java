/**
 * Full-text search over the catalog with Apache Lucene: datasets, their columns, scripts and owners as
 * documents, Headwater's own query syntax, facets, snippets, "did you mean", and ranking by text relevance,
 * use and lineage centrality. The index is a derived copy: it is fed by the ingestion path after each
 * committed batch, records the last change-log sequence it absorbed, and can always be rebuilt from the store.
 */
package org.headwater.search;
