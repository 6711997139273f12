# The capture session: one per R process, one run record.

io_key <- function(path, direction) paste(direction, path, sep = "\t")

# One entry per (path, direction): the first call's via and time, the last
# size and hash, the last data frame facts seen.
add_io <- function(path, direction, via, bytes, sha, frame, at) {
  key <- io_key(path, direction)
  e <- .hw$io[[key]]
  if (is.null(e)) {
    .hw$io[[key]] <- list(path = path, direction = direction, bytes = bytes, sha256 = sha,
                          via = via, at = at, frame = frame, stamped = FALSE)
    .hw$io_order <- c(.hw$io_order, key)
  } else {
    if (!is.null(bytes)) e$bytes <- bytes
    if (!is.null(sha)) e$sha256 <- sha
    if (!is.null(frame)) e$frame <- frame
    .hw$io[[key]] <- e
  }
  key
}

# Outputs are measured once the run is over (after stamping).
add_output <- function(path, via, frame, at, stamp) {
  key <- add_io(path, "write", via, NULL, NULL, frame, at)
  if (stamp) .hw$stamp_keys <- union(.hw$stamp_keys, key)
  key
}

script_from_args <- function(args = commandArgs()) {
  f <- grep("^--file=", args, value = TRUE)
  if (length(f) == 0) return(NULL)
  p <- sub("^--file=", "", f[1])
  if (!file.exists(p)) return(NULL)
  normalizePath(p, winslash = "/")
}

git_commit <- function(path) {
  if (is.null(path) || !nzchar(Sys.which("git"))) return(NULL)
  out <- tryCatch(suppressWarnings(system2("git", c("-C", shQuote(dirname(path)), "rev-parse", "HEAD"),
                                           stdout = TRUE, stderr = FALSE, timeout = 2)),
                  error = function(e) NULL)
  if (!is.null(attr(out, "status")) || length(out) != 1) return(NULL)
  out <- trimws(out)
  if (grepl("^[0-9a-f]{40}([0-9a-f]{24})?$", out)) out else NULL
}

# Is it safe to add a global calling handler now?  R refuses while other
# handlers are on the stack ("should not be called with handlers on the
# stack"), and a failed attempt cannot be caught without adding one.
no_handlers_on_stack <- function() {
  busy <- list(base::tryCatch, base::withCallingHandlers, base::try, base::suppressWarnings,
               base::suppressMessages, base::suppressPackageStartupMessages)
  for (k in seq_len(sys.nframe())) {
    f <- sys.function(k)
    for (b in busy) if (identical(f, b)) return(FALSE)
  }
  TRUE
}

on_uncaught <- function(e) {
  if (isTRUE(.hw$active) && .hw$busy == 0L && is.null(.hw$uncaught))
    .hw$uncaught <- class(e)[1]
}

# Start capture in this process (idempotent).  `script` overrides the
# script found in the command line.
start_session <- function(script = NULL, loader = NULL) {
  if (!is.null(.hw$session)) return(invisible(.hw$session$run_id))
  started <- now()
  run_id <- NULL; child_file <- NULL
  cf <- Sys.getenv("HEADWATER_R_CHILD", "")
  if (nzchar(cf)) {
    child_file <- cf
    run_id <- Sys.getenv("HEADWATER_R_RUN_ID", "")
    st <- suppressWarnings(as.numeric(Sys.getenv("HEADWATER_R_STARTED", "")))
    if (!is.na(st)) started <- st
    Sys.unsetenv(c("HEADWATER_R_CHILD", "HEADWATER_R_RUN_ID", "HEADWATER_R_STARTED"))
  }
  s <- new.env(parent = emptyenv())
  s$run_id <- if (!is.null(run_id) && nzchar(run_id)) run_id else uuid4()
  s$started <- started
  s$child_file <- child_file
  s$finished <- FALSE
  .hw$session <- s
  .hw$loader <- loader %||% .hw$loader
  ok <- quietly({
    .hw$cfg <- read_config()
    s$cwd <- normalizePath(getwd(), winslash = "/")
    s$script <- if (!is.null(script)) normalizePath(script, winslash = "/", mustWork = FALSE) else script_from_args()
    s$script_sha <- if (!is.null(s$script)) sha256_file(s$script) else NULL
    s$args <- commandArgs(trailingOnly = TRUE)
    .hw$io <- new.env(parent = emptyenv()); .hw$io_order <- character()
    .hw$stamp_keys <- character(); .hw$devices <- list(); .hw$closed_devices <- list()
    .hw$calls <- list(); .hw$uncaught <- NULL; .hw$exit_status <- NULL
    .hw$exclude_roots <- exclude_roots()
    install_hooks()
    reg.finalizer(s, function(e) finish_session(), onexit = TRUE)
    TRUE
  }, "starting capture", FALSE)
  if (!isTRUE(ok)) { .hw$session <- NULL; return(invisible(NULL)) }
  # An uncaught error ends a non-interactive R with status 1; a global
  # calling handler sees it (and only it: errors caught by tryCatch/try
  # never reach the bottom of the handler stack).
  if (!interactive()) {
    if (no_handlers_on_stack()) globalCallingHandlers(error = on_uncaught)
    else report_once("handlers", "capture started inside a condition handler; an uncaught error will be reported with exit code 0")
  }
  .hw$active <- TRUE
  invisible(s$run_id)
}

# Devices the script left open are closed here, as R would close them just
# after this (at exit R runs finalizers before it shuts the devices down).
close_open_devices <- function() {
  for (key in names(.hw$devices)) {
    d <- .hw$devices[[key]]
    dev <- as.integer(key)
    if (dev %in% grDevices::dev.list()) try(grDevices::dev.off(dev), silent = TRUE)
    .hw$closed_devices[[length(.hw$closed_devices) + 1L]] <- d
  }
  .hw$devices <- list()
}

# The files a device wrote: its file name, or for a name with a page number
# format (Rplot%03d.png) each page file written since the run started.
device_files <- function(pattern, since) {
  if (!grepl("%[0-9]*d", basename(pattern))) return(pattern)
  out <- character()
  for (i in 1:9999) {
    f <- tryCatch(sprintf(pattern, i), error = function(e) NA_character_)
    if (is.na(f) || !file.exists(f)) break
    if (as.numeric(file.info(f)$mtime) >= floor(since) - 1) out <- c(out, f)
  }
  out
}

finish_outputs <- function(s) {
  for (d in .hw$closed_devices) {
    for (f in device_files(d$pattern, s$started)) add_output(f, d$via, NULL, d$at, TRUE)
  }
  .hw$closed_devices <- list()
  for (key in .hw$io_order) {
    e <- .hw$io[[key]]
    if (e$direction != "write") next
    if (!file.exists(e$path) || dir.exists(e$path)) {
      rm(list = key, envir = .hw$io)
      next
    }
    if (.hw$cfg$stamp && key %in% .hw$stamp_keys) {
      e$stamped <- isTRUE(quietly(stamp_file(e$path, s$run_id), "stamping a figure", FALSE))
    }
    f <- file_facts(e$path, Inf)
    e$bytes <- f$bytes; e$sha256 <- f$sha256
    .hw$io[[key]] <- e
  }
  .hw$io_order <- Filter(function(k) exists(k, envir = .hw$io, inherits = FALSE), .hw$io_order)
}

r_version <- function() paste(R.version$major, R.version$minor, sep = ".")

build_record <- function(s, exit_code, exception) {
  info <- Sys.info()
  io <- lapply(.hw$io_order, function(k) {
    e <- .hw$io[[k]]
    list(path = e$path, direction = e$direction, bytes = e$bytes, sha256 = e$sha256,
         via = e$via, at = iso_utc(e$at), frame = e$frame, stamped = isTRUE(e$stamped))
  })
  list(run_id = s$run_id, client = CLIENT,
       script = list(path = s$script, sha256 = s$script_sha, git_commit = git_commit(s$script),
                     language = "r"),
       args = json_array(as.character(s$args)),
       user = unname(info[["user"]]), host = unname(info[["nodename"]]),
       r = r_version(), cwd = s$cwd,
       started_at = iso_utc(s$started), ended_at = iso_utc(s$ended),
       exit_code = exit_code, exception = exception,
       io = json_array(io))
}

# Close the run: undo the wrapping, close devices, stamp and hash outputs,
# build the record and deliver it (or, in a child started by run(), hand
# it to the parent).  Runs once; never signals.
finish_session <- function() {
  s <- .hw$session
  if (is.null(s) || isTRUE(s$finished)) return(invisible(NULL))
  s$finished <- TRUE
  .hw$active <- FALSE
  quietly({
    uninstall_hooks()
    close_open_devices()
    s$ended <- now()
    finish_outputs(s)
    exit_code <- if (!is.null(.hw$uncaught)) 1L else (.hw$exit_status %||% 0L)
    exception <- .hw$uncaught
    rec <- build_record(s, exit_code, exception)
    if (!is.null(s$child_file)) {
      saveRDS(rec, s$child_file)
    } else {
      deliver(rec, .hw$cfg)
    }
  }, "closing the run")
  invisible(NULL)
}
