# Tests of the Headwater R connector.  Plain base R; from the repository root:
#
#   Rscript connectors/r/tests/run-tests.R
#
# The package is installed into a temporary library first.  Every script
# runs in a child Rscript with HOME, the spool and the server address set
# for that test; the only server is a loopback receiver (receiver.py).
# Checks use outside references where there is one: the sha256sum program
# for hashes, R itself for what the script would have done, Python's json,
# zlib and xml.etree, qpdf/pdfinfo for PDF files.  Tests needing something
# missing are skipped, or fail when HEADWATER_REQUIRE_EXTERNAL=true.
# Exits non-zero when a check fails; the last line is "N passed, N failed".

this_file <- normalizePath(sub("^--file=", "", grep("^--file=", commandArgs(), value = TRUE)[1]))
tests_dir <- dirname(this_file)
pkg_dir <- dirname(tests_dir)
source(file.path(tests_dir, "json-read.R"))

require_external <- identical(tolower(Sys.getenv("HEADWATER_REQUIRE_EXTERNAL")), "true")
passed <- 0L; failed <- 0L; skipped <- 0L
check <- function(name, ok, detail = NULL) {
  if (isTRUE(ok)) { passed <<- passed + 1L; cat("ok   ", name, "\n") }
  else {
    failed <<- failed + 1L
    cat("FAIL ", name, "\n")
    if (!is.null(detail)) cat(paste0("     ", utils::capture.output(print(detail)), collapse = "\n"), "\n")
  }
}
skip <- function(name, why) {
  if (require_external) check(paste(name, "(needs", why, "; HEADWATER_REQUIRE_EXTERNAL=true)"), FALSE)
  else { skipped <<- skipped + 1L; cat("skip ", name, ":", why, "is not available\n") }
}
have_pkg <- function(p) requireNamespace(p, quietly = TRUE)
have_prog <- function(p) nzchar(Sys.which(p))

# ------------------------------------------------------------- set-up
root <- tempfile("hw-r-tests-")
dir.create(root)
lib <- file.path(root, "lib"); dir.create(lib)
inst <- system2(file.path(R.home("bin"), "R"), c("CMD", "INSTALL", "--no-test-load", "-l", shQuote(lib), shQuote(pkg_dir)),
                stdout = file.path(root, "install.log"), stderr = file.path(root, "install.log"))
if (inst != 0) { cat(readLines(file.path(root, "install.log")), sep = "\n"); stop("R CMD INSTALL failed") }
Sys.setenv(R_LIBS = paste(c(lib, .libPaths()), collapse = .Platform$path.sep))
hw <- loadNamespace("headwater", lib.loc = lib)
state <- hw$.hw
home <- file.path(root, "home"); dir.create(home)
rscript <- file.path(R.home("bin"), "Rscript")

# Run Rscript with these arguments in folder `wd` with extra environment;
# returns status, stdout and stderr (as text).
rs <- function(args, wd, env = character(), profile = NULL) {
  out <- tempfile(tmpdir = root); err <- tempfile(tmpdir = root)
  base_env <- c(HOME = home, HEADWATER_SPOOL = file.path(wd, "spool.ndjson"), HEADWATER_URL = "",
                HEADWATER_TOKEN = "", HEADWATER_CAPTURE = "", HEADWATER_STAMP = "", HEADWATER_HASH_CAP = "",
                R_PROFILE_USER = if (is.null(profile)) file.path(root, "empty-profile.R") else profile,
                LANG = "C.UTF-8", LC_ALL = "C.UTF-8")
  base_env[names(env)] <- env
  old <- Sys.getenv(names(base_env), unset = NA, names = TRUE)
  do.call(Sys.setenv, as.list(base_env))
  owd <- setwd(wd)
  status <- system2(rscript, shQuote(args), stdout = out, stderr = err)
  setwd(owd)
  for (n in names(old)) if (is.na(old[[n]])) Sys.unsetenv(n) else do.call(Sys.setenv, as.list(old[n]))
  list(status = status, out = paste(readLines(out, warn = FALSE), collapse = "\n"),
       err = paste(readLines(err, warn = FALSE), collapse = "\n"))
}
writeLines("", file.path(root, "empty-profile.R"))
run_expr <- function(script, extra = "") sprintf("headwater::run(%s%s)", deparse(script), extra)

new_dir <- function(name) { d <- file.path(root, name); dir.create(d); normalizePath(d) }
spool_records <- function(wd) {
  f <- file.path(wd, "spool.ndjson")
  if (!file.exists(f)) return(list())
  l <- readLines(f, encoding = "UTF-8", warn = FALSE)
  lapply(l[nzchar(l)], json_read)
}
last_record <- function(wd) { r <- spool_records(wd); if (length(r)) r[[length(r)]] else NULL }
sha256sum <- function(path) sub(" .*$", "", system2("sha256sum", shQuote(path), stdout = TRUE))
io_of <- function(rec, path, direction) {
  for (e in rec$io) if (identical(e$path, path) && identical(e$direction, direction)) return(e)
  NULL
}
count_io <- function(rec, path, direction) sum(vapply(rec$io, function(e) identical(e$path, path) && identical(e$direction, direction), TRUE))

# The loopback receiver: returns list(port, pid, bodies file).
start_receiver <- function(status = 201L) {
  pf <- tempfile(tmpdir = root); bodies <- tempfile(tmpdir = root)
  system2("python3", c(shQuote(file.path(tests_dir, "receiver.py")), shQuote(pf), shQuote(bodies), status), wait = FALSE)
  for (i in 1:100) { if (file.exists(pf)) break; Sys.sleep(0.05) }
  v <- as.integer(strsplit(readLines(pf, warn = FALSE), " ")[[1]])
  list(port = v[1], pid = v[2], bodies = bodies, url = sprintf("http://127.0.0.1:%d", v[1]))
}
stop_receiver <- function(r) { tools::pskill(r$pid); Sys.sleep(0.2) }
received <- function(r) {
  if (!file.exists(r$bodies)) return(list())
  l <- readLines(r$bodies, encoding = "UTF-8", warn = FALSE)
  lapply(strsplit(l[nzchar(l)], "\t", fixed = TRUE), function(p)
    list(path = p[1], auth = p[2], body = paste(p[-(1:2)], collapse = "\t"), record = json_read(paste(p[-(1:2)], collapse = "\t"))))
}

# ------------------------------------------------------------- units
# CRC-32 check value: CRC-32 of the ASCII string "123456789" is cbf43926
# (the published check value of CRC-32/ISO-HDLC, the CRC the PNG spec uses).
check("crc32 of '123456789' is the published check value cbf43926",
      identical(hw$crc32_hex(charToRaw("123456789")), "cbf43926"))
local({
  set.seed(5); bytes <- as.raw(sample(0:255, 3000, TRUE))
  f <- tempfile(tmpdir = root); writeBin(bytes, f)
  if (have_prog("python3")) {
    # expected: Python's zlib.crc32
    py <- system2("python3", c("-c", shQuote(sprintf("import zlib;print('%%08x'%%zlib.crc32(open('%s','rb').read()))", f))), stdout = TRUE)
    check("crc32 of 3000 random bytes matches Python's zlib.crc32", identical(hw$crc32_hex(bytes), py))
  } else skip("crc32 against zlib", "python3")
})

local({
  had <- exists(".Random.seed", envir = globalenv())
  set.seed(42); seed <- .Random.seed
  ids <- replicate(20, hw$uuid4())
  check("uuid4 is RFC 4122 version 4, variant 10xx",
        all(grepl("^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$", ids)) && !anyDuplicated(ids))
  check("making run ids leaves the script's random number state as it was", identical(.Random.seed, seed))
})

if (have_prog("python3")) {
  # expected: Python's datetime for the same instant
  py <- system2("python3", c("-c", shQuote("import datetime as d;print(d.datetime.fromtimestamp(1798927200.1234, d.timezone.utc).strftime('%Y-%m-%dT%H:%M:%S.%f')[:23]+'Z')")), stdout = TRUE)
  check("iso_utc gives ISO 8601 UTC with milliseconds (as Python's datetime)",
        identical(hw$iso_utc(0), "1970-01-01T00:00:00.000Z") && identical(hw$iso_utc(1798927200.1234), py), list(hw$iso_utc(1798927200.1234), py))
} else skip("iso_utc against Python's datetime", "python3")

local({
  # Strings that need escaping; expected: Python's json module decodes the
  # writer's output to exactly these characters.
  s <- c("plain", "quote \" and backslash \\", "tab\tnew\nline\rcr", "ctrl \001\002\037 del \177",
         "unicode \u00e9\u4e2d\U0001F600", "slash / ok")
  js <- hw$to_json(list(s = hw$json_array(s), n = NULL, t = TRUE, i = 12345678901, d = 0.1, e = hw$json_array(character())))
  if (have_prog("python3")) {
    jf <- tempfile(tmpdir = root); writeBin(charToRaw(enc2utf8(js)), jf)
    hex <- vapply(s, function(x) paste(sprintf("%02x", as.integer(charToRaw(enc2utf8(x)))), collapse = ""), "")
    hf <- tempfile(tmpdir = root); writeLines(hex, hf)
    code <- sprintf(paste0("import json\nd=json.loads(open('%s','rb').read().decode('utf-8'))\n",
                           "want=[bytes.fromhex(h).decode('utf-8') for h in open('%s').read().split()]\n",
                           "print(d['s']==want and d['n'] is None and d['t'] is True and d['i']==12345678901 and d['d']==0.1 and d['e']==[])"), jf, hf)
    res <- system2("python3", c("-c", shQuote(code)), stdout = TRUE, stderr = TRUE)
    check("JSON writer escapes quotes, backslashes and control characters and keeps UTF-8 (Python json decodes it)",
          identical(res, "True"), list(js, res))
  } else skip("JSON writer against Python json", "python3")
})

local({
  f <- tempfile(tmpdir = root); writeBin(charToRaw("hello headwater\n"), f)
  ref <- sha256sum(f)
  backends <- c(if (have_pkg("digest")) "digest", "sha256sum")
  for (b in backends) {
    options(headwater.sha256 = b); state$sha_backend <- NULL; state$hash_cache <- NULL
    check(paste("SHA-256 via", b, "equals the sha256sum program"), identical(hw$sha256_file(f), ref))
  }
  options(headwater.sha256 = NULL); state$sha_backend <- NULL; state$hash_cache <- NULL
  if (!have_pkg("digest")) skip("SHA-256 via the digest package", "the digest package")
})

# ------------------------------------------------------------- reads and writes
wd <- new_dir("io")
writeLines(c(
  'df <- data.frame(id = 1:4, name = c("a", "b", "c", "SECRET-CELL-VALUE"), score = c(1.5, 2, 3.25, 4), stringsAsFactors = FALSE)',
  'write.csv(df, "out/plain.csv", row.names = FALSE)',
  'back <- read.csv("out/plain.csv")',
  'back2 <- read.csv("out/plain.csv")',
  'write.table(df, "out/table.tsv", sep = "\\t", quote = FALSE)',
  't2 <- read.delim("out/table.tsv")',
  'saveRDS(df, "out/df.rds")',
  'r <- readRDS("out/df.rds")',
  'keep <- 1:3; save(keep, df, file = "out/both.RData")',
  'load("out/both.RData")',
  'cat(nrow(back), "\\n")'), file.path(wd, "io.R"))
dir.create(file.path(wd, "out"))
res <- rs(c("-e", (run_expr("io.R"))), wd)
rec <- last_record(wd)
check("run(): a script's reads and writes give one run record in the spool", res$status == 0 && !is.null(rec), res)
if (!is.null(rec)) {
  out <- normalizePath(file.path(wd, "out"))
  expect <- list(
    list("plain.csv", "write", "utils::write.csv", c("id", "name", "score"), c("integer", "character", "numeric"), 4),
    list("plain.csv", "read", "utils::read.csv", c("id", "name", "score"), c("integer", "character", "numeric"), 4),
    list("table.tsv", "write", "utils::write.table", c("id", "name", "score"), c("integer", "character", "numeric"), 4),
    list("table.tsv", "read", "utils::read.delim", NULL, NULL, NULL),
    list("df.rds", "write", "base::saveRDS", c("id", "name", "score"), c("integer", "character", "numeric"), 4),
    list("df.rds", "read", "base::readRDS", c("id", "name", "score"), c("integer", "character", "numeric"), 4),
    list("both.RData", "write", "base::save", NULL, NULL, NULL),
    list("both.RData", "read", "base::load", NULL, NULL, NULL))
  for (x in expect) {
    p <- file.path(out, x[[1]])
    e <- io_of(rec, p, x[[2]])
    check(sprintf("%s %s recorded with its absolute path, via %s", x[[2]], x[[1]], x[[3]]),
          !is.null(e) && identical(e$via, x[[3]]), e)
    if (is.null(e)) next
    # expected: the file's size from the file system, its hash from sha256sum
    check(sprintf("%s %s: bytes and SHA-256 equal the file's (sha256sum)", x[[2]], x[[1]]),
          e$bytes == file.info(p)$size && identical(e$sha256, sha256sum(p)), e)
    if (!is.null(x[[4]]))
      check(sprintf("%s %s: columns, classes and row count as R reports them", x[[2]], x[[1]]),
            identical(unlist(e$frame$columns), x[[4]]) && identical(unlist(e$frame$dtypes), x[[5]]) &&
              e$frame$rows == x[[6]], e$frame)
  }
  # expected: R's own reading of the file written with row names
  t2 <- read.delim(file.path(out, "table.tsv"))
  e <- io_of(rec, file.path(out, "table.tsv"), "read")
  check("read.delim's data frame facts equal R's own read of the file",
        !is.null(e) && identical(unlist(e$frame$columns), names(t2)) &&
          identical(unlist(e$frame$dtypes), unname(vapply(t2, function(c) class(c)[1], ""))) && e$frame$rows == nrow(t2), e)
  check("a file read twice is one io entry (deduplicated per path and direction)",
        count_io(rec, file.path(out, "plain.csv"), "read") == 1)
  check("record fields: client, language, script path and SHA-256, R version, cwd",
        identical(rec$client, "headwater-r/0.1.0") && identical(rec$script$language, "r") &&
          identical(rec$script$path, file.path(wd, "io.R")) && identical(rec$script$sha256, sha256sum(file.path(wd, "io.R"))) &&
          identical(rec$r, paste(R.version$major, R.version$minor, sep = ".")) && identical(rec$cwd, wd), rec[c("client", "script", "r", "cwd")])
  check("record holds user and host from Sys.info(), exit code 0, no exception",
        identical(rec$user, Sys.info()[["user"]]) && identical(rec$host, Sys.info()[["nodename"]]) &&
          rec$exit_code == 0 && is.null(rec$exception))
  iso <- "^\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d\\.\\d{3}Z$"
  check("start, end and io times are ISO 8601 UTC with milliseconds, end not before start",
        grepl(iso, rec$started_at, perl = TRUE) && grepl(iso, rec$ended_at, perl = TRUE) &&
          all(vapply(rec$io, function(e) grepl(iso, e$at, perl = TRUE), TRUE)) && rec$ended_at >= rec$started_at)
  check("the run id is a UUID version 4", grepl("^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$", rec$run_id))
  line <- readLines(file.path(wd, "spool.ndjson"), warn = FALSE)
  check("no cell value is in the record (only names, classes, counts, hashes)", !any(grepl("SECRET-CELL-VALUE", line, fixed = TRUE)))
}

# readr and data.table
if (have_pkg("readr") && have_pkg("data.table")) {
  wd <- new_dir("libs")
  writeLines(c('suppressMessages({library(readr); library(data.table)})',
               'x <- data.frame(k = c("p", "q"), v = c(10L, 20L))',
               'readr::write_csv(x, "r.csv")',
               'a <- read_csv("r.csv", show_col_types = FALSE)',
               'write_tsv(a, "r.tsv")',
               'b <- readr::read_tsv("r.tsv", show_col_types = FALSE)',
               'fwrite(x, "d.csv")',
               'd <- fread("d.csv")',
               'cat(nrow(d), "\\n")'), file.path(wd, "libs.R"))
  res <- rs(c("-e", (run_expr("libs.R"))), wd)
  rec <- last_record(wd)
  check("readr and data.table script runs and is recorded", res$status == 0 && !is.null(rec), res)
  if (!is.null(rec)) {
    for (x in list(list("r.csv", "write", "readr::write_csv"), list("r.csv", "read", "readr::read_csv"),
                   list("r.tsv", "write", "readr::write_tsv"), list("r.tsv", "read", "readr::read_tsv"),
                   list("d.csv", "write", "data.table::fwrite"), list("d.csv", "read", "data.table::fread"))) {
      p <- file.path(wd, x[[1]]); e <- io_of(rec, p, x[[2]])
      check(sprintf("%s %s via %s with size and sha256sum hash", x[[3]], x[[1]], x[[2]]),
            !is.null(e) && identical(e$via, x[[3]]) && e$bytes == file.info(p)$size && identical(e$sha256, sha256sum(p)), e)
    }
    # expected: what readr and data.table themselves return for the files
    a <- readr::read_csv(file.path(wd, "r.csv"), show_col_types = FALSE)
    d <- data.table::fread(file.path(wd, "d.csv"))
    ea <- io_of(rec, file.path(wd, "r.csv"), "read"); ed <- io_of(rec, file.path(wd, "d.csv"), "read")
    check("read_csv frame facts equal readr's own result",
          identical(unlist(ea$frame$columns), names(a)) && identical(unlist(ea$frame$dtypes), unname(vapply(a, function(c) class(c)[1], ""))) && ea$frame$rows == nrow(a), ea$frame)
    check("fread frame facts equal data.table's own result",
          identical(unlist(ed$frame$columns), names(d)) && identical(unlist(ed$frame$dtypes), unname(vapply(d, function(c) class(c)[1], ""))) && ed$frame$rows == nrow(d), ed$frame)
  }
} else skip("readr and data.table capture", "readr or data.table")

# ------------------------------------------------------------- behaviour unchanged
wd <- new_dir("same")
writeLines(c(
  'args <- commandArgs(trailingOnly = TRUE)',
  'print(args)',
  'cat("random seed exists:", exists(".Random.seed"), "\\n")',
  'df <- data.frame(a = 1:2)',
  'saveRDS(df, "d.rds")',
  'readRDS("d.rds")',
  'write.csv(df)',
  'print(withVisible(saveRDS(df, "e.rds"))$visible)',
  'print(withVisible(readRDS("e.rds"))$visible)',
  'x <- 1; save(x, file = "x.RData"); load("x.RData")',
  'f <- function() parent.frame(); e <- new.env(); local(load("x.RData", envir = e)); print(ls(e))',
  'png("p.png"); plot(1); dev.off()',
  'warning("visible warning")',
  'message("a message")'), file.path(wd, "same.R"))
plain <- rs(c("same.R", "one", "two words"), wd)
viarun <- rs(c("-e", (run_expr("same.R", ', args = c("one", "two words")'))), wd)
check("run(script, args=): stdout, stderr and exit status equal plain Rscript",
      identical(plain[c("status", "out", "err")], viarun[c("status", "out", "err")]), list(plain, viarun))
viaargs <- rs(c("-e", (run_expr("same.R")), "--args", "one", "two words"), wd)
check("run() with --args a b: the script sees the same commandArgs()", identical(plain$out, viaargs$out), list(plain$out, viaargs$out))
check("the record's args are the script's trailing arguments", identical(unlist(last_record(wd)$args), c("one", "two words")))
writeLines('if (requireNamespace("headwater", quietly = TRUE)) headwater::auto()', file.path(root, "auto-profile.R"))
plain_p <- rs(c("same.R", "one"), wd, profile = file.path(root, "auto-profile.R"))
n_before <- length(spool_records(wd))
auto <- rs(c("same.R", "one"), wd, env = c(HEADWATER_CAPTURE = "1"), profile = file.path(root, "auto-profile.R"))
check("HEADWATER_CAPTURE=1 with the .Rprofile line: output and status unchanged (in-process hooks)",
      identical(plain_p[c("status", "out", "err")], auto[c("status", "out", "err")]), list(plain_p, auto))
check("HEADWATER_CAPTURE=1 records the run; without it the profile line records nothing",
      length(spool_records(wd)) == n_before + 1 && identical(last_record(wd)$script$path, file.path(wd, "same.R")))

n_before <- length(spool_records(wd))
both <- rs(c("-e", run_expr("same.R")), wd, env = c(HEADWATER_CAPTURE = "1"), profile = file.path(root, "auto-profile.R"))
check("run() under HEADWATER_CAPTURE=1 with the profile line gives exactly one record",
      both$status == 0 && length(spool_records(wd)) == n_before + 1, both)

# ------------------------------------------------------------- errors
wd <- new_dir("errors")
writeLines(c(
  'f <- function(x) g(x)',
  'g <- function(x) stop(structure(class = c("badInput", "error", "condition"), list(message = "x is too big", call = sys.call())))',
  'write.csv(data.frame(q = 1), "before.csv")',
  'cat("before the error\\n")',
  'f(2)',
  'cat("not reached\\n")'), file.path(wd, "err.R"))
plain <- rs("err.R", wd)
viarun <- rs(c("-e", (run_expr("err.R"))), wd)
check("uncaught error under run(): same stdout, same stderr (message and Calls:), same non-zero exit",
      plain$status != 0 && identical(plain[c("status", "out", "err")], viarun[c("status", "out", "err")]), list(plain, viarun))
rec <- last_record(wd)
check("the run is recorded with exit code 1 and the error class", !is.null(rec) && rec$exit_code == 1 && identical(rec$exception, "badInput"), rec[c("exit_code", "exception")])
check("writes before the error are in the record", !is.null(io_of(rec, file.path(wd, "before.csv"), "write")))
inproc <- rs("err.R", wd, env = c(HEADWATER_CAPTURE = "1"), profile = file.path(root, "auto-profile.R"))
check("uncaught error with in-process capture: same output and exit", identical(plain[c("status", "out", "err")], inproc[c("status", "out", "err")]), inproc)
rec <- last_record(wd)
check("in-process capture records exit code 1 and the error class", rec$exit_code == 1 && identical(rec$exception, "badInput"))
writeLines(c('x <- tryCatch(read.csv("nope.csv"), error = function(e) "caught")', 'print(x)', 'y <- read.csv("missing.csv")'), file.path(wd, "err2.R"))
plain <- rs("err2.R", wd)
inproc <- rs("err2.R", wd, env = c(HEADWATER_CAPTURE = "1"), profile = file.path(root, "auto-profile.R"))
check("an error inside a wrapped function (read.csv of a missing file): same message, Calls: line and warnings",
      identical(plain[c("status", "out", "err")], inproc[c("status", "out", "err")]), list(plain, inproc))
check("a caught error does not count; the uncaught one is recorded as simpleError",
      identical(last_record(wd)$exception, "simpleError"))
writeLines(c('cat("leaving\\n")', 'quit(status = 3)'), file.path(wd, "quit.R"))
viarun <- rs(c("-e", (run_expr("quit.R"))), wd)
check("quit(status = 3): run() exits 3 and records exit code 3", viarun$status == 3 && last_record(wd)$exit_code == 3, viarun)
inproc <- rs("quit.R", wd, env = c(HEADWATER_CAPTURE = "1"), profile = file.path(root, "auto-profile.R"))
check("quit(status = 3) with in-process capture: exit 3, recorded 3", inproc$status == 3 && last_record(wd)$exit_code == 3, inproc)

# ------------------------------------------------------------- switch-on without installing
wd <- new_dir("sourced")
capture_file <- normalizePath(file.path(pkg_dir, "inst", "capture.R"))
writeLines(c(sprintf('source(%s)', deparse(capture_file)), 'write.csv(data.frame(z = 1:2), "s.csv")', 'cat("ok\\n")'),
           file.path(wd, "src.R"))
res <- rs("src.R", wd, env = c(R_LIBS = ""))
rec <- last_record(wd)
check("sourcing inst/capture.R at the top of a script records the run without the package installed",
      res$status == 0 && identical(res$out, "ok") && !is.null(rec) && !is.null(io_of(rec, file.path(wd, "s.csv"), "write")), res)

# ------------------------------------------------------------- names and non-files
wd <- new_dir("names")
writeLines(c('write.csv(data.frame("caf\u00e9 q\\\\" = 1, check.names = FALSE), "donn\u00e9es \u4e2d.csv", row.names = FALSE)',
             'x <- read.csv(text = "a,b\n1,2")',
             'y <- read.table(textConnection("p q\n1 2"), header = TRUE)',
             'cat(ncol(x), ncol(y), "\\n")'), file.path(wd, "names.R"), useBytes = TRUE)
res <- rs(c("-e", run_expr("names.R")), wd)
rec <- last_record(wd)
p <- file.path(wd, "donn\u00e9es \u4e2d.csv")
e <- io_of(rec, p, "write")
check("a non-ASCII file name and column name travel as UTF-8 in the JSON record",
      res$status == 0 && !is.null(e) && identical(unlist(e$frame$columns), "caf\u00e9 q\\") && identical(e$sha256, sha256sum(p)), list(res, rec$io))
check("read.csv(text=) and text connections are not files: nothing recorded, nothing on stderr",
      length(rec$io) == 1 && identical(res$err, "") && identical(res$out, "2 2 "), list(res, rec$io))

# ------------------------------------------------------------- undone at the end
wd <- new_dir("undo")
writeLines(c('orig <- list(utils::read.table, base::readRDS, grDevices::png)',
             'headwater::capture()',
             'now <- list(utils::read.table, base::readRDS, grDevices::png)',
             'headwater:::finish_session()',
             'after <- list(utils::read.table, base::readRDS, grDevices::png)',
             'cat(!identical(orig, now), identical(orig, after), "\\n")'), file.path(wd, "undo.R"))
res <- rs("undo.R", wd)
check("the wrapped functions are the originals again once the run is closed", identical(res$out, "TRUE TRUE "), res)

# ------------------------------------------------------------- hash cap
wd <- new_dir("cap")
writeLines(paste(rep("x", 100), collapse = ""), file.path(wd, "big.txt"))
writeLines(c('a <- read.table("big.txt")', 'write.table(a, "copy.txt")'), file.path(wd, "cap.R"))
res <- rs(c("-e", (run_expr("cap.R"))), wd, env = c(HEADWATER_HASH_CAP = "10"))
rec <- last_record(wd)
e_in <- io_of(rec, file.path(wd, "big.txt"), "read"); e_out <- io_of(rec, file.path(wd, "copy.txt"), "write")
check("HEADWATER_HASH_CAP: an input above the cap has its size but no hash; outputs are always hashed",
      !is.null(e_in) && e_in$bytes == 101 && is.null(e_in$sha256) && identical(e_out$sha256, sha256sum(file.path(wd, "copy.txt"))), list(e_in, e_out))

# ------------------------------------------------------------- delivery
if (have_prog("python3") && have_prog("curl")) {
  wd <- new_dir("deliver")
  writeLines('cat("hi\\n")', file.path(wd, "hi.R"))
  r <- start_receiver()
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r$url, HEADWATER_TOKEN = "sekret-token"))
  got <- received(r)
  check("a run is POSTed to {HEADWATER_URL}/api/runs with the bearer token",
        length(got) == 1 && identical(got[[1]]$path, "/api/runs") && identical(got[[1]]$auth, "Bearer sekret-token") &&
          identical(got[[1]]$record$script$path, file.path(wd, "hi.R")), got)
  check("nothing is spooled when the server takes the record", length(spool_records(wd)) == 0)
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r$url))
  check("without HEADWATER_TOKEN no Authorization header is sent", length(received(r)) == 2 && identical(received(r)[[2]]$auth, "-"))
  stop_receiver(r)
  # The server down: the port of the stopped receiver has no listener now.
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r$url))
  spooled <- spool_records(wd)
  check("server unreachable: the record goes to the spool, the script's output and status are unchanged",
        length(spooled) == 1 && res$status == 0 && identical(res$out, "hi") && identical(res$err, ""), res)
  r2 <- start_receiver()
  res <- rs(c("-e", "headwater::flush()"), wd, env = c(HEADWATER_URL = r2$url))
  got <- received(r2)
  check("server back: headwater::flush() sends exactly the spooled record and empties the spool",
        length(got) == 1 && identical(got[[1]]$record$run_id, spooled[[1]]$run_id) && length(spool_records(wd)) == 0, got)
  stop_receiver(r2)
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r2$url))
  first <- spool_records(wd)
  r3 <- start_receiver()
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r3$url))
  got <- received(r3)
  ids <- vapply(got, function(g) g$record$run_id, "")
  check("the next run's end sends the spooled record first, then its own; the spool is emptied",
        length(got) == 2 && identical(ids[1], first[[1]]$run_id) && length(spool_records(wd)) == 0, ids)
  stop_receiver(r3)
  r5 <- start_receiver(503L)
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r5$url))
  check("a 5xx answer keeps the record in the spool", length(received(r5)) == 1 && length(spool_records(wd)) == 1)
  stop_receiver(r5)
  file.remove(file.path(wd, "spool.ndjson"))
  r4 <- start_receiver(400L)
  res <- rs(c("-e", (run_expr("hi.R"))), wd, env = c(HEADWATER_URL = r4$url))
  check("a 4xx answer drops the record (not spooled) and says so once on stderr",
        length(spool_records(wd)) == 0 && grepl("^headwater: the server refused run", res$err) && identical(res$out, "hi"), res)
  stop_receiver(r4)
} else skip("delivery to a loopback receiver", "python3 or curl")

# ------------------------------------------------------------- figures
wd <- new_dir("figures")
writeLines(c(
  'png("plot.png", width = 200, height = 150); plot(1:10); dev.off()',
  'svg("plot.svg", width = 4, height = 3); plot(1:10); dev.off()',
  'pdf("plot.pdf"); plot(1:10); dev.off()',
  'png("page%02d.png"); plot(1); plot(2); dev.off()',
  'pdf("open.pdf"); plot(3)'), file.path(wd, "fig.R"))
res <- rs(c("-e", (run_expr("fig.R"))), wd)
rec <- last_record(wd)
id <- rec$run_id
png_chunks_py <- function(path) {
  # expected: chunk layout and CRCs as Python's zlib computes them (PNG spec 5.3)
  code <- sprintf(paste0("import struct,zlib\nd=open('%s','rb').read()\nassert d[:8]==b'\\x89PNG\\r\\n\\x1a\\n'\np=8\nout=[]\n",
                         "while p<len(d):\n n=struct.unpack('>I',d[p:p+4])[0];t=d[p+4:p+8];b=d[p+8:p+8+n];c=struct.unpack('>I',d[p+8+n:p+12+n])[0]\n",
                         " out.append('%%s %%s %%s'%%(t.decode(),'crc-ok' if zlib.crc32(t+b)&0xffffffff==c else 'crc-bad',b.replace(b'\\x00',b'|').decode('latin-1') if t==b'tEXt' else ''))\n p+=12+n\n",
                         "print('\\n'.join(out))"), path)
  system2("python3", c("-c", shQuote(code)), stdout = TRUE)
}
for (f in c("plot.png", "page01.png", "page02.png")) {
  p <- file.path(wd, f); e <- io_of(rec, p, "write")
  check(sprintf("%s recorded as written by grDevices::png, stamped, hash taken after stamping", f),
        !is.null(e) && isTRUE(e$stamped) && identical(e$via, "grDevices::png") && identical(e$sha256, sha256sum(p)), e)
  if (have_prog("python3")) {
    ch <- png_chunks_py(p)
    check(sprintf("%s: every chunk CRC is valid, tEXt 'headwater:run' holds the run id just before IEND", f),
          all(grepl("crc-ok", ch)) && identical(ch[length(ch)], "IEND crc-ok ") &&
            identical(ch[length(ch) - 1], paste0("tEXt crc-ok headwater:run|", id)), ch)
  }
}
if (have_pkg("png")) {
  img <- tryCatch(png::readPNG(file.path(wd, "plot.png")), error = function(e) NULL)
  check("the stamped PNG still decodes (png::readPNG) to 150 x 200 pixels", !is.null(img) && all(dim(img)[1:2] == c(150, 200)))
} else skip("decoding the stamped PNG", "the png package")
e <- io_of(rec, file.path(wd, "plot.svg"), "write")
check("plot.svg stamped, hash after stamping", !is.null(e) && isTRUE(e$stamped) && identical(e$sha256, sha256sum(file.path(wd, "plot.svg"))))
svg_run <- NULL
if (have_pkg("xml2")) {
  doc <- xml2::read_xml(file.path(wd, "plot.svg"))
  node <- xml2::xml_find_first(doc, "/*[local-name()='svg']/*[local-name()='metadata']/*[local-name()='run' and namespace-uri()='urn:headwater:run']")
  svg_run <- xml2::xml_text(node)
} else if (have_prog("python3")) {
  code <- sprintf("import xml.etree.ElementTree as E\nr=E.parse('%s').getroot()\nm=r.find('{http://www.w3.org/2000/svg}metadata')\nprint(m.find('{urn:headwater:run}run').text)", file.path(wd, "plot.svg"))
  svg_run <- system2("python3", c("-c", shQuote(code)), stdout = TRUE)
}
if (!is.null(svg_run)) check("the stamped SVG parses as XML; svg/metadata/headwater:run holds the run id", identical(svg_run, id), svg_run) else skip("parsing the stamped SVG", "xml2 or python3")
for (f in c("plot.pdf", "open.pdf")) {
  p <- file.path(wd, f); e <- io_of(rec, p, "write")
  check(sprintf("%s stamped (a device left open is closed and recorded at the end), hash after stamping", f),
        !is.null(e) && isTRUE(e$stamped) && identical(e$sha256, sha256sum(p)), e)
  if (have_prog("qpdf")) {
    q <- suppressWarnings(system2("qpdf", c("--check", shQuote(p)), stdout = TRUE, stderr = TRUE))
    check(sprintf("%s passes qpdf --check after the incremental update", f), is.null(attr(q, "status")) && any(grepl("No syntax or stream encoding errors", q)), q)
  } else skip(paste(f, "qpdf --check"), "qpdf")
  if (have_prog("pdfinfo")) {
    info <- system2("pdfinfo", c("-custom", shQuote(p)), stdout = TRUE, stderr = TRUE)
    check(sprintf("%s: the Info dictionary has HeadwaterRun and keeps R's Title and Producer (pdfinfo)", f),
          any(info == paste0("HeadwaterRun:    ", id)) && any(grepl("^Title: +R Graphics Output$", info)) &&
            any(grepl("^Producer: +R ", info)), info)
  } else skip(paste(f, "Info dictionary via pdfinfo"), "pdfinfo")
}
wd <- new_dir("nostamp")
writeLines('png("n.png"); plot(1); invisible(dev.off())', file.path(wd, "n.R"))
res <- rs(c("-e", (run_expr("n.R"))), wd, env = c(HEADWATER_STAMP = "0"))
e <- io_of(last_record(wd), file.path(wd, "n.png"), "write")
pd <- new_dir("nostamp-plain"); invisible(file.copy(file.path(wd, "n.R"), pd))
plainpng <- rs("n.R", pd)
check("HEADWATER_STAMP=0: the figure is recorded, not stamped, byte for byte what R wrote",
      !is.null(e) && isFALSE(e$stamped) &&
        identical(unname(tools::md5sum(file.path(wd, "n.png"))), unname(tools::md5sum(file.path(root, "nostamp-plain", "n.png")))), e)
if (have_pkg("ggplot2")) {
  wd <- new_dir("ggsave")
  writeLines(c('suppressMessages(library(ggplot2))', 'p <- ggplot(data.frame(x = 1:3, y = 3:1), aes(x, y)) + geom_point()',
               'ggsave("g.png", p, width = 3, height = 2, dpi = 50)', 'ggsave("g.pdf", p, width = 3, height = 2)',
               'dir.create("figs"); ggsave("g.svg", p, path = "figs", width = 3, height = 2)'), file.path(wd, "gg.R"))
  res <- rs(c("-e", (run_expr("gg.R"))), wd)
  rec <- last_record(wd)
  for (f in c("g.png", "g.pdf", "figs/g.svg")) {
    p <- file.path(wd, f); e <- io_of(rec, p, "write")
    check(sprintf("ggsave %s: recorded via ggplot2::ggsave, stamped, hash after stamping", f),
          !is.null(e) && identical(e$via, "ggplot2::ggsave") && isTRUE(e$stamped) && identical(e$sha256, sha256sum(p)), list(res, e))
  }
} else skip("ggsave capture", "ggplot2")

unlink(root, recursive = TRUE)
cat(sprintf("%d passed, %d failed, %d skipped\n", passed, failed, skipped))
quit(status = if (failed > 0) 1L else 0L)
