package org.headwater.analysis.script;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.headwater.model.Language;

/**
 * Analyses every script of a workspace: shell drivers first, so that their command lines feed the
 * scripts they run, then every Python, notebook and R script. Hidden folders are skipped.
 */
public final class WorkspaceAnalysis {
    private static final org.slf4j.Logger LOG = org.slf4j.LoggerFactory.getLogger(WorkspaceAnalysis.class);

    private final ScriptAnalyzer analyzer = new ScriptAnalyzer();
    private final ShellDriverAnalyzer drivers = new ShellDriverAnalyzer();

    /** Analyses every script found under the root. */
    public List<ScriptAnalysis> analyze(Path workspaceRoot, AnalysisContext ctx) throws IOException {
        Path root = workspaceRoot.toAbsolutePath().normalize();
        return analyze(root, scripts(root), ctx);
    }

    /**
     * Analyses the given scripts, paths relative to the root in name order: a harvest passes the scripts its
     * own listing found, so the tree is not walked a second time.
     */
    public List<ScriptAnalysis> analyze(Path workspaceRoot, List<Path> scripts, AnalysisContext ctx) {
        Path root = workspaceRoot.toAbsolutePath().normalize();
        List<ScriptInvocation> invocations = new ArrayList<>(ctx.invocations());
        for (Path s : scripts) {
            if (Language.ofFileName(s.getFileName().toString()).orElse(null) == Language.SHELL) {
                try {
                    invocations.addAll(drivers.analyze(root, s));
                } catch (IOException e) {
                    skip(s, e);
                }
            }
        }
        AnalysisContext full = ctx.withInvocations(invocations);
        List<ScriptAnalysis> out = new ArrayList<>();
        for (Path s : scripts) {
            try {
                out.add(analyzer.analyze(root, s, full));
            } catch (IOException e) {
                skip(s, e);
            }
        }
        return out;
    }

    /** One script that cannot be read (not UTF-8, a notebook that is not JSON) must not cost the others theirs. */
    private static void skip(Path script, IOException e) {
        LOG.warn("Script {} not analysed: {}", script, e.getMessage());
    }

    /** Whether a workspace file is one {@link #analyze} analyses: a script of any language but SQL. */
    public static boolean analysed(String fileName) {
        return Language.ofFileName(fileName).filter(l -> l != Language.SQL).isPresent();
    }

    private static List<Path> scripts(Path root) throws IOException {
        try (Stream<Path> files = Files.walk(root)) {
            return files.filter(Files::isRegularFile)
                    .map(root::relativize)
                    .filter(p -> {
                        for (Path part : p) {
                            if (part.toString().startsWith(".")) {
                                return false;
                            }
                        }
                        return true;
                    })
                    .filter(p -> analysed(p.getFileName().toString()))
                    .sorted(Comparator.comparing(Path::toString))
                    .toList();
        }
    }
}
