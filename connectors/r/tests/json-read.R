# A small JSON reader for the tests (RFC 8259), written apart from the
# connector's writer so that one does not check itself.  Objects become
# named lists, arrays unnamed lists, null NULL (kept in lists as NULL).
json_read <- function(text) {
  chars <- strsplit(text, "")[[1]]
  pos <- 1L
  n <- length(chars)
  ws <- function() while (pos <= n && chars[pos] %in% c(" ", "\t", "\n", "\r")) pos <<- pos + 1L
  expect <- function(s) {
    k <- nchar(s)
    if (paste(chars[pos:(pos + k - 1L)], collapse = "") != s) stop("JSON: expected ", s, " at ", pos)
    pos <<- pos + k
  }
  value <- function() {
    ws()
    c1 <- chars[pos]
    if (c1 == "{") {
      pos <<- pos + 1L; out <- list(); ws()
      if (chars[pos] == "}") { pos <<- pos + 1L; return(structure(list(), names = character())) }
      repeat {
        ws(); k <- str(); ws(); expect(":"); v <- value()
        out[k] <- list(v)
        ws()
        if (chars[pos] == ",") { pos <<- pos + 1L; next }
        expect("}"); return(out)
      }
    }
    if (c1 == "[") {
      pos <<- pos + 1L; out <- list(); ws()
      if (chars[pos] == "]") { pos <<- pos + 1L; return(out) }
      repeat {
        v <- value(); out[length(out) + 1L] <- list(v); ws()
        if (chars[pos] == ",") { pos <<- pos + 1L; next }
        expect("]"); return(out)
      }
    }
    if (c1 == "\"") return(str())
    if (c1 == "t") { expect("true"); return(TRUE) }
    if (c1 == "f") { expect("false"); return(FALSE) }
    if (c1 == "n") { expect("null"); return(NULL) }
    start <- pos
    while (pos <= n && chars[pos] %in% c(as.character(0:9), "-", "+", ".", "e", "E")) pos <<- pos + 1L
    as.numeric(paste(chars[start:(pos - 1L)], collapse = ""))
  }
  str <- function() {
    expect("\""); out <- character()
    repeat {
      c1 <- chars[pos]
      if (c1 == "\"") { pos <<- pos + 1L; break }
      if (c1 == "\\") {
        e <- chars[pos + 1L]
        if (e == "u") {
          code <- strtoi(paste(chars[(pos + 2L):(pos + 5L)], collapse = ""), 16L)
          out <- c(out, intToUtf8(code)); pos <<- pos + 6L; next
        }
        out <- c(out, switch(e, "\"" = "\"", "\\" = "\\", "/" = "/", b = "\b", f = "\f",
                             n = "\n", r = "\r", t = "\t"))
        pos <<- pos + 2L; next
      }
      out <- c(out, c1); pos <<- pos + 1L
    }
    paste(out, collapse = "")
  }
  v <- value()
  v
}
