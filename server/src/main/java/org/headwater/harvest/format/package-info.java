/**
 * Format readers: each turns the first bytes of a file into its columns, row count and format facts.
 * Readers are pluggable through {@link org.headwater.harvest.format.FormatReader}; the
 * {@link org.headwater.harvest.format.FormatRegistry} picks one per file. Readers of formats that keep their
 * structure at the end (Parquet, PDF) read it through {@link org.headwater.harvest.format.Sample#readTail(int)};
 * {@link org.headwater.harvest.format.ContentSniffer} names a file's format from its content.
 */
package org.headwater.harvest.format;
