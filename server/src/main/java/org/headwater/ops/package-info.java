/**
 * Operations on a whole catalog: copying an embedded H2 store to a file and back ({@link
 * org.headwater.ops.H2Backup}), and the catalog as one versioned JSON document ({@link
 * org.headwater.ops.CatalogExport}, {@link org.headwater.ops.CatalogImport}). These move stored rows as
 * they are, history included; they never invent catalog facts, so they do not go through the ingestor.
 */
package org.headwater.ops;
