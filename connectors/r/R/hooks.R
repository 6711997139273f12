# Which functions are watched, as data, and how they are wrapped.
#
# kind
#   io            a read or write of the file named by `path_arg`
#   delegate      not wrapped; names the call when it reaches the wrapped
#                 `delegate_to` (write.csv's formals are only `...`, so its
#                 arguments cannot be looked at without evaluating them a
#                 second time; it is seen through write.table)
#   device_open   a graphics device writing to `path_arg`; the files are
#                 taken when dev.off() closes it (or at the end of the run)
#   device_close  dev.off(): `path_arg` is the device number
#   exit_status   quit()/q(): `path_arg` is the exit status
# path_arg   argument naming the file; "a|b" tries a, then b
# dir_arg    argument naming a folder the file is relative to (ggsave's path)
# data_arg   argument holding the data frame written
# frame      "result": column facts from the value returned; "data": from data_arg
# stamp      TRUE for figure writers: PNG/SVG/PDF outputs get the run id
hook_table <- function() {
  r <- function(package, fun, kind, path_arg = NA, direction = NA, data_arg = NA,
                frame = NA, dir_arg = NA, delegate_to = NA, stamp = FALSE)
    data.frame(package = package, fun = fun, kind = kind, path_arg = path_arg,
               direction = direction, data_arg = data_arg, frame = frame,
               dir_arg = dir_arg, delegate_to = delegate_to, stamp = stamp,
               stringsAsFactors = FALSE)
  rbind(
    r("utils", "read.table", "io", "file", "read", frame = "result"),
    r("utils", "read.csv", "delegate", delegate_to = "read.table"),
    r("utils", "read.csv2", "delegate", delegate_to = "read.table"),
    r("utils", "read.delim", "delegate", delegate_to = "read.table"),
    r("utils", "read.delim2", "delegate", delegate_to = "read.table"),
    r("utils", "write.table", "io", "file", "write", data_arg = "x", frame = "data"),
    r("utils", "write.csv", "delegate", delegate_to = "write.table"),
    r("utils", "write.csv2", "delegate", delegate_to = "write.table"),
    r("base", "readRDS", "io", "file", "read", frame = "result"),
    r("base", "saveRDS", "io", "file", "write", data_arg = "object", frame = "data"),
    r("base", "load", "io", "file", "read"),
    r("base", "save", "io", "file", "write"),
    r("readr", "read_csv", "io", "file", "read", frame = "result"),
    r("readr", "read_csv2", "io", "file", "read", frame = "result"),
    r("readr", "read_tsv", "io", "file", "read", frame = "result"),
    r("readr", "read_delim", "io", "file", "read", frame = "result"),
    r("readr", "write_csv", "io", "file", "write", data_arg = "x", frame = "data"),
    r("readr", "write_tsv", "io", "file", "write", data_arg = "x", frame = "data"),
    r("readr", "write_delim", "io", "file", "write", data_arg = "x", frame = "data"),
    r("data.table", "fread", "io", "file|input", "read", frame = "result"),
    r("data.table", "fwrite", "io", "file", "write", data_arg = "x", frame = "data"),
    r("ggplot2", "ggsave", "io", "filename", "write", dir_arg = "path", stamp = TRUE),
    r("grDevices", "png", "device_open", "filename", "write", stamp = TRUE),
    r("grDevices", "jpeg", "device_open", "filename", "write", stamp = TRUE),
    r("grDevices", "svg", "device_open", "filename", "write", stamp = TRUE),
    r("grDevices", "pdf", "device_open", "file", "write", stamp = TRUE),
    r("grDevices", "cairo_pdf", "device_open", "filename", "write", stamp = TRUE),
    r("grDevices", "dev.off", "device_close", "which"),
    r("base", "quit", "exit_status", "status"),
    r("base", "q", "exit_status", "status")
  )
}

# A unique object: "the function ended with an error" (returnValue default).
NO_VALUE <- new.env(parent = emptyenv())

needs_leave <- function(row) identical(row$frame, "result") || identical(row$kind, "device_open")

# The wrapped copy of `orig`: the same closure (formals, environment) with a
# body that first calls hook_enter and, for rows that need the result, ends
# with hook_leave.  The original body is evaluated in the function's own
# frame, so sys.call(), parent.frame(), match.call(), missing(), on.exit()
# and the call shown in error messages and in "Calls:" are unchanged.  A
# separate wrapper closure would add a frame and change those; trace()
# puts its exit code in on.exit(), which the function's own on.exit(close(
# file)) replaces (read.table, readRDS, save, load do that), and it prints.
make_wrapped <- function(orig, idx, row) {
  enter <- hook_enter; leave <- hook_leave
  BODY <- body(orig)
  if (needs_leave(row)) {
    new_body <- bquote({
      .(enter)(.(idx), environment())
      .(base::on.exit)(.(leave)(.(idx), environment(), .(base::returnValue)(.(NO_VALUE))), add = TRUE)
      .headwater.value <- .Internal(withVisible(.(BODY)))
      .(leave)(.(idx), environment(), .(base::`[[`)(.headwater.value, "value"))
      if (.(base::`[[`)(.headwater.value, "visible")) .(base::`[[`)(.headwater.value, "value")
      else .(base::invisible)(.(base::`[[`)(.headwater.value, "value"))
    })
  } else {
    new_body <- bquote({
      .(enter)(.(idx), environment())
      .(BODY)
    })
  }
  f <- orig
  attributes(f) <- NULL
  body(f) <- new_body
  f
}

assign_over <- function(name, value, env) {
  locked <- bindingIsLocked(name, env)
  if (locked) unlockBinding(name, env)
  assign(name, value, envir = env)
  if (locked) lockBinding(name, env)
}

ns_env <- function(pkg) if (pkg == "base") .BaseNamespaceEnv else asNamespace(pkg)

# Wrap the rows of one package whose namespace is loaded.
patch_package <- function(pkg) {
  tab <- .hw$table
  for (idx in which(tab$package == pkg)) {
    row <- tab[idx, ]
    key <- paste0(pkg, "::", row$fun)
    if (!is.null(.hw$patched[[key]])) next
    ns <- ns_env(pkg)
    if (!exists(row$fun, envir = ns, inherits = FALSE)) next
    orig <- get(row$fun, envir = ns, inherits = FALSE)
    if (!is.function(orig) || is.primitive(orig)) next
    if (row$kind == "delegate") {
      .hw$delegates[[key]] <- list(fun = orig, via = key, to = row$delegate_to)
      next
    }
    wrapped <- make_wrapped(orig, idx, row)
    where <- list(ns)
    pkg_name <- paste0("package:", pkg)
    if (pkg != "base" && pkg_name %in% search()) {
      penv <- as.environment(pkg_name)
      if (exists(row$fun, envir = penv, inherits = FALSE) &&
          identical(get(row$fun, envir = penv, inherits = FALSE), orig))
        where[[2]] <- penv
    }
    for (env in where) assign_over(row$fun, wrapped, env)
    .hw$patched[[key]] <- list(orig = orig, wrapped = wrapped, where = where, name = row$fun)
  }
}

# After attach: the package environment may hold the original functions
# (when the namespace was loaded before capture started).
patch_attached <- function(pkg) {
  penv <- as.environment(paste0("package:", pkg))
  for (key in names(.hw$patched)) {
    p <- .hw$patched[[key]]
    if (!startsWith(key, paste0(pkg, "::"))) next
    if (exists(p$name, envir = penv, inherits = FALSE) &&
        identical(get(p$name, envir = penv, inherits = FALSE), p$orig)) {
      assign_over(p$name, p$wrapped, penv)
      p$where[[length(p$where) + 1L]] <- penv
      .hw$patched[[key]] <- p
    }
  }
}

install_hooks <- function() {
  .hw$table <- hook_table()
  .hw$patched <- list(); .hw$delegates <- list(); .hw$load_hooks <- list()
  for (pkg in unique(.hw$table$package)) {
    if (pkg == "base" || isNamespaceLoaded(pkg)) quietly(patch_package(pkg), paste("wrapping", pkg))
    if (pkg != "base") {
      on_load <- local({ p <- pkg; function(...) quietly(patch_package(p), paste("wrapping", p)) })
      on_attach <- local({ p <- pkg; function(...) quietly(patch_attached(p), paste("wrapping", p)) })
      setHook(packageEvent(pkg, "onLoad"), on_load)
      setHook(packageEvent(pkg, "attach"), on_attach)
      .hw$load_hooks[[length(.hw$load_hooks) + 1L]] <- list(pkg = pkg, on_load = on_load, on_attach = on_attach)
    }
  }
}

# Put every original back (where our copy is still in place) and remove
# the package-load hooks.
uninstall_hooks <- function() {
  for (key in names(.hw$patched)) {
    p <- .hw$patched[[key]]
    for (env in p$where) {
      if (exists(p$name, envir = env, inherits = FALSE) &&
          identical(get(p$name, envir = env, inherits = FALSE), p$wrapped))
        assign_over(p$name, p$orig, env)
    }
  }
  .hw$patched <- list()
  for (h in .hw$load_hooks) {
    for (ev in c("onLoad", "attach")) {
      name <- packageEvent(h$pkg, ev)
      mine <- if (ev == "onLoad") h$on_load else h$on_attach
      hooks <- getHook(name)
      keep <- Filter(function(f) !identical(f, mine), hooks)
      setHook(name, if (length(keep)) keep else NULL, "replace")
    }
  }
  .hw$load_hooks <- list()
}

# ------------------------------------------------------------ recording
# Evaluate an argument of the wrapped call.  This is done outside the
# connector's muffling, so a warning from the script's own expression
# reaches the script as before; an error leaves the promise unforced (the
# function then evaluates it itself and fails as it would have).
force_arg <- function(name, frame) {
  if (is.na(name) || !nzchar(name)) return(NULL)
  tryCatch(list(value = get(name, envir = frame, inherits = FALSE)), error = function(e) NULL)
}

hook_enter <- function(idx, frame) {
  if (!isTRUE(.hw$active) || .hw$busy > 0L) return(invisible(NULL))
  row <- .hw$table[idx, ]
  got <- list()
  if (!is.na(row$data_arg)) got$data <- force_arg(row$data_arg, frame)
  for (a in strsplit(row$path_arg, "|", fixed = TRUE)[[1]]) {
    v <- force_arg(a, frame)
    if (!is.null(v) && !is.null(v$value)) { got$path <- v; break }
  }
  if (!is.na(row$dir_arg)) got$dir <- force_arg(row$dir_arg, frame)
  quietly(enter_work(idx, row, frame, got), "recording a call")
  invisible(NULL)
}

hook_leave <- function(idx, frame, value) {
  if (.hw$busy > 0L || is.null(.hw$calls)) return(invisible(NULL))
  quietly(leave_work(idx, frame, value), "recording a result")
  invisible(NULL)
}

# Paths named by an argument value: character strings (not URLs or literal
# data) and the description of file connections.
as_paths <- function(v) {
  if (is.null(v)) return(character())
  if (inherits(v, "connection")) {
    s <- tryCatch(summary(v), error = function(e) NULL)
    if (is.null(s) || !(s$class %in% c("file", "gzfile", "bzfile", "xzfile"))) return(character())
    v <- s$description
  }
  if (!is.character(v) || inherits(v, "AsIs")) return(character())
  v <- v[!is.na(v) & nzchar(v)]
  v <- v[!grepl("[\n\r]", v)]
  file_url <- grepl("^file://", v)
  v[file_url] <- sub("^file://", "", v[file_url])
  v[!grepl("^[A-Za-z][A-Za-z0-9+.-]*://", v)]
}

excluded <- function(path) {
  roots <- .hw$exclude_roots
  any(startsWith(path, roots)) || identical(path, .hw$cfg$spool)
}

exclude_roots <- function() {
  r <- c(R.home(), .libPaths(), tempdir(), "/proc", "/dev", "/sys")
  r <- unique(c(r, normalizePath(r, winslash = "/", mustWork = FALSE)))
  paste0(sub("/+$", "", r), "/")
}

nearest_delegate <- function(to) {
  ds <- Filter(function(d) identical(d$to, to), .hw$delegates)
  if (length(ds) == 0) return(NULL)
  for (k in rev(seq_len(max(0L, sys.nframe() - 1L)))) {
    f <- sys.function(k)
    for (d in ds) if (identical(f, d$fun)) return(d$via)
  }
  NULL
}

frame_info <- function(x) {
  if (!is.data.frame(x)) return(NULL)
  list(columns = json_array(as.character(names(x))),
       dtypes = json_array(vapply(x, function(col) class(col)[1], "")),
       rows = nrow(x))
}

enter_work <- function(idx, row, frame, got) {
  via <- paste0(row$package, "::", row$fun)
  if (row$kind == "exit_status") {
    if (!is.null(got$path)) .hw$exit_status <- as.integer(got$path$value)[1]
    return()
  }
  if (row$kind == "device_close") {
    which <- if (is.null(got$path)) grDevices::dev.cur() else got$path$value
    key <- as.character(as.integer(which)[1])
    d <- .hw$devices[[key]]
    if (!is.null(d)) {
      .hw$closed_devices[[length(.hw$closed_devices) + 1L]] <- d
      .hw$devices[[key]] <- NULL
    }
    return()
  }
  paths <- as_paths(got$path$value)
  if (!is.null(got$dir) && is.character(got$dir$value) && length(got$dir$value) == 1 &&
      !is.na(got$dir$value) && length(paths) == 1 && !is_absolute(path.expand(paths)))
    paths <- file.path(got$dir$value, paths)
  paths <- vapply(paths, absolute_path, "", USE.NAMES = FALSE)
  paths <- paths[!vapply(paths, excluded, TRUE)]
  via <- nearest_delegate(row$fun) %||% via
  at <- now()
  keys <- character()
  if (row$kind == "device_open") {
    if (length(paths) == 1)
      prune_push(list(frame = frame, idx = idx, device = list(pattern = paths, via = via, at = at)))
    return()
  }
  data_frame <- if (identical(row$frame, "data") && !is.null(got$data)) frame_info(got$data$value) else NULL
  for (p in paths) {
    if (row$direction == "read") {
      if (!file.exists(p) || dir.exists(p)) next
      f <- file_facts(p, .hw$cfg$hash_cap)
      keys <- c(keys, add_io(p, "read", via, f$bytes, f$sha256, NULL, at))
    } else {
      keys <- c(keys, add_output(p, via, data_frame, at, isTRUE(row$stamp)))
    }
  }
  if (needs_leave(row) && length(keys)) prune_push(list(frame = frame, idx = idx, keys = keys))
}

# Calls waiting for their result.  Entries whose function has left without
# reaching hook_leave (an error after its own on.exit() replaced ours) are
# dropped here.
prune_push <- function(call) {
  calls <- .hw$calls
  if (length(calls)) {
    live <- sys.frames()
    calls <- Filter(function(c) any(vapply(live, identical, TRUE, c$frame)), calls)
  }
  calls[[length(calls) + 1L]] <- call
  .hw$calls <- calls
}

leave_work <- function(idx, frame, value) {
  calls <- .hw$calls
  hit <- 0L
  for (i in rev(seq_along(calls))) if (identical(calls[[i]]$frame, frame) && calls[[i]]$idx == idx) { hit <- i; break }
  if (hit == 0L) return()
  call <- calls[[hit]]
  .hw$calls <- calls[-hit]
  if (identical(value, NO_VALUE)) return()
  if (!is.null(call$device)) {
    dev <- grDevices::dev.cur()
    if (dev > 1) .hw$devices[[as.character(dev)]] <- call$device
    return()
  }
  fi <- frame_info(value)
  if (!is.null(fi)) for (k in call$keys) { e <- .hw$io[[k]]; if (!is.null(e)) { e$frame <- fi; .hw$io[[k]] <- e } }
}
