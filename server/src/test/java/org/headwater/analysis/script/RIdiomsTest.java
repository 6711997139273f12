package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** R idioms one by one; expected values follow the R Language Definition and package manuals (from memory). */
class RIdiomsTest {
    @TempDir
    Path ws;

    @Test
    void functionsOfTheScriptAreFollowedAtTheirCalls() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "library(readr)",
                "load_year <- function(y, dir = \"raw\") {", "  read_csv(file.path(dir, paste0(\"y\", y, \".csv\")))", "}",
                "load_year(2023)", "load_year(2024, dir = \"old\")").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ raw/y2023.csv @3", "READ old/y2024.csv @3");
    }

    @Test
    void unqualifiedCallOfAPackageNotAttachedIsLessSure() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "x <- read_parquet(\"raw/a.parquet\")", "y <- arrow::read_parquet(\"raw/b.parquet\")").analyze("m.R");
        assertThat(a.references()).extracting(r -> r.target() + " " + r.confidence()).containsExactly("raw/a.parquet 0.8", "raw/b.parquet 1.0");
    }

    @Test
    void tidyverseAttachesReadr() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "library(tidyverse)", "read_csv(\"raw/a.csv\")").analyze("m.R");
        assertThat(a.references()).extracting(DataReference::confidence).containsExactly(1.0);
    }

    @Test
    void magrittrPipeAndDotPlaceholderPassTheFrame() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "library(readr)", "library(dplyr)",
                "read_csv(\"raw/a.csv\") %>% select(k, v) %>% write_csv(\"work/one.csv\")",
                "read_csv(\"raw/b.csv\") %>% write.csv(file = \"work/two.csv\", x = .)").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ raw/a.csv @3", "WRITE work/one.csv @3", "READ raw/b.csv @4", "WRITE work/two.csv @4");
        assertThat(Refs.flowsInto(a, "work/one.csv")).containsExactly("k <- raw/a.csv#k (direct)", "v <- raw/a.csv#v (direct)");
    }

    @Test
    void everyAssignmentArrowBindsAndFalseConstantsSkipCode() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R",
                "a <- \"raw\"", "\"x.csv\" -> b", "c = file.path(a, b)", "f <- function() { d <<- \"raw/d.csv\" }", "f()",
                "readRDS(c)", "readRDS(d)", "if (F) readRDS(\"raw/never.rds\")", "while (FALSE) { readRDS(\"raw/never2.rds\") }").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ raw/x.csv @6", "READ raw/d.csv @7");
    }

    @Test
    void sourcedFileGivesItsVariables() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("config.R", "RAW_DIR <- file.path(\"data\", \"raw\")")
                .file("m.R", "source(\"config.R\")", "read.csv(file.path(RAW_DIR, \"sites.csv\"))").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ data/raw/sites.csv @2");
    }

    @Test
    void vectorOfPathsGivesOneReferenceEach() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "files <- file.path(\"raw\", c(\"a.csv\", \"b.csv\"))", "data.table::fread(files[1])",
                "arrow::open_dataset(files)").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ raw/a.csv @2", "READ raw/a.csv @3", "READ raw/b.csv @3");
    }

    @Test
    void groupedSummariseGivesKeysAndDerivedAggregates() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "library(readr)", "library(dplyr)",
                "w <- read_csv(\"raw/w.csv\")", "s <- w |> group_by(hive) |> summarise(mean_kg = mean(kg), n = n())",
                "write_csv(s, \"work/s.csv\")").analyze("m.R");
        assertThat(Refs.flowsInto(a, "work/s.csv")).containsExactly("hive <- raw/w.csv#hive (direct)", "mean_kg <- raw/w.csv#kg (derived)");
        assertThat(a.flows().get(0).datasetLevelOnly()).isFalse();
    }

    @Test
    void commandArgsWithoutDriverIsUnresolvedAndWithDriverIsTheArgument() throws Exception {
        Snippets s = new Snippets(ws).file("m.R", "args <- commandArgs(trailingOnly = TRUE)", "read.csv(args[[1]])");
        assertThat(Refs.of(s.analyze("m.R"))).containsExactly("READ ? @2 [args[[1]]]");
        assertThat(Refs.of(s.analyze("m.R", List.of("raw/given.csv")))).containsExactly("READ raw/given.csv @2");
    }

    @Test
    void readsInsideASourcedFunctionArePlacedAtTheCallInThisScript() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("helpers.R", "", "", "load_site <- function(n) readRDS(paste0(\"raw/\", n, \".rds\"))")
                .file("m.R", "source(\"helpers.R\")", "", "s <- load_site(\"north\")").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ raw/north.rds @3");
    }

    @Test
    void pasteJoinsWithItsSeparator() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "readRDS(paste(\"raw/part\", 3, \"a.rds\", sep = \"_\"))",
                "readRDS(here::here(\"raw\", \"b.rds\"))").analyze("m.R");
        // reference: R documentation of paste (sep) and here::here (paths from the project root)
        assertThat(Refs.of(a)).containsExactly("READ raw/part_3_a.rds @1", "READ raw/b.rds @2");
    }

    @Test
    void dbiTablesAreReadAndWrittenByName() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("m.R", "library(DBI)", "con <- dbConnect(RSQLite::SQLite(), \"work/coop.db\")",
                "hives <- dbReadTable(con, \"hives\")", "dbWriteTable(con, name = \"hives_copy\", value = hives)").analyze("m.R");
        assertThat(Refs.of(a)).containsExactly("READ table:hives @3", "WRITE table:hives_copy @4");
        assertThat(a.flows()).singleElement().satisfies(f -> assertThat(f.sources()).containsExactly("table:hives"));
    }
}
