# A small JSON writer (RFC 8259).  Base R has none.
#
#   NULL, NA              -> null
#   json_array(x)         -> an array, whatever the length of x
#   other atomic length 1 -> a scalar; longer vectors -> arrays
#   named list            -> an object (names in order); unnamed list -> array
#
# Strings are written as UTF-8; '"' and '\' are escaped, and so are the
# control characters U+0000..U+001F (RFC 8259 section 7: "All Unicode
# characters may be placed within the quotation marks, except for the
# characters that MUST be escaped: quotation mark, reverse solidus, and the
# control characters").  Bytes that are not valid UTF-8 become U+FFFD.

json_array <- function(x) structure(list(x), class = "hw_json_array")

json_string <- function(s) {
  s <- as.character(s)
  out <- character(length(s))
  for (i in seq_along(s)) {
    x <- s[i]
    if (is.na(x)) { out[i] <- "null"; next }
    x <- enc2utf8(x)
    if (!validUTF8(x)) x <- iconv(x, "UTF-8", "UTF-8", sub = "\uFFFD")
    if (is.na(x)) x <- "\uFFFD"
    x <- gsub("\\", "\\\\", x, fixed = TRUE)
    x <- gsub("\"", "\\\"", x, fixed = TRUE)
    if (grepl("[\001-\037]", x, useBytes = TRUE)) {
      x <- gsub("\n", "\\n", x, fixed = TRUE)
      x <- gsub("\r", "\\r", x, fixed = TRUE)
      x <- gsub("\t", "\\t", x, fixed = TRUE)
      x <- gsub("\b", "\\b", x, fixed = TRUE)
      x <- gsub("\f", "\\f", x, fixed = TRUE)
      for (code in c(1:7, 11L, 14:31)) {
        ch <- rawToChar(as.raw(code))
        if (grepl(ch, x, fixed = TRUE, useBytes = TRUE))
          x <- gsub(ch, sprintf("\\u%04x", code), x, fixed = TRUE, useBytes = TRUE)
      }
      Encoding(x) <- "UTF-8"
    }
    out[i] <- paste0("\"", x, "\"")
  }
  out
}

json_number <- function(x) {
  vapply(x, function(v) {
    if (is.na(v) || !is.finite(v)) return("null")
    if (v == floor(v) && abs(v) < 2^53) return(format(v, scientific = FALSE, trim = TRUE))
    s <- sprintf("%.15g", v)
    if (as.numeric(s) != v) s <- sprintf("%.17g", v)
    s
  }, "")
}

json_atoms <- function(x) {
  if (is.factor(x)) x <- as.character(x)
  if (is.logical(x)) return(ifelse(is.na(x), "null", ifelse(x, "true", "false")))
  if (is.numeric(x)) return(json_number(as.numeric(x)))
  json_string(as.character(x))
}

to_json <- function(x) {
  if (is.null(x)) return("null")
  if (inherits(x, "hw_json_array")) {
    v <- x[[1]]
    if (is.list(v)) return(paste0("[", paste(vapply(v, to_json, ""), collapse = ","), "]"))
    if (length(v) == 0) return("[]")
    return(paste0("[", paste(json_atoms(v), collapse = ","), "]"))
  }
  if (is.list(x)) {
    n <- names(x)
    if (!is.null(n)) {
      parts <- vapply(seq_along(x), function(i) paste0(json_string(n[i]), ":", to_json(x[[i]])), "")
      return(paste0("{", paste(parts, collapse = ","), "}"))
    }
    return(paste0("[", paste(vapply(x, to_json, ""), collapse = ","), "]"))
  }
  if (length(x) == 0) return("null")
  if (length(x) == 1) return(json_atoms(x))
  paste0("[", paste(json_atoms(x), collapse = ","), "]")
}
