package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The csv-spectrum suite (npm package csv-spectrum 2.0.0, fetched by
 * src/test/fetch-csv-spectrum.sh): each csvs/NAME.csv, read with the dialect the sniffer
 * detects, must give the rows of json/NAME.json (objects keyed by the header).
 */
class CsvSpectrumTest {

  private static final String FETCH = "sh server/src/test/fetch-csv-spectrum.sh";

  /**
   * Expected values in the suite that contradict its own CSV: location_coordinates.json says
   * the phone number is 1234567890 while the CSV holds 2095257564. We check the CSV's value,
   * and that the JSON still says what we think, so that a fixed suite is noticed.
   */
  private static final Map<String, String[]> SUITE_ERRATA = Map.of(
      "location_coordinates", new String[] {"Contact Phone Number", "1234567890", "2095257564"});

  @Test
  void readsEveryCaseLikeTheSuiteExpects() throws Exception {
    Path suite = ExternalSuite.locate("headwater.csvSpectrum", "target/csv-spectrum/package");
    if (suite == null || !Files.isDirectory(suite.resolve("csvs"))) {
      ExternalSuite.missing("csv-spectrum", FETCH);
    }
    List<Path> cases;
    try (Stream<Path> files = Files.list(suite.resolve("csvs"))) {
      cases = files.filter(p -> p.toString().endsWith(".csv")).sorted().toList();
    }
    assertThat(cases).hasSize(12); // csv-spectrum 2.0.0 ships twelve cases
    List<String> failures = new ArrayList<>();
    int matching = 0;
    for (Path csv : cases) {
      String name = csv.getFileName().toString().replace(".csv", "");
      String problem = check(name, Files.readAllBytes(csv),
          suite.resolve("json").resolve(name + ".json"));
      if (problem == null) {
        matching++;
      } else {
        failures.add(name + ": " + problem);
      }
    }
    System.out.printf("csv-spectrum: %d of %d cases read as expected%n", matching, cases.size());
    assertThat(failures).isEmpty();
  }

  private static String check(String name, byte[] bytes, Path jsonFile) throws IOException {
    CsvSniff sniff;
    try {
      sniff = Fixtures.sniff(bytes);
    } catch (NotDelimitedTextException e) {
      return "refused: " + e.getMessage();
    }
    if (!sniff.header()) {
      return "no header detected";
    }
    if (sniff.dialect().delimiter() != ',') {
      return "delimiter " + sniff.dialect();
    }
    String text = new String(bytes, sniff.encoding());
    if (text.startsWith("\uFEFF")) {
      text = text.substring(1);
    }
    List<List<String>> rows = new CsvParser(sniff.dialect()).parseAll(text);
    List<Map<String, String>> actual = new ArrayList<>();
    for (List<String> row : rows.subList(1, rows.size())) {
      Map<String, String> object = new LinkedHashMap<>();
      for (int i = 0; i < row.size(); i++) {
        object.put(rows.get(0).get(i), row.get(i));
      }
      actual.add(object);
    }
    List<Map<String, String>> expected = expected(new ObjectMapper().readTree(jsonFile.toFile()));
    String[] erratum = SUITE_ERRATA.get(name);
    if (erratum != null) {
      if (!erratum[1].equals(expected.get(0).get(erratum[0]))) {
        return "suite erratum changed: " + expected.get(0).get(erratum[0]);
      }
      expected.get(0).put(erratum[0], erratum[2]);
    }
    if (sniff.rowCount() != expected.size()) {
      return "row count " + sniff.rowCount() + " != " + expected.size();
    }
    return actual.equals(expected) ? null : "cells " + actual + " != " + expected;
  }

  /** The suite's JSON: an array of objects, or (location_coordinates) a single object. */
  private static List<Map<String, String>> expected(JsonNode json) {
    List<Map<String, String>> rows = new ArrayList<>();
    for (JsonNode node : json.isArray() ? json : List.of(json)) {
      Map<String, String> object = new LinkedHashMap<>();
      for (Map.Entry<String, JsonNode> e : node.properties()) {
        object.put(e.getKey(), e.getValue().asText());
      }
      rows.add(object);
    }
    return rows;
  }
}
