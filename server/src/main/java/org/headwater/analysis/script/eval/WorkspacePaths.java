package org.headwater.analysis.script.eval;

import java.nio.file.Path;
import java.util.ArrayDeque;
import java.util.Deque;

/** Turns a path the code names into the form references carry: relative to the workspace root where it lies inside. */
public final class WorkspacePaths {
    private WorkspacePaths() {
    }

    /**
     * Resolves a pattern against the working directory and the workspace root. Patterns may hold
     * {@code *}, so this works on the text, not on {@link Path}, and never touches the file system.
     */
    public static String resolve(String pattern, RunSetting run) {
        if (pattern.contains("://") || pattern.startsWith("~")) {
            return pattern; // a URL or a home-relative path: nothing in the workspace to resolve against
        }
        String slashed = pattern.replace('\\', '/');
        String absolute = slashed.startsWith("/") ? slashed : slash(run.workingDir()) + "/" + slashed;
        String normal = normalize(absolute);
        String root = slash(run.workspaceRoot());
        if (normal.equals(root)) {
            return ".";
        }
        if (normal.startsWith(root + "/")) {
            return normal.substring(root.length() + 1);
        }
        return normal;
    }

    private static String slash(Path p) {
        String s = p.toAbsolutePath().normalize().toString().replace('\\', '/');
        return s.endsWith("/") && s.length() > 1 ? s.substring(0, s.length() - 1) : s;
    }

    /** Drops {@code .} and folds {@code ..}, keeping the leading slash. */
    static String normalize(String absolute) {
        Deque<String> parts = new ArrayDeque<>();
        for (String part : absolute.split("/")) {
            if (part.isEmpty() || part.equals(".")) {
                continue;
            }
            if (part.equals("..")) {
                if (!parts.isEmpty()) {
                    parts.removeLast();
                }
                continue;
            }
            parts.addLast(part);
        }
        return "/" + String.join("/", parts);
    }
}
