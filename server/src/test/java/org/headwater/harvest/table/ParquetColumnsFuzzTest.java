package org.headwater.harvest.table;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.apache.hadoop.conf.Configuration;
import org.apache.parquet.column.ParquetProperties.WriterVersion;
import org.apache.parquet.example.data.Group;
import org.apache.parquet.example.data.simple.SimpleGroupFactory;
import org.apache.parquet.hadoop.ParquetReader;
import org.apache.parquet.hadoop.ParquetWriter;
import org.apache.parquet.hadoop.example.ExampleParquetWriter;
import org.apache.parquet.hadoop.example.GroupReadSupport;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.apache.parquet.io.LocalOutputFile;
import org.apache.parquet.schema.MessageType;
import org.apache.parquet.schema.MessageTypeParser;
import org.headwater.testing.Fuzz;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * The checkpoint column decoder against parquet-hadoop's own reader (the reference implementation): random
 * optional text and numbers inside an optional struct, written with every codec, page version and dictionary
 * choice the decoder claims, in pages small enough that each column spans many of them.
 */
class ParquetColumnsFuzzTest {
    private static final MessageType SCHEMA = MessageTypeParser.parseMessageType("""
            message fuzz {
              optional group add {
                optional binary path (STRING);
                optional int64 size;
                optional int32 flags;
              }
            }
            """);

    @TempDir
    Path temp;

    @TestFactory
    Stream<DynamicTest> decodedValuesEqualParquetHadoopsReading() {
        return Fuzz.cases("checkpoint columns", 24, 9_100, random -> {
            int rows = 1 + random.nextInt(3_000);
            Path file = temp.resolve("f" + random.nextLong() + ".parquet");
            boolean v2 = random.nextBoolean();
            var builder = ExampleParquetWriter.builder(new LocalOutputFile(file)).withConf(new Configuration(false))
                    .withType(SCHEMA)
                    .withCompressionCodec(Fuzz.pick(random, List.of(CompressionCodecName.UNCOMPRESSED,
                            CompressionCodecName.SNAPPY, CompressionCodecName.GZIP)))
                    .withDictionaryEncoding(random.nextBoolean())
                    .withWriterVersion(v2 ? WriterVersion.PARQUET_2_0 : WriterVersion.PARQUET_1_0)
                    .withPageSize(256 + random.nextInt(4_096))
                    .withRowGroupSize(64L * 1024 + random.nextInt(256 * 1024));
            SimpleGroupFactory groups = new SimpleGroupFactory(SCHEMA);
            List<String> prefixes = List.of("", "harbour=north/part-", "harbour=south/part-0000", "d/");
            try (ParquetWriter<Group> writer = builder.build()) {
                for (int i = 0; i < rows; i++) {
                    Group row = groups.newGroup();
                    if (random.nextInt(5) > 0) {
                        Group add = row.addGroup("add");
                        if (random.nextInt(6) > 0) {
                            add.append("path", Fuzz.pick(random, prefixes) + random.nextInt(random.nextBoolean() ? 5 : 1_000_000));
                        }
                        if (random.nextInt(6) > 0) {
                            add.append("size", random.nextBoolean() ? random.nextLong() : random.nextInt(10_000));
                        }
                        if (random.nextInt(6) > 0) {
                            add.append("flags", random.nextInt());
                        }
                    }
                    writer.write(row);
                }
            }
            Map<String, ParquetColumns.Column> decoded = ParquetColumns.read(Files.readAllBytes(file),
                    Set.of("add.path", "add.size", "add.flags"));
            // expected: parquet-hadoop's GroupReadSupport reading of the same file, field by field.
            List<Object> paths = new ArrayList<>();
            List<Object> sizes = new ArrayList<>();
            List<Object> flags = new ArrayList<>();
            try (ParquetReader<Group> reader = ParquetReader.builder(new GroupReadSupport(), new org.apache.hadoop.fs.Path(file.toUri()))
                    .withConf(new Configuration(false)).build()) {
                Group g;
                while ((g = reader.read()) != null) {
                    Group add = g.getFieldRepetitionCount("add") == 0 ? null : g.getGroup("add", 0);
                    paths.add(add == null || add.getFieldRepetitionCount("path") == 0 ? null : add.getString("path", 0));
                    sizes.add(add == null || add.getFieldRepetitionCount("size") == 0 ? null : add.getLong("size", 0));
                    flags.add(add == null || add.getFieldRepetitionCount("flags") == 0 ? null : add.getInteger("flags", 0));
                }
            }
            assertThat(decoded.get("add.path").values()).containsExactlyElementsOf(paths);
            assertThat(decoded.get("add.size").values()).containsExactlyElementsOf(sizes);
            assertThat(decoded.get("add.flags").values()).containsExactlyElementsOf(flags);
        });
    }
}
