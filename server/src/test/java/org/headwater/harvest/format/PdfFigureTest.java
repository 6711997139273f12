package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Calendar;
import java.util.GregorianCalendar;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Random;
import java.util.SimpleTimeZone;
import org.apache.pdfbox.cos.COSName;
import org.apache.pdfbox.cos.COSStream;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.pdmodel.PDDocumentInformation;
import org.apache.pdfbox.pdmodel.PDPage;
import org.apache.pdfbox.pdmodel.common.PDRectangle;
import org.apache.pdfbox.pdmodel.encryption.AccessPermission;
import org.apache.pdfbox.pdmodel.encryption.StandardProtectionPolicy;
import org.headwater.model.DatasetKind;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PdfFigureTest {
    private final FigureReader reader = new FigureReader();

    @TempDir
    Path dir;

    private static Sample whole(String name, byte[] bytes) {
        return new Sample(name, bytes, true, bytes.length);
    }

    private static Calendar at(int year, int month, int day, int hour, int minute, int offsetHours) {
        Calendar c = new GregorianCalendar(new SimpleTimeZone(offsetHours * 3_600_000, "test"));
        c.clear();
        c.set(year, month - 1, day, hour, minute, 0);
        return c;
    }

    /** A PDF written by PDFBox: A4 pages, the first one landscape by rotation, and every standard Info entry plus a custom one. */
    private static byte[] report(int pages, byte[] padding, String userPassword) throws Exception {
        try (PDDocument doc = new PDDocument()) {
            for (int i = 0; i < pages; i++) {
                PDPage page = new PDPage(i == 0 ? PDRectangle.A4 : PDRectangle.LETTER);
                if (i == 0) {
                    page.setRotation(90);
                }
                doc.addPage(page);
            }
            PDDocumentInformation info = doc.getDocumentInformation();
            info.setTitle("Fernbrook nitrate bulletin, spring 2026");
            info.setAuthor("Quillwater field team");
            info.setSubject("Weekly nitrate means");
            info.setKeywords("nitrate; weir; invented");
            info.setCreator("bulletin.py");
            info.setProducer("Apache PDFBox test");
            info.setCreationDate(at(2026, 1, 5, 9, 30, 1));
            info.setModificationDate(at(2026, 2, 1, 17, 0, 0));
            info.setCustomMetadataValue("HeadwaterRun", "run-0042");
            if (padding != null) {
                COSStream stream = doc.getDocument().createCOSStream();
                try (var out = stream.createRawOutputStream()) {
                    out.write(padding);
                }
                doc.getDocumentCatalog().getCOSObject().setItem(COSName.getPDFName("HeadwaterPadding"), stream);
            }
            if (userPassword != null) {
                StandardProtectionPolicy policy = new StandardProtectionPolicy("owner-secret", userPassword, new AccessPermission());
                policy.setEncryptionKeyLength(128);
                doc.protect(policy);
            }
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            doc.save(out);
            return out.toByteArray();
        }
    }

    @Test
    void pageCountPageSizeAndEveryInfoEntryAreRead() throws Exception {
        Reading r = reader.read(whole("bulletin.pdf", report(3, null, null)));
        assertThat(r.format()).isEqualTo("pdf");
        assertThat(r.kind()).isEqualTo(DatasetKind.FIGURE);
        // expected: what PDFBox was told to write; A4 as PDFBox's PDRectangle.A4 gives it in points.
        assertThat(r.details()).containsEntry("page_count", 3)
                .containsEntry("page_width_pt", Double.parseDouble(Float.toString(PDRectangle.A4.getWidth())))
                .containsEntry("page_height_pt", Double.parseDouble(Float.toString(PDRectangle.A4.getHeight())))
                .containsEntry("page_rotation", 90)
                .containsEntry("title", "Fernbrook nitrate bulletin, spring 2026");
        assertThat(r.details().get("page_width_pt")).isEqualTo(595.27563);
        // ISO 32000-1 table 317 keys; dates (7.9.4, "D:20260105093000+01'00'") shown in ISO 8601.
        Map<String, String> expected = new LinkedHashMap<>();
        expected.put("Title", "Fernbrook nitrate bulletin, spring 2026");
        expected.put("Author", "Quillwater field team");
        expected.put("Subject", "Weekly nitrate means");
        expected.put("Keywords", "nitrate; weir; invented");
        expected.put("Creator", "bulletin.py");
        expected.put("Producer", "Apache PDFBox test");
        expected.put("CreationDate", "2026-01-05T09:30:00+01:00");
        expected.put("ModDate", "2026-02-01T17:00:00Z");
        expected.put("HeadwaterRun", "run-0042");
        assertThat(r.details().get("info")).isEqualTo(expected);
    }

    @Test
    void theDemoWorkspaceFigureIsRead() throws Exception {
        Path file = Workspaces.demo().resolve("bulletin/figures/fig3_ion_balance.pdf");
        byte[] bytes = Files.readAllBytes(file);
        Reading r = reader.read(new Sample(file.getFileName().toString(), bytes, true, bytes.length));
        // expected: the file's own page tree, "/MediaBox [0 0 432 288]" on its single page.
        assertThat(r.details()).containsEntry("page_count", 1).containsEntry("page_width_pt", 432.0)
                .containsEntry("page_height_pt", 288.0).containsEntry("pdf_version", "1.4");
    }

    @Test
    void aLargePdfIsLoadedFromItsHeadAndTheRestThroughTheTailReader() throws Exception {
        byte[] padding = new byte[300 * 1024];
        new Random(3).nextBytes(padding);
        byte[] pdf = report(2, padding, null);
        Path file = Files.write(dir.resolve("big.pdf"), pdf);
        Sample sample = new Sample("big.pdf", Arrays.copyOf(pdf, 64 * 1024), false, pdf.length, new FileTailReader(file, pdf.length));
        assertThat(reader.read(sample).details()).containsEntry("page_count", 2);
        assertThatThrownBy(() -> reader.read(new Sample("big.pdf", Arrays.copyOf(pdf, 64 * 1024), false, pdf.length)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("Could not read the end of the PDF: The harvester gave no access to the end of the file")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("unreadable");
    }

    @Test
    void aPdfOverTheCapIsTooLarge() throws Exception {
        byte[] pdf = report(1, null, null);
        long claimed = PdfFigure.MAX_BYTES + 1L;
        // A file of the claimed size whose last bytes are the small PDF: its head and its end look like a PDF's.
        TailReader end = n -> {
            byte[] tail = new byte[n];
            int take = Math.min(n, pdf.length);
            System.arraycopy(pdf, pdf.length - take, tail, n - take, take);
            return tail;
        };
        Sample sample = new Sample("huge.pdf", Arrays.copyOf(pdf, 512), false, claimed, end);
        assertThatThrownBy(() -> reader.read(sample))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The PDF has " + claimed + " bytes; metadata is read from PDFs up to " + PdfFigure.MAX_BYTES + " bytes")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("too_large");
    }

    @Test
    void anEncryptedPdfSaysItNeedsAPassword() throws Exception {
        Reading r = reader.read(whole("locked.pdf", report(1, null, "user-secret")));
        assertThat(r.details()).isEqualTo(Map.of("encrypted", true, "password_required", true));
    }

    @Test
    void aPdfCutShortIsTruncated() throws Exception {
        byte[] pdf = report(3, null, null);
        assertThatThrownBy(() -> reader.read(whole("bulletin.pdf", Arrays.copyOf(pdf, pdf.length / 2))))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The PDF has no %%EOF marker near its end: it was cut short")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("truncated");
    }

    @Test
    void aDotPdfWithoutAPdfHeaderIsInvalid() {
        assertThatThrownBy(() -> reader.read(whole("bulletin.pdf", "<html>error page</html>\n%%EOF".getBytes())))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The file has no PDF header (%PDF-) in its first 1024 bytes");
    }

    @Test
    void aPdfWhoseBodyIsGarbageIsInvalid() throws Exception {
        byte[] garbage = ("%PDF-1.7\n" + "x".repeat(2000) + "\n%%EOF\n").getBytes();
        assertThatThrownBy(() -> reader.read(whole("junk.pdf", garbage)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("PDFBox cannot read the PDF: ")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void pdfBoxCanReadWhatItWrote() throws Exception {
        // The reference check for the test data itself: PDFBox reads back its own Info entries.
        try (PDDocument doc = org.apache.pdfbox.Loader.loadPDF(report(1, null, null))) {
            assertThat(doc.getDocumentInformation().getCustomMetadataValue("HeadwaterRun")).isEqualTo("run-0042");
        }
        assertThat(new ByteArrayInputStream(report(1, null, null)).readNBytes(5)).isEqualTo("%PDF-".getBytes());
    }
}
