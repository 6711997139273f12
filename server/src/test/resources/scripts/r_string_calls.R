# Reference lister for Headwater's tests: every call whose first argument is a string literal.
#
# Uses only R's own parser (parse + getParseData). For each .R file named on the command line it
# prints one tab-separated line per call: file, line, the function as written (pkg::name kept), and
# the first argument's text.
# Calls under a constant-false condition (if (FALSE), if (F), while (FALSE)) are left out: that code
# never runs.
args <- commandArgs(trailingOnly = TRUE)
for (f in args) {
  pd <- getParseData(parse(f, keep.source = TRUE), includeText = TRUE)
  rownames(pd) <- as.character(pd$id)
  kids <- split(pd$id, pd$parent)
  children <- function(id) {
    k <- kids[[as.character(id)]]
    if (is.null(k)) return(integer(0))
    k[order(pd[as.character(k), "line1"], pd[as.character(k), "col1"])]
  }
  tok <- function(id) pd[as.character(id), "token"]
  descendants <- function(id) {
    out <- id
    for (k in children(id)) out <- c(out, descendants(k))
    out
  }
  skipped <- integer(0)
  for (id in pd$id[pd$token == "expr"]) {
    ch <- children(id)
    if (length(ch) >= 5 && tok(ch[1]) %in% c("IF", "WHILE") && tok(ch[2]) == "'('") {
      cond <- children(ch[3])
      if (length(cond) == 1 && pd[as.character(cond[1]), "text"] %in% c("FALSE", "F")) {
        skipped <- c(skipped, descendants(ch[5]))
      }
    }
  }
  for (id in pd$id[pd$token == "expr"]) {
    if (id %in% skipped) next
    ch <- children(id)
    if (length(ch) < 3 || tok(ch[1]) != "expr" || tok(ch[2]) != "'('") next
    head <- children(ch[1])
    if (!any(tok(head) == "SYMBOL_FUNCTION_CALL")) next
    first <- ch[3]
    if (tok(first) != "expr") next
    inner <- children(first)
    if (length(inner) != 1 || tok(inner[1]) != "STR_CONST") next
    name <- paste(pd[as.character(head), "text"], collapse = "")
    cat(f, pd[as.character(id), "line1"], name, gsub("^.|.$", "", pd[as.character(inner[1]), "text"]), sep = "\t")
    cat("\n")
  }
}
