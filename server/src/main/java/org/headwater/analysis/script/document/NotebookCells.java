package org.headwater.analysis.script.document;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * The code cells of a Jupyter notebook, in order. Lines that are IPython magics ({@code %...}) or shell
 * escapes ({@code !...}) are blanked, so the rest parses as the kernel's language and keeps its line
 * numbers; a cell magic other than timing or capture makes the whole cell another language, so it is
 * left out. // reference: nbformat 4 JSON schema (cells, cell_type, source as string or list of lines)
 */
public final class NotebookCells {
    private static final ObjectMapper JSON = new ObjectMapper();
    // Cell magics that run the rest of the cell as Python. // common practice, no source
    private static final Set<String> PYTHON_CELL_MAGICS = Set.of("time", "timeit", "capture", "prun", "memit");

    private NotebookCells() {
    }

    /** The notebook's kernel language, from its metadata, {@code python} when it does not say. */
    public static String language(JsonNode notebook) {
        String lang = notebook.path("metadata").path("kernelspec").path("language").asText("");
        if (lang.isEmpty()) {
            lang = notebook.path("metadata").path("language_info").path("name").asText("python");
        }
        return lang.toLowerCase(Locale.ROOT);
    }

    public static List<CodePiece> read(String json) throws IOException {
        JsonNode notebook = JSON.readTree(json);
        String language = language(notebook);
        List<CodePiece> out = new ArrayList<>();
        JsonNode cells = notebook.path("cells");
        for (int i = 0; i < cells.size(); i++) {
            JsonNode cell = cells.get(i);
            if (!"code".equals(cell.path("cell_type").asText())) {
                continue;
            }
            String source = source(cell.path("source"));
            String code = blankMagics(source);
            if (code != null) {
                out.add(new CodePiece(language, code, 0, i));
            }
        }
        return out;
    }

    private static String source(JsonNode source) {
        if (source.isArray()) {
            StringBuilder sb = new StringBuilder();
            source.forEach(line -> sb.append(line.asText()));
            return sb.toString();
        }
        return source.asText("");
    }

    /** The cell with magic and shell lines blanked, or {@code null} when a cell magic makes it another language. */
    static String blankMagics(String source) {
        String[] lines = source.split("\n", -1);
        String first = lines.length == 0 ? "" : lines[0].strip();
        if (first.startsWith("%%")) {
            String magic = first.substring(2).split("\\s+")[0];
            if (!PYTHON_CELL_MAGICS.contains(magic)) {
                return null;
            }
            lines[0] = "";
        }
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < lines.length; i++) {
            String stripped = lines[i].stripLeading();
            boolean magic = stripped.startsWith("%") || stripped.startsWith("!");
            out.append(magic ? "" : lines[i]);
            if (i + 1 < lines.length) {
                out.append('\n');
            }
        }
        return out.toString();
    }
}
