package org.headwater.lineage;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Finds the run id a connector stamped into a figure: a PNG {@code tEXt}/{@code iTXt} chunk with keyword
 * {@code headwater:run} (PNG specification, ISO/IEC 15948, sections 11.3.4.3 and 11.3.4.5), an SVG
 * {@code <headwater:run>} element inside {@code <metadata>}, or a {@code /HeadwaterRun} entry of a PDF
 * document information dictionary (ISO 32000-1, 14.3.3); for PDF the last one wins, as incremental
 * updates append.
 */
public final class StampReader {
    static final String KEYWORD = "headwater:run";
    private static final byte[] PNG_SIGNATURE = {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'};
    private static final Pattern SVG_STAMP = Pattern.compile("<headwater:run[^>]*>\\s*([^<\\s]+)\\s*</headwater:run>");
    private static final Pattern PDF_STAMP = Pattern.compile("/HeadwaterRun\\s*\\(([^)]{1,64})\\)");

    private StampReader() {
    }

    public static Optional<String> runId(byte[] file) {
        if (startsWith(file, PNG_SIGNATURE)) {
            return png(file);
        }
        String head = new String(file, 0, Math.min(file.length, 8), StandardCharsets.ISO_8859_1);
        String text = new String(file, StandardCharsets.ISO_8859_1);
        if (head.startsWith("%PDF-")) {
            Matcher m = PDF_STAMP.matcher(text);
            String last = null;
            while (m.find()) {
                last = m.group(1);
            }
            return Optional.ofNullable(last);
        }
        if (text.contains("<svg")) {
            Matcher m = SVG_STAMP.matcher(new String(file, StandardCharsets.UTF_8));
            return m.find() ? Optional.of(m.group(1)) : Optional.empty();
        }
        return Optional.empty();
    }

    private static Optional<String> png(byte[] file) {
        ByteBuffer b = ByteBuffer.wrap(file);
        int at = PNG_SIGNATURE.length;
        while (at + 12 <= file.length) {
            long length = Integer.toUnsignedLong(b.getInt(at));
            String type = new String(file, at + 4, 4, StandardCharsets.ISO_8859_1);
            if (length > file.length - at - 12L) {
                return Optional.empty();
            }
            int data = at + 8;
            if (type.equals("tEXt") || type.equals("iTXt")) {
                int nul = indexOf(file, (byte) 0, data, data + (int) length);
                if (nul > 0 && new String(file, data, nul - data, StandardCharsets.ISO_8859_1).equals(KEYWORD)) {
                    int text = nul + 1;
                    if (type.equals("iTXt")) {
                        // compression flag, method, then language tag and translated keyword, each NUL-ended
                        text = indexOf(file, (byte) 0, indexOf(file, (byte) 0, nul + 3, data + (int) length) + 1,
                                data + (int) length) + 1;
                    }
                    return Optional.of(new String(file, text, data + (int) length - text, StandardCharsets.UTF_8).trim());
                }
            }
            if (type.equals("IEND")) {
                break;
            }
            at = data + (int) length + 4;
        }
        return Optional.empty();
    }

    private static int indexOf(byte[] bytes, byte value, int from, int to) {
        for (int i = Math.max(0, from); i < Math.min(to, bytes.length); i++) {
            if (bytes[i] == value) {
                return i;
            }
        }
        return -1;
    }

    private static boolean startsWith(byte[] bytes, byte[] prefix) {
        if (bytes.length < prefix.length) {
            return false;
        }
        for (int i = 0; i < prefix.length; i++) {
            if (bytes[i] != prefix[i]) {
                return false;
            }
        }
        return true;
    }
}
