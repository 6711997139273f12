package org.headwater.harvest.format.csv;

import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.testing.Python;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code headwater sniff --json} against ground truth on a generated corpus of messy files, scored key by key,
 * with Python's {@code csv.Sniffer} (the standard library's dialect guesser) scored on the same files as the
 * baseline. The generator (messy_corpus.py) writes every file with Python's csv.writer and records what it
 * wrote; it hands the Sniffer text already decoded, so the baseline is, if anything, favoured. This is the
 * corpus the detector was developed against; {@link HeldOutCorpusScoreTest} is the one it was not.
 */
class MessyCorpusScoreTest {
    private static final int FILES = 300;

    @TempDir
    Path out;

    @Test
    void sniffBeatsPythonsCsvSnifferOnEveryKeyOfAMessyCorpus() throws Exception {
        Python.requireAvailable();
        Path corpus = Files.createDirectories(out.resolve("corpus"));
        Python.run(Workspaces.repoRoot().resolve("server/src/test/resources/csv/messy_corpus.py"),
                corpus.toString(), Integer.toString(FILES), System.getProperty("corpusSeed", "20261202"));

        CorpusScoreboard board = CorpusScoreboard.run(corpus, name -> name.startsWith("f_"));

        board.print("messy corpus, " + FILES + " files", 12);
        board.assertTargets();
    }
}
