package org.headwater.harvest.format.csv;

/**
 * Bytes seen as characters, one per byte, so that records of a large file in an
 * ASCII-compatible charset can be counted without decoding it. Only ASCII characters are
 * read correctly; that is all the record splitter looks at.
 */
final class ByteCharView implements CharSequence {

  private final byte[] bytes;
  private final int from;
  private final int to;

  ByteCharView(byte[] bytes, int from, int to) {
    this.bytes = bytes;
    this.from = from;
    this.to = to;
  }

  @Override
  public int length() {
    return to - from;
  }

  @Override
  public char charAt(int index) {
    return (char) (bytes[from + index] & 0xFF);
  }

  @Override
  public CharSequence subSequence(int start, int end) {
    return new ByteCharView(bytes, from + start, from + end);
  }

  @Override
  public String toString() {
    return new String(bytes, from, to - from, java.nio.charset.StandardCharsets.ISO_8859_1);
  }
}
