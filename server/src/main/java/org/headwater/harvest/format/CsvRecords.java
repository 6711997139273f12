package org.headwater.harvest.format;

import java.util.ArrayList;
import java.util.List;

/** Splits delimited text into records, honouring quotes, doubled quotes and line breaks inside quotes (RFC 4180). */
final class CsvRecords {
    private final String text;
    private final char delimiter;
    private final char quote;

    CsvRecords(String text, char delimiter, char quote) {
        this.text = text;
        this.delimiter = delimiter;
        this.quote = quote;
    }

    /**
     * Reads up to {@code max} records. When the text is a cut sample, the last record may be partial and
     * is dropped. Blank lines are skipped.
     */
    List<List<String>> read(int max, boolean dropPartialLast) {
        List<List<String>> records = new ArrayList<>();
        List<String> fields = new ArrayList<>();
        StringBuilder field = new StringBuilder();
        boolean quoted = false;
        boolean fieldStarted = false;
        int i = 0;
        int n = text.length();
        while (i < n && records.size() < max) {
            char ch = text.charAt(i);
            if (quoted) {
                if (ch == quote) {
                    if (i + 1 < n && text.charAt(i + 1) == quote) {
                        field.append(quote);
                        i += 2;
                        continue;
                    }
                    quoted = false;
                } else {
                    field.append(ch);
                }
                i++;
                continue;
            }
            if (ch == quote && !fieldStarted) {
                quoted = true;
                fieldStarted = true;
            } else if (ch == delimiter) {
                fields.add(field.toString());
                field.setLength(0);
                fieldStarted = false;
            } else if (ch == '\n' || ch == '\r') {
                if (ch == '\r' && i + 1 < n && text.charAt(i + 1) == '\n') {
                    i++;
                }
                if (fieldStarted || !fields.isEmpty() || field.length() > 0) {
                    fields.add(field.toString());
                    records.add(fields);
                }
                fields = new ArrayList<>();
                field.setLength(0);
                fieldStarted = false;
            } else {
                field.append(ch);
                fieldStarted = true;
            }
            i++;
        }
        boolean reachedEnd = i >= n;
        if (reachedEnd && records.size() < max && (fieldStarted || !fields.isEmpty() || field.length() > 0)) {
            if (!dropPartialLast) {
                fields.add(field.toString());
                records.add(fields);
            }
        }
        return records;
    }
}
