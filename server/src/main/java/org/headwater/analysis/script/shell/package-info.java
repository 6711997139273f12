/**
 * Owns shell drivers: the command lines of a {@code .sh} file (parsed with tree-sitter-bash) that run
 * Python, R or notebook scripts, with their arguments as the shell would pass them, variables and
 * literal for-loops expanded, and the working directory followed through {@code cd}.
 */
package org.headwater.analysis.script.shell;
