package org.headwater.impact;

import java.io.IOException;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Pattern;
import org.headwater.store.LabelReader;

/**
 * Whether a script's code names a column. Static analysis of Python and R traces the columns a script
 * copies and computes, but not those it filters or joins on; a script whose code names the changed
 * column as a whole word reads it, even where no traced flow shows it.
 */
final class ScriptTexts {
    /** Scripts larger than this are not searched (they are listed as uncertain instead). */
    private static final long MAX_BYTES = 4L * 1024 * 1024;

    private final LabelReader labels;
    private final Map<Long, Optional<String>> texts = new HashMap<>();

    ScriptTexts(LabelReader labels) {
        this.labels = labels;
    }

    /** True or false when the code could be read; empty when it could not (gone, remote, too large). */
    Optional<Boolean> names(long scriptId, String column) {
        Optional<String> text = texts.computeIfAbsent(scriptId, this::read);
        Pattern word = Pattern.compile("(?<![\\p{L}\\p{N}_])" + Pattern.quote(column) + "(?![\\p{L}\\p{N}_])");
        return text.map(t -> word.matcher(t).find());
    }

    private Optional<String> read(long scriptId) {
        String uri = labels.scriptUris(List.of(scriptId)).get(scriptId);
        if (uri == null || !uri.startsWith("file:")) {
            return Optional.empty();
        }
        try {
            Path file = Path.of(URI.create(uri));
            if (!Files.isRegularFile(file) || Files.size(file) > MAX_BYTES) {
                return Optional.empty();
            }
            return Optional.of(new String(Files.readAllBytes(file), StandardCharsets.UTF_8));
        } catch (IOException | RuntimeException e) {
            return Optional.empty();
        }
    }
}
