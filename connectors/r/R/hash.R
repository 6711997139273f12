# SHA-256 of files.  Base R has only tools::md5sum; this uses the digest
# package when it is installed (a Suggests), else the sha256sum program of
# GNU coreutils, run with system2.  Which one is used is decided once.

sha256_backend <- function() {
  b <- .hw$sha_backend
  if (!is.null(b)) return(b)
  forced <- getOption("headwater.sha256")   # "digest" or "sha256sum", for tests
  b <- if (!is.null(forced)) forced
       else if (requireNamespace("digest", quietly = TRUE)) "digest"
       else if (nzchar(Sys.which("sha256sum"))) "sha256sum"
       else "none"
  .hw$sha_backend <- b
  b
}

# Lower-case hex SHA-256 of a file, or NULL.
sha256_file <- function(path) {
  b <- sha256_backend()
  if (identical(b, "digest")) {
    h <- tryCatch(digest::digest(path, algo = "sha256", file = TRUE), error = function(e) NULL)
    return(if (is.character(h) && nchar(h) == 64) tolower(h) else NULL)
  }
  if (identical(b, "sha256sum")) {
    # "--" ends options, so a file named "-x" is not taken for one; the
    # file is given with its absolute path (no leading "-").
    out <- tryCatch(suppressWarnings(system2("sha256sum", c("--", shQuote(path)),
                                             stdout = TRUE, stderr = FALSE)),
                    error = function(e) NULL)
    if (length(out) >= 1) {
      h <- sub("^\\\\?([0-9a-fA-F]{64}).*$", "\\1", out[1])
      if (nchar(h) == 64 && grepl("^[0-9a-fA-F]+$", h)) return(tolower(h))
    }
    return(NULL)
  }
  report_once("no-sha256", "neither the digest package nor the sha256sum program is available; no hashes are recorded")
  NULL
}

# list(bytes, sha256) of a regular file; sha256 NULL above `cap` bytes.
# Results are cached by path, size and modification time.
file_facts <- function(path, cap = Inf) {
  info <- file.info(path, extra_cols = FALSE)
  if (is.na(info$size) || isTRUE(info$isdir)) return(NULL)
  size <- as.numeric(info$size)
  if (size > cap) return(list(bytes = size, sha256 = NULL))
  key <- paste(path, size, as.numeric(info$mtime), sep = "\r")
  cache <- .hw$hash_cache
  if (is.null(cache)) cache <- .hw$hash_cache <- new.env(parent = emptyenv())
  hit <- cache[[key]]
  if (!is.null(hit)) return(list(bytes = size, sha256 = hit))
  h <- sha256_file(path)
  if (!is.null(h)) assign(key, h, envir = cache)
  list(bytes = size, sha256 = h)
}
