# Writes delimited files with R's own writers (write.csv, write.csv2, write.table) and records what it wrote.
#
# Usage: Rscript r_writer.R OUT_DIR COUNT SEED
# Writes OUT_DIR/r_NNN.<ext> and OUT_DIR/r_truth.json. Part of the held-out corpus: written by a writer
# that the detector was never tuned on, with R's quoting (qmethod), fileEncoding, na=, dec=, eol= and
# row names. The tables are invented (a fictional survey of ponds); nothing here names a real place.
suppressPackageStartupMessages(library(jsonlite))

args <- commandArgs(trailingOnly = TRUE)
out <- args[1]
count <- as.integer(args[2])
set.seed(as.integer(args[3]))
dir.create(out, showWarnings = FALSE, recursive = TRUE)

plain <- c("reed bed", "outfall", "east pond", "sluice", "marsh", "inlet 2", "weed mat", "gravel")
tricky <- c("said \"ok\"", "a, b", "x;y", "bar|foo", "O'Tarn")
people <- c("Ilsa", "Moreth", "Tavi", "Quen", "Sorrel", "Vang")
accented <- c("Zoë", "Brûlé", "Fjóla", "Göran", "Hélo", "Iñaki", "Dømi")

column <- function(kind, n, quoted) {
  switch(kind,
    integer = sample(-300:60000, n, replace = TRUE),
    decimal = round(runif(n, -200, 9000), sample(1:3, 1)),
    # Measurements over orders of magnitude: R writes 15 significant digits and sometimes 1e-04 style.
    measure = signif(rlnorm(n, 0, 4), 15),
    boolean = sample(c(TRUE, FALSE), n, replace = TRUE),
    date = as.Date("2000-01-01") + sample(0:11000, n, replace = TRUE),
    timestamp = as.POSIXct("2015-01-01", tz = "UTC") + sample(0:300000000, n, replace = TRUE),
    text = sample(if (quoted) c(plain, tricky) else plain, n, replace = TRUE),
    factor = factor(sample(c("low", "mid", "high"), n, replace = TRUE)))
}
logical_type <- c(integer = "integer", decimal = "decimal", measure = "decimal", boolean = "boolean",
                  date = "date", timestamp = "timestamp", text = "text", factor = "text")

truth <- list()
for (i in seq_len(count) - 1) {
  writer <- sample(c("csv", "csv", "csv2", "csv2", "table"), 1)
  sep <- switch(writer, csv = ",", csv2 = ";", table = sample(c("\t", "\t", "|", " ", ";"), 1))
  quote <- if (writer == "table") runif(1) < 0.6 else TRUE
  qmethod <- if (writer == "table") sample(c("escape", "double"), 1) else "double"
  dec <- switch(writer, csv = ".", csv2 = ",", table = if (sep %in% c(";", "\t") && runif(1) < 0.4) "," else ".")
  na <- sample(c("NA", "NA", "", "-", "n/a", "NULL"), 1)
  if (!quote && na == "" && sep == " ") na <- "NA"
  eol <- sample(c("\n", "\r\n"), 1)
  encoding <- sample(c("UTF-8", "UTF-8", "latin1", "CP1252"), 1)
  row_names <- runif(1) < (if (writer == "table") 0.2 else 0.25)
  kinds <- sample(c("integer", "decimal", "measure", "boolean", "date", "timestamp", "text", "factor"),
                  sample(2:7, 1), replace = TRUE)
  # A space-separated file cannot hold unquoted cells with spaces: R would write a broken file.
  if (sep == " ") kinds <- kinds[kinds != "timestamp"]
  if (sep == " " && !quote) kinds <- kinds[kinds != "text"]
  if (length(kinds) < 2) kinds <- c(kinds, "integer", "decimal")[1:2]
  n <- sample(10:140, 1)
  names <- c("pond", paste0(kinds, "_", seq_along(kinds)))
  # Quoting off needs cells free of the separator and of quotes; quoting on may hold anything.
  df <- data.frame(pond = sample(people, n, replace = TRUE), stringsAsFactors = FALSE)
  if (encoding != "UTF-8") df$pond[1] <- sample(accented, 1)
  for (k in seq_along(kinds)) {
    values <- column(kinds[k], n, quote)
    if (runif(1) < 0.3) values[sample(n, max(1, n %/% 12))] <- NA
    df[[names[k + 1]]] <- values
  }
  if (writer != "table" || quote) df$pond[sample(n, 1)] <- sample(tricky, 1)
  # dec="," with sep="," is what R refuses; write.csv2 fixes sep=";" for it.
  ext <- sample(c("csv", "csv", "txt", if (sep == "\t") "tsv" else "dat"), 1)
  file <- sprintf("r_%03d.%s", i, ext)
  path <- file.path(out, file)
  if (writer == "csv") {
    write.csv(df, path, row.names = row_names, na = na, eol = eol, fileEncoding = encoding)
  } else if (writer == "csv2") {
    write.csv2(df, path, row.names = row_names, na = na, eol = eol, fileEncoding = encoding)
  } else {
    write.table(df, path, sep = sep, quote = quote, qmethod = qmethod, dec = dec, na = na, eol = eol,
                row.names = row_names, col.names = TRUE, fileEncoding = encoding)
  }
  text_cells <- unlist(lapply(df, function(v) if (is.character(v) || is.factor(v)) as.character(v) else NULL))
  needs_escape <- quote && (any(grepl("\"", text_cells, fixed = TRUE)) || any(grepl("\"", names, fixed = TRUE)))
  columns <- lapply(seq_along(names), function(k) {
    list(name = names[k], type = if (k == 1) "text" else unname(logical_type[kinds[k - 1]]))
  })
  if (row_names) {
    # Row names: an unnamed first column (write.csv writes "" for its name; write.table writes no name at
    # all, so its header is one cell short), holding 1..n quoted when quote=TRUE.
    columns <- c(list(list(name = "", type = "integer")), columns)
  }
  truth[[file]] <- list(
    writer = paste0("R ", writer),
    delimiter = sep,
    quote = if (quote) "\"" else NULL,
    escape = if (needs_escape) (if (qmethod == "escape") "backslash" else "double") else NULL,
    header = TRUE,
    skip_lines = 0L,
    footer_lines = 0L,
    encoding = switch(encoding, "UTF-8" = "utf-8", latin1 = "iso-8859-1", CP1252 = "windows-1252"),
    bom = FALSE,
    decimal_separator = dec,
    columns = columns,
    row_count = n)
}
writeLines(toJSON(truth, auto_unbox = TRUE, null = "null", pretty = TRUE), file.path(out, "r_truth.json"),
           useBytes = TRUE)
