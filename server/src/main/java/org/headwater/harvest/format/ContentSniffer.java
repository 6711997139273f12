package org.headwater.harvest.format;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.io.JsonEOFException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.Optional;
import java.util.Set;

/**
 * Decides a file's format from its content, not its name: a {@code .csv} that holds a PNG is a PNG. The
 * extension only breaks ties the bytes leave open. Whether text is delimited is decided elsewhere; here it
 * is just {@code text}.
 */
public final class ContentSniffer {
    private static final JsonFactory JSON = new JsonFactory();
    private static final Set<String> LINE_EXTENSIONS = Set.of("ndjson", "jsonl");
    // ISO 32000-1 7.5.2 puts "%PDF-" on the first line; readers accept it within the first 1024 bytes
    // (PDF Reference 1.7, implementation note 13 in appendix H; from memory).
    private static final int PDF_HEADER_WINDOW = 1024;
    // common practice, no source: how many lines an NDJSON check needs to look at to be convinced.
    private static final int MAX_NDJSON_LINES = 200;
    // common practice, no source: git calls a file binary when its first 8000 bytes hold a NUL; the share of
    // control characters that still passes for text is our own choice.
    private static final int TEXT_WINDOW = 8192;
    private static final double MAX_CONTROL_SHARE = 0.10;

    private ContentSniffer() {
    }

    /** The format named by a signature at the start of the bytes, if any: cheap enough for {@code accepts}. */
    public static Optional<String> signature(byte[] head) {
        // Apache Parquet format spec, "File Format": the file starts and ends with "PAR1";
        // "PARE" with an encrypted footer (parquet-format Encryption.md).
        if (startsWith(head, 'P', 'A', 'R', '1') || startsWith(head, 'P', 'A', 'R', 'E')) {
            return Optional.of("parquet");
        }
        // PNG spec (W3C, ISO 15948) section 5.2: the eight-byte signature.
        if (startsWith(head, 0x89, 'P', 'N', 'G', 0x0D, 0x0A, 0x1A, 0x0A)) {
            return Optional.of("png");
        }
        // ITU T.81 B.1.1.3 and table B.1: SOI (FFD8) begins the image and a marker (FF..) follows it.
        if (startsWith(head, 0xFF, 0xD8, 0xFF)) {
            return Optional.of("jpeg");
        }
        // GIF89a spec section 17: "GIF" and the version "87a" or "89a".
        if (startsWith(head, 'G', 'I', 'F', '8', '7', 'a') || startsWith(head, 'G', 'I', 'F', '8', '9', 'a')) {
            return Optional.of("gif");
        }
        if (startsWith(head, '%', 'P', 'D', 'F', '-')) {
            return Optional.of("pdf");
        }
        return Optional.empty();
    }

    /** Decides the format of a sample. Never fails: what cannot be read is {@code binary} or {@code text}. */
    public static Sniff sniff(Sample sample) {
        byte[] head = sample.head();
        if (head.length == 0) {
            return new Sniff("text", 0.2, "The file is empty");
        }
        Optional<String> signed = signature(head);
        if (signed.isPresent()) {
            return signed.get().equals("parquet") ? parquet(sample) : new Sniff(signed.get(), 0.95,
                    "The file starts with the " + signed.get().toUpperCase(java.util.Locale.ROOT) + " signature");
        }
        int pdfAt = indexOf(head, "%PDF-".getBytes(StandardCharsets.US_ASCII), PDF_HEADER_WINDOW);
        if (pdfAt > 0) {
            return new Sniff("pdf", 0.85, "A PDF header at byte " + pdfAt + ", after leading bytes");
        }
        if (TextDecoding.looksBinary(head)) {
            return new Sniff("binary", 0.9, "NUL bytes in the first 8 KiB and no known signature");
        }
        TextDecoding.Decoded decoded = TextDecoding.decode(head, sample.complete());
        String text = decoded.text();
        XmlProlog.Root root = XmlProlog.root(text);
        if (root.svg()) {
            return new Sniff("svg", 0.95, "XML whose root element is <" + root.name() + ">");
        }
        if (root.undecided() && sample.extension().equals("svg")) {
            return new Sniff("svg", 0.6, "The sample ends inside the XML prolog; the name says .svg");
        }
        String stripped = text.strip();
        boolean jsonLike = !stripped.isEmpty() && (stripped.charAt(0) == '{' || stripped.charAt(0) == '[');
        if (jsonLike) {
            Sniff json = json(stripped, sample);
            if (json != null) {
                return json;
            }
        }
        if (controlShare(text) > MAX_CONTROL_SHARE) {
            return new Sniff("binary", 0.8, "Many control characters and no known signature");
        }
        if (jsonLike) {
            return new Sniff("text", 0.6, "Starts like JSON but parses neither as JSON nor as one object per line");
        }
        if (root.name() != null) {
            return new Sniff("text", 0.8, "XML whose root element is <" + root.name() + ">, not <svg>");
        }
        return new Sniff("text", 0.7, "Decodes as " + decoded.charset().name() + " text without NUL bytes");
    }

    /** PAR1 at the start; the footer's PAR1 at the end confirms it when the end can be read. */
    private static Sniff parquet(Sample sample) {
        try {
            byte[] end = sample.readTail(4);
            if (startsWith(end, 'P', 'A', 'R', '1') || startsWith(end, 'P', 'A', 'R', 'E')) {
                return new Sniff("parquet", 1.0, "Parquet magic at the start and the end of the file");
            }
            return new Sniff("parquet", 0.8, "Parquet magic at the start but not at the end: cut short or still being written");
        } catch (IOException | IllegalArgumentException e) {
            return new Sniff("parquet", 0.9, "Parquet magic at the start; the end of the file was not checked");
        }
    }

    /** JSON or NDJSON when the text parses as such; null when it only looks like it (then it is text). */
    private static Sniff json(String text, Sample sample) {
        boolean lineExtension = LINE_EXTENSIONS.contains(sample.extension());
        Parsed whole = Parsed.of(text);
        boolean cut = !sample.complete();
        if (whole.error() == null && whole.roots() == 1) {
            if (lineExtension && whole.firstObject() && text.indexOf('\n') < 0) {
                return new Sniff("ndjson", 0.8, "One JSON object on one line; the name says ." + sample.extension());
            }
            return new Sniff("json", 0.95, "Parses as one JSON " + (whole.firstObject() ? "object" : "array"));
        }
        boolean endedEarly = whole.error() instanceof JsonEOFException;
        if (whole.roots() >= 2 || (endedEarly && cut && whole.roots() == 1)) {
            if (objectPerLine(text, cut)) {
                return new Sniff("ndjson", cut ? 0.9 : 0.95, "Several lines, each one JSON object");
            }
        }
        if (endedEarly && cut && whole.roots() <= 1) {
            if (whole.roots() == 0 && objectPerLine(text, true)) {
                return new Sniff("ndjson", 0.85, "Several lines, each one JSON object; the sample ends inside one");
            }
            return new Sniff("json", 0.7, "Valid JSON up to where the sample ends");
        }
        return null;
    }

    /** At least two non-blank lines, each exactly one JSON object; the last line is skipped when the sample was cut. */
    private static boolean objectPerLine(String text, boolean cut) {
        String[] lines = text.split("\r?\n", MAX_NDJSON_LINES + 1);
        int last = lines.length == MAX_NDJSON_LINES + 1 || cut ? lines.length - 1 : lines.length;
        int objects = 0;
        for (int i = 0; i < last; i++) {
            String line = lines[i].strip();
            if (line.isEmpty()) {
                continue;
            }
            Parsed p = Parsed.of(line);
            if (p.error() != null || p.roots() != 1 || !p.firstObject()) {
                return false;
            }
            objects++;
        }
        return objects >= 2;
    }

    /** How many top-level JSON values the text holds, whether the first is an object, and the error that stopped the parse. */
    private record Parsed(int roots, boolean firstObject, IOException error) {
        static Parsed of(String text) {
            int roots = 0;
            boolean firstObject = false;
            try (JsonParser parser = JSON.createParser(text)) {
                JsonToken token;
                // skipChildren consumes each value whole, so every turn consumes input: the loop ends with it.
                while ((token = parser.nextToken()) != null) {
                    if (roots == 0) {
                        firstObject = token == JsonToken.START_OBJECT;
                    }
                    parser.skipChildren();
                    roots++;
                }
                return new Parsed(roots, firstObject, null);
            } catch (IOException e) {
                return new Parsed(roots, firstObject, e);
            }
        }
    }

    private static double controlShare(String text) {
        int n = Math.min(text.length(), TEXT_WINDOW);
        if (n == 0) {
            return 0;
        }
        int control = 0;
        for (int i = 0; i < n; i++) {
            char c = text.charAt(i);
            boolean layout = c == '\t' || c == '\n' || c == '\r' || c == '\f';
            if ((c < 0x20 && !layout) || c == 0x7F || c == '\uFFFD') {
                control++;
            }
        }
        return (double) control / n;
    }

    static boolean startsWith(byte[] bytes, int... prefix) {
        if (bytes.length < prefix.length) {
            return false;
        }
        for (int i = 0; i < prefix.length; i++) {
            if ((bytes[i] & 0xFF) != prefix[i]) {
                return false;
            }
        }
        return true;
    }

    private static int indexOf(byte[] bytes, byte[] needle, int window) {
        int end = Math.min(bytes.length, window) - needle.length;
        for (int i = 0; i <= end; i++) {
            if (Arrays.equals(bytes, i, i + needle.length, needle, 0, needle.length)) {
                return i;
            }
        }
        return -1;
    }
}
