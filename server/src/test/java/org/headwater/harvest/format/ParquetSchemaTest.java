package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.parquet.ParquetReadOptions;
import org.apache.parquet.column.ColumnDescriptor;
import org.apache.parquet.format.ConvertedType;
import org.apache.parquet.format.FieldRepetitionType;
import org.apache.parquet.format.SchemaElement;
import org.apache.parquet.format.Type;
import org.apache.parquet.hadoop.ParquetFileReader;
import org.apache.parquet.io.LocalInputFile;
import org.apache.parquet.schema.DecimalMetadata;
import org.apache.parquet.schema.LogicalTypeAnnotation;
import org.apache.parquet.schema.MessageTypeParser;
import org.apache.parquet.schema.OriginalType;
import org.headwater.model.ColumnDef;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ParquetSchemaTest {

    @TempDir
    Path dir;

    @Test
    void olderListShapesAndRarerTypesFollowTheBackwardCompatibilityRules() throws Exception {
        // Parquet LogicalTypes.md, "Lists" backward-compatibility rules: a repeated primitive is the element;
        // a repeated group named "array" or "<list>_tuple", or with several fields, is the element itself.
        Path file = ParquetFiles.writeEmpty(dir.resolve("legacy.parquet"), MessageTypeParser.parseMessageType("""
                message legacy {
                  optional group two_level (LIST) { repeated int32 element; }
                  optional group structs (LIST) { repeated group array { required binary name (UTF8); } }
                  optional group pairs (LIST) { repeated group pairs_tuple { required int64 n; } }
                  required group points (LIST) { repeated group p { required double x; required double y; } }
                  required group plain { repeated group items { required int32 x; } }
                  optional group kv (MAP_KEY_VALUE) { repeated group map { required binary key (UTF8); optional int32 value; } }
                  optional int96 legacy_ts;
                  optional fixed_len_byte_array(16) uid (UUID);
                  optional binary doc (JSON);
                  required int64 clock (TIME(MICROS,false));
                  optional binary blob (BSON);
                  optional fixed_len_byte_array(12) span (INTERVAL);
                  optional fixed_len_byte_array(2) half (FLOAT16);
                  optional binary label (ENUM);
                }
                """));
        Reading r = new ParquetReader().read(whole(file));
        assertThat(r.columns()).containsExactly(
                new ColumnDef("two_level[]", "integer", true),
                new ColumnDef("structs[].name", "text", true),
                new ColumnDef("pairs[].n", "integer", true),
                new ColumnDef("points[].x", "decimal", false),
                new ColumnDef("points[].y", "decimal", false),
                new ColumnDef("plain.items[].x", "integer", false),
                new ColumnDef("kv[].key", "text", true),
                new ColumnDef("kv[].value", "integer", true),
                // INT96: common practice, no source (legacy Impala/Hive/Spark timestamps).
                new ColumnDef("legacy_ts", "timestamp", true),
                new ColumnDef("uid", "text", true),
                new ColumnDef("doc", "text", true),
                new ColumnDef("clock", "text", false),
                new ColumnDef("blob", "binary", true),
                new ColumnDef("span", "binary", true),
                new ColumnDef("half", "decimal", true),
                new ColumnDef("label", "text", true));
        // expected: parquet-column's own leaf paths for the same footer.
        assertThat(parquetPaths(r)).isEqualTo(pathsByParquet(file));
    }

    @Test
    @SuppressWarnings("deprecation") // converted (original) types are the deprecated legacy under test
    void aFooterWithOnlyConvertedTypesIsReadAsTheirLogicalTypes() throws Exception {
        List<SchemaElement> schema = List.of(
                new SchemaElement("old").setNum_children(4),
                leaf("s", Type.BYTE_ARRAY).setConverted_type(ConvertedType.UTF8),
                leaf("t", Type.INT64).setConverted_type(ConvertedType.TIMESTAMP_MICROS),
                leaf("u", Type.INT32).setConverted_type(ConvertedType.UINT_16),
                leaf("d", Type.INT32).setConverted_type(ConvertedType.DECIMAL).setPrecision(5).setScale(2));
        List<ParquetSchema.Column> columns = ParquetSchema.columns(schema);
        assertThat(columns).extracting(ParquetSchema.Column::type).containsExactly("text", "timestamp", "integer", "decimal");
        // expected: parquet-column's mapping of each converted (original) type to a logical type annotation.
        assertThat(columns).extracting(ParquetSchema.Column::logicalType).containsExactly(
                LogicalTypeAnnotation.fromOriginalType(OriginalType.UTF8, null).toString(),
                LogicalTypeAnnotation.fromOriginalType(OriginalType.TIMESTAMP_MICROS, null).toString(),
                LogicalTypeAnnotation.fromOriginalType(OriginalType.UINT_16, null).toString(),
                LogicalTypeAnnotation.fromOriginalType(OriginalType.DECIMAL, new DecimalMetadata(5, 2)).toString());
    }

    @Test
    void aGroupClaimingMoreChildrenThanFollowIsInvalid() {
        List<SchemaElement> schema = List.of(new SchemaElement("m").setNum_children(5), leaf("a", Type.INT32), leaf("b", Type.INT32));
        assertThatThrownBy(() -> ParquetSchema.columns(schema))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("Parquet schema group 'm' claims 5 children; only 2 elements follow");
    }

    @Test
    void elementsLeftOverAfterTheRootsTreeAreInvalid() {
        List<SchemaElement> schema = List.of(new SchemaElement("m").setNum_children(1), leaf("a", Type.INT32), leaf("b", Type.INT32));
        assertThatThrownBy(() -> ParquetSchema.columns(schema))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The Parquet schema lists 3 elements but its root's tree holds 2");
    }

    @Test
    void nestingDeeperThanTheLimitIsRefusedNotWalked() {
        List<SchemaElement> schema = new ArrayList<>();
        schema.add(new SchemaElement("m").setNum_children(1));
        for (int i = 0; i < 100; i++) {
            schema.add(new SchemaElement("g" + i).setNum_children(1).setRepetition_type(FieldRepetitionType.REQUIRED));
        }
        schema.add(leaf("x", Type.INT32));
        assertThatThrownBy(() -> ParquetSchema.columns(schema))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("The Parquet schema nests deeper than 64 levels");
    }

    private static SchemaElement leaf(String name, Type type) {
        return new SchemaElement(name).setType(type).setRepetition_type(FieldRepetitionType.REQUIRED);
    }

    private static Sample whole(Path file) throws Exception {
        byte[] bytes = Files.readAllBytes(file);
        return new Sample(file.getFileName().toString(), bytes, true, bytes.length);
    }

    @SuppressWarnings("unchecked")
    private static List<String> parquetPaths(Reading r) {
        List<String> paths = new ArrayList<>();
        for (var c : (List<java.util.Map<String, Object>>) r.details().get("columns")) {
            paths.add((String) c.get("parquet_path"));
        }
        return paths;
    }

    private static List<String> pathsByParquet(Path file) throws Exception {
        try (ParquetFileReader r = ParquetFileReader.open(new LocalInputFile(file), ParquetReadOptions.builder().build())) {
            List<String> paths = new ArrayList<>();
            for (ColumnDescriptor d : r.getFooter().getFileMetaData().getSchema().getColumns()) {
                paths.add(String.join(".", d.getPath()));
            }
            return paths;
        }
    }
}
