package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** Any bytes give a sniff or a NotDelimitedTextException, never an unchecked exception. */
class RobustnessTest {

  private final CsvSniffer sniffer = new CsvSniffer();

  /** Sniffs; returns null for a refusal, fails on a detector fault. */
  private CsvSniff sniffOrRefuse(byte[] bytes, boolean whole) {
    try {
      return sniffer.sniff(bytes, whole, whole ? bytes.length : bytes.length * 3L);
    } catch (NotDelimitedTextException e) {
      assertThat(e.reason()).as("refusal of %s", Arrays.toString(Arrays.copyOf(bytes, 40)))
          .isNotEqualTo(NotDelimitedTextException.Reason.UNEXPECTED);
      return null;
    }
  }

  @Test
  void survivesRandomBytes() {
    Random random = new Random(20240601L);
    for (int i = 0; i < 300; i++) {
      byte[] bytes = new byte[1 + random.nextInt(2000)];
      random.nextBytes(bytes);
      sniffOrRefuse(bytes, random.nextBoolean());
    }
  }

  @Test
  void survivesRandomPrintableText() {
    Random random = new Random(7L);
    String alphabet = "ab1.,;\t|\"'\\\n\r -:#";
    for (int i = 0; i < 500; i++) {
      char[] chars = new char[1 + random.nextInt(400)];
      for (int k = 0; k < chars.length; k++) {
        chars[k] = alphabet.charAt(random.nextInt(alphabet.length()));
      }
      sniffOrRefuse(new String(chars).getBytes(StandardCharsets.UTF_8), random.nextBoolean());
    }
  }

  @Test
  void survivesEveryTruncationOfQuotedFixtures() {
    for (String fixture : new String[] {"backslash.csv", "single_quote.csv", "thousands.csv"}) {
      byte[] bytes = Fixtures.bytes(fixture);
      for (int cut = 1; cut <= bytes.length; cut++) {
        sniffOrRefuse(Arrays.copyOf(bytes, cut), false);
        sniffOrRefuse(Arrays.copyOf(bytes, cut), true);
      }
    }
  }

  @Test
  void survivesFlippedBytesInUtf16() {
    byte[] original = Fixtures.encoded("decimal_comma.csv", StandardCharsets.UTF_16LE, true);
    Random random = new Random(99L);
    for (int i = 0; i < 200; i++) {
      byte[] bytes = original.clone();
      bytes[2 + random.nextInt(bytes.length - 2)] = (byte) random.nextInt(256);
      sniffOrRefuse(bytes, true);
    }
  }

  @Test
  void refusesBlankInputAsEmpty() {
    assertThatThrownBy(() -> sniffer.sniff("\n\r\n  \n".getBytes(StandardCharsets.US_ASCII), true, 6))
        .isInstanceOfSatisfying(NotDelimitedTextException.class,
            e -> assertThat(e.reason()).isEqualTo(NotDelimitedTextException.Reason.EMPTY));
    assertThatThrownBy(() -> sniffer.sniff(null, true, 0))
        .isInstanceOf(NotDelimitedTextException.class);
  }

  @Test
  void refusesProseAsNotTabular() {
    String prose = "It was a bright cold day in April, and the clocks were striking.\n"
        + "Winston Smith, his chin nuzzled into his breast, slipped quickly through.\n"
        + "The hallway smelt of boiled cabbage and old rag mats.\n"
        + "At one end of it a coloured poster, too large for indoor display, had been tacked.\n"
        + "It depicted simply an enormous face, more than a metre wide: the face of a man.\n"
        + "Winston made for the stairs; it was no use trying the lift.\n";
    assertThatThrownBy(() -> sniffer.sniff(prose.getBytes(StandardCharsets.US_ASCII), true, -1))
        .isInstanceOfSatisfying(NotDelimitedTextException.class,
            e -> assertThat(e.reason()).isEqualTo(NotDelimitedTextException.Reason.NOT_TABULAR));
  }

  @Test
  void refusesControlCharactersAsBinary() {
    byte[] bytes = new byte[200];
    Arrays.fill(bytes, (byte) 'a');
    for (int i = 0; i < 200; i += 10) {
      bytes[i] = 0x01;
    }
    assertThatThrownBy(() -> sniffer.sniff(bytes, true, 200))
        .isInstanceOfSatisfying(NotDelimitedTextException.class,
            e -> assertThat(e.reason()).isEqualTo(NotDelimitedTextException.Reason.BINARY));
  }
}
