package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;

import java.awt.image.BufferedImage;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

class ContentSnifferTest {

    private static Sniff sniff(String name, byte[] bytes) {
        return ContentSniffer.sniff(new Sample(name, bytes, true, bytes.length));
    }

    private static Sniff sniff(String name, String text) {
        return sniff(name, text.getBytes(StandardCharsets.UTF_8));
    }

    private static Sniff sniffHead(String name, String text, long size) {
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        return ContentSniffer.sniff(new Sample(name, bytes, false, size));
    }

    @Test
    void signaturesDecideWhateverTheName() throws Exception {
        BufferedImage image = Images.picture(4, 4, BufferedImage.TYPE_INT_RGB);
        // PNG spec 5.2; ITU T.81 B.1.1.3 (SOI); GIF89a section 17; ISO 32000-1 7.5.2.
        assertThat(sniff("table.csv", Images.write(image, "png")))
                .isEqualTo(new Sniff("png", 0.95, "The file starts with the PNG signature"));
        assertThat(sniff("notes.txt", Images.write(image, "jpeg")).format()).isEqualTo("jpeg");
        assertThat(sniff("data.json", Images.write(image, "gif")).format()).isEqualTo("gif");
        assertThat(sniff("report", "%PDF-1.7\n%%EOF\n")).isEqualTo(new Sniff("pdf", 0.95, "The file starts with the PDF signature"));
    }

    @Test
    void aPdfHeaderAfterLeadingBytesIsStillAPdf() {
        assertThat(sniff("mail.bin", "junk from a mail gateway\n%PDF-1.4\n"))
                .isEqualTo(new Sniff("pdf", 0.85, "A PDF header at byte 25, after leading bytes"));
    }

    @Test
    void parquetIsConfirmedByItsEndWhenTheEndCanBeRead() {
        byte[] cut = "PAR1 and then the data stops".getBytes(StandardCharsets.US_ASCII);
        assertThat(sniff("part-0.parquet", cut))
                .isEqualTo(new Sniff("parquet", 0.8, "Parquet magic at the start but not at the end: cut short or still being written"));
        assertThat(ContentSniffer.sniff(new Sample("part-0.parquet", cut, false, 10_000)))
                .isEqualTo(new Sniff("parquet", 0.9, "Parquet magic at the start; the end of the file was not checked"));
    }

    @Test
    void svgIsXmlWhoseRootIsSvgAfterAnyProlog() {
        String svg = "\uFEFF<?xml version=\"1.0\"?>\n<!-- a <comment> -->\n"
                + "<!DOCTYPE svg PUBLIC \"-//W3C//DTD SVG 1.1//EN\" \"http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd\" [\n"
                + "  <!ENTITY e \"x>y\">\n]>\n<?xml-stylesheet href=\"a.css\"?>\n<svg:svg xmlns:svg=\"http://www.w3.org/2000/svg\"/>";
        assertThat(sniff("figure.xml", svg)).isEqualTo(new Sniff("svg", 0.95, "XML whose root element is <svg:svg>"));
        assertThat(sniff("feed.xml", "<?xml version=\"1.0\"?><rss version=\"2.0\"/>"))
                .isEqualTo(new Sniff("text", 0.8, "XML whose root element is <rss>, not <svg>"));
    }

    @Test
    void aSampleEndingInsideTheXmlPrologIsAnSvgOnlyIfTheNameSaysSo() {
        String prolog = "<?xml version=\"1.0\"?>\n<!-- a very long comment that the sample cuts";
        assertThat(sniffHead("drawing.svg", prolog, 100_000))
                .isEqualTo(new Sniff("svg", 0.6, "The sample ends inside the XML prolog; the name says .svg"));
        assertThat(sniffHead("drawing.xml", prolog, 100_000).format()).isEqualTo("text");
    }

    @Test
    void jsonIsTextThatParsesAsJson() {
        // RFC 8259: an object or an array as the top-level value.
        assertThat(sniff("a.txt", "  [1, {\"a\": null}]\n")).isEqualTo(new Sniff("json", 0.95, "Parses as one JSON array"));
        assertThat(sniff("a", "{\n  \"a\": {\"b\": [true]}\n}\n")).isEqualTo(new Sniff("json", 0.95, "Parses as one JSON object"));
        assertThat(sniff("a.json", "{\"a\": }"))
                .isEqualTo(new Sniff("text", 0.6, "Starts like JSON but parses neither as JSON nor as one object per line"));
    }

    @Test
    void severalLinesEachAJsonObjectAreNdjson() {
        // JSON Lines / NDJSON convention: one JSON value per line (common practice, no formal standard).
        assertThat(sniff("log.json", "{\"t\": 1}\n{\"t\": 2}\n\n{\"t\": 3}\n"))
                .isEqualTo(new Sniff("ndjson", 0.95, "Several lines, each one JSON object"));
        assertThat(sniff("arrays.txt", "[1]\n[2]\n"))
                .isEqualTo(new Sniff("text", 0.6, "Starts like JSON but parses neither as JSON nor as one object per line"));
    }

    @Test
    void theNameBreaksTheTieOfASingleObjectOnOneLine() {
        assertThat(sniff("one.ndjson", "{\"t\": 1}"))
                .isEqualTo(new Sniff("ndjson", 0.8, "One JSON object on one line; the name says .ndjson"));
        assertThat(sniff("one.json", "{\"t\": 1}").format()).isEqualTo("json");
    }

    @Test
    void aCutSampleOfJsonOrNdjsonIsStillRecognised() {
        assertThat(sniffHead("big.json", "[{\"a\": 1}, {\"a\": 2}, {\"a\"", 1_000_000))
                .isEqualTo(new Sniff("json", 0.7, "Valid JSON up to where the sample ends"));
        assertThat(sniffHead("big.log", "{\"a\": 1}\n{\"a\": 2}\n{\"a\": 3}\n{\"a\"", 1_000_000))
                .isEqualTo(new Sniff("ndjson", 0.9, "Several lines, each one JSON object"));
    }

    @Test
    void delimitedTextIsJustText() {
        assertThat(sniff("rows.dat", "id;name\n1;Ada\n")).isEqualTo(new Sniff("text", 0.7, "Decodes as UTF-8 text without NUL bytes"));
        byte[] latin = "café;1\n".getBytes(StandardCharsets.ISO_8859_1);
        assertThat(sniff("rows.csv", latin)).isEqualTo(new Sniff("text", 0.7, "Decodes as windows-1252 text without NUL bytes"));
        byte[] utf16 = "\uFEFFa,b\n1,2\n".getBytes(StandardCharsets.UTF_16LE);
        assertThat(sniff("rows.csv", utf16).format()).isEqualTo("text");
    }

    @Test
    void bytesWithNulsOrManyControlCharactersAreBinary() {
        byte[] nul = {'a', 'b', 0, 'c'};
        assertThat(sniff("x.csv", nul)).isEqualTo(new Sniff("binary", 0.9, "NUL bytes in the first 8 KiB and no known signature"));
        byte[] controls = new byte[100];
        Arrays.fill(controls, (byte) 0x01);
        assertThat(sniff("x.txt", controls)).isEqualTo(new Sniff("binary", 0.8, "Many control characters and no known signature"));
    }

    @Test
    void anEmptyFileIsText() {
        assertThat(sniff("empty.parquet", new byte[0])).isEqualTo(new Sniff("text", 0.2, "The file is empty"));
    }
}
