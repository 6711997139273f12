package org.headwater.harvest.format;

import java.io.EOFException;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * A {@link TailReader} for a local file. Each call opens the file anew, so the harvester holds no handle
 * between the head it sampled and the reader's request, and nothing needs closing.
 */
public final class FileTailReader implements TailReader {
    private final Path file;
    private final long expectedSize;

    /**
     * @param expectedSize the size the harvester saw when it sampled the head; a different size at read time
     *     means the file changed, and head and tail would not belong together
     */
    public FileTailReader(Path file, long expectedSize) {
        this.file = file;
        this.expectedSize = expectedSize;
    }

    @Override
    public byte[] readTail(int n) throws IOException {
        if (n < 0) {
            throw new IllegalArgumentException("n must not be negative: " + n);
        }
        try (FileChannel channel = FileChannel.open(file, StandardOpenOption.READ)) {
            long size = channel.size();
            if (size != expectedSize) {
                throw new IOException("The file changed while it was read: " + size + " bytes now, " + expectedSize
                        + " when sampled");
            }
            int length = (int) Math.min(n, size);
            ByteBuffer buffer = ByteBuffer.allocate(length);
            long position = size - length;
            // Each read moves forward by at least one byte or ends the loop, so it ends after at most n reads.
            while (buffer.hasRemaining()) {
                int read = channel.read(buffer, position + buffer.position());
                if (read < 0) {
                    throw new EOFException("The file ended early at byte " + (position + buffer.position()));
                }
            }
            return buffer.array();
        }
    }
}
