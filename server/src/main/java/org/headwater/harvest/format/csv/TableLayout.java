package org.headwater.harvest.format.csv;

import java.util.List;

/**
 * Where the table sits in the decoded text.
 *
 * @param width the number of columns (the most common record width)
 * @param header whether the table starts with a header record
 * @param skipLines physical lines before the header or first data row
 * @param dataStart offset in the text of the first data row
 * @param names one unique name per column
 */
record TableLayout(int width, boolean header, int skipLines, int dataStart, List<String> names) {}
