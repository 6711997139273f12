package org.headwater.analysis.script.document;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.commonmark.node.AbstractVisitor;
import org.commonmark.node.FencedCodeBlock;
import org.commonmark.node.Node;
import org.commonmark.node.SourceSpan;
import org.commonmark.parser.IncludeSourceSpans;
import org.commonmark.parser.Parser;

/**
 * The executable code chunks of R Markdown and Quarto documents: fenced blocks whose info string is
 * in braces, {@code ```{r label, eval=FALSE}}. A chunk with {@code eval=FALSE} (or Quarto's
 * {@code #| eval: false}) never runs, so it is left out, like {@code if (FALSE)}.
 * // reference: R Markdown chunk options (knitr: eval), Quarto cell options (#| eval: false), from memory
 */
public final class MarkdownChunks {
    private static final Parser PARSER = Parser.builder().includeSourceSpans(IncludeSourceSpans.BLOCKS).build();

    private MarkdownChunks() {
    }

    public static List<CodePiece> read(String document) {
        List<CodePiece> out = new ArrayList<>();
        Node root = PARSER.parse(document);
        root.accept(new AbstractVisitor() {
            @Override
            public void visit(FencedCodeBlock block) {
                String info = block.getInfo() == null ? "" : block.getInfo().strip();
                if (!info.startsWith("{") || !info.endsWith("}")) {
                    return; // a plain code block is shown, not run
                }
                String header = info.substring(1, info.length() - 1).strip();
                String language = header.split("[\\s,]+")[0].toLowerCase(Locale.ROOT);
                String code = block.getLiteral();
                if (isOff(header) || code.lines().anyMatch(MarkdownChunks::isQuartoOff)) {
                    return;
                }
                List<SourceSpan> spans = block.getSourceSpans();
                int fenceLine = spans.isEmpty() ? 0 : spans.get(0).getLineIndex();
                out.add(new CodePiece(language, code, fenceLine + 1, null));
            }
        });
        return out;
    }

    private static boolean isOff(String header) {
        String compact = header.replace(" ", "");
        return compact.contains("eval=FALSE") || compact.contains("eval=F,") || compact.endsWith("eval=F");
    }

    private static boolean isQuartoOff(String line) {
        String compact = line.replace(" ", "").toLowerCase(Locale.ROOT);
        return compact.equals("#|eval:false");
    }
}
