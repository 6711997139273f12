package org.headwater.harvest.format.csv;

import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.Charset;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/** Decodes bytes with the JDK decoders, replacing malformed input instead of failing. */
final class TextDecoder {

  private static final String ASCII_SPECIALS = "\r\n\"',;\t|:^~ \\#";

  private TextDecoder() {}

  /**
   * Decodes {@code bytes[from, to)}. When {@code endOfInput} is false a character cut at the
   * end is left out rather than replaced.
   */
  static String decode(byte[] bytes, int from, int to, Charset charset, boolean endOfInput) {
    if (endOfInput) {
      // The String constructor replaces malformed and unmappable input just as the decoder below does
      // (its Javadoc), and copies ASCII bytes straight into a compact string, where the decoder fills a
      // char buffer that toString() compresses again (decoding showed in about 8 % of the reading threads'
      // samples in a profile of the benchmark lake).
      return new String(bytes, from, to - from, charset);
    }
    CharsetDecoder decoder = charset.newDecoder()
        .onMalformedInput(CodingErrorAction.REPLACE)
        .onUnmappableCharacter(CodingErrorAction.REPLACE);
    ByteBuffer in = ByteBuffer.wrap(bytes, from, to - from);
    int capacity = (int) Math.ceil((to - from) * (double) decoder.maxCharsPerByte()) + 4;
    CharBuffer out = CharBuffer.allocate(capacity);
    decoder.decode(in, out, endOfInput);
    if (endOfInput) {
      decoder.flush(out);
    }
    out.flip();
    return out.toString();
  }

  /**
   * Whether every character the parser acts on is one ASCII byte in this charset and no other
   * byte can be mistaken for it: true for UTF-8 (whose multi-byte sequences use only bytes
   * 0x80 and above) and for ASCII-based single-byte charsets such as ISO-8859-1.
   */
  static boolean asciiCompatible(Charset charset) {
    if (charset.equals(StandardCharsets.UTF_8)) {
      return true;
    }
    if (!charset.canEncode() || charset.newEncoder().maxBytesPerChar() != 1.0f) {
      return false;
    }
    byte[] encoded = ASCII_SPECIALS.getBytes(charset);
    if (encoded.length != ASCII_SPECIALS.length()) {
      return false;
    }
    for (int i = 0; i < encoded.length; i++) {
      if (encoded[i] != ASCII_SPECIALS.charAt(i)) {
        return false;
      }
    }
    return true;
  }
}
