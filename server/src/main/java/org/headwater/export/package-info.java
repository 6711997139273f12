/**
 * What leaves the catalog in an open format: the lineage graph as W3C PROV-O in JSON-LD. Export reads the
 * store (as it is now or as it was at a given time) and never changes it.
 */
package org.headwater.export;
