package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;

/**
 * The character encoding found for some bytes.
 *
 * @param charset the encoding
 * @param bomLength bytes of byte order mark at the start (0 when there is none)
 * @param basis what the finding rests on, from certain to guessed
 */
public record DetectedEncoding(Charset charset, int bomLength, Basis basis) {

  /** What an encoding finding rests on. */
  public enum Basis {
    /** A byte order mark: certain. */
    BOM,
    /** The bytes are valid UTF-8 (ASCII included): near certain. */
    VALID_UTF8,
    /** Zero bytes in every other position, as ASCII-range text in UTF-16 has. */
    UTF16_ZERO_PATTERN,
    /** The statistical guess of the charset-detection library. */
    STATISTICAL,
    /** Nothing fitted better: the Latin-1 family, which decodes any byte. */
    FALLBACK
  }

  public boolean bom() {
    return bomLength > 0;
  }
}
