package org.headwater.harvest.format;

import java.util.List;
import org.headwater.model.DatasetKind;

/** The readers the harvester tries, in order; a file no reader accepts is recorded as an opaque dataset. */
public final class FormatRegistry {
    private final List<FormatReader> readers;

    public FormatRegistry(List<FormatReader> readers) {
        this.readers = List.copyOf(readers);
    }

    /** The readers that ship with Headwater. */
    public static FormatRegistry standard() {
        // Readers that recognise content by its signature come first, so a ".csv" holding a PNG or a
        // Parquet file goes to the reader of what it holds; JSON comes before delimited text because NDJSON
        // lines, full of commas, would otherwise pass for a table.
        return new FormatRegistry(List.of(new ParquetReader(), new FigureReader(), new JsonRecordsReader(),
                new DelimitedTextReader()));
    }

    /** Reads the sample with the first reader that accepts it. */
    public Reading read(Sample sample) throws UnreadableFileException {
        for (FormatReader reader : readers) {
            if (reader.accepts(sample)) {
                return reader.read(sample);
            }
        }
        String format = sample.extension().isEmpty() ? "unknown" : sample.extension();
        return Reading.opaque(format, DatasetKind.OTHER);
    }
}
