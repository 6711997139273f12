/**
 * Owns static script analysis: what each Python script, Jupyter notebook, R script and R Markdown /
 * Quarto document reads and writes, found by parsing the code (tree-sitter) and evaluating path
 * expressions over abstract values without running anything; the column lineage data-frame code
 * shows; and the script invocations of shell drivers. Read and write functions are data (the
 * {@code *-io.tsv} tables in the {@code io} package's resources), not code. Results are plain
 * records; turning them into observations for the ingestion path is the caller's job.
 *
 * <p><b>Working directory.</b> Relative paths in code are relative to where the script runs. A driver
 * that {@code cd}s says where; otherwise {@link org.headwater.analysis.script.AnalysisContext#defaults()}
 * assumes the workspace root for scripts (a top-level driver runs them so) and the document's own
 * folder for notebooks and R Markdown/Quarto (Jupyter starts kernels and knitr renders there). Both
 * are parameters. {@code __file__}, {@code Path(__file__)} and {@code here::here} do not depend on it.
 *
 * <p><b>Confidence.</b> A reference starts at its table row's confidence (1.0 for a qualified function)
 * and is multiplied by: 0.95 for a method on an object whose type was tracked (the variable came from
 * a known constructor or reader); a row for any receiver ({@code *.to_csv}: 0.6, {@code *.savefig}: 0.7)
 * applies when the receiver's type is not known; 0.8 for an R function whose package was neither
 * attached nor named with {@code ::}; 0.8 for tables found by scanning SQL text; 0.9 for each path
 * among several a branch allows; 0.9 for a read inside another workspace file's function, placed at
 * this script's call; 0.5 for a file mode that is not a constant (both directions are reported).
 * These are judgements of this project, not measured rates.
 *
 * <p><b>What is never guessed.</b> A path the code does not determine stays an unresolved reference
 * with its expression text and position; a loop over values the code does not show leaves a shape
 * ({@code raw/*.csv}) marked unresolved; a command-line argument no driver supplies is dropped only
 * when the code gives a default beside it, with a warning. Commented-out code, {@code if False:},
 * {@code if 0:}, R {@code if (FALSE)} and chunks with {@code eval=FALSE} produce nothing. Loops are
 * assumed to run (once, with the loop variable as a pattern hole); code after a {@code return} or
 * {@code sys.exit()} is still read.
 */
package org.headwater.analysis.script;
