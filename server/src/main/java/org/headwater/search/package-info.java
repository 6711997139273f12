/**
 * Full-text search over the catalog with Apache Lucene. The index is a derived copy: it is fed by the
 * ingestion path after each committed batch, records the last change-log sequence it absorbed, and can
 * always be rebuilt from the store.
 */
package org.headwater.search;
