package org.headwater.harvest.format;

import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.Charset;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/**
 * Turns a file's first bytes into text: byte-order marks first, then strict UTF-8, then Windows-1252.
 * This is the walking skeleton's decoder; statistical detection of other encodings is a later step.
 */
public final class TextDecoding {
    private static final Charset WINDOWS_1252 = Charset.forName("windows-1252");

    /** Decoded text and the encoding that produced it. */
    public record Decoded(String text, Charset charset, boolean bom) {
    }

    private TextDecoding() {
    }

    public static Decoded decode(byte[] bytes, boolean complete) {
        if (startsWith(bytes, 0xEF, 0xBB, 0xBF)) {
            return new Decoded(new String(bytes, 3, bytes.length - 3, StandardCharsets.UTF_8), StandardCharsets.UTF_8, true);
        }
        if (startsWith(bytes, 0xFF, 0xFE)) {
            return new Decoded(new String(bytes, 2, evenLength(bytes.length - 2), StandardCharsets.UTF_16LE), StandardCharsets.UTF_16LE, true);
        }
        if (startsWith(bytes, 0xFE, 0xFF)) {
            return new Decoded(new String(bytes, 2, evenLength(bytes.length - 2), StandardCharsets.UTF_16BE), StandardCharsets.UTF_16BE, true);
        }
        // A sample cut from a longer file may end inside a multi-byte character: drop that tail.
        int length = complete ? bytes.length : utf8Boundary(bytes);
        if (org.headwater.harvest.format.csv.EncodingDetector.isAscii(bytes, length)) {
            // Valid UTF-8 as it is, one character per byte: copied straight into a compact string.
            return new Decoded(new String(bytes, 0, length, StandardCharsets.US_ASCII), StandardCharsets.UTF_8, false);
        }
        CharsetDecoder strict = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        try {
            return new Decoded(strict.decode(ByteBuffer.wrap(bytes, 0, length)).toString(), StandardCharsets.UTF_8, false);
        } catch (CharacterCodingException notUtf8) {
            return new Decoded(new String(bytes, WINDOWS_1252), WINDOWS_1252, false);
        }
    }

    /** True when the bytes contain a NUL outside a UTF-16 file, the cheapest sign of binary content. */
    public static boolean looksBinary(byte[] bytes) {
        if (startsWith(bytes, 0xFF, 0xFE) || startsWith(bytes, 0xFE, 0xFF)) {
            return false;
        }
        int n = Math.min(bytes.length, 8192);
        for (int i = 0; i < n; i++) {
            if (bytes[i] == 0) {
                return true;
            }
        }
        return false;
    }

    private static int utf8Boundary(byte[] bytes) {
        int end = bytes.length;
        // Walk back over at most three continuation bytes to the start of the last character.
        for (int i = end - 1; i >= 0 && i >= end - 4; i--) {
            int b = bytes[i] & 0xFF;
            if ((b & 0xC0) != 0x80) {
                int need = b < 0x80 ? 1 : (b >= 0xF0 ? 4 : b >= 0xE0 ? 3 : b >= 0xC0 ? 2 : 1);
                return i + need <= end ? end : i;
            }
        }
        return end;
    }

    private static int evenLength(int n) {
        return n - (n % 2);
    }

    private static boolean startsWith(byte[] bytes, int... prefix) {
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
}
