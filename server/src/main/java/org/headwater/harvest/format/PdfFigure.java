package org.headwater.harvest.format;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.OffsetDateTime;
import java.time.format.DateTimeFormatter;
import java.util.Calendar;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.cos.COSBase;
import org.apache.pdfbox.cos.COSBoolean;
import org.apache.pdfbox.cos.COSDictionary;
import org.apache.pdfbox.cos.COSName;
import org.apache.pdfbox.cos.COSNumber;
import org.apache.pdfbox.cos.COSString;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.pdmodel.PDPage;
import org.apache.pdfbox.pdmodel.common.PDRectangle;
import org.apache.pdfbox.pdmodel.encryption.InvalidPasswordException;
import org.apache.pdfbox.util.DateConverter;

/**
 * Reads a PDF's page count, first page size and document information dictionary (ISO 32000-1 section
 * 14.3.3) with Apache PDFBox: PDF objects can sit anywhere in the file, behind cross-reference tables,
 * object streams and encryption, which a well-kept parser handles and a hand-written one would not.
 */
final class PdfFigure {
    /** PDFs up to this size are loaded whole (from the sample, or its head and the rest through the tail reader). */
    static final int MAX_BYTES = 32 * 1024 * 1024;
    // common practice, no source: readers look for "%%EOF" (ISO 32000-1 7.5.5) within the last KiB, since
    // writers and transfers leave trailing bytes after it.
    private static final int EOF_WINDOW = 1024;
    // ISO 32000-1 table 317: the entries whose values are dates (section 7.9.4).
    private static final Set<String> DATE_KEYS = Set.of("CreationDate", "ModDate");

    private PdfFigure() {
    }

    static Map<String, Object> read(Sample sample) throws UnreadableFileException {
        byte[] head = sample.head();
        if (indexOf(head, "%PDF-", EOF_WINDOW) < 0) {
            throw new UnreadableFileException("invalid", "The file has no PDF header (%PDF-) in its first 1024 bytes");
        }
        byte[] end;
        try {
            end = sample.readTail(EOF_WINDOW);
        } catch (IOException e) {
            throw new UnreadableFileException("unreadable", "Could not read the end of the PDF: " + e.getMessage());
        }
        if (indexOf(end, "%%EOF", end.length) < 0) {
            throw new UnreadableFileException("truncated", "The PDF has no %%EOF marker near its end: it was cut short");
        }
        Optional<byte[]> whole = Figures.whole(sample, MAX_BYTES);
        if (whole.isEmpty()) {
            throw new UnreadableFileException("too_large", "The PDF has " + sample.size() + " bytes; metadata is read from PDFs up to "
                    + MAX_BYTES + " bytes");
        }
        try (PDDocument doc = Loader.loadPDF(whole.get())) {
            return details(doc);
        } catch (InvalidPasswordException e) {
            Map<String, Object> out = new LinkedHashMap<>();
            out.put("encrypted", true);
            out.put("password_required", true);
            return out;
        } catch (IOException | RuntimeException e) {
            // PDFBox's lenient parser repairs what it can; what it cannot repair throws, IOException or not.
            throw new UnreadableFileException("invalid", "PDFBox cannot read the PDF: " + e.getMessage());
        }
    }

    private static Map<String, Object> details(PDDocument doc) {
        Map<String, Object> out = new LinkedHashMap<>();
        out.put("pdf_version", Float.toString(doc.getVersion()));
        out.put("page_count", doc.getNumberOfPages());
        if (doc.getNumberOfPages() > 0) {
            PDPage first = doc.getPage(0);
            // ISO 32000-1 14.11.2: the media box is the page's physical size, in default user space units
            // of 1/72 inch (8.3.2.3).
            PDRectangle box = first.getMediaBox();
            out.put("page_width_pt", points(box.getWidth()));
            out.put("page_height_pt", points(box.getHeight()));
            if (first.getRotation() != 0) {
                out.put("page_rotation", first.getRotation());
            }
        }
        if (doc.isEncrypted()) {
            out.put("encrypted", true);
        }
        TextEntries info = info(doc.getDocumentInformation().getCOSObject());
        String title = info.get("Title");
        if (title != null && !title.isBlank()) {
            out.put("title", title);
        }
        out.put("info", info.asMap());
        if (info.truncated()) {
            out.put("info_truncated", true);
        }
        return out;
    }

    /** Every Info entry with a string, name, number or boolean value, custom keys included; dates in ISO 8601. */
    private static TextEntries info(COSDictionary dict) {
        TextEntries info = new TextEntries();
        for (Map.Entry<COSName, COSBase> e : dict.entrySet()) {
            String key = e.getKey().getName();
            COSBase value = dict.getDictionaryObject(e.getKey());
            String text = null;
            if (value instanceof COSString s) {
                text = DATE_KEYS.contains(key) ? date(s) : s.getString();
            } else if (value instanceof COSName n) {
                text = n.getName();
            } else if (value instanceof COSNumber || value instanceof COSBoolean) {
                text = value.toString();
            }
            if (text != null) {
                info.put(key, text);
            }
        }
        return info;
    }

    /** ISO 32000-1 7.9.4 dates ("D:20260105093000+01'00'") as ISO 8601; the raw string when it does not parse. */
    private static String date(COSString s) {
        Calendar c = DateConverter.toCalendar(s);
        if (c == null) {
            return s.getString();
        }
        return OffsetDateTime.ofInstant(c.toInstant(), c.getTimeZone().toZoneId()).format(DateTimeFormatter.ISO_OFFSET_DATE_TIME);
    }

    /** The float as PDFBox holds it, without the binary noise of widening it to double. */
    private static double points(float f) {
        return Double.parseDouble(Float.toString(f));
    }

    private static int indexOf(byte[] bytes, String needle, int window) {
        byte[] n = needle.getBytes(StandardCharsets.US_ASCII);
        int end = Math.min(bytes.length, window) - n.length;
        for (int i = 0; i <= end; i++) {
            if (java.util.Arrays.equals(bytes, i, i + n.length, n, 0, n.length)) {
                return i;
            }
        }
        return -1;
    }
}
