/**
 * Owns the evaluation of R scripts and R Markdown chunks without running them: assignments in every
 * arrow direction, pipes, attached packages, file.path/paste/sprintf/here, commandArgs, functions of the
 * script followed at their calls, and dplyr verbs for column lineage. Read and write functions come
 * from {@code r-io.tsv}.
 */
package org.headwater.analysis.script.r;
