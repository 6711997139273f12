package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;

/**
 * The web assets work under {@code Content-Security-Policy: script-src 'self'} and put catalog text on the
 * page as text: checked on the files themselves, so a new view that breaks the rule fails here at once.
 */
class WebAssetsTest {
    static final Path ASSETS = Workspaces.repoRoot().resolve("web/src/main/resources/headwater-web");

    static List<Path> files(String ending) throws IOException {
        try (Stream<Path> s = Files.list(ASSETS)) {
            return s.filter(p -> p.toString().endsWith(ending)).sorted().toList();
        }
    }

    @Test
    void pagesHaveNoInlineScriptsOrEventHandlerAttributes() throws IOException {
        // expected: CSP Level 3 (W3C), section 6.1.10: with script-src 'self' and no 'unsafe-inline', inline
        // <script> blocks and on* attributes do not run
        Pattern inline = Pattern.compile("<script(?![^>]*\\bsrc=)[^>]*>", Pattern.CASE_INSENSITIVE);
        Pattern handler = Pattern.compile("<[^>]+\\son[a-z]+\\s*=", Pattern.CASE_INSENSITIVE);
        List<Path> pages = files(".html");
        assertThat(pages).isNotEmpty();
        for (Path page : pages) {
            String html = Files.readString(page);
            assertThat(inline.matcher(html).find()).as(page + " has an inline script").isFalse();
            assertThat(handler.matcher(html).find()).as(page + " has an event-handler attribute").isFalse();
        }
    }

    @Test
    void scriptsUseNoEvalAndSetHtmlOnlyFromTheEscapedSnippet() throws IOException {
        // expected: CSP Level 3 blocks eval and new Function without 'unsafe-eval' (section 6.1.10.4);
        // common practice, no source: string timers count as eval too
        Pattern eval = Pattern.compile("\\beval\\s*\\(|new\\s+Function\\s*\\(|setTimeout\\s*\\(\\s*[\"'`]|setInterval\\s*\\(\\s*[\"'`]");
        Pattern html = Pattern.compile("\\.(innerHTML|outerHTML)\\s*=|insertAdjacentHTML|document\\.write");
        int htmlSinks = 0;
        for (Path script : files(".js")) {
            List<String> lines = Files.readAllLines(script);
            for (String line : lines) {
                assertThat(eval.matcher(line).find()).as(script.getFileName() + ": " + line).isFalse();
                if (html.matcher(line).find()) {
                    assertThat(line.trim()).as(script.getFileName() + " sets HTML").isEqualTo("p.innerHTML = hit.snippet;");
                    htmlSinks++;
                }
            }
        }
        assertThat(htmlSinks).isEqualTo(1);
    }
}
