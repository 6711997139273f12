package org.headwater.harvest.format.csv;

/**
 * Lines before the table that are recognised without a dialect.
 *
 * @param offset where the rest of the text starts
 * @param forcedDelimiter the delimiter named by an Excel-style {@code sep=} first line, or 0
 * @param commentLines lines starting with '#' that were passed over
 */
record LeadingLines(int offset, char forcedDelimiter, int commentLines) {}
