package org.headwater.harvest.format;

import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.zip.CRC32;
import javax.imageio.IIOImage;
import javax.imageio.ImageIO;
import javax.imageio.ImageTypeSpecifier;
import javax.imageio.ImageWriteParam;
import javax.imageio.ImageWriter;
import javax.imageio.metadata.IIOMetadata;
import javax.imageio.metadata.IIOMetadataNode;
import javax.imageio.stream.ImageOutputStream;
import org.w3c.dom.Node;

/** Test images written by the JDK's ImageIO, and PNG chunks built by hand per the PNG spec. */
final class Images {
    static final String PNG_FORMAT = "javax_imageio_png_1.0";

    private Images() {
    }

    static BufferedImage picture(int width, int height, int type) {
        BufferedImage image = new BufferedImage(width, height, type);
        Graphics2D g = image.createGraphics();
        g.setColor(Color.BLUE);
        g.fillRect(0, 0, width / 2, height);
        g.dispose();
        return image;
    }

    /** A PNG with text chunks written through ImageIO's PNG metadata format (tEXt, iTXt plain and compressed, zTXt). */
    static byte[] pngWithText(BufferedImage image) throws IOException {
        ImageWriter writer = ImageIO.getImageWritersByFormatName("png").next();
        ImageWriteParam param = writer.getDefaultWriteParam();
        IIOMetadata metadata = writer.getDefaultImageMetadata(ImageTypeSpecifier.createFromRenderedImage(image), param);
        IIOMetadataNode root = new IIOMetadataNode(PNG_FORMAT);
        IIOMetadataNode text = new IIOMetadataNode("tEXt");
        text.appendChild(entry("tEXtEntry", "keyword", "Title", "value", "Nitrate at Fernbrook weir, 2025"));
        text.appendChild(entry("tEXtEntry", "keyword", "Author", "value", "Quillwater field team"));
        root.appendChild(text);
        IIOMetadataNode itxt = new IIOMetadataNode("iTXt");
        itxt.appendChild(entry("iTXtEntry", "keyword", "Description", "compressionFlag", "FALSE", "compressionMethod", "0",
                "languageTag", "en", "translatedKeyword", "Beschreibung", "text", "Weekly means; µg/L ± 2σ"));
        itxt.appendChild(entry("iTXtEntry", "keyword", "Comment", "compressionFlag", "TRUE", "compressionMethod", "0",
                "languageTag", "", "translatedKeyword", "", "text", "Made by run r-2025-117 — «invented»"));
        root.appendChild(itxt);
        IIOMetadataNode ztxt = new IIOMetadataNode("zTXt");
        ztxt.appendChild(entry("zTXtEntry", "keyword", "Source", "compressionMethod", "deflate", "text", "gauge.parquet ".repeat(20).strip()));
        root.appendChild(ztxt);
        // The JDK's PNG metadata format spells the method as a number in iTXt and as "deflate" in zTXt.
        metadata.mergeTree(PNG_FORMAT, root);
        return write(writer, new IIOImage(image, null, metadata), param);
    }

    static byte[] write(BufferedImage image, String format) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        if (!ImageIO.write(image, format, out)) {
            throw new IllegalStateException("ImageIO has no writer for " + format);
        }
        return out.toByteArray();
    }

    static byte[] progressiveJpeg(BufferedImage image) throws IOException {
        ImageWriter writer = ImageIO.getImageWritersByFormatName("jpeg").next();
        ImageWriteParam param = writer.getDefaultWriteParam();
        param.setProgressiveMode(ImageWriteParam.MODE_DEFAULT);
        return write(writer, new IIOImage(image, null, null), param);
    }

    private static byte[] write(ImageWriter writer, IIOImage image, ImageWriteParam param) throws IOException {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (ImageOutputStream out = ImageIO.createImageOutputStream(bytes)) {
            writer.setOutput(out);
            writer.write(null, image, param);
        } finally {
            writer.dispose();
        }
        return bytes.toByteArray();
    }

    private static IIOMetadataNode entry(String name, String... attributes) {
        IIOMetadataNode node = new IIOMetadataNode(name);
        for (int i = 0; i < attributes.length; i += 2) {
            node.setAttribute(attributes[i], attributes[i + 1]);
        }
        return node;
    }

    /** The text entries ImageIO's own PNG reader finds: keyword to text, for tEXt, iTXt and zTXt. */
    static Map<String, String> textByImageIo(byte[] png) throws IOException {
        var reader = ImageIO.getImageReadersByFormatName("png").next();
        try (var in = ImageIO.createImageInputStream(new java.io.ByteArrayInputStream(png))) {
            reader.setInput(in);
            Node root = reader.getImageMetadata(0).getAsTree(PNG_FORMAT);
            Map<String, String> found = new LinkedHashMap<>();
            for (Node group = root.getFirstChild(); group != null; group = group.getNextSibling()) {
                for (Node e = group.getFirstChild(); e != null; e = e.getNextSibling()) {
                    var attrs = e.getAttributes();
                    switch (e.getNodeName()) {
                        case "tEXtEntry" -> found.put(attrs.getNamedItem("keyword").getNodeValue(), attrs.getNamedItem("value").getNodeValue());
                        case "iTXtEntry", "zTXtEntry" -> found.put(attrs.getNamedItem("keyword").getNodeValue(), attrs.getNamedItem("text").getNodeValue());
                        default -> { }
                    }
                }
            }
            return found;
        } finally {
            reader.dispose();
        }
    }

    /** A PNG chunk per PNG spec 5.3: length, type, data, and the CRC-32 of type and data (java.util.zip's CRC32). */
    static byte[] chunk(String type, byte[] data) {
        CRC32 crc = new CRC32();
        byte[] typeBytes = type.getBytes(StandardCharsets.US_ASCII);
        crc.update(typeBytes);
        crc.update(data);
        return ByteBuffer.allocate(12 + data.length).putInt(data.length).put(typeBytes).put(data)
                .putInt((int) crc.getValue()).array();
    }

    /** The bytes with {@code chunk} inserted just before the 12-byte IEND chunk at the end. */
    static byte[] beforeIend(byte[] png, byte[] chunk) {
        int iend = png.length - 12;
        byte[] out = Arrays.copyOf(png, png.length + chunk.length);
        System.arraycopy(chunk, 0, out, iend, chunk.length);
        System.arraycopy(png, iend, out, iend + chunk.length, 12);
        return out;
    }

    static byte[] latin1(String s) {
        return s.getBytes(StandardCharsets.ISO_8859_1);
    }
}
