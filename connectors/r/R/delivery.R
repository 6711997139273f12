# Sending run records to POST {HEADWATER_URL}/api/runs, and the spool file
# (JSON lines, shared with the Python connector) for records not yet sent.
#
# Base R cannot POST: url() and download.file() only GET (and
# download.file(method = "libcurl") has no request body), so the curl
# program is run with system2.  Its options are given in a config file
# (curl -K) so that the token never appears in the process list.

endpoint <- function(url) paste0(sub("/+$", "", url), "/api/runs")

# 2xx: sent.  408, 429 and 5xx: the server may take it later (RFC 9110
# 15.5.9, RFC 6585 section 4, RFC 9110 15.6), keep it.  Other 4xx: the
# server will never take it as it is, drop it.  Anything else: keep.
classify <- function(status) {
  if (is.na(status)) return("retry")
  if (status >= 200 && status < 300) return("sent")
  if (status %in% c(408, 429) || (status >= 500 && status < 600)) return("retry")
  if (status >= 400 && status < 500) return("dropped")
  "retry"
}

curl_quote <- function(s) paste0("\"", gsub("\"", "\\\"", gsub("\\", "\\\\", s, fixed = TRUE), fixed = TRUE), "\"")

# POST one JSON line.  Returns list(outcome = "sent"|"retry"|"dropped", reason).
post_line <- function(line, cfg) {
  if (is.null(cfg$url)) return(list(outcome = "retry", reason = "HEADWATER_URL is not set"))
  if (!grepl("^https?://", tolower(cfg$url))) {
    report_once("url-scheme", "HEADWATER_URL must start with http:// or https://; run records are spooled")
    return(list(outcome = "retry", reason = "not an http(s) URL"))
  }
  curl <- Sys.which("curl")
  if (!nzchar(curl)) {
    report_once("no-curl", "the curl program is not installed; run records are spooled")
    return(list(outcome = "retry", reason = "no curl program"))
  }
  body <- tempfile("headwater-body-"); conf <- tempfile("headwater-curl-")
  on.exit(unlink(c(body, conf)))
  con <- file(body, "wb"); writeBin(charToRaw(enc2utf8(line)), con); close(con)
  lines <- c(paste("url =", curl_quote(endpoint(cfg$url))),
             "request = \"POST\"",
             paste("data-binary =", curl_quote(paste0("@", body))),
             "header = \"Content-Type: application/json\"",
             "header = \"Accept: application/json\"",
             paste("header =", curl_quote(paste("User-Agent:", CLIENT))),
             paste("max-time =", cfg$timeout),
             paste("connect-timeout =", cfg$timeout),
             "silent", "output = \"/dev/null\"",
             "write-out = \"%{http_code}\"")
  if (!is.null(cfg$token)) lines <- c(lines, paste("header =", curl_quote(paste("Authorization: Bearer", cfg$token))))
  old <- Sys.umask("077"); writeLines(lines, conf); Sys.umask(old)
  out <- tryCatch(suppressWarnings(system2(curl, c("-q", "-K", shQuote(conf)), stdout = TRUE, stderr = FALSE,
                                           timeout = cfg$timeout + 3)),
                  error = function(e) NULL)
  code <- suppressWarnings(as.integer(trimws(paste(out, collapse = ""))))
  if (is.na(code) || code == 0L) return(list(outcome = "retry", reason = "server unreachable"))
  list(outcome = classify(code), reason = paste("HTTP", code))
}

spool_append <- function(line, spool) {
  dir <- dirname(spool)
  if (!dir.exists(dir)) dir.create(dir, recursive = TRUE, mode = "0700")
  old <- Sys.umask("077"); on.exit(Sys.umask(old))
  con <- file(spool, "ab")
  on.exit(close(con), add = TRUE)
  writeBin(charToRaw(paste0(enc2utf8(line), "\n")), con)
}

spool_lines <- function(spool) {
  if (!file.exists(spool)) return(character())
  x <- readBin(spool, "raw", file.info(spool)$size)
  if (length(x) == 0) return(character())
  l <- strsplit(rawToChar(x), "\n", fixed = TRUE)[[1]]
  Encoding(l) <- "UTF-8"
  l
}

# Rewrite the spool without the lines sent (lines appended meanwhile stay).
spool_remove <- function(spool, done) {
  current <- spool_lines(spool)
  keep <- current[!(current %in% done) & nzchar(trimws(current))]
  tmp <- file.path(dirname(spool), paste0(".", basename(spool), ".", Sys.getpid(), ".tmp"))
  old <- Sys.umask("077"); on.exit(Sys.umask(old))
  con <- file(tmp, "wb")
  if (length(keep)) writeBin(charToRaw(paste0(paste(keep, collapse = "\n"), "\n")), con)
  close(con)
  file.rename(tmp, spool)
  length(keep)
}

run_id_of <- function(line) sub("^.*?\"run_id\":\"([^\"]*)\".*$", "\\1", line, perl = TRUE)

flush_spool <- function(cfg, budget = Inf, max_records = Inf) {
  stats <- list(sent = 0L, dropped = 0L, kept = 0L, unreachable = FALSE)
  lines <- spool_lines(cfg$spool)
  if (length(lines) == 0) return(stats)
  started <- now(); done <- character(); tried <- 0L
  for (line in unique(lines)) {
    if (!nzchar(trimws(line))) { done <- c(done, line); next }
    if (tried >= max_records || now() - started > budget) break
    if (!grepl("^\\s*\\{", line)) {
      report_once("spool-corrupt", paste("dropped an unreadable line of", cfg$spool))
      done <- c(done, line); stats$dropped <- stats$dropped + 1L; next
    }
    tried <- tried + 1L
    r <- post_line(line, cfg)
    if (r$outcome == "sent") {
      done <- c(done, line); stats$sent <- stats$sent + 1L
      verbose_note(paste("sent spooled run", run_id_of(line)))
    } else if (r$outcome == "dropped") {
      done <- c(done, line); stats$dropped <- stats$dropped + 1L
      report_once(paste("drop", r$reason), sprintf("the server refused spooled run %s (%s); dropped it", run_id_of(line), r$reason))
    } else {
      stats$unreachable <- TRUE
      verbose_note(paste("spooled runs kept:", r$reason))
      break
    }
  }
  stats$kept <- if (length(done)) spool_remove(cfg$spool, done) else sum(nzchar(trimws(lines)))
  stats
}

# At the end of a run: the backlog first (bounded), then this record; what
# cannot be sent now is appended to the spool.
deliver <- function(record, cfg) {
  line <- to_json(record)
  id <- record$run_id
  if (is.null(cfg$url)) {
    spool_append(line, cfg$spool)
    verbose_note(sprintf("HEADWATER_URL is not set; run %s spooled to %s", id, cfg$spool))
    return("spooled")
  }
  backlog <- flush_spool(cfg, EXIT_FLUSH_BUDGET_S, EXIT_FLUSH_MAX_RECORDS)
  if (backlog$unreachable) {
    spool_append(line, cfg$spool)
    verbose_note(sprintf("server unreachable; run %s spooled to %s", id, cfg$spool))
    return("spooled")
  }
  r <- post_line(line, cfg)
  if (r$outcome == "sent") { verbose_note(paste("sent run", id)); return("sent") }
  if (r$outcome == "dropped") {
    report_once(paste("drop", r$reason), sprintf("the server refused run %s (%s); the record was dropped, not spooled", id, r$reason))
    return("dropped")
  }
  spool_append(line, cfg$spool)
  verbose_note(sprintf("run %s spooled to %s: %s", id, cfg$spool, r$reason))
  "spooled"
}
