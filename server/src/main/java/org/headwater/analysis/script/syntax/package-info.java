/**
 * Owns parsing: it wraps the tree-sitter grammars (Python, R, bash) behind a small read-only node
 * type that knows its source text, its 1-based line and column, and its notebook cell. Nothing here
 * knows what a script reads or writes.
 */
package org.headwater.analysis.script.syntax;
