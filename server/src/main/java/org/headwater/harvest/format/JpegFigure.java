package org.headwater.harvest.format;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;

/** Reads a JPEG's frame header (ITU T.81, annex B): size, sample precision, components and coding process. */
final class JpegFigure {
    // Metadata segments (Exif, ICC profiles) can push the frame header past the sample; up to this size the
    // rest of the file is read to find it.
    static final int WHOLE_CAP = 16 * 1024 * 1024;

    private JpegFigure() {
    }

    static Map<String, Object> read(Sample sample) throws UnreadableFileException {
        Map<String, Object> found = frame(sample.head(), sample.complete());
        if (found == null) {
            Optional<byte[]> whole = Figures.whole(sample, WHOLE_CAP);
            if (whole.isEmpty()) {
                throw new UnreadableFileException("too_large", "No JPEG frame header in the first "
                        + sample.head().length + " bytes, and the file is over " + WHOLE_CAP + " bytes");
            }
            found = frame(whole.get(), true);
        }
        return found;
    }

    /** The frame header's facts, or null when {@code b} is a head that ends before it. */
    private static Map<String, Object> frame(byte[] b, boolean complete) throws UnreadableFileException {
        // T.81 B.1.1.3: SOI first.
        if (!ContentSniffer.startsWith(b, 0xFF, 0xD8)) {
            throw new UnreadableFileException("invalid", "The file does not start with the JPEG SOI marker");
        }
        int pos = 2;
        // Each turn moves pos forward by at least two bytes, so the walk ends within b.
        while (pos + 1 < b.length) {
            if ((b[pos] & 0xFF) != 0xFF) {
                throw new UnreadableFileException("invalid", "Expected a JPEG marker at byte " + pos);
            }
            int marker = b[pos + 1] & 0xFF;
            if (marker == 0xFF) {
                pos++; // T.81 B.1.1.2: any marker may be preceded by fill bytes 0xFF.
                continue;
            }
            // T.81 table B.1: TEM and RST0-7 stand alone, without a length.
            if (marker == 0x01 || (marker >= 0xD0 && marker <= 0xD7)) {
                pos += 2;
                continue;
            }
            if (marker == 0xD9 || marker == 0xDA) {
                throw new UnreadableFileException("invalid", "The JPEG reaches its " + (marker == 0xD9 ? "end" : "first scan")
                        + " without a frame header");
            }
            if (pos + 4 > b.length) {
                break;
            }
            int length = ((b[pos + 2] & 0xFF) << 8) | (b[pos + 3] & 0xFF);
            if (length < 2) {
                throw new UnreadableFileException("invalid", "A JPEG segment at byte " + pos + " has length " + length);
            }
            if (isFrameHeader(marker)) {
                if (pos + 2 + length > b.length) {
                    break;
                }
                return frameFacts(b, pos + 4, length, marker);
            }
            pos += 2 + length;
        }
        if (complete) {
            throw new UnreadableFileException("truncated", "The JPEG ends before its frame header");
        }
        return null;
    }

    /** T.81 table B.1: SOF0-3, 5-7, 9-11, 13-15; C4 (DHT), C8 (JPG) and CC (DAC) are not frame headers. */
    private static boolean isFrameHeader(int marker) {
        return marker >= 0xC0 && marker <= 0xCF && marker != 0xC4 && marker != 0xC8 && marker != 0xCC;
    }

    /** T.81 B.2.2: Lf, P (precision), Y (lines), X (samples per line), Nf (components). */
    private static Map<String, Object> frameFacts(byte[] b, int at, int length, int marker) throws UnreadableFileException {
        if (length < 8) {
            throw new UnreadableFileException("invalid", "The JPEG frame header is " + length + " bytes, less than 8");
        }
        int precision = b[at] & 0xFF;
        int height = ((b[at + 1] & 0xFF) << 8) | (b[at + 2] & 0xFF);
        int width = ((b[at + 3] & 0xFF) << 8) | (b[at + 4] & 0xFF);
        int components = b[at + 5] & 0xFF;
        if (width == 0) {
            throw new UnreadableFileException("invalid", "The JPEG frame header gives a width of 0");
        }
        Map<String, Object> out = new LinkedHashMap<>();
        out.put("width", width);
        // T.81 B.2.2: Y = 0 means the height comes later, in a DNL segment; it is then left out here.
        if (height > 0) {
            out.put("height", height);
        }
        out.put("bits_per_sample", precision);
        out.put("components", components);
        out.put("process", process(marker));
        out.put("coding", marker >= 0xC8 ? "arithmetic" : "huffman");
        return out;
    }

    /** T.81 table B.1's processes, in lower case. */
    private static String process(int marker) {
        return switch (marker & 0x07) {
            case 0 -> "baseline";
            case 1 -> "extended_sequential";
            case 2 -> "progressive";
            case 3 -> "lossless";
            case 5 -> "differential_sequential";
            case 6 -> "differential_progressive";
            default -> "differential_lossless";
        };
    }
}
