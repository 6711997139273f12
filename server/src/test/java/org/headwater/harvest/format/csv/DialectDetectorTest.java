package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class DialectDetectorTest {

  private static Dialect detect(String text) {
    return DialectDetector.detect(text, true, 2000, (char) 0).dialect();
  }

  @Test
  void prefersSemicolonOverCommaWhenCommasAreDecimalSeparators() {
    // Both split every row into two cells somewhere; only ';' leaves numbers whole.
    assertThat(detect("name;price\npen;1,50\nink;12,25\ncap;0,99\n").delimiter()).isEqualTo(';');
  }

  @Test
  void prefersCommaWhenSemicolonsOnlyOccurInsideQuotedText() {
    Dialect d = detect("id,text\n1,\"a;b\"\n2,\"c;d;e\"\n3,plain\n");
    assertThat(d).isEqualTo(Dialect.RFC_4180);
  }

  @Test
  void pipeDelimitedWithColonsInTimes() {
    assertThat(detect("t|v\n10:15|1\n11:30|2\n12:45|3\n").delimiter()).isEqualTo('|');
  }

  @Test
  void treatsInchMarksAsNoQuote() {
    // '"' never opens a field here, it only follows digits: as a quote it breaks RFC 4180
    // section 2 rule 5 in every row, so the tie goes to no quote at all.
    Dialect d = detect("item,size\nscreen,27\"\npanel,32\"\n");
    assertThat(d.quote()).isNull();
  }

  @Test
  void readsASingleColumnAsCommaDelimited() {
    assertThat(detect("name\nAnna\nBen\n")).isEqualTo(Dialect.RFC_4180);
  }

  @Test
  void honoursAForcedDelimiter() {
    assertThat(DialectDetector.detect("a,b|c\n", true, 10, '|').dialect().delimiter())
        .isEqualTo('|');
  }

  @Test
  void detectsSpaceSeparatedNumbers() {
    assertThat(detect("1 2 3\n4 5 6\n7 8 9\n").delimiter()).isEqualTo(' ');
  }

  @Test
  void detectsCaretAndTildeDelimiters() {
    assertThat(detect("a^b^c\n1^2^3\n4^5^6\n").delimiter()).isEqualTo('^');
    assertThat(detect("a~b~c\n1~2~3\n4~5~6\n").delimiter()).isEqualTo('~');
  }

  @Test
  void prefersTheQuoteThatActuallyQuotesFields() {
    // Read with or without the single quote the cells count the same; only with it does
    // 'O''Neil' become one clean quoted field.
    assertThat(detect("a:b\nx:1\n'O''Neil':2\ny:3\n").quote()).isEqualTo('\'');
  }

  @Test
  void takesBackslashesThatOnlyProtectSpecialCharactersAsEscapes() {
    // Python's csv.writer with escapechar='\\' writes O\'Neil and back\\slash: every
    // backslash stands before the quote character or another backslash.
    Dialect d = detect("a;b\n1;O\\'Neil\n2;back\\\\slash\n3;plain\n");
    assertThat(d).isEqualTo(new Dialect(';', '\'', Escape.BACKSLASH));
  }

  @Test
  void keepsBackslashesInWindowsPathsLiteral() {
    Dialect d = detect("id,path\n1,C:\\temp\\x.txt\n2,D:\\data\n");
    assertThat(d.escape()).isEqualTo(Escape.DOUBLE);
  }
}
