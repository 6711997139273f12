package org.headwater.harvest.format;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.headwater.harvest.format.csv.ColumnProfile;
import org.headwater.harvest.format.csv.ColumnStats;
import org.headwater.harvest.format.csv.CsvSniff;
import org.headwater.harvest.format.csv.CsvSniffer;
import org.headwater.harvest.format.csv.LogicalType;
import org.headwater.harvest.format.csv.NotDelimitedTextException;
import org.headwater.harvest.format.csv.ShapeMemory;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;

/**
 * Reads CSV-family files through {@link CsvSniffer}: encoding, dialect, header, preamble and footer,
 * separators, column types and statistics, row count. Files named as tables are always read as such;
 * {@code .txt} and {@code .dat} files only when the sniffer finds a consistent table in them.
 */
public final class DelimitedTextReader implements FormatReader {
    private static final Set<String> EXTENSIONS = Set.of("csv", "tsv", "tab", "psv");
    /** Endings that are sometimes tables and sometimes prose: accepted only when a table is found. */
    private static final Set<String> MAYBE_EXTENSIONS = Set.of("txt", "dat");
    /** Types whose minimum and maximum say nothing about a person; text extremes could be names. */
    private static final Set<LogicalType> SAFE_EXTREMES =
            Set.of(LogicalType.INTEGER, LogicalType.DECIMAL, LogicalType.DATE, LogicalType.TIMESTAMP, LogicalType.BOOLEAN);

    private final CsvSniffer sniffer = new CsvSniffer();
    private final ShapeMemory memory;
    private final boolean values;

    /** A reader that sniffs every file in full. */
    public DelimitedTextReader() {
        this(ShapeMemory.NONE, true);
    }

    /**
     * A reader that reuses the shapes of earlier files of {@code memory} where they fit; without
     * {@code values} it leaves out each column's minimum and maximum (cell values) instead of working them
     * out for the harvest to strip.
     */
    public DelimitedTextReader(ShapeMemory memory, boolean values) {
        this.memory = memory;
        this.values = values;
    }

    @Override
    public boolean accepts(Sample sample) {
        if (EXTENSIONS.contains(sample.extension())) {
            return true;
        }
        if (!MAYBE_EXTENSIONS.contains(sample.extension())) {
            return false;
        }
        try {
            return looksLikeTable(sniffer.sniff(sample.head(), sample.complete(), sample.size()));
        } catch (NotDelimitedTextException e) {
            return false;
        }
    }

    /**
     * Whether a file not named as a table really is one. Prose with commas also splits into "columns", so
     * the bar is higher than for a {@code .csv}: several columns, no footer, and either a header or at least
     * one column that is not text, or a delimiter that prose does not use. Preamble lines are allowed
     * (exported tables often carry a title); a header-less table of text only split at commas or spaces is
     * left as text, since prose looks the same; split at tabs, bars, carets or tildes into a steady width
     * (the sniffer refuses an unsteady one) it is a table. (our rule)
     */
    static boolean looksLikeTable(CsvSniff sniff) {
        boolean typed = sniff.columns().stream().anyMatch(c -> c.type() != LogicalType.TEXT);
        boolean tableDelimiter = PROSE_FREE_DELIMITERS.indexOf(sniff.dialect().delimiter()) >= 0;
        return sniff.columns().size() > 1 && sniff.footerLines() == 0
                && (sniff.header() || typed || tableDelimiter && sniff.rowCount() > 1);
    }

    /** Delimiters that running text hardly ever holds (common practice, no source). */
    private static final String PROSE_FREE_DELIMITERS = "\t|^~";

    @Override
    public Reading read(Sample sample) throws UnreadableFileException {
        return read(sample, Detail.FULL);
    }

    @Override
    public Reading read(Sample sample, Detail detail) throws UnreadableFileException {
        ColumnStats wanted = detail == Detail.SCHEMA ? ColumnStats.TYPES_AND_NULLS
                : values ? ColumnStats.ALL : ColumnStats.NO_VALUES;
        CsvSniff sniff;
        try {
            sniff = sniffer.sniff(sample.head(), sample.complete(), sample.size(), memory, wanted);
        } catch (NotDelimitedTextException e) {
            throw new UnreadableFileException(kind(e), e.getMessage());
        }
        List<ColumnDef> columns = new ArrayList<>();
        List<Map<String, Object>> stats = new ArrayList<>();
        for (ColumnProfile c : sniff.columns()) {
            columns.add(new ColumnDef(c.name(), word(c.type()), c.nullable()));
            Map<String, Object> stat = new LinkedHashMap<>();
            stat.put("name", c.name());
            stat.put("null_count", c.nullCount());
            if (c.distinctEstimate() >= 0) {
                stat.put("distinct_estimate", c.distinctEstimate());
            }
            if (c.datePattern() != null) {
                stat.put("date_pattern", c.datePattern());
            }
            // Value sampling is off by default: the extremes of a text column are cell values (often names).
            if (wanted == ColumnStats.ALL && SAFE_EXTREMES.contains(c.type())) {
                stat.put("min", c.min());
                stat.put("max", c.max());
            }
            stats.add(stat);
        }
        return new Reading("csv", DatasetKind.FILE, columns, sniff.rowCount(), sniff.rowCountExact(), details(sniff, stats));
    }

    /** The detection facts under the keys of {@code headwater sniff --json}. */
    static Map<String, Object> details(CsvSniff sniff, List<Map<String, Object>> stats) {
        Map<String, Object> d = new LinkedHashMap<>();
        d.put("encoding", sniff.encodingName());
        d.put("bom", sniff.bom());
        d.put("delimiter", String.valueOf(sniff.dialect().delimiter()));
        d.put("quote", sniff.dialect().quote() == null ? null : String.valueOf(sniff.dialect().quote()));
        d.put("escape", sniff.dialect().escape().name().toLowerCase(Locale.ROOT));
        d.put("line_terminator", sniff.lineTerminator().name().toLowerCase(Locale.ROOT));
        d.put("header", sniff.header());
        d.put("skip_lines", sniff.skipLines());
        d.put("footer_lines", sniff.footerLines());
        d.put("decimal_separator", String.valueOf(sniff.decimalSeparator()));
        d.put("thousands_separator", sniff.thousandsSeparator() == null ? null : String.valueOf(sniff.thousandsSeparator()));
        d.put("profiled_rows", sniff.profiledRows());
        d.put("column_stats", stats);
        if (!sniff.warnings().isEmpty()) {
            d.put("warnings", sniff.warnings());
        }
        return d;
    }

    static String word(LogicalType type) {
        return type.name().toLowerCase(Locale.ROOT);
    }

    private static String kind(NotDelimitedTextException e) {
        return switch (e.reason()) {
            case BINARY -> "binary";
            case EMPTY -> "empty";
            case NOT_TABULAR -> "not_tabular";
            default -> "invalid";
        };
    }
}
