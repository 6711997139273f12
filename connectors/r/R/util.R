# Small helpers shared by the whole connector.  Everything here is base R.

.hw <- new.env(parent = emptyenv())   # the one state of this process
.hw$reported <- character()            # keys of problems already reported
.hw$busy <- 0L                         # > 0 while the connector itself works

CLIENT <- "headwater-r/0.1.0"

`%||%` <- function(a, b) if (is.null(a)) b else a

# Report a problem of the connector once per key on stderr; never signals.
report_once <- function(key, message) {
  if (key %in% .hw$reported) return(invisible(FALSE))
  .hw$reported <- c(.hw$reported, key)
  try(cat("headwater: ", message, "\n", sep = "", file = stderr()), silent = TRUE)
  invisible(TRUE)
}

verbose_note <- function(message) {
  if (isTRUE(.hw$cfg$verbose))
    try(cat("headwater: ", message, "\n", sep = "", file = stderr()), silent = TRUE)
}

# Run connector code: warnings and messages it raises are muffled (they must
# not reach the script's handlers or its printed warnings), an error is
# reported once under `what` and turned into `otherwise`.
quietly <- function(expr, what = "internal error", otherwise = NULL) {
  .hw$busy <- .hw$busy + 1L
  on.exit(.hw$busy <- .hw$busy - 1L)
  tryCatch(
    withCallingHandlers(expr,
      warning = function(w) invokeRestart("muffleWarning"),
      message = function(m) invokeRestart("muffleMessage")),
    error = function(e) {
      report_once(what, paste0(what, ": ", conditionMessage(e)))
      otherwise
    })
}

# Seconds since the epoch, as a double.
now <- function() as.numeric(Sys.time())

# ISO 8601 UTC with milliseconds, e.g. 2026-12-01T22:00:00.123Z.
iso_utc <- function(t) {
  ms <- floor(t * 1000 + 0.5)
  secs <- ms %/% 1000
  paste0(format(as.POSIXct(secs, origin = "1970-01-01", tz = "UTC"),
                "%Y-%m-%dT%H:%M:%S", tz = "UTC"),
         sprintf(".%03dZ", as.integer(ms %% 1000)))
}

# 16 random bytes from the operating system; R's own generator is never
# used, so the script's random numbers (.Random.seed) are untouched.
random_bytes <- function(n = 16L) {
  b <- tryCatch(suppressWarnings(readBin("/dev/urandom", "raw", n)), error = function(e) raw(0))
  if (length(b) == n) return(b)
  # No /dev/urandom (Windows): R's generator, with its state put back.
  had <- exists(".Random.seed", envir = globalenv(), inherits = FALSE)
  if (had) old <- get(".Random.seed", envir = globalenv(), inherits = FALSE)
  on.exit(if (had) assign(".Random.seed", old, envir = globalenv())
          else if (exists(".Random.seed", envir = globalenv(), inherits = FALSE))
            rm(".Random.seed", envir = globalenv()))
  set.seed(NULL)
  as.raw(sample.int(256L, n, replace = TRUE) - 1L)
}

# A random UUID, RFC 4122 section 4.4: version 4 in the high nibble of byte
# 7, variant 10xx in the two high bits of byte 9.
uuid4 <- function(bytes = random_bytes(16L)) {
  b <- as.integer(bytes)
  b[7] <- bitwOr(bitwAnd(b[7], 0x0FL), 0x40L)
  b[9] <- bitwOr(bitwAnd(b[9], 0x3FL), 0x80L)
  h <- sprintf("%02x", b)
  paste0(paste(h[1:4], collapse = ""), "-", paste(h[5:6], collapse = ""), "-",
         paste(h[7:8], collapse = ""), "-", paste(h[9:10], collapse = ""), "-",
         paste(h[11:16], collapse = ""))
}

TRUE_WORDS <- c("1", "true", "yes", "on")
FALSE_WORDS <- c("0", "false", "no", "off")

env_flag <- function(name, default = FALSE) {
  v <- tolower(trimws(Sys.getenv(name, "")))
  if (v %in% TRUE_WORDS) return(TRUE)
  if (v %in% FALSE_WORDS) return(FALSE)
  default
}

DEFAULT_HASH_CAP <- 64 * 1024 * 1024   # 64 MiB
POST_TIMEOUT_S <- 2
EXIT_FLUSH_BUDGET_S <- 1.5
EXIT_FLUSH_MAX_RECORDS <- 50L

default_spool <- function() file.path(path.expand("~"), ".headwater", "spool.ndjson")

# A snapshot of the HEADWATER_* variables.
read_config <- function() {
  url <- trimws(Sys.getenv("HEADWATER_URL", ""))
  token <- trimws(Sys.getenv("HEADWATER_TOKEN", ""))
  spool <- trimws(Sys.getenv("HEADWATER_SPOOL", ""))
  spool <- if (nzchar(spool)) absolute_path(path.expand(spool)) else default_spool()
  cap <- DEFAULT_HASH_CAP
  raw_cap <- trimws(Sys.getenv("HEADWATER_HASH_CAP", ""))
  if (nzchar(raw_cap)) {
    n <- suppressWarnings(as.numeric(raw_cap))
    if (is.na(n) || n < 0 || n != floor(n)) {
      report_once("config-cap", sprintf("HEADWATER_HASH_CAP=%s is not a number of bytes; using %.0f",
                                        raw_cap, DEFAULT_HASH_CAP))
    } else cap <- n
  }
  list(url = if (nzchar(url)) url else NULL,
       token = if (nzchar(token)) token else NULL,
       spool = spool, hash_cap = cap,
       stamp = env_flag("HEADWATER_STAMP", TRUE),
       verbose = env_flag("HEADWATER_VERBOSE", FALSE),
       timeout = POST_TIMEOUT_S)
}

is_absolute <- function(p) grepl("^(/|[A-Za-z]:[/\\\\]|\\\\\\\\)", p)

# An absolute path for `p`, resolving symbolic links where the file or its
# folder exists; relative paths are taken against the working folder now.
absolute_path <- function(p) {
  p <- path.expand(p)
  if (file.exists(p)) return(normalizePath(p, winslash = "/", mustWork = FALSE))
  d <- dirname(p)
  if (dir.exists(d)) return(file.path(normalizePath(d, winslash = "/", mustWork = FALSE), basename(p)))
  if (is_absolute(p)) p else file.path(normalizePath(getwd(), winslash = "/"), p)
}
