package org.headwater.checks;

import java.nio.file.FileSystems;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.PatternSyntaxException;

/**
 * The workspace's policy file, {@value #NAME} at the root of a harvested folder: one rule a line,
 * a glob over workspace-relative dataset names, then a policy or {@code none}. Blank lines and lines
 * starting with {@code #} are ignored. Of the rules that match a name, the most specific wins (the one
 * with the most characters that are not wildcards); at equal specificity the later line wins.
 */
public final class PolicyFile {
    /** Hidden, so the harvester never takes the file itself for a dataset. */
    public static final String NAME = ".headwater-freshness";

    private final List<Rule> rules;
    private final List<Problem> problems;

    private PolicyFile(List<Rule> rules, List<Problem> problems) {
        this.rules = List.copyOf(rules);
        this.problems = List.copyOf(problems);
    }

    /**
     * One line of the file.
     *
     * @param policy the policy, or empty for {@code none}
     */
    public record Rule(int line, String glob, Optional<Policy> policy, PathMatcher matcher, int specificity) {
        boolean matches(String name) {
            return matcher.matches(Path.of(name));
        }
    }

    /** A line that could not be read; the other lines still count. */
    public record Problem(int line, String message) {
    }

    /** Reads the file's text; a bad line becomes a {@link Problem} and is skipped. */
    public static PolicyFile parse(String text) {
        List<Rule> rules = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        String[] lines = text.split("\\R", -1);
        for (int i = 0; i < lines.length; i++) {
            String line = lines[i].strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String[] parts = line.split("\\s+", 2);
            if (parts.length < 2) {
                problems.add(new Problem(i + 1, "a rule is a glob and a policy ('max-age 36h', 'schedule 0 6 * * *'"
                        + " or 'none'), got only '" + line + "'"));
                continue;
            }
            try {
                rules.add(rule(i + 1, parts[0], parts[1].strip()));
            } catch (IllegalArgumentException e) {
                problems.add(new Problem(i + 1, e.getMessage()));
            }
        }
        return new PolicyFile(rules, problems);
    }

    private static Rule rule(int line, String glob, String policyText) {
        String pattern = glob.startsWith("/") ? glob.substring(1) : glob;
        // A folder stands for everything below it.
        pattern = pattern.endsWith("/") ? pattern + "**" : pattern;
        PathMatcher matcher;
        try {
            matcher = FileSystems.getDefault().getPathMatcher("glob:" + pattern);
        } catch (PatternSyntaxException e) {
            throw new IllegalArgumentException("'" + glob + "' is not a glob: " + e.getDescription());
        }
        Optional<Policy> policy = policyText.equalsIgnoreCase("none") ? Optional.empty()
                : Optional.of(Policy.parse(policyText));
        int specificity = (int) pattern.chars().filter(c -> "*?[]{},".indexOf(c) < 0).count();
        return new Rule(line, glob, policy, matcher, specificity);
    }

    /** The rule that decides for a name, if any matches. */
    public Optional<Rule> ruleFor(String name) {
        Rule best = null;
        for (Rule rule : rules) {
            if (rule.matches(name) && (best == null || rule.specificity() >= best.specificity())) {
                best = rule;
            }
        }
        return Optional.ofNullable(best);
    }

    public List<Rule> rules() {
        return rules;
    }

    public List<Problem> problems() {
        return problems;
    }
}
