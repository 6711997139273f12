package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.TreeSet;
import org.apache.parquet.ParquetReadOptions;
import org.apache.parquet.column.ColumnDescriptor;
import org.apache.parquet.hadoop.ParquetFileReader;
import org.apache.parquet.hadoop.metadata.BlockMetaData;
import org.apache.parquet.hadoop.metadata.ColumnChunkMetaData;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.apache.parquet.hadoop.metadata.ParquetMetadata;
import org.apache.parquet.io.LocalInputFile;
import org.apache.parquet.schema.PrimitiveType;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ParquetReaderTest {
    private static final int HEAD = 64 * 1024;
    private final ParquetReader reader = new ParquetReader();

    @TempDir
    Path dir;

    /** What the harvester hands a reader: the first 64 KiB and a tail reader on the file. */
    private static Sample sampled(Path file) throws IOException {
        byte[] all = Files.readAllBytes(file);
        byte[] head = Arrays.copyOf(all, Math.min(HEAD, all.length));
        return new Sample(file.getFileName().toString(), head, head.length == all.length, all.length,
                new FileTailReader(file, all.length));
    }

    private static Sample whole(String name, byte[] bytes) {
        return new Sample(name, bytes, true, bytes.length);
    }

    @Test
    void theFooterGivesFlattenedColumnsTypesAndNullability() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("gauge.parquet"), 250, 100, CompressionCodecName.SNAPPY);
        Reading r = reader.read(sampled(file));
        assertThat(r.format()).isEqualTo("parquet");
        assertThat(r.kind()).isEqualTo(DatasetKind.FILE);
        // Types per Parquet LogicalTypes.md mapped to Headwater's words; nullable when any level is OPTIONAL
        // (Parquet format spec, "Nested Encoding": an optional level may be absent).
        assertThat(r.columns()).containsExactly(
                new ColumnDef("reading_id", "integer", false),
                new ColumnDef("station", "text", false),
                new ColumnDef("level_m", "decimal", true),
                new ColumnDef("day", "date", true),
                new ColumnDef("taken_at", "timestamp", false),
                new ColumnDef("flow", "decimal", true),
                new ColumnDef("checked", "boolean", true),
                new ColumnDef("raw", "binary", true),
                new ColumnDef("sensor_bits", "integer", true),
                new ColumnDef("gps.lat", "decimal", true),
                new ColumnDef("gps.lon", "decimal", true),
                new ColumnDef("tags[]", "text", true),
                new ColumnDef("samples[]", "integer", false),
                new ColumnDef("attrs[].key", "text", true),
                new ColumnDef("attrs[].value", "text", true),
                new ColumnDef("visits[].by", "text", true),
                new ColumnDef("visits[].minutes", "integer", true));
    }

    @Test
    void rowCountRowGroupsCodecAndWriterMatchParquetsOwnReader() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("gauge.parquet"), 250, 100, CompressionCodecName.SNAPPY);
        Reading r = reader.read(sampled(file));
        ParquetMetadata oracle = footerByParquet(file);
        // expected: parquet-hadoop's ParquetFileReader on the same file; 250 rows were written, at most 100 a group.
        long oracleRows = oracle.getBlocks().stream().mapToLong(BlockMetaData::getRowCount).sum();
        assertThat(oracleRows).isEqualTo(250L);
        assertThat(r.rowCount()).isEqualTo(oracleRows);
        assertThat(r.rowCountExact()).isTrue();
        assertThat(r.details().get("row_groups")).isEqualTo(oracle.getBlocks().size()).isEqualTo(3);
        assertThat(r.details().get("compression")).isEqualTo(codecs(oracle)).isEqualTo(List.of("SNAPPY"));
        assertThat(r.details().get("created_by")).isEqualTo(oracle.getFileMetaData().getCreatedBy());
        assertThat((String) r.details().get("created_by")).startsWith("parquet-mr version 1.17.1");
    }

    @Test
    void eachColumnsPathPhysicalAndLogicalTypeMatchParquetsOwnReader() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("gauge.parquet"), 10, 100, CompressionCodecName.GZIP);
        Reading r = reader.read(sampled(file));
        @SuppressWarnings("unchecked")
        List<Map<String, Object>> described = (List<Map<String, Object>>) r.details().get("columns");
        List<String> ours = new ArrayList<>();
        for (Map<String, Object> c : described) {
            ours.add(c.get("parquet_path") + " " + c.get("physical_type") + " " + c.get("logical_type") + " " + c.get("repetition"));
        }
        // expected: parquet-column's ColumnDescriptor for each leaf. parquet.thrift names BYTE_ARRAY what
        // parquet-column calls BINARY; LogicalTypeAnnotation.toString prints the annotation.
        List<String> theirs = new ArrayList<>();
        for (ColumnDescriptor d : footerByParquet(file).getFileMetaData().getSchema().getColumns()) {
            PrimitiveType t = d.getPrimitiveType();
            String physical = t.getPrimitiveTypeName() == PrimitiveType.PrimitiveTypeName.BINARY ? "BYTE_ARRAY"
                    : t.getPrimitiveTypeName().name();
            theirs.add(String.join(".", d.getPath()) + " " + physical + " " + t.getLogicalTypeAnnotation() + " " + t.getRepetition());
        }
        assertThat(ours).isEqualTo(theirs);
        assertThat(ours).contains("taken_at INT64 TIMESTAMP(MILLIS,true) REQUIRED", "flow INT32 DECIMAL(9,2) OPTIONAL",
                "tags.list.element BYTE_ARRAY STRING OPTIONAL", "raw BYTE_ARRAY null OPTIONAL");
        assertThat(r.details().get("compression")).isEqualTo(List.of("GZIP"));
    }

    @Test
    void aFileUnderTheSampleSizeNeedsNoTailReader() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("small.parquet"), 5, 100, CompressionCodecName.UNCOMPRESSED);
        byte[] bytes = Files.readAllBytes(file);
        Reading r = reader.read(whole("small.parquet", bytes));
        assertThat(r.rowCount()).isEqualTo(5L);
        assertThat(r.details().get("compression")).isEqualTo(List.of("UNCOMPRESSED"));
        assertThat(r.details().get("row_groups")).isEqualTo(1);
    }

    @Test
    void aLargeFileIsReadFromItsHeadAndTailOnly() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("large.parquet"), 20_000, 5_000, CompressionCodecName.UNCOMPRESSED);
        long size = Files.size(file);
        assertThat(size).isGreaterThan(HEAD);
        List<Integer> asked = new ArrayList<>();
        TailReader counting = n -> {
            asked.add(n);
            return new FileTailReader(file, size).readTail(n);
        };
        byte[] head = Arrays.copyOf(Files.readAllBytes(file), HEAD);
        Reading r = reader.read(new Sample("large.parquet", head, false, size, counting));
        assertThat(r.rowCount()).isEqualTo(20_000L);
        assertThat(r.details().get("row_groups")).isEqualTo(4);
        // Two reads: the 8-byte trailer (length + PAR1), then the footer with it.
        assertThat(asked).hasSize(2);
        assertThat(asked.get(0)).isEqualTo(8);
        assertThat(asked.get(1)).isEqualTo((int) r.details().get("footer_bytes") + 8);
    }

    @Test
    void aCutSampleWithoutTailAccessIsReportedNotGuessed() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("gauge.parquet"), 10, 100, CompressionCodecName.UNCOMPRESSED);
        byte[] bytes = Files.readAllBytes(file);
        Sample noTail = new Sample("gauge.parquet", Arrays.copyOf(bytes, 100), false, bytes.length);
        assertThatThrownBy(() -> reader.read(noTail))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("Could not read the Parquet footer at the end of the file: The harvester gave no access to the end of the file")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("unreadable");
    }

    @Test
    void aFileCutShortHasNoFooterAndIsTruncated() throws Exception {
        byte[] bytes = Files.readAllBytes(ParquetFiles.writeGauge(dir.resolve("g.parquet"), 50, 100, CompressionCodecName.UNCOMPRESSED));
        for (int cut : new int[] {bytes.length - 1, bytes.length - 4, bytes.length / 2, 100, 13}) {
            assertThatThrownBy(() -> reader.read(whole("g.parquet", Arrays.copyOf(bytes, cut))))
                    .as("cut at %d", cut)
                    .isInstanceOf(UnreadableFileException.class)
                    .hasMessage("The file does not end with PAR1: it was cut short or is still being written");
        }
        assertThatThrownBy(() -> reader.read(whole("g.parquet", Arrays.copyOf(bytes, 8))))
                .hasMessage("A Parquet file has at least 12 bytes; this one has 8");
    }

    @Test
    void aFooterLengthBeyondTheFileIsInvalid() throws Exception {
        byte[] bytes = Files.readAllBytes(ParquetFiles.writeGauge(dir.resolve("g.parquet"), 5, 100, CompressionCodecName.UNCOMPRESSED));
        ByteBuffer.wrap(bytes, bytes.length - 8, 4).order(ByteOrder.LITTLE_ENDIAN).putInt(bytes.length);
        assertThatThrownBy(() -> reader.read(whole("g.parquet", bytes)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The footer length " + bytes.length + " does not fit in a file of " + bytes.length + " bytes")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void aGarbledFooterIsInvalid() throws Exception {
        byte[] bytes = Files.readAllBytes(ParquetFiles.writeGauge(dir.resolve("g.parquet"), 5, 100, CompressionCodecName.UNCOMPRESSED));
        int footer = ByteBuffer.wrap(bytes, bytes.length - 8, 4).order(ByteOrder.LITTLE_ENDIAN).getInt();
        Arrays.fill(bytes, bytes.length - 8 - footer, bytes.length - 8, (byte) 0xFF);
        assertThatThrownBy(() -> reader.read(whole("g.parquet", bytes)))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("The Parquet footer cannot be decoded: ")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
    }

    @Test
    void aNameSayingParquetOnOtherBytesIsInvalid() {
        assertThatThrownBy(() -> reader.read(whole("notes.parquet", "id,name\n1,a\n".getBytes())))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The file does not start with the Parquet magic PAR1");
    }

    @Test
    void randomDamageToTheFooterGivesAReadingOrAnUnreadableFileNeverACrash() throws Exception {
        byte[] original = Files.readAllBytes(ParquetFiles.writeGauge(dir.resolve("g.parquet"), 5, 100, CompressionCodecName.UNCOMPRESSED));
        int footer = ByteBuffer.wrap(original, original.length - 8, 4).order(ByteOrder.LITTLE_ENDIAN).getInt();
        Random random = new Random(20260101);
        TreeSet<String> kinds = new TreeSet<>();
        for (int trial = 0; trial < 300; trial++) {
            byte[] bytes = original.clone();
            for (int flips = 0; flips < 1 + trial % 4; flips++) {
                int at = original.length - 8 - footer + random.nextInt(footer);
                bytes[at] = (byte) random.nextInt(256);
            }
            try {
                reader.read(whole("g.parquet", bytes));
                kinds.add("read");
            } catch (UnreadableFileException e) {
                kinds.add(e.kind());
            }
        }
        assertThat(kinds).isSubsetOf("read", "invalid");
        assertThat(kinds).contains("invalid");
    }

    @Test
    void anEncryptedFooterIsReportedWithoutColumns() throws Exception {
        // parquet-format Encryption.md: files with an encrypted footer start and end with "PARE" (from memory).
        byte[] bytes = "PARE-encrypted-bytes-PARE".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        Reading r = reader.read(whole("secret.parquet", bytes));
        assertThat(r.format()).isEqualTo("parquet");
        assertThat(r.columns()).isNull();
        assertThat(r.details()).isEqualTo(Map.of("encrypted_footer", true));
    }

    @Test
    void theSnifferCallsAParquetFileParquetWhateverItsName() throws Exception {
        byte[] bytes = Files.readAllBytes(ParquetFiles.writeGauge(dir.resolve("g.parquet"), 5, 100, CompressionCodecName.UNCOMPRESSED));
        assertThat(ContentSniffer.sniff(whole("export.csv", bytes)))
                .isEqualTo(new Sniff("parquet", 1.0, "Parquet magic at the start and the end of the file"));
        assertThat(reader.accepts(whole("export.csv", bytes))).isTrue();
        assertThat(FormatRegistry.standard().read(whole("export.csv", bytes)).format()).isEqualTo("parquet");
    }

    private static ParquetMetadata footerByParquet(Path file) throws IOException {
        try (ParquetFileReader r = ParquetFileReader.open(new LocalInputFile(file), ParquetReadOptions.builder().build())) {
            return r.getFooter();
        }
    }

    private static List<String> codecs(ParquetMetadata m) {
        return m.getBlocks().stream().flatMap(b -> b.getColumns().stream()).map(ColumnChunkMetaData::getCodec)
                .map(CompressionCodecName::name).distinct().sorted().toList();
    }
}
