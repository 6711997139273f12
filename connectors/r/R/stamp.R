# Writing the run id into a figure's own metadata, once the run is over.
#
# * PNG: a tEXt chunk, keyword "headwater:run", just before IEND (PNG
#   specification, ISO/IEC 15948 / W3C PNG 2nd ed., 11.3.4.3 tEXt: keyword,
#   a null separator, Latin-1 text; 5.6 chunk ordering: tEXt may appear
#   anywhere between IHDR and IEND).  Image chunks are copied untouched.
# * SVG: <metadata><headwater:run xmlns:headwater="urn:headwater:run">ID
#   </headwater:run></metadata> as the first child of the root svg element
#   (SVG 1.1, 21.2 The 'metadata' element: elements from other namespaces
#   are allowed inside it).
# * PDF: an incremental update (ISO 32000-1, 7.5.6): a new document
#   information dictionary (14.3.3) with the old entries and
#   /HeadwaterRun (ID), a new cross-reference section and a trailer whose
#   /Prev points at the previous one.  Files whose last cross-reference is a
#   stream (7.5.8) or that are encrypted are left as they are.
#
# Each stamp_* returns TRUE when the file carries the stamp afterwards and
# FALSE when it was left unchanged.  Stamping twice with one id is a no-op.

STAMP_MAX_BYTES <- 256 * 1024 * 1024

read_all <- function(path) {
  n <- file.info(path, extra_cols = FALSE)$size
  if (is.na(n)) stop("cannot read ", path)
  readBin(path, "raw", n)
}

write_all <- function(path, bytes) {
  con <- file(path, "wb")
  on.exit(close(con))
  writeBin(bytes, con)
}

raw_find <- function(hay, needle, from = 1L, all = FALSE) {
  if (from > length(hay)) return(integer())
  hits <- grepRaw(needle, hay[from:length(hay)], fixed = TRUE, all = all)
  if (length(hits) == 0) integer() else hits + from - 1L
}

raw_rfind <- function(hay, needle) {
  hits <- grepRaw(needle, hay, fixed = TRUE, all = TRUE)
  if (length(hits) == 0) integer() else hits[length(hits)]
}

starts_with <- function(bytes, prefix) {
  n <- length(prefix)
  length(bytes) >= n && identical(bytes[seq_len(n)], prefix)
}

figure_kind <- function(path) {
  head <- tryCatch(readBin(path, "raw", 512L), error = function(e) raw(0))
  if (starts_with(head, PNG_SIGNATURE)) return("png")
  if (starts_with(head, charToRaw("%PDF-"))) return("pdf")
  text <- tolower(rawToChar(head[head != as.raw(0)]))
  if (grepl("<svg", text, fixed = TRUE)) return("svg")
  if (grepl("\\.svgz?$", tolower(path)) && grepl("^(\xef\xbb\xbf)?\\s*<", text, useBytes = TRUE)) return("svg")
  NA_character_
}

stamp_file <- function(path, run_id) {
  kind <- figure_kind(path)
  if (is.na(kind)) return(FALSE)
  size <- file.info(path, extra_cols = FALSE)$size
  if (is.na(size) || size > STAMP_MAX_BYTES) return(FALSE)
  switch(kind, png = stamp_png(path, run_id), svg = stamp_svg(path, run_id),
         pdf = stamp_pdf(path, run_id), FALSE)
}

# ------------------------------------------------------------------- PNG
PNG_SIGNATURE <- as.raw(c(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A))
PNG_KEYWORD <- "headwater:run"

be32 <- function(b) sum(as.numeric(as.integer(b)) * c(16777216, 65536, 256, 1))
be32_raw <- function(n) as.raw(c(n %/% 16777216, (n %/% 65536) %% 256, (n %/% 256) %% 256, n %% 256))

# data.frame of chunks up to IEND: start (1-based), type, data start, length, end.
png_chunks <- function(data) {
  if (!starts_with(data, PNG_SIGNATURE)) stop("not a PNG")
  pos <- 9L
  starts <- integer(); types <- character(); lens <- numeric()
  repeat {
    if (pos + 11L > length(data)) stop("truncated PNG")
    len <- be32(data[pos:(pos + 3L)])
    type <- rawToChar(data[(pos + 4L):(pos + 7L)])
    end <- pos + 12 + len - 1
    if (end > length(data)) stop("truncated PNG chunk")
    starts <- c(starts, pos); types <- c(types, type); lens <- c(lens, len)
    pos <- as.integer(end + 1)
    if (type == "IEND") break
  }
  data.frame(start = starts, type = types, length = lens, stringsAsFactors = FALSE)
}

png_chunk <- function(type, body) {
  tb <- c(charToRaw(type), body)
  c(be32_raw(length(body)), tb, crc32_raw(tb))
}

stamp_png <- function(path, run_id) {
  data <- read_all(path)
  chunks <- tryCatch(png_chunks(data), error = function(e) NULL)
  if (is.null(chunks)) return(FALSE)
  keyword <- charToRaw(PNG_KEYWORD)
  wanted <- c(keyword, as.raw(0), charToRaw(run_id))
  body_of <- function(i) {
    if (chunks$length[i] == 0) return(raw(0))
    s <- chunks$start[i] + 8L
    data[s:(s + chunks$length[i] - 1)]
  }
  ours <- vapply(seq_len(nrow(chunks)), function(i) {
    chunks$type[i] == "tEXt" && starts_with(body_of(i), c(keyword, as.raw(0)))
  }, TRUE)
  if (sum(ours) == 1 && identical(body_of(which(ours)), wanted)) return(TRUE)
  n <- nrow(chunks)
  keep <- lapply(seq_len(n - 1L), function(i) {
    if (ours[i]) return(raw(0))
    data[chunks$start[i]:(chunks$start[i] + 12 + chunks$length[i] - 1)]
  })
  iend_start <- chunks$start[n]
  rest <- data[iend_start:length(data)]   # IEND and anything after it
  out <- c(PNG_SIGNATURE, unlist(keep), png_chunk("tEXt", wanted), rest)
  write_all(path, out)
  TRUE
}

# ------------------------------------------------------------------- SVG
SVG_RUN_OPEN <- "<headwater:run xmlns:headwater=\"urn:headwater:run\">"

# 1-based index of the root element's "<", past the XML declaration,
# processing instructions, comments, a DOCTYPE and white space.
svg_root_at <- function(txt) {
  n <- nchar(txt, type = "bytes"); i <- 1L
  sub1 <- function(a, len) substr(txt, a, a + len - 1L)
  while (i <= n) {
    c1 <- sub1(i, 1L)
    if (c1 %in% c(" ", "\t", "\r", "\n")) { i <- i + 1L; next }
    if (sub1(i, 2L) == "<?") {
      j <- regexpr("?>", substr(txt, i, n), fixed = TRUE)
      if (j < 0) stop("unterminated processing instruction")
      i <- i + j + 1L; next
    }
    if (sub1(i, 4L) == "<!--") {
      j <- regexpr("-->", substr(txt, i, n), fixed = TRUE)
      if (j < 0) stop("unterminated comment")
      i <- i + j + 2L; next
    }
    if (sub1(i, 9L) == "<!DOCTYPE") {
      depth <- 0L; quote <- ""; i <- i + 9L
      repeat {
        if (i > n) stop("unterminated DOCTYPE")
        ch <- sub1(i, 1L)
        if (nzchar(quote)) { if (ch == quote) quote <- "" }
        else if (ch %in% c("\"", "'")) quote <- ch
        else if (ch == "[") depth <- depth + 1L
        else if (ch == "]") depth <- depth - 1L
        else if (ch == ">" && depth <= 0L) { i <- i + 1L; break }
        i <- i + 1L
      }
      next
    }
    if (c1 == "<") return(i)
    stop("text before the root element")
  }
  stop("no root element")
}

stamp_svg <- function(path, run_id) {
  data <- read_all(path)
  if (starts_with(data, as.raw(c(0xFF, 0xFE))) || starts_with(data, as.raw(c(0xFE, 0xFF)))) return(FALSE)
  if (any(data == as.raw(0))) return(FALSE)
  bom <- starts_with(data, as.raw(c(0xEF, 0xBB, 0xBF)))
  txt <- rawToChar(if (bom) data[-(1:3)] else data)
  Encoding(txt) <- "bytes"
  # Already stamped: put this id in place of the old one.
  m <- regexpr(paste0(SVG_RUN_OPEN, "[^<]*</headwater:run>"), txt, fixed = FALSE, useBytes = TRUE)
  if (m > 0) {
    old <- regmatches(txt, m)
    new <- paste0(SVG_RUN_OPEN, run_id, "</headwater:run>")
    if (identical(old, new)) return(TRUE)
    out <- paste0(substr(txt, 1L, m - 1L), new, substr(txt, m + attr(m, "match.length"), nchar(txt, "bytes")))
  } else {
    at <- tryCatch(svg_root_at(txt), error = function(e) NA_integer_)
    if (is.na(at)) return(FALSE)
    rest <- substr(txt, at, nchar(txt, "bytes"))
    name <- regmatches(rest, regexpr("^<[^[:space:]/>]+", rest, useBytes = TRUE))
    name <- substring(name, 2L)
    local <- sub("^.*:", "", name)
    if (!identical(local, "svg")) return(FALSE)
    prefix <- if (grepl(":", name, fixed = TRUE)) sub(":.*$", ":", name) else ""
    # End of the root start tag: the first ">" outside quoted attribute values.
    n <- nchar(rest, "bytes"); j <- 2L; quote <- ""; tag_end <- NA_integer_
    while (j <= n) {
      ch <- substr(rest, j, j)
      if (nzchar(quote)) { if (ch == quote) quote <- "" }
      else if (ch %in% c("\"", "'")) quote <- ch
      else if (ch == ">") { tag_end <- j; break }
      j <- j + 1L
    }
    if (is.na(tag_end)) return(FALSE)
    meta <- paste0("<", prefix, "metadata>", SVG_RUN_OPEN, run_id, "</headwater:run></", prefix, "metadata>")
    self_closing <- substr(rest, tag_end - 1L, tag_end - 1L) == "/"
    before <- substr(txt, 1L, at - 1L)
    if (self_closing) {
      out <- paste0(before, substr(rest, 1L, tag_end - 2L), ">", meta, "</", name, ">",
                    substr(rest, tag_end + 1L, n))
    } else {
      out <- paste0(before, substr(rest, 1L, tag_end), meta, substr(rest, tag_end + 1L, n))
    }
  }
  bytes <- charToRaw(out)
  write_all(path, if (bom) c(as.raw(c(0xEF, 0xBB, 0xBF)), bytes) else bytes)
  TRUE
}

# ------------------------------------------------------------------- PDF
# Just enough of a PDF reader (ISO 32000-1, 7.2 lexical conventions and 7.3
# objects) to find the trailer, the cross-reference table and the document
# information dictionary.  Bytes are handled as integer codes; positions
# are 1-based indexes into the file.

PDF_WS <- c(0L, 9L, 10L, 12L, 13L, 32L)
PDF_DELIM <- as.integer(charToRaw("()<>[]{}/%"))

pdf_skip_ws <- function(b, i) {
  n <- length(b)
  while (i <= n) {
    c1 <- b[i]
    if (c1 %in% PDF_WS) i <- i + 1L
    else if (c1 == 37L) {          # % comment, to the end of the line
      while (i <= n && !(b[i] %in% c(10L, 13L))) i <- i + 1L
    } else break
  }
  i
}

pdf_token_end <- function(b, i) {
  n <- length(b)
  while (i <= n && !(b[i] %in% PDF_WS) && !(b[i] %in% PDF_DELIM)) i <- i + 1L
  i
}

pdf_text <- function(b, from, to) if (to < from) "" else rawToChar(as.raw(b[from:to]))

pdf_starts <- function(b, i, word) {
  w <- as.integer(charToRaw(word))
  i + length(w) - 1L <= length(b) && all(b[i:(i + length(w) - 1L)] == w)
}

# list(value, end) where end is the index just past the value.
pdf_value <- function(b, i) {
  i <- pdf_skip_ws(b, i)
  n <- length(b)
  if (i > n) stop("unexpected end of PDF data")
  c1 <- b[i]
  if (c1 == 47L) {                                   # /Name
    e <- pdf_token_end(b, i + 1L)
    return(list(value = list(type = "name", v = pdf_text(b, i + 1L, e - 1L)), end = e))
  }
  if (pdf_starts(b, i, "<<")) return(pdf_dict(b, i))
  if (c1 == 60L) {                                   # <hex string>
    j <- i
    while (j <= n && b[j] != 62L) j <- j + 1L
    return(list(value = list(type = "raw", start = i, end = j), end = j + 1L))
  }
  if (c1 == 40L) {                                   # (literal string)
    depth <- 0L; j <- i
    while (j <= n) {
      ch <- b[j]
      if (ch == 92L) { j <- j + 2L; next }
      if (ch == 40L) depth <- depth + 1L
      else if (ch == 41L) {
        depth <- depth - 1L
        if (depth == 0L) return(list(value = list(type = "raw", start = i, end = j), end = j + 1L))
      }
      j <- j + 1L
    }
    stop("unterminated string")
  }
  if (c1 == 91L) {                                   # [array]
    items <- list(); j <- i + 1L
    repeat {
      j <- pdf_skip_ws(b, j)
      if (j > n) stop("unterminated array")
      if (b[j] == 93L) return(list(value = list(type = "array", items = items, start = i, end = j), end = j + 1L))
      v <- pdf_value(b, j); items[[length(items) + 1L]] <- v$value; j <- v$end
    }
  }
  e <- pdf_token_end(b, i)
  word <- pdf_text(b, i, e - 1L)
  if (grepl("^[0-9]+$", word)) {
    # "n g R" is an indirect reference.
    j <- pdf_skip_ws(b, e)
    e2 <- pdf_token_end(b, j)
    gen <- pdf_text(b, j, e2 - 1L)
    if (grepl("^[0-9]+$", gen)) {
      k <- pdf_skip_ws(b, e2)
      if (k <= n && b[k] == 82L && pdf_token_end(b, k) == k + 1L)
        return(list(value = list(type = "ref", num = as.numeric(word), gen = as.numeric(gen),
                                 start = i, end = k), end = k + 1L))
    }
    return(list(value = list(type = "int", v = as.numeric(word)), end = e))
  }
  if (grepl("^[+-]?([0-9]+\\.?[0-9]*|\\.[0-9]+)$", word))
    return(list(value = list(type = "real", v = as.numeric(word)), end = e))
  if (word %in% c("true", "false", "null"))
    return(list(value = list(type = word), end = e))
  stop("unexpected PDF token '", substr(word, 1, 20), "'")
}

pdf_dict <- function(b, i) {
  i <- pdf_skip_ws(b, i)
  if (!pdf_starts(b, i, "<<")) stop("expected a dictionary")
  entries <- list(); j <- i + 2L
  repeat {
    j <- pdf_skip_ws(b, j)
    if (j > length(b)) stop("unterminated dictionary")
    if (pdf_starts(b, j, ">>")) break
    start <- j
    k <- pdf_value(b, j)
    if (!identical(k$value$type, "name")) stop("dictionary key is not a name")
    v <- pdf_value(b, k$end)
    entries[[k$value$v]] <- list(value = v$value, start = start, end = v$end - 1L)
    j <- v$end
  }
  list(value = list(type = "dict", entries = entries, start = i, end = j + 1L), end = j + 2L)
}

pdf_bytes_of <- function(b, v) pdf_text(b, v$start, v$end)

# The trailer and the object offsets of the cross-reference tables, newest
# first, following /Prev.  NULL when the file uses cross-reference streams.
pdf_xref <- function(b, startxref) {
  offsets <- list(); trailer <- NULL; seen <- numeric()
  off <- startxref
  while (!is.null(off) && !(off %in% seen)) {
    seen <- c(seen, off)
    i <- pdf_skip_ws(b, off + 1L)
    if (!pdf_starts(b, i, "xref")) return(NULL)
    i <- i + 4L
    repeat {
      i <- pdf_skip_ws(b, i)
      if (pdf_starts(b, i, "trailer")) {
        t <- pdf_dict(b, i + 7L)$value
        break
      }
      first <- pdf_value(b, i); count <- pdf_value(b, first$end)
      i <- pdf_skip_ws(b, count$end)
      for (k in seq_len(count$value$v)) {
        entry <- pdf_text(b, i, min(length(b), i + 19L))
        m <- regmatches(entry, regexec("^([0-9]{10}) ([0-9]{5}) ([nf])", entry))[[1]]
        if (length(m) != 4) stop("bad cross-reference entry")
        num <- as.character(first$value$v + k - 1)
        if (is.null(offsets[[num]]))
          offsets[[num]] <- if (m[4] == "n") as.numeric(m[2]) else NA
        i <- i + 20L
      }
    }
    if (is.null(trailer)) trailer <- t
    prev <- t$entries$Prev
    off <- if (!is.null(prev) && identical(prev$value$type, "int")) prev$value$v else NULL
  }
  list(trailer = trailer, offsets = offsets)
}

pdf_string <- function(text) {
  text <- gsub("\\", "\\\\", text, fixed = TRUE)
  text <- gsub("(", "\\(", text, fixed = TRUE)
  text <- gsub(")", "\\)", text, fixed = TRUE)
  paste0("(", text, ")")
}

stamp_pdf <- function(path, run_id) {
  data <- read_all(path)
  if (!starts_with(data, charToRaw("%PDF-"))) return(FALSE)
  b <- as.integer(data)
  n <- length(b)
  update <- tryCatch({
    tail_from <- max(1L, n - 2047L)
    at <- raw_rfind(data[tail_from:n], charToRaw("startxref"))
    if (length(at) == 0) stop("no startxref")
    sx <- pdf_value(b, tail_from + at - 1L + 9L)$value
    if (!identical(sx$type, "int")) stop("bad startxref")
    x <- pdf_xref(b, sx$v)
    if (is.null(x)) return(FALSE)      # cross-reference streams: left alone
    tr <- x$trailer$entries
    if (!is.null(tr$Encrypt)) return(FALSE)
    size <- tr$Size$value; root <- tr$Root$value
    if (!identical(size$type, "int") || !identical(root$type, "ref")) return(FALSE)
    entries <- ""
    info <- tr$Info$value
    want <- pdf_string(run_id)
    if (!is.null(info)) {
      if (!identical(info$type, "ref")) return(FALSE)
      off <- x$offsets[[as.character(info$num)]]
      if (is.null(off) || is.na(off)) return(FALSE)
      i <- off + 1L
      for (w in 1:2) i <- pdf_value(b, i)$end          # "N G"
      i <- pdf_skip_ws(b, i)
      if (!pdf_starts(b, i, "obj")) stop("no object at the Info offset")
      d <- pdf_dict(b, i + 3L)$value
      cur <- d$entries$HeadwaterRun
      if (!is.null(cur) && identical(pdf_bytes_of(b, cur$value), want)) return(TRUE)
      keep <- Filter(function(nm) nm != "HeadwaterRun", names(d$entries))
      parts <- vapply(keep, function(nm) pdf_text(b, d$entries[[nm]]$start, d$entries[[nm]]$end), "")
      entries <- paste(parts, collapse = "\n")
    }
    number <- size$v
    sep <- if (b[n] %in% c(10L, 13L)) "" else "\n"
    info_at <- n + nchar(sep)
    body <- sprintf("%.0f 0 obj\n<<%s%s/HeadwaterRun %s>>\nendobj\n",
                    number, entries, if (nzchar(entries)) "\n" else "", want)
    xref_at <- info_at + nchar(body, "bytes")
    tail_dict <- sprintf("/Size %.0f /Root %s /Info %.0f 0 R /Prev %.0f",
                         max(size$v, number + 1), pdf_bytes_of(b, root), number, sx$v)
    if (!is.null(tr$ID)) tail_dict <- paste0(tail_dict, " /ID ", pdf_bytes_of(b, tr$ID$value))
    # Each cross-reference entry is exactly 20 bytes (7.5.4).
    paste0(sep, body, sprintf("xref\n%.0f 1\n%010.0f 00000 n\r\n", number, info_at),
           "trailer\n<<", tail_dict, ">>\nstartxref\n", sprintf("%.0f", xref_at), "\n%%EOF\n")
  }, error = function(e) NULL)
  if (is.null(update) || isFALSE(update)) return(FALSE)
  if (isTRUE(update)) return(TRUE)
  con <- file(path, "ab")
  on.exit(close(con))
  writeBin(charToRaw(update), con)
  TRUE
}
