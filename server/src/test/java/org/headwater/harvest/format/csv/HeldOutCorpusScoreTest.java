package org.headwater.harvest.format.csv;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.headwater.testing.External;
import org.headwater.testing.Python;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code headwater sniff --json} on a held-out corpus, written by writers the detector was never tuned on, scored
 * key by key against what each writer recorded, beside Python's {@code csv.Sniffer} on the same files:
 * <ul>
 *   <li>R's own writers (r_writer.R): write.csv, write.csv2 and write.table with R's quoting ({@code qmethod}
 *       double or escape), {@code fileEncoding} latin1/CP1252/UTF-8, {@code na=}, {@code dec=}, {@code eol=},
 *       row names (an unnamed first column; write.table's header one cell short);</li>
 *   <li>Python's csv.writer in settings the tuning corpus does not use (held_out_corpus.py): CR line ends,
 *       quotechar "'", QUOTE_NONE with an escapechar, QUOTE_NONNUMERIC, excel-tab and unix dialects, '^' '~'
 *       and space delimiters, UTF-16 in either byte order;</li>
 *   <li>hand-made traits of real folders (held_out_corpus.py): trailing delimiters, blank lines, a units row,
 *       a totals footer, ragged rows, a title line, mixed missing tokens, dotted, US and ISO-with-zone dates,
 *       currency and percent, thousands separators, an Excel sep= line, BOM + CRLF, Windows-1252 with the
 *       euro sign, no header, one column, a header alone, a very wide table.</li>
 * </ul>
 * The judgments behind the hand-made truth (the empty cell after a trailing delimiter is no column, a units
 * row is no data row, "12.5%" and "$1,234.50" are decimals) are our own and say so in the generator.
 */
class HeldOutCorpusScoreTest {
    private static final int R_FILES = 120;

    @TempDir
    Path out;

    @Test
    void sniffBeatsPythonsCsvSnifferOnEveryKeyOfACorpusFromIndependentWriters() throws Exception {
        Python.requireAvailable();
        External.need(rscriptAvailable(), "R (r-base-core, r-cran-jsonlite)");
        Path corpus = Files.createDirectories(out.resolve("held-out"));
        Path scripts = Workspaces.repoRoot().resolve("server/src/test/resources/csv/heldout");
        String seed = System.getProperty("corpusSeed", "20261203");
        runR(scripts.resolve("r_writer.R"), corpus.toString(), Integer.toString(R_FILES), seed);
        Python.run(scripts.resolve("held_out_corpus.py"), corpus.toString(), seed);

        CorpusScoreboard board = CorpusScoreboard.run(corpus,
                name -> !name.endsWith(".json") && (name.startsWith("r_") || name.startsWith("p_") || name.startsWith("h_")));

        board.print("held-out corpus (R, Python settings not tuned on, hand-made traits)", 40);
        board.assertTargets();
    }

    private static boolean rscriptAvailable() {
        try {
            Process p = new ProcessBuilder("Rscript", "-e", "library(jsonlite)").redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            return p.waitFor(60, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    private static void runR(Path script, String... args) throws IOException, InterruptedException {
        List<String> command = new java.util.ArrayList<>(List.of("Rscript", script.toString()));
        command.addAll(List.of(args));
        Process p = new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.INHERIT).start();
        if (!p.waitFor(180, TimeUnit.SECONDS) || p.exitValue() != 0) {
            throw new AssertionError("Rscript " + script + " failed");
        }
    }
}
