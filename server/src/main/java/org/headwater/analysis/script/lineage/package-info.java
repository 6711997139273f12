/**
 * Owns column lineage inside a script: a data frame's columns and where each came from, updated by the
 * frame operations the code shows (selection, rename, assignment, merge, aggregation), and the tables
 * of which operation does what to columns. Where the code hides it, a frame says so instead of guessing.
 */
package org.headwater.analysis.script.lineage;
