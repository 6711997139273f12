package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code HEADWATER_LOG_FORMAT=json}: a real command's log lines are one JSON object each. */
class JsonLogsTest {
    @TempDir
    Path temp;

    @Test
    void withTheJsonFormatEveryLogLineOfAHarvestIsOneJsonObject() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("a.csv"), "x\n1\n");
        // A notebook that is not JSON: the harvest logs a warning that it was not analysed.
        Files.writeString(lake.resolve("broken.ipynb"), "{\"cells\": [");
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                "org.headwater.cli.Main", "harvest", lake.toString(), "--data-dir", temp.resolve("catalog").toString())
                .redirectOutput(temp.resolve("out.txt").toFile()).redirectError(temp.resolve("err.txt").toFile());
        pb.environment().put("HEADWATER_LOG_FORMAT", "json");
        Process p = pb.start();
        assertThat(p.waitFor(120, TimeUnit.SECONDS)).isTrue();
        List<String> lines = Files.readAllLines(temp.resolve("err.txt"), StandardCharsets.UTF_8).stream()
                .filter(l -> !l.isBlank()).toList();
        assertThat(lines).isNotEmpty();
        // expected: JSON Lines (jsonlines.org), each line one RFC 8259 JSON text, parsed by Jackson
        ObjectMapper json = new ObjectMapper();
        for (String line : lines) {
            JsonNode event = json.readTree(line);
            assertThat(event.isObject()).as(line).isTrue();
        }
        assertThat(lines).anySatisfy(l -> {
            JsonNode event = json.readTree(l);
            assertThat(event.path("level").asText()).isEqualTo("WARN");
            assertThat(event.path("loggerName").asText()).isEqualTo("org.headwater.analysis.script.WorkspaceAnalysis");
            assertThat(event.path("formattedMessage").asText()).startsWith("Script broken.ipynb not analysed");
        });
    }
}
