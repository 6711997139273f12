package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.nio.ByteBuffer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import javax.imageio.ImageIO;
import javax.imageio.ImageReader;
import org.headwater.model.DatasetKind;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Element;
import org.w3c.dom.Node;

class JpegAndGifFigureTest {
    private final FigureReader reader = new FigureReader();

    @TempDir
    Path dir;

    private static Sample whole(String name, byte[] bytes) {
        return new Sample(name, bytes, true, bytes.length);
    }

    @Test
    void aBaselineJpegGivesItsFrameHeader() throws Exception {
        byte[] jpeg = Images.write(Images.picture(123, 45, BufferedImage.TYPE_INT_RGB), "jpeg");
        Reading r = reader.read(whole("photo.jpg", jpeg));
        assertThat(r.format()).isEqualTo("jpeg");
        assertThat(r.kind()).isEqualTo(DatasetKind.FIGURE);
        // expected: the frame header as ImageIO's JPEG reader reports it (javax_imageio_jpeg_image_1.0, <sof>).
        Element sof = sofByImageIo(jpeg);
        assertThat(r.details()).containsEntry("width", Integer.parseInt(sof.getAttribute("samplesPerLine")))
                .containsEntry("height", Integer.parseInt(sof.getAttribute("numLines")))
                .containsEntry("bits_per_sample", Integer.parseInt(sof.getAttribute("samplePrecision")))
                .containsEntry("components", Integer.parseInt(sof.getAttribute("numFrameComponents")));
        assertThat(r.details()).containsEntry("width", 123).containsEntry("height", 45).containsEntry("components", 3)
                .containsEntry("process", "baseline").containsEntry("coding", "huffman");
    }

    @Test
    void aProgressiveGreyJpegSaysSo() throws Exception {
        byte[] jpeg = Images.progressiveJpeg(Images.picture(64, 48, BufferedImage.TYPE_BYTE_GRAY));
        Reading r = reader.read(whole("scan.jpeg", jpeg));
        // ITU T.81 table B.1: SOF2 is progressive DCT, Huffman coding; ImageIO's <sof process="2"> agrees.
        assertThat(sofByImageIo(jpeg).getAttribute("process")).isEqualTo("2");
        assertThat(r.details()).containsEntry("process", "progressive").containsEntry("components", 1);
    }

    @Test
    void aFrameHeaderBehindLargeMetadataSegmentsIsFoundThroughTheTailReader() throws Exception {
        byte[] jpeg = Images.write(Images.picture(40, 30, BufferedImage.TYPE_INT_RGB), "jpeg");
        // Two APP15 segments of the largest size T.81 B.1.1.4 allows (length 65535) right after SOI.
        byte[] app = ByteBuffer.allocate(2 + 65535).put((byte) 0xFF).put((byte) 0xEF).putShort((short) 65535).array();
        byte[] big = new byte[jpeg.length + 2 * app.length];
        System.arraycopy(jpeg, 0, big, 0, 2);
        System.arraycopy(app, 0, big, 2, app.length);
        System.arraycopy(app, 0, big, 2 + app.length, app.length);
        System.arraycopy(jpeg, 2, big, 2 + 2 * app.length, jpeg.length - 2);
        assertThat(ImageIO.read(new ByteArrayInputStream(big)).getWidth()).isEqualTo(40);
        Path file = Files.write(dir.resolve("big.jpg"), big);
        Sample sample = new Sample("big.jpg", Arrays.copyOf(big, 64 * 1024), false, big.length, new FileTailReader(file, big.length));
        assertThat(reader.read(sample).details()).containsEntry("width", 40).containsEntry("height", 30);
    }

    @Test
    void aJpegCutBeforeItsFrameHeaderIsTruncated() throws Exception {
        byte[] jpeg = Images.write(Images.picture(40, 30, BufferedImage.TYPE_INT_RGB), "jpeg");
        assertThatThrownBy(() -> reader.read(whole("photo.jpg", Arrays.copyOf(jpeg, 20))))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The JPEG ends before its frame header")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("truncated");
    }

    @Test
    void aJpegWithABrokenMarkerIsInvalid() throws Exception {
        byte[] jpeg = Images.write(Images.picture(40, 30, BufferedImage.TYPE_INT_RGB), "jpeg");
        // ImageIO writes a JFIF APP0 segment first (length at bytes 4-5); the byte after it must be a marker's 0xFF.
        int next = 4 + (((jpeg[4] & 0xFF) << 8) | (jpeg[5] & 0xFF));
        jpeg[next] = 0x00;
        assertThatThrownBy(() -> reader.read(whole("photo.jpg", jpeg)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("Expected a JPEG marker at byte " + next)
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void aGifGivesItsLogicalScreenSize() throws Exception {
        byte[] gif = Images.write(Images.picture(77, 33, BufferedImage.TYPE_BYTE_INDEXED), "gif");
        Reading r = reader.read(whole("anim.gif", gif));
        assertThat(r.format()).isEqualTo("gif");
        // expected: the size of the image ImageIO wrote, and the version its header bytes spell (GIF89a section 17).
        assertThat(new String(gif, 0, 6, java.nio.charset.StandardCharsets.US_ASCII)).isEqualTo("GIF89a");
        assertThat(r.details()).isEqualTo(java.util.Map.of("width", 77, "height", 33, "version", "89a"));
    }

    @Test
    void aGifCutInsideItsScreenDescriptorIsTruncated() throws Exception {
        byte[] gif = Images.write(Images.picture(7, 3, BufferedImage.TYPE_BYTE_INDEXED), "gif");
        assertThatThrownBy(() -> reader.read(whole("anim.gif", Arrays.copyOf(gif, 9))))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The GIF ends inside its logical screen descriptor")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("truncated");
    }

    private static Element sofByImageIo(byte[] jpeg) throws Exception {
        ImageReader r = ImageIO.getImageReadersByFormatName("jpeg").next();
        try (var in = ImageIO.createImageInputStream(new ByteArrayInputStream(jpeg))) {
            r.setInput(in);
            Node root = r.getImageMetadata(0).getAsTree("javax_imageio_jpeg_image_1.0");
            return (Element) ((Element) root).getElementsByTagName("sof").item(0);
        } finally {
            r.dispose();
        }
    }
}
