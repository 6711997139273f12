package org.headwater.harvest.format;

import java.util.List;
import org.headwater.harvest.format.csv.ShapeMemory;
import org.headwater.model.DatasetKind;

/** The readers the harvester tries, in order; a file no reader accepts is recorded as an opaque dataset. */
public final class FormatRegistry {
    private final List<FormatReader> readers;

    public FormatRegistry(List<FormatReader> readers) {
        this.readers = List.copyOf(readers);
    }

    /** The readers that ship with Headwater; each file is read on its own, as {@code headwater sniff} reads it. */
    public static FormatRegistry standard() {
        return withCsvMemory(ShapeMemory.NONE);
    }

    /**
     * The readers of one harvest: as {@link #standard()}, but a CSV whose first line and make-up match a file
     * already read in this harvest (a sibling partition) is read with that file's dialect and header, once the
     * parse confirms they fit (see {@link ShapeMemory}). Use a new registry per harvest.
     */
    public static FormatRegistry forHarvest() {
        return withCsvMemory(ShapeMemory.forOneHarvest());
    }

    private static FormatRegistry withCsvMemory(ShapeMemory memory) {
        // Readers that recognise content by its signature come first, so a ".csv" holding a PNG or a
        // Parquet file goes to the reader of what it holds; JSON comes before delimited text because NDJSON
        // lines, full of commas, would otherwise pass for a table.
        return new FormatRegistry(List.of(new ParquetReader(), new FigureReader(), new JsonRecordsReader(),
                new DelimitedTextReader(memory)));
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
