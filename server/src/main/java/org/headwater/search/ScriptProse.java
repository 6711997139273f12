package org.headwater.search;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;

/**
 * The words a script's author wrote about it: a Python module docstring, the leading comment block of an R,
 * shell or SQL file, the first Markdown cell of a notebook. Read from the file itself (the store keeps no
 * script text), from its first 64 KiB; a file that cannot be read has no prose.
 */
final class ScriptProse {
    private static final int READ_LIMIT = 64 * 1024;
    private static final int PROSE_LIMIT = 4000;
    private static final ObjectMapper JSON = new ObjectMapper();
    // A comment can hold a credential; such lines never reach the index.
    private static final Pattern SECRET = Pattern.compile(
            "(?i)(password|passwd|secret|token|api[_-]?key|credential)s?\\s*[:=]");
    private static final Pattern PY_DOCSTRING = Pattern.compile("^\\s*[rRuU]?(\"\"\"|''')(.*?)\\1", Pattern.DOTALL);

    private ScriptProse() {
    }

    /** The prose of the script at {@code uri}, or an empty string. */
    static String of(String uri) {
        Path path;
        try {
            URI parsed = URI.create(uri);
            if (!"file".equals(parsed.getScheme())) {
                return "";
            }
            path = Path.of(parsed);
        } catch (IllegalArgumentException | java.nio.file.FileSystemNotFoundException notLocal) {
            return "";
        }
        String text;
        try (InputStream in = Files.newInputStream(path)) {
            text = new String(in.readNBytes(READ_LIMIT), StandardCharsets.UTF_8);
        } catch (IOException | SecurityException unreadable) {
            return "";
        }
        return clean(extract(path.getFileName().toString().toLowerCase(Locale.ROOT), text));
    }

    static String extract(String fileName, String text) {
        if (fileName.endsWith(".ipynb")) {
            return notebook(text);
        }
        if (fileName.endsWith(".sql")) {
            return leadingComments(text, "--");
        }
        if (fileName.endsWith(".py")) {
            String comments = leadingComments(text, "#");
            String rest = text.lines().dropWhile(l -> l.isBlank() || l.stripLeading().startsWith("#"))
                    .reduce((a, b) -> a + "\n" + b).orElse("");
            var m = PY_DOCSTRING.matcher(rest);
            return m.find() ? (comments + "\n" + m.group(2)).strip() : comments;
        }
        return leadingComments(text, "#");
    }

    /** The first comment block, after a shebang line and blank lines, without the comment markers. */
    private static String leadingComments(String text, String marker) {
        List<String> lines = new ArrayList<>();
        boolean started = false;
        for (String line : (Iterable<String>) text.lines()::iterator) {
            String t = line.strip();
            if (t.startsWith("#!") && !started) {
                continue;
            }
            if (t.startsWith(marker)) {
                started = true;
                lines.add(t.substring(marker.length()).strip());
            } else if (t.isEmpty() && !started) {
                continue;
            } else {
                break;
            }
        }
        return String.join("\n", lines);
    }

    private static String notebook(String text) {
        try {
            JsonNode cells = JSON.readTree(text).path("cells");
            for (JsonNode cell : cells) {
                if (cell.path("cell_type").asText().equals("markdown")) {
                    JsonNode source = cell.path("source");
                    StringBuilder out = new StringBuilder();
                    if (source.isArray()) {
                        source.forEach(s -> out.append(s.asText()));
                    } else {
                        out.append(source.asText());
                    }
                    return out.toString().replaceAll("(?m)^#+\\s*", "");
                }
            }
        } catch (IOException | RuntimeException truncatedOrNotJson) {
            // A notebook longer than the read limit or not JSON simply has no prose here.
        }
        return "";
    }

    private static String clean(String prose) {
        StringBuilder out = new StringBuilder();
        for (String line : (Iterable<String>) prose.lines()::iterator) {
            if (!SECRET.matcher(line).find()) {
                out.append(line).append('\n');
            }
        }
        String text = out.toString().strip();
        return text.length() > PROSE_LIMIT ? text.substring(0, PROSE_LIMIT) : text;
    }
}
