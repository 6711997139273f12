package org.headwater.analysis.script.syntax;

import java.util.function.Supplier;
import org.treesitter.TSLanguage;
import org.treesitter.TreeSitterBash;
import org.treesitter.TreeSitterPython;
import org.treesitter.TreeSitterR;

/** The tree-sitter grammars Headwater parses scripts with. */
public enum Grammar {
    PYTHON(TreeSitterPython::new),
    R(TreeSitterR::new),
    BASH(TreeSitterBash::new);

    private final Supplier<TSLanguage> language;

    Grammar(Supplier<TSLanguage> language) {
        this.language = language;
    }

    TSLanguage language() {
        return language.get();
    }
}
