/**
 * Owns the documents that hold code among other things: the code cells of Jupyter notebooks (with
 * IPython magics and shell escapes blanked out) and the code chunks of R Markdown and Quarto files.
 */
package org.headwater.analysis.script.document;
