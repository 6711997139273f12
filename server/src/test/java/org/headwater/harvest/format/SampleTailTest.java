package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SampleTailTest {
    private static final byte[] FILE = "0123456789abcdefghij".getBytes(StandardCharsets.US_ASCII);

    @TempDir
    Path dir;

    @Test
    void aCompleteSampleServesItsTailFromTheHead() throws Exception {
        Sample s = new Sample("f.bin", FILE, true, FILE.length);
        assertThat(new String(s.readTail(4), StandardCharsets.US_ASCII)).isEqualTo("ghij");
        assertThat(s.readTail(100)).isEqualTo(FILE);
        assertThat(s.readWhole(20)).contains(FILE);
        assertThat(s.readWhole(19)).isEmpty();
    }

    @Test
    void aFileTailReaderReadsTheEndOfTheFile() throws Exception {
        Path file = Files.write(dir.resolve("f.bin"), FILE);
        Sample s = new Sample("f.bin", Arrays.copyOf(FILE, 5), false, FILE.length, new FileTailReader(file, FILE.length));
        assertThat(new String(s.readTail(3), StandardCharsets.US_ASCII)).isEqualTo("hij");
        assertThat(s.readTail(50)).isEqualTo(FILE);
        assertThat(s.readWhole(1024)).contains(FILE);
        assertThat(s.readWhole(10)).isEmpty();
    }

    @Test
    void aFileThatChangedSinceItsHeadWasSampledIsRefused() throws Exception {
        Path file = Files.write(dir.resolve("f.bin"), FILE);
        FileTailReader tail = new FileTailReader(file, FILE.length);
        Files.write(file, Arrays.copyOf(FILE, 30));
        assertThatThrownBy(() -> tail.readTail(4))
                .isInstanceOf(IOException.class)
                .hasMessage("The file changed while it was read: 30 bytes now, 20 when sampled");
    }

    @Test
    void withoutATailReaderACutSampleSaysSo() {
        Sample s = new Sample("f.bin", Arrays.copyOf(FILE, 5), false, FILE.length);
        assertThatThrownBy(() -> s.readTail(4))
                .isInstanceOf(IOException.class)
                .hasMessage("The harvester gave no access to the end of the file");
    }

    @Test
    void aTailReaderGivingTheWrongLengthOrFailingIsAnIoError() {
        Sample shortTail = new Sample("f.bin", Arrays.copyOf(FILE, 5), false, FILE.length, n -> new byte[1]);
        assertThatThrownBy(() -> shortTail.readTail(4)).isInstanceOf(IOException.class)
                .hasMessage("Asked for the last 4 bytes, got 1");
        Sample failing = new Sample("f.bin", Arrays.copyOf(FILE, 5), false, FILE.length, n -> {
            throw new IllegalStateException("connection reset");
        });
        assertThatThrownBy(() -> failing.readTail(4)).isInstanceOf(IOException.class)
                .hasMessage("The tail reader failed: java.lang.IllegalStateException: connection reset");
    }
}
