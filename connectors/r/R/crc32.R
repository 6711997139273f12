# CRC-32 as the PNG specification defines it (ISO/IEC 15948, Annex D
# "Sample Cyclic Redundancy Code implementation": polynomial 0xEDB88320,
# register preset to all ones, result complemented).  Base R has no crc32
# and no unsigned 32-bit integers, so the register is kept as two 16-bit
# halves in ordinary integers.

crc_table <- function() {
  t <- .hw$crc_table
  if (!is.null(t)) return(t)
  hi <- integer(256); lo <- integer(256)
  for (n in 0:255) {
    h <- 0L; l <- n
    for (k in 1:8) {
      odd <- bitwAnd(l, 1L) == 1L
      # shift the 32-bit value (h:l) right by one
      l <- bitwOr(bitwShiftR(l, 1L), bitwShiftL(bitwAnd(h, 1L), 15L))
      h <- bitwShiftR(h, 1L)
      if (odd) { h <- bitwXor(h, 0xEDB8L); l <- bitwXor(l, 0x8320L) }
    }
    hi[n + 1] <- h; lo[n + 1] <- l
  }
  t <- list(hi = hi, lo = lo)
  .hw$crc_table <- t
  t
}

# CRC-32 of a raw vector, as 8 lower-case hex digits.
crc32_hex <- function(bytes) {
  t <- crc_table(); th <- t$hi; tl <- t$lo
  h <- 0xFFFFL; l <- 0xFFFFL
  for (b in as.integer(bytes)) {
    i <- bitwXor(bitwAnd(l, 0xFFL), b) + 1L
    nl <- bitwOr(bitwShiftR(l, 8L), bitwShiftL(bitwAnd(h, 0xFFL), 8L))
    h <- bitwXor(th[i], bitwShiftR(h, 8L))
    l <- bitwXor(tl[i], nl)
  }
  h <- bitwXor(h, 0xFFFFL); l <- bitwXor(l, 0xFFFFL)
  sprintf("%04x%04x", h, l)
}

# The CRC as 4 big-endian bytes (the order PNG stores it in).
crc32_raw <- function(bytes) {
  hex <- crc32_hex(bytes)
  as.raw(strtoi(substring(hex, c(1, 3, 5, 7), c(2, 4, 6, 8)), 16L))
}
