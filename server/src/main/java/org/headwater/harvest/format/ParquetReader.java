package org.headwater.harvest.format;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import org.apache.parquet.format.ColumnChunk;
import org.apache.parquet.format.FileMetaData;
import org.apache.parquet.format.KeyValue;
import org.apache.parquet.format.RowGroup;
import org.apache.parquet.format.Util;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;

/**
 * Reads a Parquet file's footer: its schema, exact row count, row groups, compression codecs and writer.
 * The footer is at the end of the file, so this reader asks the sample for the file's tail. Decoding the
 * footer's Thrift structure is left to Apache Parquet's own {@code parquet-format-structures}; the schema
 * tree is rebuilt by {@link ParquetSchema}.
 */
public final class ParquetReader implements FormatReader {
    // Apache Parquet format spec, "File Format": 4-byte magic "PAR1", data, FileMetaData, 4-byte
    // little-endian footer length, "PAR1". So the smallest possible file is 12 bytes plus its footer.
    private static final int MAGIC_LENGTH = 4;
    private static final int TRAILER_LENGTH = 8;
    /** Footers past this size are refused, not read: 16 MiB holds the schema of tens of thousands of columns. */
    static final int MAX_FOOTER_BYTES = 16 * 1024 * 1024;
    private static final int MAX_METADATA_KEYS = 64;

    @Override
    public boolean accepts(Sample sample) {
        return sample.extension().equals("parquet")
                || ContentSniffer.signature(sample.head()).filter("parquet"::equals).isPresent();
    }

    @Override
    public Reading read(Sample sample) throws UnreadableFileException {
        byte[] head = sample.head();
        if (sample.size() < 2 * MAGIC_LENGTH + 4) {
            throw new UnreadableFileException("truncated", "A Parquet file has at least 12 bytes; this one has " + sample.size());
        }
        if (ContentSniffer.startsWith(head, 'P', 'A', 'R', 'E')) {
            return encrypted();
        }
        if (!ContentSniffer.startsWith(head, 'P', 'A', 'R', '1')) {
            throw new UnreadableFileException("invalid", "The file does not start with the Parquet magic PAR1");
        }
        byte[] trailer = tail(sample, TRAILER_LENGTH);
        if (!ContentSniffer.startsWith(java.util.Arrays.copyOfRange(trailer, 4, 8), 'P', 'A', 'R', '1')) {
            throw new UnreadableFileException("truncated",
                    "The file does not end with PAR1: it was cut short or is still being written");
        }
        int footerLength = ByteBuffer.wrap(trailer, 0, 4).order(ByteOrder.LITTLE_ENDIAN).getInt();
        long room = sample.size() - MAGIC_LENGTH - TRAILER_LENGTH;
        if (footerLength <= 0 || footerLength > room) {
            throw new UnreadableFileException("invalid", "The footer length " + Integer.toUnsignedString(footerLength)
                    + " does not fit in a file of " + sample.size() + " bytes");
        }
        if (footerLength > MAX_FOOTER_BYTES) {
            throw new UnreadableFileException("too_large", "The Parquet footer has " + footerLength
                    + " bytes; footers up to " + MAX_FOOTER_BYTES + " are read");
        }
        byte[] footer = tail(sample, footerLength + TRAILER_LENGTH);
        FileMetaData meta = decode(footer, footerLength);
        if (meta.getNum_rows() < 0) {
            throw new UnreadableFileException("invalid", "The Parquet footer gives a negative row count " + meta.getNum_rows());
        }
        List<ParquetSchema.Column> columns = ParquetSchema.columns(meta.getSchema());
        return reading(meta, columns, footerLength);
    }

    private static byte[] tail(Sample sample, int n) throws UnreadableFileException {
        try {
            return sample.readTail(n);
        } catch (IOException e) {
            throw new UnreadableFileException("unreadable", "Could not read the Parquet footer at the end of the file: "
                    + e.getMessage());
        }
    }

    private static FileMetaData decode(byte[] footer, int footerLength) throws UnreadableFileException {
        try {
            // The message-size limit makes Thrift refuse lengths and counts that the footer's bytes cannot
            // hold, instead of allocating for them.
            return Util.readFileMetaData(new ByteArrayInputStream(footer, 0, footerLength), footerLength);
        } catch (IOException | RuntimeException e) {
            throw new UnreadableFileException("invalid", "The Parquet footer cannot be decoded: " + e.getMessage());
        }
    }

    private static Reading reading(FileMetaData meta, List<ParquetSchema.Column> columns, int footerLength) {
        List<ColumnDef> defs = new ArrayList<>(columns.size());
        List<Map<String, Object>> described = new ArrayList<>(columns.size());
        for (ParquetSchema.Column c : columns) {
            defs.add(new ColumnDef(c.name(), c.type(), c.nullable()));
            Map<String, Object> d = new LinkedHashMap<>();
            d.put("name", c.name());
            d.put("parquet_path", c.parquetPath());
            d.put("physical_type", c.physicalType());
            if (c.logicalType() != null) {
                d.put("logical_type", c.logicalType());
            }
            d.put("repetition", c.repetition());
            described.add(d);
        }
        TreeSet<String> codecs = new TreeSet<>();
        if (meta.getRow_groups() != null) {
            for (RowGroup group : meta.getRow_groups()) {
                if (group.getColumns() == null) {
                    continue;
                }
                for (ColumnChunk chunk : group.getColumns()) {
                    if (chunk.getMeta_data() != null && chunk.getMeta_data().getCodec() != null) {
                        codecs.add(chunk.getMeta_data().getCodec().name());
                    }
                }
            }
        }
        Map<String, Object> details = new LinkedHashMap<>();
        details.put("format_version", meta.getVersion());
        if (meta.getCreated_by() != null) {
            details.put("created_by", meta.getCreated_by());
        }
        details.put("row_groups", meta.getRow_groupsSize());
        details.put("compression", List.copyOf(codecs));
        details.put("footer_bytes", footerLength);
        details.put("columns", described);
        if (meta.getKey_value_metadataSize() > 0) {
            // Only the keys: writers store whole schemas (Avro, Arrow, Spark) in the values.
            List<String> keys = new ArrayList<>();
            for (KeyValue kv : meta.getKey_value_metadata()) {
                if (keys.size() < MAX_METADATA_KEYS && kv.getKey() != null) {
                    keys.add(kv.getKey());
                }
            }
            details.put("metadata_keys", keys);
        }
        return new Reading("parquet", DatasetKind.FILE, defs, meta.getNum_rows(), true, details);
    }

    /** Parquet modular encryption (parquet-format Encryption.md): an encrypted footer cannot be read without keys. */
    private static Reading encrypted() {
        return new Reading("parquet", DatasetKind.FILE, null, null, false, Map.of("encrypted_footer", true));
    }
}
