# The ways to switch capture on, and flush().

#' Run an R script with capture, as `Rscript script.R args...` would.
#'
#' The script runs in a child `Rscript` process (the same R), so its
#' commandArgs(), output, messages, error text ("Error in ...", "Calls:")
#' and exit status are exactly those of `Rscript script.R args...`.  The
#' child reads the same profiles as a plain Rscript would; capture starts
#' after them.  Outside interactive use, a non-zero status of the script
#' ends this R with that same status.
run <- function(script, args = trailing_args()) {
  status <- run_child(script, as.character(args))
  if (!interactive() && status != 0L) quit(save = "no", status = status)
  invisible(status)
}

# The arguments after the -e expression.  Rscript puts "--args" before
# them itself, so `Rscript -e 'headwater::run("s.R")' --args a b` shows
# "--args" "a" "b": that extra "--args" is dropped.
trailing_args <- function() {
  a <- commandArgs(trailingOnly = TRUE)
  if (length(a) && a[1] == "--args") a[-1] else a
}

#' Start capture if HEADWATER_CAPTURE is on (for ~/.Rprofile).
auto <- function() {
  if (nzchar(Sys.getenv("HEADWATER_R_CHILD")) ||
      (env_flag("HEADWATER_CAPTURE", FALSE) && !is.null(script_from_args())))
    start_session()
  invisible(run_id())
}

#' Start capture in this R session now; the run ends when R exits.
capture <- function(script = NULL) invisible(start_session(script))

#' The id of the run being captured, or NULL.
run_id <- function() .hw$session$run_id

#' Send the run records waiting in the spool file.  Called with a
#' connection, it is base::flush().
flush <- function(con) {
  if (!missing(con)) return(base::flush(con))
  cfg <- read_config()
  stats <- quietly(flush_spool(cfg), "sending spooled runs",
                   list(sent = 0L, dropped = 0L, kept = NA, unreachable = TRUE))
  invisible(stats)
}

# ------------------------------------------------------------------ run()
rscript_path <- function() {
  exe <- if (.Platform$OS.type == "windows") "Rscript.exe" else "Rscript"
  file.path(R.home("bin"), exe)
}

# How the child loads this code: the installed package, or the capture
# file this code was sourced from.
loader_line <- function() {
  top <- topenv(environment(run_child))
  if (isNamespace(top) && identical(getNamespaceName(top)[[1]], "headwater")) {
    lib <- dirname(getNamespaceInfo(top, "path"))
    return(sprintf("invisible(local({ loadNamespace(\"headwater\", lib.loc = %s); headwater:::start_session() }))",
                   deparse(lib)))
  }
  f <- .hw$loader$file
  if (is.null(f)) stop("the capture file this code came from is not known")
  sprintf("source(%s)", deparse(f))
}

child_profile <- function(skip_user) {
  orig <- Sys.getenv("R_PROFILE_USER", NA)
  user <- if (skip_user) ""
          else if (!is.na(orig) && nzchar(orig)) path.expand(orig)
          else if (file.exists(".Rprofile")) normalizePath(".Rprofile")
          else if (file.exists(file.path(path.expand("~"), ".Rprofile"))) file.path(path.expand("~"), ".Rprofile")
          else ""
  c("# written by headwater::run for one child R; removed when it ends",
    if (is.na(orig)) "Sys.unsetenv(\"R_PROFILE_USER\")" else sprintf("Sys.setenv(R_PROFILE_USER = %s)", deparse(orig)),
    if (nzchar(user)) sprintf("if (file.exists(%s)) sys.source(%s, envir = globalenv())", deparse(user), deparse(user)),
    loader_line())
}

minimal_record <- function(run_id, script, args, started, ended) {
  info <- Sys.info()
  path <- if (file.exists(script)) normalizePath(script, winslash = "/") else absolute_path(script)
  list(run_id = run_id, client = CLIENT,
       script = list(path = path, sha256 = if (file.exists(path)) sha256_file(path) else NULL,
                     git_commit = if (file.exists(path)) git_commit(path) else NULL, language = "r"),
       args = json_array(args), user = unname(info[["user"]]), host = unname(info[["nodename"]]),
       r = r_version(), cwd = normalizePath(getwd(), winslash = "/"),
       started_at = iso_utc(started), ended_at = iso_utc(ended),
       exit_code = 0L, exception = NULL, io = json_array(list()))
}

run_child <- function(script, args) {
  run_id <- uuid4()
  started <- now()
  rec_file <- tempfile("headwater-run-", fileext = ".rds")
  prof <- tempfile("headwater-profile-", fileext = ".R")
  ca <- commandArgs()
  pre <- ca[seq_len(match("--args", ca, nomatch = length(ca) + 1L) - 1L)]
  skip_user <- any(pre %in% c("--vanilla", "--no-init-file"))
  pass <- intersect(pre, c("--no-environ", "--no-site-file"))
  if ("--vanilla" %in% pre) pass <- union(pass, c("--no-environ", "--no-site-file"))
  prepared <- quietly({ writeLines(child_profile(skip_user), prof); TRUE }, "preparing the run", FALSE)
  saved <- Sys.getenv(c("R_PROFILE_USER", "HEADWATER_R_CHILD", "HEADWATER_R_RUN_ID", "HEADWATER_R_STARTED"),
                      unset = NA, names = TRUE)
  if (isTRUE(prepared))
    Sys.setenv(R_PROFILE_USER = prof, HEADWATER_R_CHILD = rec_file, HEADWATER_R_RUN_ID = run_id,
               HEADWATER_R_STARTED = sprintf("%.3f", started))
  status <- tryCatch(system2(rscript_path(), c(pass, shQuote(script), if (length(args)) shQuote(args))),
                     error = function(e) 127L)
  for (n in names(saved)) if (is.na(saved[[n]])) Sys.unsetenv(n) else do.call(Sys.setenv, as.list(saved[n]))
  ended <- now()
  quietly({
    rec <- if (file.exists(rec_file)) readRDS(rec_file) else minimal_record(run_id, script, args, started, ended)
    rec$exit_code <- as.integer(status)
    if (status == 0L) rec["exception"] <- list(NULL)
    rec$args <- json_array(args)
    deliver(rec, read_config())
  }, "delivering the run record")
  unlink(c(rec_file, prof))
  as.integer(status)
}
