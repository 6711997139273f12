package org.headwater.impact;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.eclipse.jgit.api.Git;
import org.eclipse.jgit.api.errors.GitAPIException;
import org.eclipse.jgit.lib.PersonIdent;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;

/**
 * The invented seed-library workspace ({@code src/test/resources/impact/seed-library}, see its README),
 * copied to a temporary folder, made a git work tree with two invented authors, and harvested.
 *
 * <p>Git history: Wren Maddox commits everything; then Ivo Marsh changes {@code scripts/rates.py} and
 * {@code scripts/plot_rates.py}. So git names [Ivo Marsh, Wren Maddox] for those two (most recent first)
 * and [Wren Maddox] for every other script.
 */
final class SeedLibrary {
    static final String SETS = "raw/trays/week=*/trays.csv";

    private SeedLibrary() {
    }

    static Path copy(Path temp) throws IOException {
        Path from = Workspaces.repoRoot().resolve("server/src/test/resources/impact/seed-library");
        Path to = temp.resolve("seed-library");
        try (Stream<Path> paths = Files.walk(from)) {
            for (Path p : (Iterable<Path>) paths::iterator) {
                Path out = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(out);
                } else {
                    Files.copy(p, out);
                }
            }
        }
        try (Git git = Git.init().setDirectory(to.toFile()).setInitialBranch("main").call()) {
            git.add().addFilepattern(".").call();
            git.commit().setAuthor(new PersonIdent("Wren Maddox", "wren@example.invalid"))
                    .setCommitter(new PersonIdent("Wren Maddox", "wren@example.invalid"))
                    .setMessage("Germination trials, first season").setSign(false).call();
            for (String script : new String[] {"scripts/rates.py", "scripts/plot_rates.py"}) {
                Files.writeString(to.resolve(script), "# reviewed for the spring newsletter\n",
                        java.nio.file.StandardOpenOption.APPEND);
                git.add().addFilepattern(script).call();
            }
            git.commit().setAuthor(new PersonIdent("Ivo Marsh", "ivo@example.invalid"))
                    .setCommitter(new PersonIdent("Ivo Marsh", "ivo@example.invalid"))
                    .setMessage("Review the rate scripts").setSign(false).call();
        } catch (GitAPIException e) {
            throw new IOException("Could not make the fixture a git work tree", e);
        }
        return to;
    }

    /** A fresh catalog holding a harvest of a fresh copy. */
    static Catalog harvested(Path temp) throws IOException {
        Path workspace = copy(temp);
        Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        return catalog;
    }
}
