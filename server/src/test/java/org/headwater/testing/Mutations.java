package org.headwater.testing;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;

/**
 * Mutated inputs for fuzz tests: real files changed by a few random edits (bit flips, byte changes,
 * insertions, deletions, repeats, truncation), the classic mutation operators of coverage-free fuzzers.
 * The same seed gives the same bytes, so a failing fuzz case can be replayed from its seed.
 */
public final class Mutations {
    private Mutations() {
    }

    /** {@code original} after 1 to 8 random edits chosen by {@code seed}. */
    public static byte[] mutate(byte[] original, long seed) {
        Random random = new Random(seed);
        byte[] b = original.clone();
        int edits = 1 + random.nextInt(8);
        for (int i = 0; i < edits; i++) {
            int at = b.length == 0 ? 0 : random.nextInt(b.length);
            switch (random.nextInt(6)) {
                case 0 -> {
                    if (b.length > 0) {
                        b[at] ^= (byte) (1 << random.nextInt(8));
                    }
                }
                case 1 -> {
                    if (b.length > 0) {
                        b[at] = (byte) random.nextInt(256);
                    }
                }
                case 2 -> {
                    byte[] insert = new byte[1 + random.nextInt(16)];
                    random.nextBytes(insert);
                    b = splice(b, at, 0, insert);
                }
                case 3 -> b = splice(b, at, Math.min(b.length - at, 1 + random.nextInt(64)), new byte[0]);
                case 4 -> {
                    int len = Math.min(b.length - at, 1 + random.nextInt(32));
                    b = splice(b, at, 0, Arrays.copyOfRange(b, at, at + len));
                }
                default -> b = Arrays.copyOf(b, at);
            }
        }
        return b;
    }

    private static byte[] splice(byte[] b, int at, int remove, byte[] insert) {
        byte[] out = new byte[b.length - remove + insert.length];
        System.arraycopy(b, 0, out, 0, at);
        System.arraycopy(insert, 0, out, at, insert.length);
        System.arraycopy(b, at + remove, out, at + insert.length, b.length - at - remove);
        return out;
    }

    /** Every file under {@code folder} whose name ends in one of {@code endings} (lower case), sorted. */
    public static List<Path> files(Path folder, String... endings) {
        try (Stream<Path> walk = Files.walk(folder)) {
            List<Path> found = new ArrayList<>();
            walk.filter(Files::isRegularFile).sorted().forEach(p -> {
                String name = p.getFileName().toString().toLowerCase(java.util.Locale.ROOT);
                for (String ending : endings) {
                    if (name.endsWith(ending)) {
                        found.add(p);
                        return;
                    }
                }
            });
            return found;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
