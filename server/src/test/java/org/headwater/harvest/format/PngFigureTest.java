package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Map;
import java.util.zip.DeflaterOutputStream;
import org.headwater.model.DatasetKind;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PngFigureTest {
    private final FigureReader reader = new FigureReader();

    @TempDir
    Path dir;

    private static Sample whole(String name, byte[] bytes) {
        return new Sample(name, bytes, true, bytes.length);
    }

    @Test
    void theHeaderGivesSizeBitDepthAndColourType() throws Exception {
        byte[] png = Images.write(Images.picture(320, 200, BufferedImage.TYPE_INT_RGB), "png");
        Reading r = reader.read(whole("fig.png", png));
        assertThat(r.format()).isEqualTo("png");
        assertThat(r.kind()).isEqualTo(DatasetKind.FIGURE);
        assertThat(r.columns()).isNull();
        // expected: the image ImageIO wrote, 320 x 200 RGB; PNG spec table 11.1: colour type 2 is truecolour.
        assertThat(r.details()).containsEntry("width", 320).containsEntry("height", 200)
                .containsEntry("bit_depth", 8).containsEntry("colour_type", 2)
                .containsEntry("colour_type_name", "truecolour").containsEntry("interlace", "none")
                .containsEntry("text", Map.of());
    }

    @Test
    void alphaAndGreyImagesHaveTheirColourTypes() throws Exception {
        // PNG spec table 11.1: 6 truecolour with alpha, 0 greyscale.
        assertThat(reader.read(whole("a.png", Images.write(Images.picture(4, 3, BufferedImage.TYPE_INT_ARGB), "png"))).details())
                .containsEntry("colour_type", 6).containsEntry("colour_type_name", "truecolour with alpha");
        assertThat(reader.read(whole("g.png", Images.write(Images.picture(4, 3, BufferedImage.TYPE_USHORT_GRAY), "png"))).details())
                .containsEntry("colour_type", 0).containsEntry("bit_depth", 16);
    }

    @Test
    void everyTextChunkKindIsReadAsImageIoReadsIt() throws Exception {
        byte[] png = Images.pngWithText(Images.picture(30, 20, BufferedImage.TYPE_INT_RGB));
        Reading r = reader.read(whole("fig.png", png));
        // expected: the JDK's own PNG reader on the same bytes (tEXt, iTXt uncompressed and compressed, zTXt).
        Map<String, String> byImageIo = Images.textByImageIo(png);
        assertThat(byImageIo).containsOnlyKeys("Title", "Author", "Description", "Comment", "Source");
        assertThat(r.details().get("text")).isEqualTo(byImageIo);
        assertThat(r.details()).containsEntry("title", "Nitrate at Fernbrook weir, 2025");
        @SuppressWarnings("unchecked")
        Map<String, String> text = (Map<String, String>) r.details().get("text");
        assertThat(text.get("Description")).isEqualTo("Weekly means; µg/L ± 2σ");
        assertThat(text.get("Comment")).isEqualTo("Made by run r-2025-117 — «invented»");
    }

    @Test
    void textChunksBuiltByHandAfterTheImageDataAreFound() throws Exception {
        byte[] png = Images.write(Images.picture(8, 8, BufferedImage.TYPE_INT_RGB), "png");
        // PNG spec 11.3.4.3 (tEXt: keyword, NUL, text) and 11.3.4.4 (zTXt: keyword, NUL, method 0, zlib data);
        // both may come after IDAT (5.6).
        png = Images.beforeIend(png, Images.chunk("tEXt", Images.latin1("Software\0headwater-test 0.1")));
        ByteArrayOutputStream z = new ByteArrayOutputStream();
        try (DeflaterOutputStream d = new DeflaterOutputStream(z)) {
            d.write(Images.latin1("Grüße aus dem Labor"));
        }
        byte[] zKeyword = Images.latin1("Disclaimer\0\0");
        byte[] zData = Arrays.copyOf(zKeyword, zKeyword.length + z.size());
        System.arraycopy(z.toByteArray(), 0, zData, zKeyword.length, z.size());
        png = Images.beforeIend(png, Images.chunk("zTXt", zData));
        Reading r = reader.read(whole("fig.png", png));
        assertThat(r.details().get("text")).isEqualTo(Map.of("Software", "headwater-test 0.1", "Disclaimer", "Grüße aus dem Labor"));
        assertThat(Images.textByImageIo(png)).isEqualTo(r.details().get("text"));
    }

    @Test
    void textIsBoundedInEntriesAndLength() throws Exception {
        byte[] png = Images.write(Images.picture(2, 2, BufferedImage.TYPE_INT_RGB), "png");
        for (int i = 0; i < 70; i++) {
            png = Images.beforeIend(png, Images.chunk("tEXt", Images.latin1("k" + i + "\0v")));
        }
        png = Images.beforeIend(png, Images.chunk("tEXt", Images.latin1("k0\0" + "x".repeat(5000))));
        Reading r = reader.read(whole("many.png", png));
        @SuppressWarnings("unchecked")
        Map<String, String> text = (Map<String, String>) r.details().get("text");
        assertThat(text).hasSize(64);
        assertThat(text.get("k0")).hasSize(4096).startsWith("v\nxxx");
        assertThat(r.details()).containsEntry("text_truncated", true);
    }

    @Test
    void aCompressedBombIsInflatedOnlyUpToTheCap() throws Exception {
        ByteArrayOutputStream z = new ByteArrayOutputStream();
        try (DeflaterOutputStream d = new DeflaterOutputStream(z)) {
            d.write(new byte[50 * 1024 * 1024]);
        }
        byte[] keyword = Images.latin1("Bomb\0\0");
        byte[] data = Arrays.copyOf(keyword, keyword.length + z.size());
        System.arraycopy(z.toByteArray(), 0, data, keyword.length, z.size());
        byte[] png = Images.beforeIend(Images.write(Images.picture(2, 2, BufferedImage.TYPE_INT_RGB), "png"), Images.chunk("zTXt", data));
        Reading r = reader.read(whole("bomb.png", png));
        @SuppressWarnings("unchecked")
        Map<String, String> text = (Map<String, String>) r.details().get("text");
        assertThat(text.get("Bomb")).hasSize(4096);
        assertThat(r.details()).containsEntry("text_truncated", true);
    }

    @Test
    void aBadCrcIsInvalid() throws Exception {
        byte[] png = Images.pngWithText(Images.picture(30, 20, BufferedImage.TYPE_INT_RGB));
        png[8 + 8 + 2] ^= 0x01; // inside IHDR's data: its CRC no longer matches
        assertThatThrownBy(() -> reader.read(whole("fig.png", png.clone())))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The PNG chunk IHDR at byte 8 fails its CRC check")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void aCutFileIsTruncated() throws Exception {
        byte[] png = Images.pngWithText(Images.picture(30, 20, BufferedImage.TYPE_INT_RGB));
        assertThatThrownBy(() -> reader.read(whole("fig.png", Arrays.copyOf(png, png.length - 2))))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("The PNG chunk IEND at byte ")
                .hasMessageEndingWith(" runs past the end of the file")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("truncated");
        assertThatThrownBy(() -> reader.read(whole("fig.png", Arrays.copyOf(png, png.length - 12))))
                .hasMessage("The PNG file ends before its IEND chunk");
    }

    @Test
    void aPngNamedCsvIsAPng() throws Exception {
        byte[] png = Images.write(Images.picture(5, 4, BufferedImage.TYPE_INT_RGB), "png");
        Reading r = FormatRegistry.standard().read(whole("table.csv", png));
        assertThat(r.format()).isEqualTo("png");
        assertThat(r.details()).containsEntry("width", 5);
    }

    @Test
    void aDotPngHoldingTextIsReportedAsAnInvalidPng() {
        assertThatThrownBy(() -> reader.read(whole("fig.png", Images.latin1("not a picture"))))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The file does not start with the PNG signature");
    }

    @Test
    void textAfterTheSampleIsReadThroughTheTailReaderOrMarkedIncomplete() throws Exception {
        // Noise does not compress, so the image data outgrows the 64 KiB sample and the tEXt chunk lies beyond it.
        BufferedImage noise = new BufferedImage(200, 200, BufferedImage.TYPE_INT_RGB);
        java.util.Random random = new java.util.Random(7);
        for (int y = 0; y < 200; y++) {
            for (int x = 0; x < 200; x++) {
                noise.setRGB(x, y, random.nextInt());
            }
        }
        byte[] png = Images.beforeIend(Images.write(noise, "png"), Images.chunk("tEXt", Images.latin1("Title\0late title")));
        assertThat(png.length).isGreaterThan(64 * 1024);
        Path file = Files.write(dir.resolve("noise.png"), png);
        byte[] head = Arrays.copyOf(png, 64 * 1024);
        Reading withTail = reader.read(new Sample("noise.png", head, false, png.length, new FileTailReader(file, png.length)));
        assertThat(withTail.details()).containsEntry("title", "late title").doesNotContainKey("text_complete");
        Reading headOnly = reader.read(new Sample("noise.png", head, false, png.length));
        assertThat(headOnly.details()).containsEntry("width", 200).containsEntry("text", Map.of())
                .containsEntry("text_complete", false);
    }
}
