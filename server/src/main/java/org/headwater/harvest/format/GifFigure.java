package org.headwater.harvest.format;

import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;

/** Reads a GIF's header and logical screen descriptor (GIF89a spec, sections 17 and 18). */
final class GifFigure {
    private static final int HEADER_AND_SCREEN = 6 + 7;

    private GifFigure() {
    }

    static Map<String, Object> read(Sample sample) throws UnreadableFileException {
        byte[] b = sample.head();
        String version = b.length >= 6 ? new String(b, 0, 6, StandardCharsets.US_ASCII) : "";
        if (!version.equals("GIF87a") && !version.equals("GIF89a")) {
            throw new UnreadableFileException("invalid", "The file does not start with GIF87a or GIF89a");
        }
        if (b.length < HEADER_AND_SCREEN) {
            throw new UnreadableFileException("truncated", "The GIF ends inside its logical screen descriptor");
        }
        // GIF89a section 18: logical screen width and height, unsigned 16-bit little-endian.
        int width = (b[6] & 0xFF) | ((b[7] & 0xFF) << 8);
        int height = (b[8] & 0xFF) | ((b[9] & 0xFF) << 8);
        Map<String, Object> out = new LinkedHashMap<>();
        out.put("width", width);
        out.put("height", height);
        out.put("version", version.substring(3));
        return out;
    }
}
