package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;
import java.util.List;

/**
 * Everything detected about one delimited text file.
 *
 * @param encoding the character encoding; its {@link #encodingName()} is the lowercase IANA name
 * @param bom whether the bytes start with a byte order mark
 * @param dialect delimiter, quote and escape
 * @param lineTerminator the dominant record terminator
 * @param header whether the first record after {@code skipLines} names the columns
 * @param skipLines physical lines before the header (or first data row): a {@code sep=} line,
 *     comments, titles
 * @param footerLines records after the data that are not data (totals, comments)
 * @param decimalSeparator '.' or ','
 * @param thousandsSeparator the digit-group separator seen in numbers, or {@code null}
 * @param columns one profile per column
 * @param rowCount data rows (header, preamble and footer excluded)
 * @param rowCountExact false when {@code rowCount} was estimated from a sample
 * @param profiledRows how many data rows the column statistics were computed from
 * @param warnings human-readable notes about doubtful findings
 */
public record CsvSniff(
    Charset encoding,
    boolean bom,
    Dialect dialect,
    LineTerminator lineTerminator,
    boolean header,
    int skipLines,
    int footerLines,
    char decimalSeparator,
    Character thousandsSeparator,
    List<ColumnProfile> columns,
    long rowCount,
    boolean rowCountExact,
    long profiledRows,
    List<String> warnings) {

  public CsvSniff {
    columns = List.copyOf(columns);
    warnings = List.copyOf(warnings);
  }

  /** The lowercase IANA name of the encoding, e.g. {@code utf-8}, {@code windows-1252}. */
  public String encodingName() {
    return encoding.name().toLowerCase(java.util.Locale.ROOT);
  }
}
