package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.Charset;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.Test;

class TextDecoderTest {

  /** Well-formed text, then malformed UTF-8: a lone continuation byte, a cut sequence, an overlong form, a surrogate. */
  private static final List<byte[]> INPUTS = List.of(
      "id;naam;bedrag\n1;Zoë;12,50\n".getBytes(StandardCharsets.UTF_8),
      new byte[] {'a', (byte) 0x80, 'b'},
      new byte[] {'a', (byte) 0xE2, (byte) 0x82, 'b'},
      new byte[] {(byte) 0xC0, (byte) 0xAF, ',', '1'},
      new byte[] {(byte) 0xED, (byte) 0xA0, (byte) 0x80, ';'},
      new byte[] {'x', (byte) 0xF0, (byte) 0x9F, (byte) 0x92});

  @Test
  void aCompleteSampleDecodesAsTheJdkDecoderWithReplacementDoes() throws CharacterCodingException {
    for (Charset charset : List.of(StandardCharsets.UTF_8, Charset.forName("windows-1252"),
        StandardCharsets.UTF_16LE, StandardCharsets.ISO_8859_1)) {
      for (byte[] input : INPUTS) {
        // expected: the JDK's own CharsetDecoder, malformed and unmappable input replaced (java.nio.charset)
        String expected = charset.newDecoder().onMalformedInput(CodingErrorAction.REPLACE)
            .onUnmappableCharacter(CodingErrorAction.REPLACE).decode(ByteBuffer.wrap(input)).toString();
        assertThat(TextDecoder.decode(input, 0, input.length, charset, true))
            .as(charset + " " + java.util.HexFormat.of().formatHex(input)).isEqualTo(expected);
      }
    }
  }

  @Test
  void aCutSampleLeavesOutTheCharacterCutAtItsEnd() {
    byte[] input = "Zoë".getBytes(StandardCharsets.UTF_8);
    assertThat(TextDecoder.decode(input, 0, input.length - 1, StandardCharsets.UTF_8, false)).isEqualTo("Zo");
    assertThat(TextDecoder.decode(input, 0, input.length - 1, StandardCharsets.UTF_8, true)).isEqualTo("Zo\uFFFD");
  }
}
