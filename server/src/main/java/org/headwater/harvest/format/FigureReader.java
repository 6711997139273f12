package org.headwater.harvest.format;

import java.util.Map;
import org.headwater.model.DatasetKind;

/** Recognises figures (PNG, JPEG, GIF, SVG, PDF); their embedded metadata is read by a later reader. */
public final class FigureReader implements FormatReader {
    private static final Map<String, String> FORMATS = Map.of(
            "png", "png", "jpg", "jpeg", "jpeg", "jpeg", "gif", "gif", "svg", "svg", "pdf", "pdf");

    @Override
    public boolean accepts(Sample sample) {
        return FORMATS.containsKey(sample.extension());
    }

    @Override
    public Reading read(Sample sample) {
        return Reading.opaque(FORMATS.get(sample.extension()), DatasetKind.FIGURE);
    }
}
