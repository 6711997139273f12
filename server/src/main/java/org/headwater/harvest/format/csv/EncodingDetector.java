package org.headwater.harvest.format.csv;

import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.Charset;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.IllegalCharsetNameException;
import java.nio.charset.StandardCharsets;
import java.nio.charset.UnsupportedCharsetException;
import org.mozilla.universalchardet.UniversalDetector;

/**
 * Finds the character encoding of the head of a text file.
 *
 * <p>Order of evidence: byte order mark, then strict UTF-8 validity (JDK decoder), then the
 * zero-byte pattern of BOM-less UTF-16, then juniversalchardet's statistical probers (a
 * maintained Java port of Mozilla's universal charset detector: small, no dependencies, unlike
 * ICU4J's 14 MB), then the Latin-1 family. UTF-8 is tested before the library on purpose:
 * valid UTF-8 (ASCII included) is nearly never anything else, while statistical probers can
 * call short ASCII-heavy samples some other charset.
 */
public final class EncodingDetector {

  private static final Charset WINDOWS_1252 = Charset.forName("windows-1252");
  private static final Charset UTF_32LE = Charset.forName("UTF-32LE");
  private static final Charset UTF_32BE = Charset.forName("UTF-32BE");

  /** Bytes examined by the statistical prober and the binary check; more adds little. */
  private static final int PROBE_LIMIT = 64 * 1024;

  /**
   * Detects the encoding of {@code head}.
   *
   * @param head the first bytes of the file (or all of it)
   * @param wholeFile whether {@code head} is the complete file; if not, a multi-byte
   *     character cut at the end is not held against UTF-8
   * @throws NotDelimitedTextException when the bytes are empty or look binary
   */
  public DetectedEncoding detect(byte[] head, boolean wholeFile) throws NotDelimitedTextException {
    if (head.length == 0) {
      throw new NotDelimitedTextException(NotDelimitedTextException.Reason.EMPTY, "no bytes");
    }
    DetectedEncoding byBom = byBom(head);
    if (byBom != null) {
      return byBom;
    }
    int probeLength = Math.min(head.length, PROBE_LIMIT);
    boolean truncated = !wholeFile || probeLength < head.length;
    if (hasZeroByte(head, probeLength)) {
      Charset utf16 = utf16ByZeroPattern(head, probeLength);
      if (utf16 == null) {
        throw new NotDelimitedTextException(
            NotDelimitedTextException.Reason.BINARY, "zero bytes outside a UTF-16 pattern");
      }
      return new DetectedEncoding(utf16, 0, DetectedEncoding.Basis.UTF16_ZERO_PATTERN);
    }
    if (isAscii(head, probeLength) || isValid(StandardCharsets.UTF_8, head, probeLength, truncated)) {
      return new DetectedEncoding(StandardCharsets.UTF_8, 0, DetectedEncoding.Basis.VALID_UTF8);
    }
    if (controlCharacterShare(head, probeLength) > 0.01) {
      throw new NotDelimitedTextException(
          NotDelimitedTextException.Reason.BINARY, "too many control characters for text");
    }
    Charset guessed = statisticalGuess(head, probeLength);
    if (guessed != null) {
      return new DetectedEncoding(latinRefined(guessed, head, probeLength), 0,
          DetectedEncoding.Basis.STATISTICAL);
    }
    return new DetectedEncoding(latinRefined(WINDOWS_1252, head, probeLength), 0,
        DetectedEncoding.Basis.FALLBACK);
  }

  private static DetectedEncoding byBom(byte[] b) {
    // Byte order marks: Unicode Standard, section 23.8 (U+FEFF in each encoding form).
    // UTF-32LE must be tested before UTF-16LE, whose mark is its prefix.
    if (startsWith(b, 0x00, 0x00, 0xFE, 0xFF)) {
      return new DetectedEncoding(UTF_32BE, 4, DetectedEncoding.Basis.BOM);
    }
    if (startsWith(b, 0xFF, 0xFE, 0x00, 0x00)) {
      return new DetectedEncoding(UTF_32LE, 4, DetectedEncoding.Basis.BOM);
    }
    if (startsWith(b, 0xEF, 0xBB, 0xBF)) {
      return new DetectedEncoding(StandardCharsets.UTF_8, 3, DetectedEncoding.Basis.BOM);
    }
    if (startsWith(b, 0xFF, 0xFE)) {
      return new DetectedEncoding(StandardCharsets.UTF_16LE, 2, DetectedEncoding.Basis.BOM);
    }
    if (startsWith(b, 0xFE, 0xFF)) {
      return new DetectedEncoding(StandardCharsets.UTF_16BE, 2, DetectedEncoding.Basis.BOM);
    }
    return null;
  }

  private static boolean startsWith(byte[] b, int... prefix) {
    if (b.length < prefix.length) {
      return false;
    }
    for (int i = 0; i < prefix.length; i++) {
      if ((b[i] & 0xFF) != prefix[i]) {
        return false;
      }
    }
    return true;
  }

  private static boolean hasZeroByte(byte[] b, int length) {
    for (int i = 0; i < length; i++) {
      if (b[i] == 0) {
        return true;
      }
    }
    return false;
  }

  /**
   * ASCII-range characters in UTF-16 put a zero in the high byte: odd positions for LE, even
   * for BE. Text in other scripts does not, but delimiters, digits and line breaks still do.
   */
  private static Charset utf16ByZeroPattern(byte[] b, int length) {
    int pairs = length / 2;
    if (pairs < 2) {
      return null;
    }
    int zeroEven = 0;
    int zeroOdd = 0;
    for (int i = 0; i + 1 < length; i += 2) {
      if (b[i] == 0) {
        zeroEven++;
      }
      if (b[i + 1] == 0) {
        zeroOdd++;
      }
    }
    // Thresholds: common practice, no source. A third of the units in ASCII range, and the
    // other position nearly free of zeros (a zero there would be U+0000 or U+xx00).
    if (zeroOdd * 3 >= pairs && zeroEven * 20 <= pairs) {
      return StandardCharsets.UTF_16LE;
    }
    if (zeroEven * 3 >= pairs && zeroOdd * 20 <= pairs) {
      return StandardCharsets.UTF_16BE;
    }
    return null;
  }

  /** Whether the first {@code length} bytes are all ASCII, and so valid UTF-8 as they are. */
  public static boolean isAscii(byte[] b, int length) {
    for (int i = 0; i < length; i++) {
      if (b[i] < 0) {
        return false;
      }
    }
    return true;
  }

  /** Whether the first {@code length} bytes decode without error (a cut tail is allowed). */
  static boolean isValid(Charset charset, byte[] b, int length, boolean truncated) {
    CharsetDecoder decoder = charset.newDecoder()
        .onMalformedInput(CodingErrorAction.REPORT)
        .onUnmappableCharacter(CodingErrorAction.REPORT);
    ByteBuffer in = ByteBuffer.wrap(b, 0, length);
    CharBuffer out = CharBuffer.allocate(4096);
    while (true) {
      CoderResult result = decoder.decode(in, out, !truncated);
      if (result.isError()) {
        return false;
      }
      if (result.isOverflow()) {
        out.clear();
        continue;
      }
      // Underflow: with a truncated sample, up to 3 bytes of a cut character may remain.
      break;
    }
    if (!truncated) {
      out.clear();
      return !decoder.flush(out).isError();
    }
    return true;
  }

  /** Share of C0 control bytes other than tab, LF, FF and CR: text has next to none. */
  private static double controlCharacterShare(byte[] b, int length) {
    int controls = 0;
    for (int i = 0; i < length; i++) {
      int c = b[i] & 0xFF;
      if (c < 0x20 && c != '\t' && c != '\n' && c != '\r' && c != '\f' && c != 0x1A) {
        controls++;
      }
    }
    return (double) controls / length;
  }

  private static Charset statisticalGuess(byte[] b, int length) {
    UniversalDetector detector = new UniversalDetector(null);
    detector.handleData(b, 0, length);
    detector.dataEnd();
    String name = detector.getDetectedCharset();
    if (name == null) {
      return null;
    }
    try {
      Charset charset = Charset.forName(name);
      // The library can still say UTF-8 for bytes that failed strict validation above.
      return charset.equals(StandardCharsets.UTF_8) || charset.name().startsWith("UTF-16")
          ? null
          : charset;
    } catch (IllegalCharsetNameException | UnsupportedCharsetException e) {
      return null;
    }
  }

  /**
   * windows-1252 and ISO-8859-1 differ only in bytes 0x80-0x9F (printable in windows-1252,
   * C1 controls in ISO-8859-1; WHATWG Encoding Standard, section 4.2, even maps the label
   * iso-8859-1 to windows-1252). We report the narrower ISO-8859-1 when no such byte occurs,
   * since both then decode identically.
   */
  private static Charset latinRefined(Charset guessed, byte[] b, int length) {
    if (!guessed.equals(WINDOWS_1252) && !guessed.equals(StandardCharsets.ISO_8859_1)) {
      return guessed;
    }
    for (int i = 0; i < length; i++) {
      int c = b[i] & 0xFF;
      if (c >= 0x80 && c <= 0x9F) {
        return WINDOWS_1252;
      }
    }
    return StandardCharsets.ISO_8859_1;
  }
}
