/**
 * Owns static script analysis: what each Python script, Jupyter notebook, R script and R Markdown
 * document reads and writes, found by parsing the code (tree-sitter) and evaluating path expressions
 * without running anything, plus the column lineage data-frame code shows, and the script invocations
 * of shell drivers. Read and write functions are data (the {@code *-io.tsv} tables beside this
 * package's classes), not code. The results are plain records; turning them into observations for the
 * ingestion path is the caller's job.
 */
package org.headwater.analysis.script;
