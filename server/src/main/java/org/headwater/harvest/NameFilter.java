package org.headwater.harvest;

import java.nio.file.FileSystems;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.List;

/**
 * Which objects of a root a source harvests, by glob over the name relative to the root ({@code *} within
 * one path segment, {@code **} across segments, as {@link java.nio.file.FileSystem#getPathMatcher} defines
 * them). No include patterns means everything; an exclude wins over an include.
 */
public final class NameFilter {
    /** Selects every object. */
    public static final NameFilter ALL = new NameFilter(List.of(), List.of());

    private final List<String> include;
    private final List<String> exclude;
    private final List<PathMatcher> includes;
    private final List<PathMatcher> excludes;

    private NameFilter(List<String> include, List<String> exclude) {
        this.include = List.copyOf(include);
        this.exclude = List.copyOf(exclude);
        this.includes = this.include.stream().map(NameFilter::matcher).toList();
        this.excludes = this.exclude.stream().map(NameFilter::matcher).toList();
    }

    /**
     * @throws IllegalArgumentException naming the pattern when one is not a valid glob
     */
    public static NameFilter of(List<String> include, List<String> exclude) {
        return new NameFilter(include == null ? List.of() : include, exclude == null ? List.of() : exclude);
    }

    public boolean selects(String relativeName) {
        Path path = Path.of(relativeName);
        if (excludes.stream().anyMatch(m -> m.matches(path))) {
            return false;
        }
        return includes.isEmpty() || includes.stream().anyMatch(m -> m.matches(path));
    }

    private static PathMatcher matcher(String glob) {
        try {
            return FileSystems.getDefault().getPathMatcher("glob:" + glob);
        } catch (RuntimeException e) {
            String why = e instanceof java.util.regex.PatternSyntaxException p ? p.getDescription() : e.getMessage();
            throw new IllegalArgumentException("Not a valid glob pattern: '" + glob + "': " + why, e);
        }
    }

    @Override
    public String toString() {
        return "include " + include + ", exclude " + exclude;
    }
}
