package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;
import org.headwater.bench.LakeGenerator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A harvest reads sibling files with the shape of the first one it sniffed; these tests hold every such
 * reading to the full sniff of the same file on its own, which is what {@code headwater sniff} reports.
 */
class ShapeMemoryTest {

    @TempDir
    Path dir;

    private final CsvSniffer sniffer = new CsvSniffer();

    @Test
    void siblingsReadWithARememberedShapeEqualTheirOwnFullSniffOnTheSyntheticLake() throws Exception {
        // The benchmark lake in small: 6 tables of 40 key=value partitions, comma, tab and semicolon with decimal commas.
        new LakeGenerator(6, 40, 60, 0).write(dir);
        List<Path> files;
        try (Stream<Path> walk = Files.walk(dir)) {
            files = walk.filter(p -> p.toString().endsWith(".csv") || p.toString().endsWith(".tsv")).sorted().toList();
        }
        ShapeMemory memory = ShapeMemory.forOneHarvest();
        for (Path file : files) {
            byte[] bytes = Files.readAllBytes(file);
            assertThat(sniffer.sniff(bytes, true, bytes.length, memory)).as(file.toString())
                    .isEqualTo(sniffer.sniff(bytes, true, bytes.length));
        }
        assertThat(files).hasSizeGreaterThan(100);
        // One full sniff per table's header, every other partition read with its sibling's shape.
        assertThat(memory.size()).isBetween(1, 6);
        assertThat(memory.recalled()).isEqualTo(files.size() - memory.size());
    }

    @Test
    void siblingsThatDoNotFitTheRememberedShapeAreSniffedInFullAndReadAsOnTheirOwn() throws Exception {
        // Families of files sharing a first line, where some members quote differently, escape with a backslash,
        // carry a units row or a footer, break the width or hold only text: each must read exactly as its full
        // sniff reads it (invented data; the expected values are the sniffer's own full reading).
        Random random = new Random(20261202L);
        List<byte[]> files = new ArrayList<>();
        String[] delimiters = {",", ";", "\t", "|"};
        for (int family = 0; family < 12; family++) {
            String d = delimiters[family % delimiters.length];
            boolean decimalComma = d.equals(";");
            String header = String.join(d, "site_code", "sampled_on", "depth_m", "reading", "note");
            for (int member = 0; member < 10; member++) {
                int variant = random.nextInt(9);
                StringBuilder text = new StringBuilder(header).append('\n');
                if (variant == 1) {
                    text.append(String.join(d, "", "", "m", "mg/l", "")).append('\n');
                }
                int rows = 5 + random.nextInt(40);
                for (int r = 0; r < rows; r++) {
                    String depth = (random.nextInt(400) / 10) + (decimalComma ? ",5" : ".5");
                    String note = switch (variant) {
                        case 2 -> "\"clear" + d + " calm\"";
                        case 3 -> "'still" + d + " cold'";
                        case 4 -> "said \\\"ok\\\"";
                        case 5 -> r == rows / 2 ? "extra" + d + "cell" : "plain";
                        default -> "plain";
                    };
                    String reading = variant == 6 ? "n" + random.nextInt(9) : Integer.toString(random.nextInt(900));
                    text.append(String.join(d, "S" + (100 + random.nextInt(50)), "2026-0" + (1 + random.nextInt(9)) + "-1"
                            + random.nextInt(10), depth, reading, note)).append(variant == 7 ? "\r\n" : "\n");
                }
                if (variant == 8) {
                    text.append("total").append(d).append(rows).append('\n');
                }
                Charset charset = member % 5 == 4 ? Charset.forName("windows-1252") : StandardCharsets.UTF_8;
                files.add(text.toString().getBytes(charset));
            }
        }
        Collections.shuffle(files, random);
        ShapeMemory memory = ShapeMemory.forOneHarvest();
        for (int i = 0; i < files.size(); i++) {
            byte[] bytes = files.get(i);
            CsvSniff alone = sniffer.sniff(bytes, true, bytes.length);
            assertThat(sniffer.sniff(bytes, true, bytes.length, memory)).as("file %d:%n%s", i,
                    new String(bytes, StandardCharsets.ISO_8859_1)).isEqualTo(alone);
        }
        assertThat(memory.recalled()).isGreaterThan(20);
    }

    @Test
    void noMemoryRemembersNothing() throws Exception {
        byte[] bytes = "a,b\n1,2\n3,4\n".getBytes(StandardCharsets.UTF_8);
        sniffer.sniff(bytes, true, bytes.length, ShapeMemory.NONE);
        sniffer.sniff(bytes, true, bytes.length, ShapeMemory.NONE);
        assertThat(ShapeMemory.NONE.size()).isZero();
        assertThat(ShapeMemory.NONE.recalled()).isZero();
    }
}
