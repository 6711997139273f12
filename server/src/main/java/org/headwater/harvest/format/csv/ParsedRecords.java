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
 * @param terminators how often each line terminator ended a record or blank line
 */
public record ParsedRecords(
    List<CsvRecord> records, int end, boolean truncated, int irregularities,
    TerminatorCounts terminators) {

  public ParsedRecords {
    records = List.copyOf(records);
  }
}
