package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.headwater.model.DatasetKind;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SvgFigureTest {
    private final FigureReader reader = new FigureReader();

    @TempDir
    Path dir;

    private static Sample whole(String name, String text) {
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        return new Sample(name, bytes, true, bytes.length);
    }

    // SVG 1.1: width/height (7.2), viewBox (7.7), <title>/<desc> (5.4), <metadata> with RDF and Dublin Core (21).
    private static final String CHART = """
            <?xml version="1.0" encoding="UTF-8" standalone="no"?>
            <!-- drawn by a test -->
            <!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">
            <svg xmlns="http://www.w3.org/2000/svg" width="432pt" height="288pt" viewBox="0, 0 432 288.5" version="1.1">
              <title>Dissolved oxygen
                 by station</title>
              <desc>Means of <tspan>weekly</tspan> samples &amp; their range</desc>
              <metadata>
                <rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#" xmlns:dc="http://purl.org/dc/elements/1.1/"
                         xmlns:cc="http://creativecommons.org/ns#">
                  <cc:Work>
                    <dc:title>Oxygen by station</dc:title>
                    <dc:date>2026-01-05</dc:date>
                    <dc:creator><cc:Agent><dc:title>plotting script v2</dc:title></cc:Agent></dc:creator>
                    <dc:type rdf:resource="http://purl.org/dc/dcmitype/StillImage"/>
                  </cc:Work>
                </rdf:RDF>
              </metadata>
              <g><title>a group's own title, not the document's</title><rect width="10" height="10"/></g>
            </svg>
            """;

    @Test
    void sizeTitleDescriptionAndDublinCoreAreRead() throws Exception {
        Reading r = reader.read(whole("chart.svg", CHART));
        assertThat(r.format()).isEqualTo("svg");
        assertThat(r.kind()).isEqualTo(DatasetKind.FIGURE);
        assertThat(r.details()).containsEntry("width", "432pt").containsEntry("height", "288pt")
                .containsEntry("view_box", List.of(0.0, 0.0, 432.0, 288.5))
                .containsEntry("title", "Dissolved oxygen by station")
                .containsEntry("description", "Means of weekly samples & their range")
                .containsEntry("metadata", Map.of("title", "Oxygen by station", "date", "2026-01-05",
                        "creator.title", "plotting script v2"))
                .containsEntry("metadata_text", "Oxygen by station 2026-01-05 plotting script v2");
    }

    @Test
    void theDemoWorkspaceFigureIsRead() throws Exception {
        Path file = Workspaces.demo().resolve("bulletin/figures/fig2_do_by_station.svg");
        byte[] bytes = Files.readAllBytes(file);
        Reading r = reader.read(new Sample(file.getFileName().toString(), bytes, true, bytes.length));
        assertThat(r.details()).containsEntry("width", "432pt").containsEntry("height", "288pt")
                .containsEntry("view_box", List.of(0.0, 0.0, 432.0, 288.0))
                .containsEntry("title", "Quillwater basin — mean dissolved oxygen by station, March–April 2025");
    }

    @Test
    void theDeclaredEncodingIsHonoured() throws Exception {
        // XML 1.0 section 4.3.3 and appendix F: the encoding declaration names the bytes' encoding.
        byte[] latin1 = "<?xml version='1.0' encoding='ISO-8859-1'?><svg><title>Café – Grüße</title></svg>"
                .replace("–", "-").getBytes(StandardCharsets.ISO_8859_1);
        Reading r = reader.read(new Sample("l.svg", latin1, true, latin1.length));
        assertThat(r.details()).containsEntry("title", "Café - Grüße");
    }

    @Test
    void anExternalEntityIsNeverResolved() throws Exception {
        Path secret = Files.writeString(dir.resolve("secret.txt"), "the cellar key is under the mat");
        String xxe = "<?xml version=\"1.0\"?><!DOCTYPE svg [<!ENTITY x SYSTEM \"" + secret.toUri() + "\">]>"
                + "<svg xmlns=\"http://www.w3.org/2000/svg\"><title>&x;</title></svg>";
        // With DTD processing off the entity is never declared, so its use is an error (XML 1.0 section 4.1, WFC:
        // Entity Declared) and the file's content is never read.
        assertThatThrownBy(() -> reader.read(whole("evil.svg", xxe)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("Invalid SVG at line 1, column ")
                .hasMessageEndingWith(": The entity \"x\" was referenced, but not declared.")
                .hasMessageNotContaining("cellar")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void nestedEntityExpansionIsRefusedNotExpanded() {
        StringBuilder dtd = new StringBuilder("<!DOCTYPE svg [<!ENTITY l0 \"lol\">");
        for (int i = 1; i <= 9; i++) {
            dtd.append("<!ENTITY l").append(i).append(" \"").append(("&l" + (i - 1) + ";").repeat(10)).append("\">");
        }
        String laughs = dtd + "]><svg><title>&l9;</title></svg>";
        assertThatThrownBy(() -> reader.read(whole("laughs.svg", laughs)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageEndingWith(": The entity \"l9\" was referenced, but not declared.")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void aDotSvgWhoseRootIsNotSvgIsInvalid() {
        assertThatThrownBy(() -> reader.read(whole("page.svg", "<html><body/></html>")))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The root element is <html>, not <svg>");
    }

    @Test
    void aFileCutShortIsTruncated() {
        String cut = CHART.substring(0, CHART.indexOf("<metadata>"));
        assertThatThrownBy(() -> reader.read(whole("chart.svg", cut)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("The SVG ends early at line ")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("truncated");
    }

    @Test
    void aLargeSvgIsReadWholeThroughTheTailReaderOrPartlyFromItsHead() throws Exception {
        String big = CHART.replace("</svg>", "<g>" + "<circle r=\"1\"/>".repeat(8000) + "</g><desc>late</desc></svg>");
        byte[] bytes = big.getBytes(StandardCharsets.UTF_8);
        Path file = Files.write(dir.resolve("big.svg"), bytes);
        byte[] head = Arrays.copyOf(bytes, 64 * 1024);
        Reading withTail = reader.read(new Sample("big.svg", head, false, bytes.length, new FileTailReader(file, bytes.length)));
        assertThat(withTail.details()).containsEntry("title", "Dissolved oxygen by station").doesNotContainKey("read_to_end");
        Reading headOnly = reader.read(new Sample("big.svg", head, false, bytes.length));
        assertThat(headOnly.details()).containsEntry("title", "Dissolved oxygen by station").containsEntry("read_to_end", false);
    }

    @Test
    void svgContentIsAFigureWhateverTheName() throws Exception {
        Reading r = FormatRegistry.standard().read(whole("chart.txt", CHART));
        assertThat(r.format()).isEqualTo("svg");
    }
}
