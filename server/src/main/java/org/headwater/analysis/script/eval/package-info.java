/**
 * Owns what both language evaluators share: how one run of a script is set up (workspace, working
 * directory, command-line arguments), how a matched read or write becomes data references (path
 * normalisation, SQL table names, choices and unknowns), and the findings a run collects.
 */
package org.headwater.analysis.script.eval;
