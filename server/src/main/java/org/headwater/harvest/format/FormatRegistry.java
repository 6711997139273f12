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
        return with(ShapeMemory.NONE, true);
    }

    /**
     * The readers of one harvest: as {@link #standard()}, but a CSV whose first line and make-up match a file
     * already read in this harvest (a sibling partition) is read with that file's dialect and header, once the
     * parse confirms they fit (see {@link ShapeMemory}). Without {@code values} (sampling off) no column's
     * minimum or maximum is worked out. Use a new registry per harvest.
     */
    public static FormatRegistry forHarvest(boolean values) {
        return with(ShapeMemory.forOneHarvest(), values);
    }

    private static FormatRegistry with(ShapeMemory memory, boolean values) {
        // Readers that recognise content by its signature come first, so a ".csv" holding a PNG or a
        // Parquet file goes to the reader of what it holds; JSON comes before delimited text because NDJSON
        // lines, full of commas, would otherwise pass for a table.
        return new FormatRegistry(List.of(new ParquetReader(), new FigureReader(), new JsonRecordsReader(),
                new DelimitedTextReader(memory, values)));
    }

    /** Reads the sample with the first reader that accepts it. */
    public Reading read(Sample sample) throws UnreadableFileException {
        return read(sample, FormatReader.Detail.FULL);
    }

    /** Reads the sample with the first reader that accepts it, to the given detail. */
    public Reading read(Sample sample, FormatReader.Detail detail) throws UnreadableFileException {
        for (FormatReader reader : readers) {
            if (reader.accepts(sample)) {
                return reader.read(sample, detail);
            }
        }
        String format = sample.extension().isEmpty() ? "unknown" : sample.extension();
        return Reading.opaque(format, DatasetKind.OTHER);
    }
}
