package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

class EncodingDetectorTest {

  private final EncodingDetector detector = new EncodingDetector();

  private DetectedEncoding detect(byte[] bytes) throws NotDelimitedTextException {
    return detector.detect(bytes, true);
  }

  private static String name(DetectedEncoding e) {
    return e.charset().name().toLowerCase(java.util.Locale.ROOT);
  }

  @Test
  void reportsPureAsciiAsUtf8() throws Exception {
    // ASCII is a subset of UTF-8 (RFC 3629 section 1), so valid ASCII is valid UTF-8
    DetectedEncoding e = detect("a,b\n1,2\n".getBytes(StandardCharsets.US_ASCII));
    assertThat(name(e)).isEqualTo("utf-8");
    assertThat(e.bom()).isFalse();
    assertThat(e.basis()).isEqualTo(DetectedEncoding.Basis.VALID_UTF8);
  }

  @Test
  void detectsUtf8WithoutBom() throws Exception {
    DetectedEncoding e = detect(Fixtures.bytes("accents.csv"));
    assertThat(name(e)).isEqualTo("utf-8");
    assertThat(e.bom()).isFalse();
  }

  @Test
  void detectsUtf8Bom() throws Exception {
    // expected: the UTF-8 encoding of U+FEFF is EF BB BF (RFC 3629 section 6)
    DetectedEncoding e = detect(Fixtures.encoded("accents.csv", StandardCharsets.UTF_8, true));
    assertThat(name(e)).isEqualTo("utf-8");
    assertThat(e.bomLength()).isEqualTo(3);
  }

  @Test
  void detectsUtf16LittleEndianBom() throws Exception {
    // expected: U+FEFF serialised little-endian is FF FE (RFC 2781 section 3.2)
    DetectedEncoding e = detect(Fixtures.encoded("accents.csv", StandardCharsets.UTF_16LE, true));
    assertThat(name(e)).isEqualTo("utf-16le");
    assertThat(e.bomLength()).isEqualTo(2);
  }

  @Test
  void detectsUtf16BigEndianBom() throws Exception {
    // expected: U+FEFF serialised big-endian is FE FF (RFC 2781 section 3.2)
    DetectedEncoding e = detect(Fixtures.encoded("accents.csv", StandardCharsets.UTF_16BE, true));
    assertThat(name(e)).isEqualTo("utf-16be");
    assertThat(e.bomLength()).isEqualTo(2);
  }

  @Test
  void detectsUtf16LittleEndianWithoutBomByZeroBytes() throws Exception {
    DetectedEncoding e = detect(Fixtures.encoded("measurements.txt", StandardCharsets.UTF_16LE, false));
    assertThat(name(e)).isEqualTo("utf-16le");
    assertThat(e.basis()).isEqualTo(DetectedEncoding.Basis.UTF16_ZERO_PATTERN);
  }

  @Test
  void detectsLatin1AccentsAsIso88591() throws Exception {
    // No byte in 0x80-0x9F: ISO-8859-1 and windows-1252 decode alike; we name the former.
    DetectedEncoding e = detect(Fixtures.encoded("accents.csv", StandardCharsets.ISO_8859_1, false));
    assertThat(name(e)).isEqualTo("iso-8859-1");
    assertThat(e.bom()).isFalse();
  }

  @Test
  void detectsWindows1252ByCurlyQuotesAndEuroSign() throws Exception {
    // expected: windows-1252 code chart (Unicode's cp1252 mapping table): 0x80 is EURO SIGN,
    // 0x93/0x94 are curly double quotes; ISO-8859-1 has C1 controls there
    Charset cp1252 = Charset.forName("windows-1252");
    byte[] bytes = "produit;prix\n\u201cCaf\u00e9\u201d;3 \u20ac\nTh\u00e9;2 \u20ac\n".getBytes(cp1252);
    assertThat(bytes).contains((byte) 0x80, (byte) 0x93);
    assertThat(name(detect(bytes))).isEqualTo("windows-1252");
  }

  @Test
  void acceptsUtf8CharacterCutAtTheEndOfASample() throws Exception {
    byte[] bytes = "a,b\nJos\u00e9,1\n".getBytes(StandardCharsets.UTF_8);
    int cut = "a,b\nJos".length() + 1; // inside the two bytes of é
    DetectedEncoding e = detector.detect(Arrays.copyOf(bytes, cut), false);
    assertThat(name(e)).isEqualTo("utf-8");
  }

  @Test
  void refusesEmptyInput() {
    assertThatThrownBy(() -> detect(new byte[0]))
        .isInstanceOfSatisfying(NotDelimitedTextException.class,
            e -> assertThat(e.reason()).isEqualTo(NotDelimitedTextException.Reason.EMPTY));
  }

  @Test
  void refusesBinaryWithZeroBytes() {
    // The first bytes of a PNG file (PNG specification, section 5.2), then zeros.
    byte[] png = {(byte) 0x89, 'P', 'N', 'G', 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 0x0D, 'I', 'H',
        'D', 'R', 0, 0, 1, 0, 0, 0, 1, 0, 8, 6, 0, 0, 0};
    assertThatThrownBy(() -> detect(png))
        .isInstanceOfSatisfying(NotDelimitedTextException.class,
            e -> assertThat(e.reason()).isEqualTo(NotDelimitedTextException.Reason.BINARY));
  }
}
