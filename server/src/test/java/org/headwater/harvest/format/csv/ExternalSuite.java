package org.headwater.harvest.format.csv;

import static org.junit.jupiter.api.Assertions.fail;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import org.junit.jupiter.api.Assumptions;

/**
 * Finds test material that lives outside the repository (a fetched test suite, a Debian data
 * package, python3). Missing material skips the test, unless the system property
 * {@code headwater.requireExternal} is true (as CI sets it), when it fails the test.
 */
final class ExternalSuite {

  private ExternalSuite() {}

  static boolean required() {
    return Boolean.parseBoolean(System.getProperty("headwater.requireExternal", "false"));
  }

  /** Skips, or fails when external material is required. Never returns. */
  static void missing(String what, String howToGet) {
    String message = what + " not found; run: " + howToGet;
    if (required()) {
      fail(message + " (headwater.requireExternal=true)");
    }
    Assumptions.assumeTrue(false, message);
  }

  /** The first existing path among a system property and fallbacks, or null. */
  static Path locate(String property, String... fallbacks) {
    String configured = System.getProperty(property);
    if (configured != null && !configured.isBlank()) {
      Path path = Paths.get(configured);
      return Files.exists(path) ? path : null;
    }
    for (String fallback : fallbacks) {
      Path path = Paths.get(fallback);
      if (Files.exists(path)) {
        return path;
      }
      String root = System.getProperty("headwater.repoRoot");
      if (root != null && !path.isAbsolute()) {
        Path fromRoot = Paths.get(root, "server").resolve(fallback);
        if (Files.exists(fromRoot)) {
          return fromRoot;
        }
      }
    }
    return null;
  }
}
