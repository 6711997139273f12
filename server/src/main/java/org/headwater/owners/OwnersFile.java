package org.headwater.owners;

import java.io.IOException;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileSystem;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.PatternSyntaxException;

/**
 * The owners file at a workspace's root, {@value #NAME}: one rule per line, a glob pattern then the
 * owners of what it matches.
 *
 * <pre>
 * # who answers for what (lines starting with # are comments)
 * raw/               team:field-crew          a folder: everything beneath it
 * raw/loggers/*.csv  Ada Quill, team:field-crew
 * scratch/**         nobody                   no owner from this file
 * </pre>
 *
 * Patterns follow {@link FileSystem#getPathMatcher} glob rules ({@code *} within one path part, {@code **}
 * across parts, {@code ?}, {@code [abc]}, {@code {a,b}}), matched against workspace-relative names with
 * {@code /} between parts; a leading {@code /} is ignored. A pattern that matches a folder gives its owners
 * to every file beneath (inherited); a pattern ending in {@code /} matches folders only. An owner is a
 * person's name, or {@code team:NAME}; owners are separated by commas; {@code nobody} clears.
 *
 * <p>When several lines match, the more specific wins: the one with more literal path parts (parts without
 * wildcards); between equally specific lines the later one wins.
 */
public final class OwnersFile {
    /** The file's name at the workspace root. */
    public static final String NAME = "headwater.owners";

    private static final FileSystem NAMES = FileSystems.getDefault();

    /** A person or a team. */
    public record Owner(String name, String kind) {
    }

    /** One rule: its line number, pattern as written, and owners (empty for {@code nobody}). */
    public record Rule(int line, String pattern, boolean foldersOnly, int literalParts, List<Owner> owners,
            PathMatcher matcher) {
    }

    /** A line that could not be read, with what is wrong; the other lines still count. */
    public record Problem(int line, String message) {
        @Override
        public String toString() {
            return NAME + " line " + line + ": " + message;
        }
    }

    /** The rule that decides a name's owners, and whether it matched a folder above the name. */
    public record Match(Rule rule, String matched, boolean inherited) {
        /** The reason stored with the ownership. */
        public String reason() {
            return NAME + " line " + rule.line() + ": " + rule.pattern()
                    + (inherited ? " (folder " + matched + ")" : "");
        }
    }

    private final List<Rule> rules;
    private final List<Problem> problems;

    private OwnersFile(List<Rule> rules, List<Problem> problems) {
        this.rules = List.copyOf(rules);
        this.problems = List.copyOf(problems);
    }

    /** No owners file: no rules. */
    public static OwnersFile none() {
        return new OwnersFile(List.of(), List.of());
    }

    /** The owners file of a workspace root, or {@link #none()} when there is none. */
    public static OwnersFile read(Path root) throws IOException {
        Path file = root.resolve(NAME);
        if (!Files.isRegularFile(file)) {
            return none();
        }
        return readFile(file);
    }

    /** An owners file at any path, such as the one a database source names; it must exist. */
    public static OwnersFile readFile(Path file) throws IOException {
        try {
            return parse(Files.readAllLines(file, StandardCharsets.UTF_8));
        } catch (CharacterCodingException e) {
            return new OwnersFile(List.of(), List.of(new Problem(0, "not UTF-8 text; no rule was read")));
        }
    }

    /** Reads the lines of an owners file; bad lines become problems, never exceptions. */
    public static OwnersFile parse(List<String> lines) {
        List<Rule> rules = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            int number = i + 1;
            String line = stripComment(lines.get(i)).strip();
            if (line.isEmpty()) {
                continue;
            }
            int space = firstSpace(line);
            if (space < 0) {
                problems.add(new Problem(number, "'" + line + "' has no owner; write 'nobody' to clear owners"));
                continue;
            }
            String pattern = line.substring(0, space);
            String ownerText = line.substring(space).strip();
            boolean folders = pattern.endsWith("/");
            String glob = pattern.replaceAll("^/+", "").replaceAll("/+$", "");
            if (glob.isEmpty()) {
                glob = "**";
            }
            PathMatcher matcher;
            try {
                matcher = NAMES.getPathMatcher("glob:" + glob);
            } catch (PatternSyntaxException e) {
                problems.add(new Problem(number, "'" + pattern + "' is not a valid glob: " + e.getDescription()));
                continue;
            }
            Optional<List<Owner>> owners = owners(ownerText, number, problems);
            if (owners.isPresent()) {
                rules.add(new Rule(number, pattern, folders, literalParts(glob), owners.get(), matcher));
            }
        }
        return new OwnersFile(rules, problems);
    }

    public List<Rule> rules() {
        return rules;
    }

    public List<Problem> problems() {
        return problems;
    }

    /**
     * The rule deciding the owners of a workspace-relative name, if any matches: the name itself, or a
     * folder above it (the nearest folder it matches, for the reason shown).
     */
    public Optional<Match> match(String name) {
        Match best = null;
        for (Rule rule : rules) {
            Match m = matchOne(rule, name);
            if (m != null && (best == null || rule.literalParts() >= best.rule().literalParts())) {
                best = m;
            }
        }
        return Optional.ofNullable(best);
    }

    private static Match matchOne(Rule rule, String name) {
        if (!rule.foldersOnly() && rule.matcher().matches(Path.of(name))) {
            return new Match(rule, name, false);
        }
        // The nearest folder first: "raw/loggers" before "raw".
        for (int slash = name.lastIndexOf('/'); slash > 0; slash = name.lastIndexOf('/', slash - 1)) {
            String folder = name.substring(0, slash);
            if (rule.matcher().matches(Path.of(folder))) {
                return new Match(rule, folder, true);
            }
        }
        return null;
    }

    private static Optional<List<Owner>> owners(String text, int line, List<Problem> problems) {
        if (text.equals("nobody")) {
            return Optional.of(List.of());
        }
        List<Owner> owners = new ArrayList<>();
        for (String part : text.split(",")) {
            String owner = part.strip();
            boolean team = owner.startsWith("team:");
            String name = team ? owner.substring("team:".length()).strip() : owner;
            if (name.isEmpty()) {
                problems.add(new Problem(line, "an empty owner name in '" + text + "'"));
                return Optional.empty();
            }
            if (name.length() > 200) {
                problems.add(new Problem(line, "an owner name longer than 200 characters"));
                return Optional.empty();
            }
            owners.add(new Owner(name, team ? "team" : "person"));
        }
        return Optional.of(owners);
    }

    /** Parts of the pattern without glob characters: how specific it is. */
    private static int literalParts(String glob) {
        int literal = 0;
        for (String part : glob.split("/")) {
            if (!part.isEmpty() && part.chars().noneMatch(c -> "*?[]{}\\".indexOf(c) >= 0)) {
                literal++;
            }
        }
        return literal;
    }

    private static String stripComment(String line) {
        String trimmed = line.stripLeading();
        if (trimmed.startsWith("#")) {
            return "";
        }
        // A comment may also follow a rule, after white space.
        for (int i = 1; i < line.length(); i++) {
            if (line.charAt(i) == '#' && Character.isWhitespace(line.charAt(i - 1))) {
                return line.substring(0, i);
            }
        }
        return line;
    }

    private static int firstSpace(String line) {
        for (int i = 0; i < line.length(); i++) {
            if (Character.isWhitespace(line.charAt(i))) {
                return i;
            }
        }
        return -1;
    }
}
