package org.headwater.harvest.format.csv;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;

/** Reads the invented fixtures under src/test/resources/csv and re-encodes them. */
final class Fixtures {

  private Fixtures() {}

  static byte[] bytes(String name) {
    try (InputStream in = Fixtures.class.getResourceAsStream("/csv/" + name)) {
      if (in == null) {
        throw new IllegalArgumentException("no fixture " + name);
      }
      return in.readAllBytes();
    } catch (IOException e) {
      throw new UncheckedIOException(e);
    }
  }

  /** The folder of the fixtures, as a path (the test classes are on the file system). */
  static java.nio.file.Path csvDir() {
    try {
      return java.nio.file.Path.of(Fixtures.class.getResource("/csv").toURI());
    } catch (java.net.URISyntaxException e) {
      throw new IllegalStateException(e);
    }
  }

  static String text(String name) {
    return new String(bytes(name), StandardCharsets.UTF_8);
  }

  /** The fixture's text in another encoding, optionally after a byte order mark. */
  static byte[] encoded(String name, Charset charset, boolean bom) {
    String text = (bom ? "\uFEFF" : "") + text(name);
    return text.getBytes(charset);
  }

  /** The fixture with every LF replaced by {@code terminator}. */
  static byte[] withTerminator(String name, String terminator) {
    return text(name).replace("\n", terminator).getBytes(StandardCharsets.UTF_8);
  }

  static CsvSniff sniff(byte[] bytes) throws NotDelimitedTextException {
    return new CsvSniffer().sniff(bytes, true, bytes.length);
  }
}
