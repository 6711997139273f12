package org.headwater.model;

import java.util.Locale;
import java.util.Map;
import java.util.Optional;

/** The script languages the catalog records, and the file endings that name them. */
public enum Language {
    PYTHON, R, SQL, NOTEBOOK, SHELL;

    private static final Map<String, Language> BY_EXTENSION = Map.of(
            "py", PYTHON,
            "r", R,
            "rmd", R,
            "qmd", R,
            "sql", SQL,
            "ipynb", NOTEBOOK,
            "sh", SHELL);

    /** The lower-case word stored and shown. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The language a file name's ending stands for, if it is a script at all. */
    public static Optional<Language> ofFileName(String fileName) {
        int dot = fileName.lastIndexOf('.');
        if (dot < 0) {
            return Optional.empty();
        }
        return Optional.ofNullable(BY_EXTENSION.get(fileName.substring(dot + 1).toLowerCase(Locale.ROOT)));
    }

    /** Reads a stored word back. */
    public static Language of(String word) {
        return valueOf(word.trim().toUpperCase(Locale.ROOT));
    }
}
