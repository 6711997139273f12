/**
 * Owns the detection of delimited-text ("CSV family") files: character encoding, dialect
 * (delimiter, quote, escape), layout (preamble, header, footer, line terminator), number
 * conventions and per-column logical types and statistics. It reads bytes and returns records;
 * it knows nothing about the catalog, storage or harvesting, which call {@link
 * org.headwater.harvest.format.csv.CsvSniffer} and keep what they need.
 */
package org.headwater.harvest.format.csv;
