/**
 * The {@code headwater} command line (picocli): one class per command, sharing the catalog and output
 * options. Exit codes: 0 when the work succeeded, 1 when it found problems, 2 for bad usage.
 */
package org.headwater.cli;
