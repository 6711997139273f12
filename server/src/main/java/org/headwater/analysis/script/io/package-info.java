/**
 * Owns the tables of read and write functions (one TSV resource per language) and the binding of a
 * call's arguments to the parameter that holds the path. Adding a library means adding rows, not code.
 */
package org.headwater.analysis.script.io;
