package org.headwater.harvest;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Recognises the variable parts of a file's path that make it one partition of a larger dataset:
 * {@code key=value} folders, date- or number-named folders, and file names ending in a date, a year or a
 * part number. The rules are data (two tables below), tried in order; the first that matches a segment wins.
 */
final class PartitionPatterns {

    /**
     * A rule for one path segment.
     *
     * @param key the partition key the variable part gets, or null to take it from the match's group 1
     * @param valueGroup the group holding the variable value
     * @param prefixGroup for file names, the group kept before the {@code *}, else 0
     */
    record Rule(Pattern pattern, String key, int valueGroup, int prefixGroup) {
    }

    // common practice, no source: the ways teams partition files by folder.
    static final List<Rule> FOLDER_RULES = List.of(
            new Rule(Pattern.compile("([A-Za-z_][A-Za-z0-9_.-]*)=(.+)"), null, 2, 0),
            new Rule(Pattern.compile("(\\d{4}-\\d{2}(?:-\\d{2})?)"), "date", 1, 0),
            new Rule(Pattern.compile("(\\d{1,8})"), "folder", 1, 0));

    // common practice, no source: the ways teams partition files by name (before the extension).
    static final List<Rule> NAME_RULES = List.of(
            new Rule(Pattern.compile("(part-)(\\d+)(?:[-._].*)?"), "part", 2, 1),
            new Rule(Pattern.compile("(.*?[_-]?)(\\d{4}-\\d{2}-\\d{2}|\\d{4}-\\d{2}|\\d{8}|\\d{6}|\\d{4})"), "date", 2, 1),
            new Rule(Pattern.compile("(.*?[_-])(\\d{1,5})"), "number", 2, 1));

    /** File endings whose files may be grouped: tables only; figures and scripts stay individual files. */
    static final Set<String> GROUPABLE = Set.of("csv", "tsv", "tab", "psv", "txt", "dat", "json", "ndjson", "jsonl",
            "parquet");

    /**
     * Where one file would belong if others share its pattern.
     *
     * @param pattern the workspace-relative path with {@code *} for each variable part
     * @param keys the variable parts' values, by key
     */
    record Placement(String pattern, Map<String, String> keys) {
    }

    private PartitionPatterns() {
    }

    /** The placement of a workspace-relative path, or empty when nothing in it varies. */
    static Optional<Placement> place(String relativePath) {
        String[] segments = relativePath.split("/");
        String file = segments[segments.length - 1];
        int dot = file.indexOf('.');
        String extension = dot < 0 ? "" : file.substring(file.lastIndexOf('.') + 1).toLowerCase(Locale.ROOT);
        if (!GROUPABLE.contains(extension)) {
            return Optional.empty();
        }
        Map<String, String> keys = new LinkedHashMap<>();
        List<String> pattern = new ArrayList<>();
        for (int i = 0; i < segments.length - 1; i++) {
            pattern.add(replace(segments[i], FOLDER_RULES, keys, false));
        }
        String base = dot < 0 ? file : file.substring(0, dot);
        String suffix = dot < 0 ? "" : file.substring(dot);
        pattern.add(replace(base, NAME_RULES, keys, true) + suffix);
        return keys.isEmpty() ? Optional.empty() : Optional.of(new Placement(String.join("/", pattern), keys));
    }

    private static String replace(String segment, List<Rule> rules, Map<String, String> keys, boolean fileName) {
        Map<String, Optional<SegmentMatch>> memo = fileName ? NAME_MEMO : FOLDER_MEMO;
        if (memo.size() > MEMO_LIMIT) {
            memo.clear();
        }
        Optional<SegmentMatch> found = memo.computeIfAbsent(segment, s -> match(s, rules, fileName));
        if (found.isEmpty()) {
            return segment;
        }
        SegmentMatch m = found.get();
        keys.put(m.keyFromMatch() ? m.key() : uniqueKey(m.key(), keys), m.value());
        return m.piece();
    }

    /**
     * What the first matching rule makes of a segment: its key (the match's own for {@code key=value}), its
     * value, and the segment's place in the pattern.
     */
    private record SegmentMatch(String key, boolean keyFromMatch, String value, String piece) {
    }

    /**
     * Segments repeat across a tree ({@code year=2021}, {@code part-00000}): each is matched against the rules
     * once. In a fresh process, matching 50,000 paths' segments one by one took about 1.5 s of a harvest's
     * single-threaded start.
     */
    private static final Map<String, Optional<SegmentMatch>> FOLDER_MEMO = new ConcurrentHashMap<>();
    private static final Map<String, Optional<SegmentMatch>> NAME_MEMO = new ConcurrentHashMap<>();
    private static final int MEMO_LIMIT = 100_000;

    private static Optional<SegmentMatch> match(String segment, List<Rule> rules, boolean fileName) {
        for (Rule rule : rules) {
            Matcher m = rule.pattern().matcher(segment);
            if (!m.matches()) {
                continue;
            }
            String value = m.group(rule.valueGroup());
            if (rule.key() == null) {
                return Optional.of(new SegmentMatch(m.group(1), true, value, m.group(1) + "=*"));
            }
            String piece = (fileName || rule.prefixGroup() > 0 ? m.group(rule.prefixGroup()) : "") + "*";
            return Optional.of(new SegmentMatch(rule.key(), false, value, piece));
        }
        return Optional.empty();
    }

    private static String uniqueKey(String key, Map<String, String> keys) {
        if (!keys.containsKey(key)) {
            return key;
        }
        int n = 2;
        while (keys.containsKey(key + "_" + n)) {
            n++;
        }
        return key + "_" + n;
    }
}
