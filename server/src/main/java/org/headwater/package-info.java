/**
 * The catalog as one object: {@link org.headwater.Catalog} wires the store, the ingestion path, the search
 * index, the lineage graph and the change-log follower together; the CLI and the HTTP server each hold one.
 */
package org.headwater;
