package org.headwater.harvest.format.csv;

import java.util.List;

/**
 * The records split from a text, and how cleanly they split.
 *
 * @param records complete records, blank lines left out
 * @param end offset just past the last complete record
 * @param truncated whether the text ended inside a record that the sample cut (not returned)
 * @param irregularities fields that broke the dialect's rules: text after a closing quote, a
 *     quote inside an unquoted field, a quote never closed at the end of the file
 * @param quotedFields fields that opened with the quote character
 * @param escapes backslash escapes used (always 0 unless the dialect has them)
 * @param specialEscapes those of the escapes that protect a character with a meaning: the
 *     quote, the delimiter, a line break or the backslash itself
 * @param terminators how often each line terminator ended a record or blank line
 */
public record ParsedRecords(
    List<CsvRecord> records, int end, boolean truncated, int irregularities,
    int quotedFields, int escapes, int specialEscapes, TerminatorCounts terminators) {

  public ParsedRecords {
    records = List.copyOf(records);
  }
}
