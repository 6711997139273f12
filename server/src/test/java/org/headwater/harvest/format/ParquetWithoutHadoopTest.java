package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.net.URL;
import java.net.URLClassLoader;
import java.nio.file.Files;
import java.nio.file.Path;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The Parquet reader runs on what the server jar ships: Headwater's classes, parquet's footer structures,
 * Jackson and slf4j, and no Hadoop or parquet-hadoop. Tests load it in a class loader holding only those,
 * since the test class path itself has Hadoop on it (for parquet's writer).
 */
class ParquetWithoutHadoopTest {

    @TempDir
    Path dir;

    @Test
    void theFooterIsReadWithNoHadoopClassesAtAll() throws Exception {
        Path file = ParquetFiles.writeGauge(dir.resolve("g.parquet"), 42, 10, CompressionCodecName.SNAPPY);
        byte[] bytes = Files.readAllBytes(file);
        URL[] jars = {
            location(ParquetReader.class),
            location(org.apache.parquet.format.Util.class),
            location(com.fasterxml.jackson.core.JsonFactory.class),
            location(org.slf4j.LoggerFactory.class),
        };
        try (URLClassLoader isolated = new URLClassLoader(jars, ClassLoader.getPlatformClassLoader())) {
            assertThatThrownBy(() -> Class.forName("org.apache.hadoop.conf.Configuration", false, isolated))
                    .isInstanceOf(ClassNotFoundException.class);
            assertThatThrownBy(() -> Class.forName("org.apache.parquet.hadoop.ParquetFileReader", false, isolated))
                    .isInstanceOf(ClassNotFoundException.class);
            Class<?> sampleClass = Class.forName(Sample.class.getName(), true, isolated);
            Object sample = sampleClass.getConstructor(String.class, byte[].class, boolean.class, long.class)
                    .newInstance("g.parquet", bytes, true, (long) bytes.length);
            Class<?> readerClass = Class.forName(ParquetReader.class.getName(), true, isolated);
            Object reader = readerClass.getConstructor().newInstance();
            Object reading = readerClass.getMethod("read", sampleClass).invoke(reader, sample);
            assertThat(reading.getClass().getClassLoader()).isSameAs(isolated);
            assertThat(reading.getClass().getMethod("rowCount").invoke(reading)).isEqualTo(42L);
        }
    }

    private static URL location(Class<?> c) {
        return c.getProtectionDomain().getCodeSource().getLocation();
    }
}
