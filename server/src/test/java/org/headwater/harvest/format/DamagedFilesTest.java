package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;

import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Random;
import java.util.Set;
import java.util.TreeSet;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.pdmodel.PDPage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Cuts and scrambles real files of every format this package reads: each damaged file gives a reading or
 * an UnreadableFileException of a known kind, never another exception, and every cut file is reported.
 */
class DamagedFilesTest {
    private static final Set<String> KINDS = Set.of("invalid", "truncated", "binary", "too_large", "unreadable");
    private final FormatRegistry registry = FormatRegistry.standard();

    @TempDir
    Path dir;

    @Test
    void cutPngsAreAllReported() throws Exception {
        everyCutIsReported("fig.png", Images.pngWithText(Images.picture(60, 40, BufferedImage.TYPE_INT_RGB)));
    }

    @Test
    void cutJpegsGiFsAndSvgsAreAllReportedUpToTheirFrameOrRoot() throws Exception {
        byte[] jpeg = Images.write(Images.picture(60, 40, BufferedImage.TYPE_INT_RGB), "jpeg");
        int sof = indexOf(jpeg, new byte[] {(byte) 0xFF, (byte) 0xC0});
        everyCutIsReported("photo.jpg", Arrays.copyOf(jpeg, sof + 10));
        everyCutIsReported("anim.gif", Arrays.copyOf(Images.write(Images.picture(6, 4, BufferedImage.TYPE_BYTE_INDEXED), "gif"), 13));
        everyCutIsReported("chart.svg", "<?xml version=\"1.0\"?><svg xmlns=\"http://www.w3.org/2000/svg\" width=\"4\"><title>t</title></svg>"
                .getBytes(StandardCharsets.UTF_8));
    }

    @Test
    void cutPdfsAndParquetFilesAreAllReported() throws Exception {
        // Only the bytes up to the last %%EOF: after it come line ends, and a PDF without them is whole.
        byte[] pdf = pdf();
        String text = new String(pdf, StandardCharsets.ISO_8859_1);
        everyCutIsReported("report.pdf", Arrays.copyOf(pdf, text.lastIndexOf("%%EOF") + 5));
        everyCutIsReported("gauge.parquet", java.nio.file.Files.readAllBytes(
                ParquetFiles.writeGauge(dir.resolve("g.parquet"), 20, 10, CompressionCodecName.UNCOMPRESSED)));
    }

    @Test
    void scrambledFilesGiveAReadingOrAKnownKindNeverACrash() throws Exception {
        Random random = new Random(42);
        scramble("fig.png", Images.pngWithText(Images.picture(60, 40, BufferedImage.TYPE_INT_RGB)), random);
        scramble("photo.jpg", Images.write(Images.picture(60, 40, BufferedImage.TYPE_INT_RGB), "jpeg"), random);
        scramble("anim.gif", Images.write(Images.picture(6, 4, BufferedImage.TYPE_BYTE_INDEXED), "gif"), random);
        scramble("chart.svg", ("<?xml version=\"1.0\"?><svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 4 4\">"
                + "<title>t</title><metadata><dc:title xmlns:dc=\"http://purl.org/dc/elements/1.1/\">x</dc:title></metadata></svg>")
                .getBytes(StandardCharsets.UTF_8), random);
        scramble("report.pdf", pdf(), random);
        scramble("gauge.parquet", java.nio.file.Files.readAllBytes(
                ParquetFiles.writeGauge(dir.resolve("g.parquet"), 20, 10, CompressionCodecName.UNCOMPRESSED)), random);
    }

    /** Every strict prefix (sampled at most 200 cut points) is an UnreadableFileException of a known kind. */
    private void everyCutIsReported(String name, byte[] bytes) {
        int step = Math.max(1, bytes.length / 200);
        for (int cut = 0; cut < bytes.length; cut += step) {
            byte[] prefix = Arrays.copyOf(bytes, cut);
            try {
                Reading r = registry.read(new Sample(name, prefix, true, prefix.length));
                throw new AssertionError(name + " cut at " + cut + " of " + bytes.length + " was read as " + r);
            } catch (UnreadableFileException e) {
                assertThat(KINDS).as("%s cut at %d: %s", name, cut, e.getMessage()).contains(e.kind());
            }
        }
    }

    private void scramble(String name, byte[] original, Random random) {
        TreeSet<String> outcomes = new TreeSet<>();
        for (int trial = 0; trial < 150; trial++) {
            byte[] bytes = original.clone();
            int flips = 1 + random.nextInt(8);
            for (int f = 0; f < flips; f++) {
                bytes[random.nextInt(bytes.length)] = (byte) random.nextInt(256);
            }
            try {
                registry.read(new Sample(name, bytes, true, bytes.length));
                outcomes.add("read");
            } catch (UnreadableFileException e) {
                assertThat(KINDS).as("%s: %s", name, e.getMessage()).contains(e.kind());
                outcomes.add(e.kind());
            }
        }
        assertThat(outcomes).as(name).isNotEmpty();
    }

    private static byte[] pdf() throws Exception {
        try (PDDocument doc = new PDDocument()) {
            doc.addPage(new PDPage());
            doc.getDocumentInformation().setTitle("Cut me");
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            doc.save(out);
            return out.toByteArray();
        }
    }

    private static int indexOf(byte[] bytes, byte[] needle) {
        for (int i = 0; i + needle.length <= bytes.length; i++) {
            if (Arrays.equals(bytes, i, i + needle.length, needle, 0, needle.length)) {
                return i;
            }
        }
        throw new AssertionError("not found");
    }
}
