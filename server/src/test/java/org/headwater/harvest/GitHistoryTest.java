package org.headwater.harvest;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.headwater.Catalog;
import org.headwater.testing.External;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class GitHistoryTest {

    @TempDir
    Path temp;

    /** Runs the git program (the reference) in a folder, with fixed author and committer identities. */
    private static String git(Path dir, String author, String... args) throws IOException, InterruptedException {
        List<String> command = new java.util.ArrayList<>(List.of("git", "-c", "user.name=" + author,
                "-c", "user.email=" + author.toLowerCase().replace(' ', '.') + "@example.invalid",
                "-c", "commit.gpgsign=false"));
        command.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(command).directory(dir.toFile()).redirectErrorStream(true);
        pb.environment().putAll(Map.of("GIT_AUTHOR_DATE", "2026-01-0" + (author.length() % 9 + 1) + "T10:00:00Z",
                "GIT_COMMITTER_DATE", "2026-01-0" + (author.length() % 9 + 1) + "T10:00:00Z"));
        Process p = pb.start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8).trim();
        if (!p.waitFor(30, TimeUnit.SECONDS) || p.exitValue() != 0) {
            throw new AssertionError("git " + String.join(" ", args) + " failed: " + out);
        }
        return out;
    }

    private static boolean gitAvailable() {
        try {
            return new ProcessBuilder("git", "--version").start().waitFor(10, TimeUnit.SECONDS);
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    @Test
    void scriptsInAGitWorkTreeGetTheirLastCommitAndEveryAuthor() throws Exception {
        External.need(gitAvailable(), "the git program");
        Path repo = Files.createDirectories(temp.resolve("repo"));
        git(repo, "Ada Quill", "init", "-q");
        Files.writeString(repo.resolve("clean.py"), "print(1)\n");
        git(repo, "Ada Quill", "add", "clean.py");
        git(repo, "Ada Quill", "commit", "-q", "-m", "first");
        Files.writeString(repo.resolve("clean.py"), "print(2)\n");
        git(repo, "Bo Tarn", "commit", "-q", "-am", "second");
        Files.writeString(repo.resolve("untracked.py"), "print(3)\n");
        // expected: what the git program itself reports
        String head = git(repo, "Bo Tarn", "log", "-1", "--format=%H", "--", "clean.py");

        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(repo, false, HarvestProgress.NONE);
            var scripts = catalog.reader().scripts(0, 10);
            var clean = scripts.stream().filter(s -> s.name().equals("clean.py")).findFirst().orElseThrow();
            assertThat(clean.gitCommit()).isEqualTo(head);
            assertThat(clean.gitAuthor()).isEqualTo("Bo Tarn");
            assertThat(clean.gitAuthors()).isEqualTo("[\"Bo Tarn\",\"Ada Quill\"]");
            var untracked = scripts.stream().filter(s -> s.name().equals("untracked.py")).findFirst().orElseThrow();
            assertThat(untracked.gitCommit()).isNull();
        }
    }
}
