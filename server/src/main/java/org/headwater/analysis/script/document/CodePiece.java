package org.headwater.analysis.script.document;

import java.util.Objects;

/**
 * Code taken out of a document.
 *
 * @param language the kernel or chunk language, lower case ({@code python}, {@code r})
 * @param lineOffset lines of the document above the code (R Markdown chunks); 0 for notebook cells
 * @param cell the notebook cell index, or {@code null} for chunks
 */
public record CodePiece(String language, String code, int lineOffset, Integer cell) {
    public CodePiece {
        Objects.requireNonNull(language, "language");
        Objects.requireNonNull(code, "code");
    }
}
