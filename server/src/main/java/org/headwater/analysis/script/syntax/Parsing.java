package org.headwater.analysis.script.syntax;

import java.util.EnumMap;
import java.util.Map;
import org.treesitter.TSParser;
import org.treesitter.TSTree;

/** Parses code with a grammar; one native parser per thread and grammar, since parsers are not shareable. */
public final class Parsing {
    private static final ThreadLocal<Map<Grammar, TSParser>> PARSERS = ThreadLocal.withInitial(() -> new EnumMap<>(Grammar.class));

    private Parsing() {
    }

    /** Parses a whole file. */
    public static Node parse(Grammar grammar, String code) {
        return parse(grammar, code, 0, null);
    }

    /**
     * Parses a piece of a file.
     *
     * @param lineOffset lines of the file above the piece (code chunks of R Markdown)
     * @param cell the notebook cell index, or {@code null}
     */
    public static Node parse(Grammar grammar, String code, int lineOffset, Integer cell) {
        TSParser parser = PARSERS.get().computeIfAbsent(grammar, g -> {
            TSParser p = new TSParser();
            p.setLanguage(g.language());
            return p;
        });
        SourceText source = new SourceText(code, lineOffset, cell);
        TSTree tree = parser.parseString(null, code);
        source.hold(tree);
        return new Node(tree.getRootNode(), source);
    }
}
