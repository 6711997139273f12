/**
 * Static analysis of scripts: what each Python, notebook, R, shell and SQL file reads and writes, down to
 * columns where the code shows it ({@code analysis.script}, {@code analysis.sql}), and the source that
 * turns those findings into observations for the ingestion path ({@link org.headwater.analysis.ScriptLineage}).
 */
package org.headwater.analysis;
