package org.headwater.harvest.format;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.apache.hadoop.conf.Configuration;
import org.apache.parquet.example.data.Group;
import org.apache.parquet.example.data.simple.SimpleGroupFactory;
import org.apache.parquet.hadoop.ParquetWriter;
import org.apache.parquet.hadoop.example.ExampleParquetWriter;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.apache.parquet.io.LocalOutputFile;
import org.apache.parquet.schema.MessageType;
import org.apache.parquet.schema.MessageTypeParser;

/** Writes Parquet test files with parquet's own example writer (which needs Hadoop's classes, test scope only). */
final class ParquetFiles {

    /**
     * Invented river-gauge readings, in parquet's schema text: required, optional and repeated fields, a
     * nested group, a three-level list of strings and one of structs, a map, and most logical types.
     */
    static final MessageType GAUGE_SCHEMA = MessageTypeParser.parseMessageType("""
            message gauge_reading {
              required int64 reading_id;
              required binary station (STRING);
              optional double level_m;
              optional int32 day (DATE);
              required int64 taken_at (TIMESTAMP(MILLIS,true));
              optional int32 flow (DECIMAL(9,2));
              optional boolean checked;
              optional binary raw;
              optional int32 sensor_bits (INTEGER(8,false));
              optional group gps {
                required double lat;
                required double lon;
              }
              optional group tags (LIST) {
                repeated group list {
                  optional binary element (STRING);
                }
              }
              repeated int32 samples;
              optional group attrs (MAP) {
                repeated group key_value {
                  required binary key (STRING);
                  optional binary value (STRING);
                }
              }
              optional group visits (LIST) {
                repeated group list {
                  required group element {
                    required binary by (STRING);
                    optional int64 minutes;
                  }
                }
              }
            }
            """);

    private ParquetFiles() {
    }

    /** Writes a file with the given schema and no rows: enough for its footer. */
    static Path writeEmpty(Path file, MessageType schema) throws IOException {
        Files.deleteIfExists(file);
        ExampleParquetWriter.builder(new LocalOutputFile(file)).withConf(new Configuration(false)).withType(schema).build().close();
        return file;
    }

    /** Writes {@code rows} gauge readings in row groups of at most {@code rowsPerGroup} rows. */
    static Path writeGauge(Path file, int rows, int rowsPerGroup, CompressionCodecName codec) throws IOException {
        Files.deleteIfExists(file);
        SimpleGroupFactory factory = new SimpleGroupFactory(GAUGE_SCHEMA);
        try (ParquetWriter<Group> writer = ExampleParquetWriter.builder(new LocalOutputFile(file))
                .withConf(new Configuration(false))
                .withType(GAUGE_SCHEMA)
                .withCompressionCodec(codec)
                .withRowGroupRowCountLimit(rowsPerGroup)
                .build()) {
            for (int i = 0; i < rows; i++) {
                Group g = factory.newGroup()
                        .append("reading_id", (long) i)
                        .append("station", "ST-" + (i % 7))
                        .append("taken_at", 1_767_225_600_000L + i * 60_000L);
                if (i % 3 != 0) {
                    g.append("level_m", 1.25 + i / 100.0).append("day", 20_454 + i / 24);
                }
                if (i % 2 == 0) {
                    g.append("flow", 12_345 + i).append("checked", i % 4 == 0);
                }
                g.addGroup("gps").append("lat", -41.5 + i / 1000.0).append("lon", 172.25);
                Group tags = g.addGroup("tags");
                tags.addGroup("list").append("element", "calm");
                g.append("samples", i).append("samples", i + 1);
                g.addGroup("attrs").addGroup("key_value").append("key", "crew").append("value", "B" + (i % 3));
                g.addGroup("visits").addGroup("list").addGroup("element").append("by", "ranger").append("minutes", 15L);
                writer.write(g);
            }
        }
        return file;
    }
}
