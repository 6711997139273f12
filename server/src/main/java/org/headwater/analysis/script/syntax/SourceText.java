package org.headwater.analysis.script.syntax;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.treesitter.TSTree;

/**
 * The UTF-8 bytes one tree was parsed from, and where they sit in the script file: a line offset
 * (code chunks of R Markdown start part-way down the file) and a notebook cell index.
 */
public final class SourceText {
    private final byte[] utf8;
    private final int[] lineStarts;
    private final int lineOffset;
    private final Integer cell;
    // Held so the native tree outlives every node read from it: the binding frees it when unreachable.
    private TSTree tree;

    SourceText(String code, int lineOffset, Integer cell) {
        this.utf8 = code.getBytes(StandardCharsets.UTF_8);
        this.lineOffset = lineOffset;
        this.cell = cell;
        List<Integer> starts = new ArrayList<>();
        starts.add(0);
        for (int i = 0; i < utf8.length; i++) {
            if (utf8[i] == '\n') {
                starts.add(i + 1);
            }
        }
        this.lineStarts = starts.stream().mapToInt(Integer::intValue).toArray();
    }

    void hold(TSTree parsed) {
        this.tree = parsed;
    }

    TSTree tree() {
        return tree;
    }

    String text(int startByte, int endByte) {
        return new String(utf8, startByte, endByte - startByte, StandardCharsets.UTF_8);
    }

    /** Line of a tree-sitter row in the script file, 1-based. */
    int line(int row) {
        return row + 1 + lineOffset;
    }

    /** Column in characters, 1-based: tree-sitter counts bytes, people count characters. */
    int column(int row, int startByte) {
        int lineStart = lineStarts[Math.min(row, lineStarts.length - 1)];
        return text(lineStart, startByte).codePointCount(0, text(lineStart, startByte).length()) + 1;
    }

    Integer cell() {
        return cell;
    }
}
