package org.headwater.harvest.config;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.headwater.harvest.NameFilter;
import org.headwater.harvest.jdbc.DatabaseSource;
import org.headwater.harvest.objectstore.ObjectStoreSettings;

/**
 * The sources file: a YAML document whose {@code sources} list names what to harvest. Every problem is
 * reported with the entry it is in; a file with any problem is refused as a whole, so a typo never
 * harvests half a configuration. Secrets are never accepted in the file: only names of environment
 * variables that hold them.
 */
public final class SourcesConfig {
    private static final ObjectMapper YAML = new ObjectMapper(new YAMLFactory());
    private static final Pattern NAME = Pattern.compile("[A-Za-z0-9][A-Za-z0-9._-]{0,99}");
    private static final Pattern EVERY = Pattern.compile("(?:(\\d+)d)?(?:(\\d+)h)?(?:(\\d+)m)?(?:(\\d+)s)?");

    private static final Set<String> COMMON = Set.of("name", "kind", "include", "exclude", "sampling", "every");
    /** The keys each kind accepts besides the common ones: a table, so the reference and the check agree. */
    private static final Map<String, Set<String>> KEYS = Map.of(
            "folder", Set.of("path"),
            "s3", Set.of("url", "endpoint", "path-style", "region", "access-key-env", "secret-key-env",
                    "session-token-env", "sample-kib", "attempts"),
            "database", Set.of("jdbc-url", "user", "password-env", "owners-file"));
    /** Keys that would hold a secret itself; refused with a pointer to the variable-name key. */
    private static final Map<String, String> SECRET_KEYS = Map.of(
            "password", "password-env", "secret-key", "secret-key-env", "access-key", "access-key-env",
            "secret", "secret-key-env", "session-token", "session-token-env", "token", "session-token-env");

    private final List<SourceSpec> sources;

    private SourcesConfig(List<SourceSpec> sources) {
        this.sources = List.copyOf(sources);
    }

    public List<SourceSpec> sources() {
        return sources;
    }

    /** The source of that name. */
    public Optional<SourceSpec> source(String name) {
        return sources.stream().filter(s -> s.name().equals(name)).findFirst();
    }

    /**
     * Reads and checks a sources file; relative folder paths are taken from the file's own folder.
     *
     * @throws ConfigException listing every problem found, each with its entry
     */
    public static SourcesConfig read(Path file) throws IOException {
        String text = Files.readString(file);
        Path base = file.toAbsolutePath().normalize().getParent();
        return parse(text, base, file.toString());
    }

    /** Parses the text of a sources file; {@code origin} names it in messages. */
    public static SourcesConfig parse(String text, Path base, String origin) {
        JsonNode root;
        try {
            root = YAML.readTree(text);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new ConfigException(origin + " is not valid YAML: " + e.getOriginalMessage());
        }
        List<String> problems = new ArrayList<>();
        if (root == null || !root.isObject() || !root.has("sources")) {
            throw new ConfigException(origin + ": expected a mapping with a 'sources' list");
        }
        for (Iterator<String> it = root.fieldNames(); it.hasNext(); ) {
            String key = it.next();
            if (!key.equals("sources")) {
                problems.add("unknown top-level key '" + key + "' (only 'sources')");
            }
        }
        JsonNode list = root.get("sources");
        if (!list.isArray()) {
            throw new ConfigException(origin + ": 'sources' must be a list");
        }
        List<SourceSpec> specs = new ArrayList<>();
        Set<String> names = new HashSet<>();
        int index = 0;
        for (JsonNode entry : list) {
            index++;
            Entry e = new Entry(entry, index, problems);
            SourceSpec spec = e.spec(base);
            String name = entry.path("name").asText("");
            if (!name.isEmpty() && !names.add(name)) {
                problems.add(e.label() + ": the name '" + name + "' is used twice");
            }
            if (spec != null) {
                specs.add(spec);
            }
        }
        if (!problems.isEmpty()) {
            throw new ConfigException(origin + " has " + problems.size() + (problems.size() == 1 ? " problem" : " problems")
                    + ":\n  " + String.join("\n  ", problems));
        }
        return new SourcesConfig(specs);
    }

    /**
     * A schedule word: days, hours, minutes and seconds in that order, each optional ({@code 6h},
     * {@code 1h30m}, {@code 1d}, {@code 45s}).
     */
    static Duration every(String text) {
        Matcher m = EVERY.matcher(text == null ? "" : text.trim());
        if (text == null || text.isBlank() || !m.matches()) {
            throw new IllegalArgumentException("'" + text + "' is not a schedule like 30m, 6h, 1h30m or 1d");
        }
        Duration d = Duration.ZERO;
        long[] units = {86_400, 3_600, 60, 1};
        for (int g = 1; g <= 4; g++) {
            if (m.group(g) != null) {
                d = d.plusSeconds(Long.parseLong(m.group(g)) * units[g - 1]);
            }
        }
        if (d.isZero()) {
            throw new IllegalArgumentException("a schedule must be longer than zero: '" + text + "'");
        }
        return d;
    }

    /** One entry being checked; collects its problems. */
    private static final class Entry {
        final JsonNode node;
        final int index;
        final List<String> problems;

        Entry(JsonNode node, int index, List<String> problems) {
            this.node = node;
            this.index = index;
            this.problems = problems;
        }

        String label() {
            String name = node.isObject() ? node.path("name").asText("") : "";
            return "source " + index + (name.isEmpty() ? "" : " (" + name + ")");
        }

        SourceSpec spec(Path base) {
            if (!node.isObject()) {
                problems.add(label() + ": expected a mapping of keys");
                return null;
            }
            String kind = text("kind");
            if (kind == null || !KEYS.containsKey(kind)) {
                problems.add(label() + ": 'kind' must be one of folder, s3, database");
                return null;
            }
            int before = problems.size();
            checkKeys(kind);
            String name = text("name");
            if (name == null || !NAME.matcher(name).matches()) {
                problems.add(label() + ": 'name' is required: letters, digits, '.', '_', '-', at most 100");
            }
            NameFilter filter = filter();
            boolean sampling = bool("sampling", false);
            Optional<Duration> every = Optional.empty();
            if (node.has("every")) {
                try {
                    every = Optional.of(SourcesConfig.every(node.get("every").asText()));
                } catch (IllegalArgumentException e) {
                    problems.add(label() + ": 'every': " + e.getMessage());
                }
            }
            SourceSpec spec = switch (kind) {
                case "folder" -> folder(name, base, filter, sampling, every);
                case "s3" -> objectStore(name, filter, sampling, every);
                default -> database(name, base, sampling, every);
            };
            return problems.size() == before ? spec : null;
        }

        private SourceSpec folder(String name, Path base, NameFilter filter, boolean sampling, Optional<Duration> every) {
            String path = text("path");
            if (path == null) {
                problems.add(label() + ": a folder needs 'path'");
                return null;
            }
            Path resolved = base == null ? Path.of(path) : base.resolve(path).normalize();
            return new SourceSpec.Folder(name, resolved, filter, sampling, every);
        }

        private SourceSpec objectStore(String name, NameFilter filter, boolean sampling, Optional<Duration> every) {
            ObjectStoreSettings settings;
            try {
                settings = ObjectStoreSettings.ofUrl(text("url"));
            } catch (IllegalArgumentException e) {
                problems.add(label() + ": 'url': " + e.getMessage());
                return null;
            }
            try {
                String endpoint = text("endpoint");
                if (endpoint != null) {
                    URI uri = URI.create(endpoint);
                    if (uri.getScheme() == null || uri.getHost() == null
                            || !(uri.getScheme().equals("http") || uri.getScheme().equals("https"))) {
                        throw new IllegalArgumentException("'endpoint' must be an http or https URL: " + endpoint);
                    }
                    if (uri.getUserInfo() != null) {
                        throw new IllegalArgumentException("'endpoint' must not carry credentials; use access-key-env");
                    }
                    settings = settings.withEndpoint(uri, bool("path-style", false));
                } else {
                    settings = settings.withEndpoint(null, bool("path-style", false));
                }
                if (text("region") != null) {
                    settings = settings.withRegion(text("region"));
                }
                settings = settings.withKeysFrom(text("access-key-env"), text("secret-key-env"), text("session-token-env"));
                int kib = integer("sample-kib", ObjectStoreSettings.DEFAULT_SAMPLE_KIB);
                if (kib < 1 || kib > 64 * 1024) {
                    throw new IllegalArgumentException("'sample-kib' must be between 1 and 65536: " + kib);
                }
                settings = settings.withSampleBytes(kib * 1024)
                        .withRetries(integer("attempts", ObjectStoreSettings.DEFAULT_MAX_ATTEMPTS), null);
            } catch (IllegalArgumentException e) {
                problems.add(label() + ": " + e.getMessage());
                return null;
            }
            return new SourceSpec.ObjectStorePrefix(name, settings, filter, sampling, every);
        }

        private SourceSpec database(String name, Path base, boolean sampling, Optional<Duration> every) {
            String url = text("jdbc-url");
            if (url == null || !url.startsWith("jdbc:")) {
                problems.add(label() + ": a database needs 'jdbc-url' starting with jdbc:");
                return null;
            }
            // A password in the URL would be a secret in the file; only password-env may bring one.
            if (url.toLowerCase(java.util.Locale.ROOT).matches(".*[?;&:]password=.*")) {
                problems.add(label() + ": 'jdbc-url' must not hold a password; name its variable in 'password-env'");
                return null;
            }
            String owners = text("owners-file");
            Path ownersFile = owners == null ? null : base == null ? Path.of(owners) : base.resolve(owners).normalize();
            return new SourceSpec.Database(new DatabaseSource(name == null ? "" : name, url, text("user"),
                    text("password-env"), strings("include"), strings("exclude"), sampling, ownersFile), every);
        }

        private void checkKeys(String kind) {
            for (Iterator<String> it = node.fieldNames(); it.hasNext(); ) {
                String key = it.next();
                if (SECRET_KEYS.containsKey(key)) {
                    problems.add(label() + ": '" + key + "' would put a secret in the file; name the environment"
                            + " variable that holds it with '" + SECRET_KEYS.get(key) + "'");
                } else if (!COMMON.contains(key) && !KEYS.get(kind).contains(key)) {
                    problems.add(label() + ": unknown key '" + key + "' for kind " + kind);
                }
            }
        }

        private NameFilter filter() {
            try {
                return NameFilter.of(strings("include"), strings("exclude"));
            } catch (IllegalArgumentException e) {
                problems.add(label() + ": " + e.getMessage());
                return NameFilter.ALL;
            }
        }

        private String text(String key) {
            JsonNode v = node.get(key);
            if (v == null || v.isNull()) {
                return null;
            }
            if (!v.isValueNode()) {
                problems.add(label() + ": '" + key + "' must be a single value");
                return null;
            }
            return v.asText();
        }

        private boolean bool(String key, boolean fallback) {
            JsonNode v = node.get(key);
            if (v == null || v.isNull()) {
                return fallback;
            }
            if (!v.isBoolean()) {
                problems.add(label() + ": '" + key + "' must be true or false");
                return fallback;
            }
            return v.asBoolean();
        }

        private int integer(String key, int fallback) {
            JsonNode v = node.get(key);
            if (v == null || v.isNull()) {
                return fallback;
            }
            if (!v.canConvertToInt() || !v.isIntegralNumber()) {
                throw new IllegalArgumentException("'" + key + "' must be a whole number");
            }
            return v.asInt();
        }

        private List<String> strings(String key) {
            JsonNode v = node.get(key);
            if (v == null || v.isNull()) {
                return List.of();
            }
            List<String> out = new ArrayList<>();
            if (v.isTextual()) {
                out.add(v.asText());
            } else if (v.isArray()) {
                v.forEach(s -> out.add(s.asText()));
            } else {
                problems.add(label() + ": '" + key + "' must be a glob or a list of globs");
            }
            return out;
        }
    }
}
