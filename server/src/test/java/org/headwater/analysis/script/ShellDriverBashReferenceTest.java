package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The command lines Headwater reads from a driver are the ones bash runs: the driver runs under bash
 * with stand-in {@code python3}, {@code Rscript} and {@code jupyter} that log the arguments and working
 * directory they get. // reference: GNU bash, running the drivers themselves
 */
class ShellDriverBashReferenceTest {
    private static final String STUB = "#!/bin/bash\n"
            + "{ printf '%s' \"$(basename \"$0\")\"; printf '\\x1f%s' \"$PWD\" \"$@\"; printf '\\n'; } >> \"$HEADWATER_STUB_LOG\"\n";

    @Test
    void fixtureDriverPassesWhatBashPasses(@TempDir Path tmp) throws Exception {
        compare(Refs.resource("/scripts/workspace"), "run_pipeline.sh", tmp);
    }

    @Test
    void demoDriverPassesWhatBashPasses(@TempDir Path tmp) throws Exception {
        Path demo = External.demoWorkspace();
        org.junit.jupiter.api.Assumptions.assumeTrue(Files.isRegularFile(demo.resolve("run_all.sh")),
                "the demo workspace is not in this checkout: skipping");
        compare(demo, "run_all.sh", tmp);
    }

    private static void compare(Path workspace, String driver, Path tmp) throws Exception {
        External.need(External.onPath("bash"), "bash");
        Path root = tmp.resolve("ws");
        Files.createDirectories(root);
        Files.copy(workspace.resolve(driver), root.resolve(driver));
        Path bin = Files.createDirectories(tmp.resolve("bin"));
        for (String name : List.of("python3", "Rscript", "jupyter", "psql")) {
            Path stub = bin.resolve(name);
            Files.writeString(stub, STUB);
            Files.setPosixFilePermissions(stub, PosixFilePermissions.fromString("rwxr-xr-x"));
        }
        Path log = tmp.resolve("calls.log");
        Files.writeString(log, "");
        External.run(tmp, List.of("bash", root.resolve(driver).toString()), Map.of(
                "PATH", bin + ":" + System.getenv("PATH"), "HEADWATER_STUB_LOG", log.toString()));

        List<String> bash = new ArrayList<>();
        for (String line : Files.readAllLines(log)) {
            List<String> fields = Arrays.asList(line.split("\u001f", -1));
            Path cwd = root.toRealPath().relativize(Path.of(fields.get(1)).toRealPath());
            List<String> argv = fields.subList(2, fields.size());
            int script = 0;
            while (script < argv.size() && !argv.get(script).matches(".*\\.(py|R|ipynb)")) {
                script++;
            }
            boolean notebook = fields.get(0).equals("jupyter");
            bash.add(cwd.resolve(argv.get(script)).normalize() + " " + (notebook ? List.of() : argv.subList(script + 1, argv.size())));
        }
        List<String> headwater = new ShellDriverAnalyzer().analyze(workspace, Path.of(driver)).stream()
                .map(i -> i.script() + " " + i.args()).toList();
        assertThat(headwater).containsExactlyElementsOf(bash);
        assertThat(headwater).isNotEmpty();
    }

    @Test
    void argumentsWithSpacesQuotesAndVariablesAreSplitAsBashSplitsThem(@TempDir Path tmp) throws Exception {
        Path ws = Files.createDirectories(tmp.resolve("quoting"));
        Files.writeString(ws.resolve("drive.sh"), String.join("\n",
                "#!/usr/bin/env bash",
                "cd \"$(dirname \"$0\")\"",
                "NAME='hive  one'",
                "DIR=raw/\"scales 2\"",
                "python3 a.py --label \"$NAME\" --dir $DIR/x.csv 'single $NAME' plain\\ escaped \"mixed\"'quotes'",
                "Rscript b.R \"${DIR}/y.csv\" --flag",
                "for f in one two; do python3 c.py \"$f.csv\"; done",
                ""));
        compare(ws, "drive.sh", tmp.resolve("run"));
    }
}
