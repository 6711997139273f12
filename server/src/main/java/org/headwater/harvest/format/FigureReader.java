package org.headwater.harvest.format;

import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.model.DatasetKind;

/**
 * Reads figures (PNG, JPEG, GIF, SVG, PDF): their size and the text they carry about themselves. The format
 * is decided by content ({@link ContentSniffer}); the extension is used when the content names none, so a
 * damaged {@code .png} is reported as a damaged PNG.
 */
public final class FigureReader implements FormatReader {
    private static final Map<String, String> EXTENSIONS = Map.of(
            "png", "png", "jpg", "jpeg", "jpeg", "jpeg", "gif", "gif", "svg", "svg", "pdf", "pdf");
    private static final Set<String> FORMATS = Set.of("png", "jpeg", "gif", "svg", "pdf");

    @Override
    public boolean accepts(Sample sample) {
        return bySignature(sample).isPresent() || EXTENSIONS.containsKey(sample.extension());
    }

    @Override
    public Reading read(Sample sample) throws UnreadableFileException {
        String format = bySignature(sample).orElse(EXTENSIONS.get(sample.extension()));
        if (format == null) {
            throw new UnreadableFileException("invalid", "The file is not a PNG, JPEG, GIF, SVG or PDF");
        }
        Map<String, Object> details = switch (format) {
            case "png" -> PngFigure.read(sample);
            case "jpeg" -> JpegFigure.read(sample);
            case "gif" -> GifFigure.read(sample);
            case "svg" -> SvgFigure.read(sample);
            default -> PdfFigure.read(sample);
        };
        return new Reading(format, DatasetKind.FIGURE, null, null, false, details);
    }

    /** The figure format the first bytes show: a binary signature, or XML whose root element is svg. */
    private static Optional<String> bySignature(Sample sample) {
        Optional<String> signed = ContentSniffer.signature(sample.head()).filter(FORMATS::contains);
        if (signed.isPresent() || ContentSniffer.signature(sample.head()).isPresent()) {
            return signed;
        }
        if (!startsLikeMarkup(sample.head()) || TextDecoding.looksBinary(sample.head())) {
            return Optional.empty();
        }
        boolean svg = XmlProlog.root(TextDecoding.decode(sample.head(), sample.complete()).text()).svg();
        return svg ? Optional.of("svg") : Optional.empty();
    }

    /** Cheap pre-check before decoding: after white space (and a UTF-8 BOM) comes '<', or a UTF-16 BOM starts the file. */
    private static boolean startsLikeMarkup(byte[] head) {
        if (ContentSniffer.startsWith(head, 0xFF, 0xFE) || ContentSniffer.startsWith(head, 0xFE, 0xFF)) {
            return true;
        }
        int i = ContentSniffer.startsWith(head, 0xEF, 0xBB, 0xBF) ? 3 : 0;
        while (i < head.length && (head[i] == ' ' || head[i] == '\t' || head[i] == '\n' || head[i] == '\r')) {
            i++;
        }
        return i < head.length && head[i] == '<';
    }
}
