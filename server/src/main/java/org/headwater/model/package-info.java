/**
 * The catalog's vocabulary as plain values: dataset kinds, evidence, columns and the names people see.
 * Every other package speaks in these types; none of them touches storage or I/O.
 */
package org.headwater.model;
