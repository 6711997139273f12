package org.headwater.harvest;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.eclipse.jgit.api.Git;
import org.eclipse.jgit.api.errors.GitAPIException;
import org.eclipse.jgit.lib.Repository;
import org.eclipse.jgit.revwalk.RevCommit;
import org.eclipse.jgit.storage.file.FileRepositoryBuilder;

/**
 * Reads what git knows about files in a work tree, through JGit (pure Java: no git program needed, and
 * the same answers on every machine). One instance serves one harvest; repositories are opened once.
 */
final class GitHistory implements AutoCloseable {
    /** Commits looked at per file: enough for "who changed this", bounded for very old histories. */
    private static final int MAX_COMMITS = 500;

    /**
     * What git says about one file.
     *
     * @param commit the last commit that changed the file
     * @param authors everyone who changed it, most recent first (names only)
     */
    record FileHistory(String commit, String author, Instant committedAt, List<String> authors) {
    }

    private final Map<Path, Optional<java.io.File>> gitDirs = new HashMap<>();
    private final Map<java.io.File, Repository> repositories = new HashMap<>();

    /** The file's history, or empty when it is not in a git work tree or has no commit yet. */
    synchronized Optional<FileHistory> of(Path file) {
        Path folder = file.toAbsolutePath().getParent();
        Optional<java.io.File> gitDir = gitDirs.computeIfAbsent(folder,
                f -> Optional.ofNullable(new FileRepositoryBuilder().findGitDir(f.toFile()).getGitDir()));
        if (gitDir.isEmpty()) {
            return Optional.empty();
        }
        Repository repo = repositories.computeIfAbsent(gitDir.get(), GitHistory::open);
        if (repo == null) {
            return Optional.empty();
        }
        Path top = repo.getWorkTree().toPath().toAbsolutePath();
        String relative = top.relativize(file.toAbsolutePath()).toString().replace(java.io.File.separatorChar, '/');
        try (Git git = new Git(repo)) {
            if (repo.resolve("HEAD") == null) {
                return Optional.empty();
            }
            Set<String> authors = new LinkedHashSet<>();
            RevCommit last = null;
            for (RevCommit c : git.log().addPath(relative).setMaxCount(MAX_COMMITS).call()) {
                if (last == null) {
                    last = c;
                }
                authors.add(c.getAuthorIdent().getName());
            }
            if (last == null) {
                return Optional.empty();
            }
            return Optional.of(new FileHistory(last.getName(), last.getAuthorIdent().getName(),
                    last.getAuthorIdent().getWhenAsInstant(), new ArrayList<>(authors)));
        } catch (IOException | GitAPIException e) {
            // A damaged or unusual repository costs the git facts of this file, not the harvest.
            return Optional.empty();
        }
    }

    private static Repository open(java.io.File gitDir) {
        try {
            Repository repo = new FileRepositoryBuilder().setGitDir(gitDir).setMustExist(true).build();
            if (repo.isBare()) {
                repo.close();
                return null;
            }
            return repo;
        } catch (IOException | IllegalArgumentException e) {
            return null;
        }
    }

    @Override
    public synchronized void close() {
        repositories.values().forEach(r -> {
            if (r != null) {
                r.close();
            }
        });
        repositories.clear();
        gitDirs.clear();
    }
}
