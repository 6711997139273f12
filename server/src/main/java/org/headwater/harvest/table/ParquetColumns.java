package org.headwater.harvest.table;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.zip.GZIPInputStream;
import org.apache.parquet.format.ColumnChunk;
import org.apache.parquet.format.ColumnMetaData;
import org.apache.parquet.format.CompressionCodec;
import org.apache.parquet.format.DataPageHeader;
import org.apache.parquet.format.DataPageHeaderV2;
import org.apache.parquet.format.Encoding;
import org.apache.parquet.format.FieldRepetitionType;
import org.apache.parquet.format.FileMetaData;
import org.apache.parquet.format.PageHeader;
import org.apache.parquet.format.RowGroup;
import org.apache.parquet.format.SchemaElement;
import org.apache.parquet.format.Type;
import org.apache.parquet.format.Util;
import org.xerial.snappy.Snappy;

/**
 * The values of a few leaf columns of a small Parquet file held in memory, as the Apache Parquet format
 * specification lays them out: the footer ("File Format", parquet.thrift {@code FileMetaData}), column chunks
 * of pages ({@code PageHeader}: dictionary, data page v1 and v2), repetition and definition levels in the
 * RLE/bit-packing hybrid ("Encodings": RLE = 3), values PLAIN, dictionary-encoded (PLAIN_DICTIONARY,
 * RLE_DICTIONARY) or delta-encoded (DELTA_BINARY_PACKED, DELTA_LENGTH_BYTE_ARRAY, DELTA_BYTE_ARRAY). Codecs: uncompressed, Snappy and gzip. Only the physical types a Delta checkpoint's
 * actions need are decoded: BYTE_ARRAY (as UTF-8 text), INT32, INT64 and BOOLEAN.
 *
 * <p>parquet-hadoop would do all this, but it needs Hadoop at run time; the server ships without it.
 */
final class ParquetColumns {
    private static final byte[] MAGIC = "PAR1".getBytes(StandardCharsets.US_ASCII);

    /**
     * One leaf column's entries in row order (several per row for repeated fields).
     *
     * @param levels each entry's definition level
     * @param values each entry's value, null where the entry's definition level is below {@code maxDefinition}
     */
    record Column(String path, int maxDefinition, List<Integer> levels, List<Object> values) {
    }

    private record Leaf(String path, Type type, int maxDefinition, int maxRepetition) {
    }

    private ParquetColumns() {
    }

    /** Reads the named leaf columns ({@code add.path}); a name the file does not have gives no column. */
    static Map<String, Column> read(byte[] file, Set<String> wanted) throws UnreadableTableException {
        FileMetaData meta = footer(file);
        Map<String, Leaf> leaves = leaves(meta.getSchema());
        Map<String, Column> out = new HashMap<>();
        for (RowGroup group : meta.getRow_groups()) {
            for (ColumnChunk chunk : group.getColumns()) {
                ColumnMetaData cm = chunk.getMeta_data();
                String path = String.join(".", cm.getPath_in_schema());
                Leaf leaf = leaves.get(path);
                if (leaf == null || !wanted.contains(path)) {
                    continue;
                }
                Column column = out.computeIfAbsent(path, p -> new Column(p, leaf.maxDefinition(), new ArrayList<>(),
                        new ArrayList<>()));
                try {
                    chunk(file, cm, leaf, column);
                } catch (IOException | RuntimeException e) {
                    throw new UnreadableTableException("Column " + path + " of the checkpoint cannot be decoded: "
                            + e.getMessage(), e);
                }
            }
        }
        return out;
    }

    private static FileMetaData footer(byte[] file) throws UnreadableTableException {
        int n = file.length;
        if (n < 12 || !startsWith(file, 0) || !startsWith(file, n - 4)) {
            throw new UnreadableTableException("The checkpoint is not a Parquet file (no PAR1 magic at both ends)");
        }
        int length = ByteBuffer.wrap(file, n - 8, 4).order(ByteOrder.LITTLE_ENDIAN).getInt();
        if (length <= 0 || length > n - 12) {
            throw new UnreadableTableException("The checkpoint's Parquet footer length " + length + " does not fit");
        }
        try {
            return Util.readFileMetaData(new ByteArrayInputStream(file, n - 8 - length, length), length);
        } catch (IOException | RuntimeException e) {
            throw new UnreadableTableException("The checkpoint's Parquet footer cannot be decoded: " + e.getMessage(), e);
        }
    }

    private static boolean startsWith(byte[] file, int at) {
        for (int i = 0; i < MAGIC.length; i++) {
            if (file[at + i] != MAGIC[i]) {
                return false;
            }
        }
        return true;
    }

    /** parquet.thrift {@code FileMetaData.schema}: depth-first, each group saying how many children follow. */
    private static Map<String, Leaf> leaves(List<SchemaElement> schema) {
        Map<String, Leaf> out = new HashMap<>();
        walk(schema, new int[] {1}, schema.get(0).getNum_children(), "", 0, 0, out);
        return out;
    }

    private static void walk(List<SchemaElement> schema, int[] next, int children, String prefix, int def, int rep,
            Map<String, Leaf> out) {
        for (int i = 0; i < children; i++) {
            SchemaElement e = schema.get(next[0]++);
            int d = def + (e.getRepetition_type() == FieldRepetitionType.REQUIRED ? 0 : 1);
            int r = rep + (e.getRepetition_type() == FieldRepetitionType.REPEATED ? 1 : 0);
            String path = prefix.isEmpty() ? e.getName() : prefix + "." + e.getName();
            if (e.isSetNum_children() && e.getNum_children() > 0) {
                walk(schema, next, e.getNum_children(), path, d, r, out);
            } else {
                out.put(path, new Leaf(path, e.getType(), d, r));
            }
        }
    }

    private static void chunk(byte[] file, ColumnMetaData cm, Leaf leaf, Column column) throws IOException {
        long start = cm.isSetDictionary_page_offset() && cm.getDictionary_page_offset() > 0
                ? Math.min(cm.getDictionary_page_offset(), cm.getData_page_offset()) : cm.getData_page_offset();
        InputStream in = new ByteArrayInputStream(file, (int) start, (int) cm.getTotal_compressed_size());
        long valuesLeft = cm.getNum_values();
        List<Object> dictionary = null;
        while (valuesLeft > 0) {
            PageHeader header = Util.readPageHeader(in);
            byte[] raw = in.readNBytes(header.getCompressed_page_size());
            switch (header.getType()) {
                case DICTIONARY_PAGE -> {
                    byte[] page = decompress(cm.getCodec(), raw, header.getUncompressed_page_size());
                    dictionary = plain(ByteBuffer.wrap(page).order(ByteOrder.LITTLE_ENDIAN), leaf.type(),
                            header.getDictionary_page_header().getNum_values());
                }
                case DATA_PAGE -> {
                    DataPageHeader h = header.getData_page_header();
                    ByteBuffer page = ByteBuffer.wrap(decompress(cm.getCodec(), raw, header.getUncompressed_page_size()))
                            .order(ByteOrder.LITTLE_ENDIAN);
                    int count = h.getNum_values();
                    if (leaf.maxRepetition() > 0) {
                        skip(page, page.getInt());
                    }
                    int[] levels = leaf.maxDefinition() > 0 ? hybrid(slice(page, page.getInt()),
                            bitWidth(leaf.maxDefinition()), count) : new int[count];
                    values(page, h.getEncoding(), leaf, levels, dictionary, column);
                    valuesLeft -= count;
                }
                case DATA_PAGE_V2 -> {
                    DataPageHeaderV2 h = header.getData_page_header_v2();
                    ByteBuffer page = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
                    int count = h.getNum_values();
                    skip(page, h.getRepetition_levels_byte_length());
                    ByteBuffer defs = slice(page, h.getDefinition_levels_byte_length());
                    int[] levels = leaf.maxDefinition() > 0 ? hybrid(defs, bitWidth(leaf.maxDefinition()), count)
                            : new int[count];
                    byte[] rest = new byte[page.remaining()];
                    page.get(rest);
                    int restSize = header.getUncompressed_page_size() - h.getRepetition_levels_byte_length()
                            - h.getDefinition_levels_byte_length();
                    byte[] body = h.isIs_compressed() ? decompress(cm.getCodec(), rest, restSize) : rest;
                    values(ByteBuffer.wrap(body).order(ByteOrder.LITTLE_ENDIAN), h.getEncoding(), leaf, levels, dictionary,
                            column);
                    valuesLeft -= count;
                }
                default -> {
                    // Index pages carry no values.
                }
            }
        }
    }

    private static void values(ByteBuffer page, Encoding encoding, Leaf leaf, int[] levels, List<Object> dictionary,
            Column column) throws IOException {
        int present = 0;
        for (int level : levels) {
            if (level == leaf.maxDefinition()) {
                present++;
            }
        }
        List<Object> decoded;
        if (encoding == Encoding.PLAIN) {
            decoded = plain(page, leaf.type(), present);
        } else if (encoding == Encoding.PLAIN_DICTIONARY || encoding == Encoding.RLE_DICTIONARY) {
            if (dictionary == null) {
                throw new IOException("a dictionary-encoded page comes without a dictionary");
            }
            decoded = new ArrayList<>(present);
            if (present > 0) {
                int width = page.get() & 0xff;
                for (int index : hybrid(page, width, present)) {
                    decoded.add(dictionary.get(index));
                }
            }
        } else if (encoding == Encoding.DELTA_BINARY_PACKED && (leaf.type() == Type.INT64 || leaf.type() == Type.INT32)) {
            decoded = new ArrayList<>(present);
            for (long v : deltaBinaryPacked(page)) {
                decoded.add(leaf.type() == Type.INT64 ? (Object) v : (Object) (int) v);
            }
        } else if (encoding == Encoding.DELTA_LENGTH_BYTE_ARRAY && leaf.type() == Type.BYTE_ARRAY) {
            decoded = new ArrayList<>(deltaLengthByteArray(page));
        } else if (encoding == Encoding.DELTA_BYTE_ARRAY && leaf.type() == Type.BYTE_ARRAY) {
            decoded = new ArrayList<>(deltaByteArray(page));
        } else {
            throw new IOException("values encoded as " + encoding + " are not read");
        }
        int next = 0;
        for (int level : levels) {
            column.levels().add(level);
            column.values().add(level == leaf.maxDefinition() ? decoded.get(next++) : null);
        }
    }

    /** "Encodings", Plain: lengths and numbers little-endian, booleans bit-packed. */
    private static List<Object> plain(ByteBuffer page, Type type, int count) throws IOException {
        List<Object> out = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            switch (type) {
                case BYTE_ARRAY -> {
                    byte[] bytes = new byte[page.getInt()];
                    page.get(bytes);
                    out.add(new String(bytes, StandardCharsets.UTF_8));
                }
                case INT64 -> out.add(page.getLong());
                case INT32 -> out.add(page.getInt());
                case BOOLEAN -> out.add(((page.get(page.position() + i / 8) >> (i % 8)) & 1) == 1);
                default -> throw new IOException("physical type " + type + " is not read");
            }
        }
        if (type == Type.BOOLEAN) {
            page.position(page.position() + (count + 7) / 8);
        }
        return out;
    }

    /** "Run Length Encoding / Bit-Packing Hybrid": runs of one value, or groups of 8 bit-packed values. */
    static int[] hybrid(ByteBuffer in, int bitWidth, int count) throws IOException {
        int[] out = new int[count];
        int n = 0;
        int byteWidth = (bitWidth + 7) / 8;
        while (n < count) {
            int header = unsignedVarInt(in);
            if ((header & 1) == 0) {
                int run = header >>> 1;
                int value = 0;
                for (int b = 0; b < byteWidth; b++) {
                    value |= (in.get() & 0xff) << (8 * b);
                }
                for (int i = 0; i < run && n < count; i++) {
                    out[n++] = value;
                }
            } else {
                int values = (header >>> 1) * 8;
                byte[] packed = new byte[(header >>> 1) * bitWidth];
                in.get(packed);
                for (int i = 0; i < values; i++) {
                    int value = 0;
                    for (int bit = 0; bit < bitWidth; bit++) {
                        int at = i * bitWidth + bit;
                        value |= ((packed[at / 8] >> (at % 8)) & 1) << bit;
                    }
                    if (n < count) {
                        out[n++] = value;
                    }
                }
            }
        }
        return out;
    }

    /**
     * "Encodings", Delta Encoding (DELTA_BINARY_PACKED = 5): a header (block size, miniblocks per block, value
     * count, first value as zigzag varint), then blocks of a zigzag minimum delta, one bit width per miniblock,
     * and the miniblocks' bit-packed deltas above that minimum.
     */
    private static long[] deltaBinaryPacked(ByteBuffer in) throws IOException {
        long blockSize = unsignedVarLong(in);
        long miniblocks = unsignedVarLong(in);
        int total = (int) unsignedVarLong(in);
        long value = zigzag(unsignedVarLong(in));
        if (miniblocks <= 0 || blockSize % miniblocks != 0) {
            throw new IOException("a delta-encoded block has " + miniblocks + " miniblocks of " + blockSize + " values");
        }
        int perMiniblock = (int) (blockSize / miniblocks);
        long[] out = new long[total];
        int n = 0;
        if (total > 0) {
            out[n++] = value;
        }
        while (n < total) {
            long minDelta = zigzag(unsignedVarLong(in));
            int[] widths = new int[(int) miniblocks];
            for (int i = 0; i < widths.length; i++) {
                widths[i] = in.get() & 0xff;
            }
            for (int mb = 0; mb < widths.length && n < total; mb++) {
                int width = widths[mb];
                byte[] packed = new byte[perMiniblock * width / 8];
                in.get(packed);
                for (int i = 0; i < perMiniblock; i++) {
                    long delta = 0;
                    for (int bit = 0; bit < width; bit++) {
                        int at = i * width + bit;
                        delta |= (long) ((packed[at / 8] >> (at % 8)) & 1) << bit;
                    }
                    if (n < total) {
                        value += minDelta + delta;
                        out[n++] = value;
                    }
                }
            }
        }
        return out;
    }

    /** "Encodings", DELTA_LENGTH_BYTE_ARRAY = 6: the lengths delta-encoded, then the bytes one after another. */
    private static List<String> deltaLengthByteArray(ByteBuffer in) throws IOException {
        long[] lengths = deltaBinaryPacked(in);
        List<String> out = new ArrayList<>(lengths.length);
        for (long length : lengths) {
            byte[] bytes = new byte[(int) length];
            in.get(bytes);
            out.add(new String(bytes, StandardCharsets.UTF_8));
        }
        return out;
    }

    /** "Encodings", DELTA_BYTE_ARRAY = 7: prefix lengths shared with the value before, then the suffixes. */
    private static List<String> deltaByteArray(ByteBuffer in) throws IOException {
        long[] prefixes = deltaBinaryPacked(in);
        long[] lengths = deltaBinaryPacked(in);
        List<String> out = new ArrayList<>(prefixes.length);
        byte[] previous = new byte[0];
        for (int i = 0; i < prefixes.length; i++) {
            byte[] value = new byte[(int) (prefixes[i] + lengths[i])];
            System.arraycopy(previous, 0, value, 0, (int) prefixes[i]);
            in.get(value, (int) prefixes[i], (int) lengths[i]);
            out.add(new String(value, StandardCharsets.UTF_8));
            previous = value;
        }
        return out;
    }

    private static long zigzag(long n) {
        return (n >>> 1) ^ -(n & 1);
    }

    private static long unsignedVarLong(ByteBuffer in) throws IOException {
        long value = 0;
        for (int shift = 0; shift < 70; shift += 7) {
            int b = in.get() & 0xff;
            value |= (long) (b & 0x7f) << shift;
            if ((b & 0x80) == 0) {
                return value;
            }
        }
        throw new IOException("a varint is longer than ten bytes");
    }

    private static int unsignedVarInt(ByteBuffer in) throws IOException {
        int value = 0;
        for (int shift = 0; shift < 35; shift += 7) {
            int b = in.get() & 0xff;
            value |= (b & 0x7f) << shift;
            if ((b & 0x80) == 0) {
                return value;
            }
        }
        throw new IOException("a run header is longer than five bytes");
    }

    private static int bitWidth(int maxLevel) {
        return 32 - Integer.numberOfLeadingZeros(maxLevel);
    }

    private static ByteBuffer slice(ByteBuffer in, int length) {
        ByteBuffer part = in.slice().order(ByteOrder.LITTLE_ENDIAN);
        part.limit(length);
        in.position(in.position() + length);
        return part;
    }

    private static void skip(ByteBuffer in, int length) {
        in.position(in.position() + length);
    }

    private static byte[] decompress(CompressionCodec codec, byte[] raw, int size) throws IOException {
        return switch (codec) {
            case UNCOMPRESSED -> raw;
            case SNAPPY -> {
                byte[] out = new byte[size];
                int n = Snappy.uncompress(raw, 0, raw.length, out, 0);
                if (n != size) {
                    throw new IOException("a Snappy page gave " + n + " bytes instead of " + size);
                }
                yield out;
            }
            case GZIP -> {
                try (InputStream in = new GZIPInputStream(new ByteArrayInputStream(raw))) {
                    ByteArrayOutputStream out = new ByteArrayOutputStream(size);
                    in.transferTo(out);
                    yield out.toByteArray();
                }
            }
            default -> throw new IOException("pages compressed with " + codec + " are not read"
                    + " (uncompressed, Snappy and gzip are)");
        };
    }
}
