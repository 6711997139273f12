package org.headwater.harvest.format;

import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.zip.CRC32;
import java.util.zip.DataFormatException;
import java.util.zip.Inflater;

/**
 * Reads a PNG's header and text chunks by walking its chunks (W3C PNG spec / ISO 15948, section 5). Pixels
 * are never decoded, which is why this is a short chunk walk rather than an image library.
 */
final class PngFigure {
    private static final int SIGNATURE_LENGTH = 8;
    // Text chunks may follow the image data; for files up to this size the whole file is read to find them.
    static final int WHOLE_CAP = 8 * 1024 * 1024;
    // A compressed text is inflated only this far (UTF-8 needs at most four bytes a character): no zip bombs.
    private static final int MAX_INFLATED = TextEntries.MAX_CHARS * 4 + 4;

    private PngFigure() {
    }

    static Map<String, Object> read(Sample sample) throws UnreadableFileException {
        Walk walk = walk(sample.head(), sample.complete());
        if (!walk.reachedEnd && !sample.complete()) {
            Optional<byte[]> whole = Figures.wholeIfReadable(sample, WHOLE_CAP);
            if (whole.isPresent()) {
                walk = walk(whole.get(), true);
            }
        }
        return walk.details();
    }

    /** What a walk over the chunks found; {@code reachedEnd} when it got to IEND. */
    private static final class Walk {
        final Map<String, Object> header = new LinkedHashMap<>();
        final TextEntries text = new TextEntries();
        boolean reachedEnd;

        Map<String, Object> details() {
            Map<String, Object> details = new LinkedHashMap<>(header);
            if (text.get("Title") != null) {
                // PNG spec 11.3.4.2: "Title" is a predefined keyword.
                details.put("title", text.get("Title"));
            }
            details.put("text", text.asMap());
            if (text.truncated()) {
                details.put("text_truncated", true);
            }
            if (!reachedEnd) {
                details.put("text_complete", false);
            }
            return details;
        }
    }

    private static Walk walk(byte[] b, boolean complete) throws UnreadableFileException {
        // PNG spec 5.2: the signature.
        if (!ContentSniffer.startsWith(b, 0x89, 'P', 'N', 'G', 0x0D, 0x0A, 0x1A, 0x0A)) {
            throw new UnreadableFileException("invalid", "The file does not start with the PNG signature");
        }
        Walk walk = new Walk();
        int pos = SIGNATURE_LENGTH;
        // Each turn moves pos forward by at least 12 bytes (length, type, CRC), so the walk ends within b.
        while (pos + 8 <= b.length) {
            long length = uint32(b, pos);
            String type = new String(b, pos + 4, 4, StandardCharsets.ISO_8859_1);
            // PNG spec 5.3: a length is at most 2^31-1; type bytes are ASCII letters.
            if (length > Integer.MAX_VALUE || !type.chars().allMatch(c -> (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'))) {
                throw new UnreadableFileException("invalid", "A damaged PNG chunk header at byte " + pos);
            }
            if (pos == SIGNATURE_LENGTH && !type.equals("IHDR")) {
                // PNG spec 5.6: IHDR shall be first.
                throw new UnreadableFileException("invalid", "The first PNG chunk is " + type + ", not IHDR");
            }
            long end = pos + 12 + length;
            if (end > b.length) {
                if (complete) {
                    throw new UnreadableFileException("truncated", "The PNG chunk " + type + " at byte " + pos
                            + " runs past the end of the file");
                }
                return walk;
            }
            int dataAt = pos + 8;
            int n = (int) length;
            // PNG spec 5.3: the CRC covers the type and data fields (the CRC-32 of ISO 3309, as java.util.zip's).
            CRC32 crc = new CRC32();
            crc.update(b, pos + 4, 4 + n);
            if (crc.getValue() != uint32(b, dataAt + n)) {
                throw new UnreadableFileException("invalid", "The PNG chunk " + type + " at byte " + pos + " fails its CRC check");
            }
            switch (type) {
                case "IHDR" -> header(b, dataAt, n, walk.header);
                case "tEXt" -> tEXt(b, dataAt, n, walk.text);
                case "zTXt" -> zTXt(b, dataAt, n, walk.text);
                case "iTXt" -> iTXt(b, dataAt, n, walk.text);
                case "IEND" -> walk.reachedEnd = true;
                default -> { }
            }
            if (walk.reachedEnd) {
                return walk;
            }
            pos = (int) end;
        }
        if (complete) {
            throw new UnreadableFileException("truncated", "The PNG file ends before its IEND chunk");
        }
        return walk;
    }

    /** PNG spec 11.2.2: width, height, bit depth, colour type, compression, filter and interlace methods. */
    private static void header(byte[] b, int at, int n, Map<String, Object> out) throws UnreadableFileException {
        if (n != 13) {
            throw new UnreadableFileException("invalid", "The PNG IHDR chunk has " + n + " bytes, not 13");
        }
        long width = uint32(b, at);
        long height = uint32(b, at + 4);
        int depth = b[at + 8] & 0xFF;
        int colour = b[at + 9] & 0xFF;
        int interlace = b[at + 12] & 0xFF;
        if (width == 0 || height == 0 || width > Integer.MAX_VALUE || height > Integer.MAX_VALUE) {
            throw new UnreadableFileException("invalid", "The PNG header gives an impossible size " + width + "x" + height);
        }
        String colourName = colourName(colour, depth);
        if (colourName == null || interlace > 1) {
            throw new UnreadableFileException("invalid", "The PNG header gives colour type " + colour + " with bit depth "
                    + depth + " and interlace method " + interlace + ", which the spec does not allow");
        }
        out.put("width", (int) width);
        out.put("height", (int) height);
        out.put("bit_depth", depth);
        out.put("colour_type", colour);
        out.put("colour_type_name", colourName);
        out.put("interlace", interlace == 1 ? "adam7" : "none");
    }

    /** PNG spec table 11.1: the allowed colour type and bit depth pairs, by the spec's names. */
    private static String colourName(int colour, int depth) {
        boolean eightOrSixteen = depth == 8 || depth == 16;
        boolean upToEight = depth == 1 || depth == 2 || depth == 4 || depth == 8;
        return switch (colour) {
            case 0 -> upToEight || depth == 16 ? "greyscale" : null;
            case 2 -> eightOrSixteen ? "truecolour" : null;
            case 3 -> upToEight ? "indexed-colour" : null;
            case 4 -> eightOrSixteen ? "greyscale with alpha" : null;
            case 6 -> eightOrSixteen ? "truecolour with alpha" : null;
            default -> null;
        };
    }

    /** PNG spec 11.3.4.3: keyword, NUL, Latin-1 text. A chunk without the separator is skipped. */
    private static void tEXt(byte[] b, int at, int n, TextEntries text) {
        int nul = indexOfNul(b, at, at + n);
        if (nul > at) {
            text.put(latin1(b, at, nul), latin1(b, nul + 1, at + n));
        }
    }

    /** PNG spec 11.3.4.4: keyword, NUL, compression method 0 (zlib), compressed Latin-1 text. */
    private static void zTXt(byte[] b, int at, int n, TextEntries text) {
        int nul = indexOfNul(b, at, at + n);
        if (nul <= at || nul + 2 > at + n || b[nul + 1] != 0) {
            return;
        }
        Inflated inflated = inflate(b, nul + 2, at + n);
        if (inflated != null) {
            text.put(latin1(b, at, nul), new String(inflated.bytes(), StandardCharsets.ISO_8859_1));
            if (inflated.cut()) {
                text.markTruncated();
            }
        }
    }

    /**
     * PNG spec 11.3.4.5: keyword, NUL, compression flag, compression method, language tag, NUL, translated
     * keyword, NUL, UTF-8 text (zlib-compressed when the flag is 1).
     */
    private static void iTXt(byte[] b, int at, int n, TextEntries text) {
        int end = at + n;
        int nul = indexOfNul(b, at, end);
        if (nul <= at || nul + 3 > end) {
            return;
        }
        boolean compressed = b[nul + 1] == 1;
        int language = nul + 3;
        int languageEnd = indexOfNul(b, language, end);
        int translatedEnd = languageEnd < 0 ? -1 : indexOfNul(b, languageEnd + 1, end);
        if (translatedEnd < 0) {
            return;
        }
        String keyword = latin1(b, at, nul);
        if (!compressed) {
            text.put(keyword, new String(b, translatedEnd + 1, end - translatedEnd - 1, StandardCharsets.UTF_8));
            return;
        }
        if (b[nul + 2] != 0) {
            return;
        }
        Inflated inflated = inflate(b, translatedEnd + 1, end);
        if (inflated != null) {
            text.put(keyword, new String(inflated.bytes(), StandardCharsets.UTF_8));
            if (inflated.cut()) {
                text.markTruncated();
            }
        }
    }

    private record Inflated(byte[] bytes, boolean cut) {
    }

    /** Inflates a zlib stream up to {@link #MAX_INFLATED} bytes; null when it is not valid zlib data. */
    private static Inflated inflate(byte[] b, int from, int to) {
        Inflater inflater = new Inflater();
        try {
            inflater.setInput(b, from, to - from);
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            byte[] buffer = new byte[4096];
            // Each turn either produces bytes toward the cap or ends the loop (no input left, or a dictionary
            // that PNG never uses).
            while (!inflater.finished() && out.size() < MAX_INFLATED) {
                int got = inflater.inflate(buffer, 0, Math.min(buffer.length, MAX_INFLATED - out.size()));
                if (got == 0) {
                    break;
                }
                out.write(buffer, 0, got);
            }
            return new Inflated(out.toByteArray(), !inflater.finished());
        } catch (DataFormatException e) {
            return null;
        } finally {
            inflater.end();
        }
    }

    private static int indexOfNul(byte[] b, int from, int to) {
        for (int i = from; i < to; i++) {
            if (b[i] == 0) {
                return i;
            }
        }
        return -1;
    }

    private static String latin1(byte[] b, int from, int to) {
        return new String(b, from, to - from, StandardCharsets.ISO_8859_1);
    }

    private static long uint32(byte[] b, int at) {
        return ((b[at] & 0xFFL) << 24) | ((b[at + 1] & 0xFFL) << 16) | ((b[at + 2] & 0xFFL) << 8) | (b[at + 3] & 0xFFL);
    }
}
