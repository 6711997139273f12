/**
 * Format readers: each turns the first bytes of a file into its columns, row count and format facts.
 * Readers are pluggable through {@link org.headwater.harvest.format.FormatReader}; the
 * {@link org.headwater.harvest.format.FormatRegistry} picks one per file.
 */
package org.headwater.harvest.format;
