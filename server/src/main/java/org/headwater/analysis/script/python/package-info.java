/**
 * Owns the evaluation of Python scripts and notebooks without running them: statements in order,
 * imports and their aliases, function calls followed into the workspace's own functions, string
 * literals and formatting, argparse and sys.argv, pathlib and os.path, and pandas frame operations for
 * column lineage. Read and write functions come from {@code python-io.tsv}.
 */
package org.headwater.analysis.script.python;
