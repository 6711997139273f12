"""Which functions are wrapped, and how.

The tables in this module are data: the wrapping code below reads them and
has no per-library branches.  Adding a library means adding rows.

HOOKS rows are (module, attribute, path position, path keyword, direction,
options):

* module      -- the module that holds the attribute; wrapped when it is (or
                 gets) imported, never imported by the connector itself.
* attribute   -- "name" for a module function, "Class.name" for a method.
* position    -- index of the path argument in the call's positional
                 arguments (0 is ``self`` for methods), or RETURN when the
                 path that was really used is the call's return value.
* keyword     -- the same argument's keyword name (None for RETURN).
* direction   -- "read", "write", "delete", "rename_from", "rename_to", or
                 "by_mode" (read and/or write, decided by the mode argument
                 named in the options).
* options     -- dict, may hold:
    "mode":   (position, keyword, default) of the mode argument;
    "frame":  where a data frame is found, "return" or "arg0";
    "suffix": a suffix the library appends when the path lacks it, or
              "matplotlib" for savefig's format-dependent extension;
    "skip_if_kw": keyword arguments that make the path relative to a
              directory descriptor (those calls are not recorded).

Several rows for the same (module, attribute) make one wrapper that records
every path named in the rows (e.g. copy source and destination).
"""

import functools
import os
import sys
import threading

RETURN = "return"

_MODE = {"mode": (1, "mode", "r")}
_DIR_FD = {"skip_if_kw": ("dir_fd", "src_dir_fd", "dst_dir_fd")}

HOOKS = [
    # --- the standard library --------------------------------------------
    ("builtins", "open", 0, "file", "by_mode", _MODE),
    ("io", "open", 0, "file", "by_mode", _MODE),
    ("pathlib", "Path.open", 0, "self", "by_mode", _MODE),
    ("pathlib", "Path.read_text", 0, "self", "read", {}),
    ("pathlib", "Path.read_bytes", 0, "self", "read", {}),
    ("pathlib", "Path.write_text", 0, "self", "write", {}),
    ("pathlib", "Path.write_bytes", 0, "self", "write", {}),
    ("pathlib", "Path.rename", 0, "self", "rename_from", {}),
    ("pathlib", "Path.rename", 1, "target", "rename_to", {}),
    ("pathlib", "Path.replace", 0, "self", "rename_from", {}),
    ("pathlib", "Path.replace", 1, "target", "rename_to", {}),
    ("pathlib", "Path.unlink", 0, "self", "delete", {}),
    ("os", "rename", 0, "src", "rename_from", _DIR_FD),
    ("os", "rename", 1, "dst", "rename_to", _DIR_FD),
    ("os", "replace", 0, "src", "rename_from", _DIR_FD),
    ("os", "replace", 1, "dst", "rename_to", _DIR_FD),
    ("os", "remove", 0, "path", "delete", _DIR_FD),
    ("os", "unlink", 0, "path", "delete", _DIR_FD),
    ("shutil", "copyfile", 0, "src", "read", {}),
    ("shutil", "copyfile", RETURN, None, "write", {}),
    ("shutil", "copy", 0, "src", "read", {}),
    ("shutil", "copy", RETURN, None, "write", {}),
    ("shutil", "copy2", 0, "src", "read", {}),
    ("shutil", "copy2", RETURN, None, "write", {}),
    ("shutil", "copytree", 0, "src", "read", {}),
    ("shutil", "copytree", 1, "dst", "write", {}),
    ("shutil", "move", 0, "src", "rename_from", {}),
    ("shutil", "move", RETURN, None, "rename_to", {}),
    ("shutil", "rmtree", 0, "path", "delete", {}),
    # --- pandas ------------------------------------------------------------
    ("pandas", "read_csv", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_table", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_fwf", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_json", 0, "path_or_buf", "read", {"frame": "return"}),
    ("pandas", "read_excel", 0, "io", "read", {"frame": "return"}),
    ("pandas", "read_parquet", 0, "path", "read", {"frame": "return"}),
    ("pandas", "read_feather", 0, "path", "read", {"frame": "return"}),
    ("pandas", "read_orc", 0, "path", "read", {"frame": "return"}),
    ("pandas", "read_pickle", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_hdf", 0, "path_or_buf", "read", {"frame": "return"}),
    ("pandas", "read_stata", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_sas", 0, "filepath_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_spss", 0, "path", "read", {"frame": "return"}),
    ("pandas", "read_xml", 0, "path_or_buffer", "read", {"frame": "return"}),
    ("pandas", "read_html", 0, "io", "read", {}),
    ("pandas", "DataFrame.to_csv", 1, "path_or_buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_json", 1, "path_or_buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_excel", 1, "excel_writer", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_parquet", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_feather", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_orc", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_pickle", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_hdf", 1, "path_or_buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_stata", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_xml", 1, "path_or_buffer", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_html", 1, "buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_markdown", 1, "buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_latex", 1, "buf", "write", {"frame": "arg0"}),
    ("pandas", "DataFrame.to_string", 1, "buf", "write", {"frame": "arg0"}),
    ("pandas", "Series.to_csv", 1, "path_or_buf", "write", {"frame": "arg0"}),
    ("pandas", "Series.to_json", 1, "path_or_buf", "write", {"frame": "arg0"}),
    ("pandas", "Series.to_excel", 1, "excel_writer", "write", {"frame": "arg0"}),
    ("pandas", "Series.to_pickle", 1, "path", "write", {"frame": "arg0"}),
    ("pandas", "Series.to_hdf", 1, "path_or_buf", "write", {"frame": "arg0"}),
    # --- numpy -------------------------------------------------------------
    ("numpy", "load", 0, "file", "read", {}),
    ("numpy", "loadtxt", 0, "fname", "read", {}),
    ("numpy", "genfromtxt", 0, "fname", "read", {}),
    ("numpy", "fromfile", 0, "file", "read", {}),
    ("numpy", "save", 0, "file", "write", {"suffix": ".npy"}),
    ("numpy", "savez", 0, "file", "write", {"suffix": ".npz"}),
    ("numpy", "savez_compressed", 0, "file", "write", {"suffix": ".npz"}),
    ("numpy", "savetxt", 0, "fname", "write", {}),
    # --- pyarrow -----------------------------------------------------------
    ("pyarrow.parquet", "read_table", 0, "source", "read", {"frame": "return"}),
    ("pyarrow.parquet", "read_pandas", 0, "source", "read", {"frame": "return"}),
    ("pyarrow.parquet", "write_table", 1, "where", "write", {"frame": "arg0"}),
    ("pyarrow.csv", "read_csv", 0, "input_file", "read", {"frame": "return"}),
    ("pyarrow.csv", "write_csv", 1, "output_file", "write", {"frame": "arg0"}),
    ("pyarrow.feather", "read_table", 0, "source", "read", {"frame": "return"}),
    ("pyarrow.feather", "read_feather", 0, "source", "read", {"frame": "return"}),
    ("pyarrow.feather", "write_feather", 1, "dest", "write", {"frame": "arg0"}),
    # --- polars ------------------------------------------------------------
    ("polars", "read_csv", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_parquet", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_ipc", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_json", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_ndjson", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_excel", 0, "source", "read", {"frame": "return"}),
    ("polars", "read_avro", 0, "source", "read", {"frame": "return"}),
    ("polars", "DataFrame.write_csv", 1, "file", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_parquet", 1, "file", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_ipc", 1, "file", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_json", 1, "file", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_ndjson", 1, "file", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_excel", 1, "workbook", "write", {"frame": "arg0"}),
    ("polars", "DataFrame.write_avro", 1, "file", "write", {"frame": "arg0"}),
    # --- matplotlib ----------------------------------------------------------
    ("matplotlib.pyplot", "savefig", 0, "fname", "write", {"suffix": "matplotlib"}),
    ("matplotlib.figure", "Figure.savefig", 1, "fname", "write", {"suffix": "matplotlib"}),
]

# Paths that are never recorded: the interpreter's own files, libraries'
# caches, kernel pseudo-files.  Rows are (kind, value, directions); kind is
#   "suffix" -- the path ends with value (case-insensitive);
#   "part"   -- a path component equals value;
#   "under"  -- the path is value or inside the directory value;
#   "starts" -- the path string starts with value.
# Values may name {prefix}, {base_prefix}, {exec_prefix}, {base_exec_prefix}
# (sys attributes), {home}, {tmp}, {package} (this package's folder),
# {spool} (the spool file; its .lock starts the same) or {env:NAME}; a row whose placeholder is empty is ignored.
# directions None means every direction.
EXCLUDE = [
    ("suffix", ".py", ("read",)),
    ("suffix", ".pyc", None),
    ("suffix", ".pyo", None),
    ("suffix", ".pyd", ("read",)),
    ("suffix", ".so", ("read",)),
    ("suffix", ".pth", ("read",)),
    ("part", "__pycache__", None),
    ("part", "site-packages", None),
    ("part", "dist-packages", None),
    ("under", "{prefix}", None),
    ("under", "{base_prefix}", None),
    ("under", "{exec_prefix}", None),
    ("under", "{base_exec_prefix}", None),
    ("under", "/usr/lib", None),
    ("under", "/usr/local/lib", None),
    ("under", "/usr/share", None),
    ("under", "/proc", None),
    ("under", "/dev", None),
    ("under", "/sys", None),
    ("under", "/etc", None),
    ("under", "{package}", None),
    ("under", "{home}/.cache/matplotlib", None),
    ("under", "{home}/.config/matplotlib", None),
    ("under", "{home}/.matplotlib", None),
    ("under", "{env:MPLCONFIGDIR}", None),
    ("starts", "{tmp}/matplotlib-", None),
    ("starts", "{spool}", None),
]

# Stamped figure formats: file suffix -> stamp function name in stamp.py.
STAMPABLE = {".png": "stamp_png", ".svg": "stamp_svg", ".pdf": "stamp_pdf"}
# Larger files are not stamped (stamping reads the whole file).
STAMP_MAX_BYTES = 256 * 1024 * 1024

# Directory arguments (e.g. a partitioned dataset, copytree) are expanded to
# the files inside, at most this many per call.
TREE_LIMIT = 10000


class Group(object):
    """All rows of one (module, attribute): one wrapper."""

    __slots__ = ("module", "attribute", "via", "paths", "options")

    def __init__(self, module, attribute):
        self.module = module
        self.attribute = attribute
        self.via = module + "." + attribute
        self.paths = []  # (position, keyword, direction)
        self.options = {}

    def __repr__(self):
        return "<hook %s>" % self.via


def groups(table=None):
    """The hook table folded into {module: [Group, ...]}, in table order."""
    by_key = {}
    out = {}
    for module, attribute, position, keyword, direction, options in (table or HOOKS):
        key = (module, attribute)
        group = by_key.get(key)
        if group is None:
            group = by_key[key] = Group(module, attribute)
            out.setdefault(module, []).append(group)
        group.paths.append((position, keyword, direction))
        group.options.update(options)
    return out


# ---------------------------------------------------------------------------
# The wrapper.  Its code is compiled under a file name that contains
# "importlib" and "_bootstrap": CPython's warnings module skips such frames
# when it counts ``stacklevel`` (Lib/warnings.py, _is_internal_frame and
# _next_external_frame; Python/_warnings.c, is_internal_frame), so a warning
# that a wrapped library raises for its caller still names the script's line,
# exactly as without capture.  A wrapper also removes its own entry from the
# traceback of an exception passing through it (Python >= 3.11 keeps that
# removal), and tbfilter.py removes it from tracebacks printed at exit.
HIDDEN_FILENAME = "<headwater wrapper, hidden like importlib._bootstrap>"

_FACTORY_SOURCE = '''
def make_wrapper(orig, group, enter, leave, tls):
    def wrapper(*args, **kwargs):
        ticket = None if tls.depth else enter(group, args, kwargs)
        if ticket is not None:
            tls.depth += 1
        try:
            result = orig(*args, **kwargs)
        except BaseException as exc:
            # Drop this frame's traceback entry; a bare raise adds none
            # back on Python >= 3.11 (older versions re-add it from the
            # saved exception state, and tbfilter cleans printed ones).
            tb = exc.__traceback__
            if tb is not None and tb.tb_frame.f_code is code:
                exc.__traceback__ = tb.tb_next
            raise
        finally:
            if ticket is not None:
                tls.depth -= 1
        if ticket is not None:
            leave(ticket, result)
        return result
    code = wrapper.__code__
    return wrapper


class Unbound(object):
    """Wrapper for a builtin (C) function.  Builtins do not bind as methods
    when stored as class attributes (e.g. pathlib's accessor on Python
    3.9/3.10 has ``open = io.open``), so their stand-in must not either: an
    object with __call__ and no __get__."""

    def __init__(self, orig, group, enter, leave, tls):
        self._orig = orig
        self._group = group
        self._enter = enter
        self._leave = leave
        self._tls = tls

    def __call__(self, *args, **kwargs):
        tls = self._tls
        ticket = None if tls.depth else self._enter(self._group, args, kwargs)
        if ticket is not None:
            tls.depth += 1
        try:
            result = self._orig(*args, **kwargs)
        except BaseException as exc:
            tb = exc.__traceback__
            if tb is not None and tb.tb_frame.f_code is _UNBOUND_CODE:
                exc.__traceback__ = tb.tb_next
            raise
        finally:
            if ticket is not None:
                tls.depth -= 1
        if ticket is not None:
            self._leave(ticket, result)
        return result

    def __repr__(self):
        return repr(self._orig)

    def __reduce__(self):
        # Pickled by name, like the builtin it stands for: unpickling looks
        # the name up again (pkgutil.resolve_name, Python >= 3.9).
        import pkgutil

        return (pkgutil.resolve_name, ("%s:%s" % (self._group.module, self._group.attribute),))


_UNBOUND_CODE = Unbound.__call__.__code__


def make_exit(orig, note):
    def exit(*args):
        note(args)
        return orig(*args)
    return exit
'''

_factory = {}
exec(compile(_FACTORY_SOURCE, HIDDEN_FILENAME, "exec"), _factory)
make_exit = _factory["make_exit"]


class _Depth(threading.local):
    """Per-thread nesting: calls made inside a wrapped call, or by the
    connector itself, are not recorded again."""

    depth = 0


tls = _Depth()


class internal(object):
    """Context manager for the connector's own work: nothing inside is
    recorded."""

    __slots__ = ()

    def __enter__(self):
        tls.depth += 1

    def __exit__(self, *exc):
        tls.depth -= 1
        return False


_MARK = "__headwater_wrapped__"


def wrap(orig, group, enter, leave):
    if hasattr(orig, "__get__"):
        wrapper = _factory["make_wrapper"](orig, group, enter, leave, tls)
    else:
        wrapper = _factory["Unbound"](orig, group, enter, leave, tls)
    try:
        functools.update_wrapper(wrapper, orig)
    except Exception:
        pass
    try:
        setattr(wrapper, _MARK, orig)
    except Exception:
        pass
    return wrapper


def _lookup(owner, name):
    """(holder, raw attribute) found through the MRO for classes, so that
    static and class methods keep their kind when they are replaced."""
    if isinstance(owner, type):
        for klass in owner.__mro__:
            if name in vars(klass):
                return vars(klass)[name]
        return None
    return getattr(owner, name, None)


def patch_module(module, module_groups, enter, leave, patched, shared=None):
    """Wrap every attribute of ``module`` named by ``module_groups``.
    ``patched`` collects (owner, name, original, own) for unpatching.
    ``shared`` maps id(original) to (original, wrapper): one builtin known
    under two names (``builtins.open`` is ``io.open``) keeps one stand-in,
    so identity checks still hold."""
    for group in module_groups:
        owner = module
        parts = group.attribute.split(".")
        try:
            for part in parts[:-1]:
                owner = getattr(owner, part)
        except AttributeError:
            continue
        name = parts[-1]
        raw = _lookup(owner, name)
        if raw is None:
            continue
        kind = None
        func = raw
        if isinstance(raw, staticmethod):
            kind, func = staticmethod, raw.__func__
        elif isinstance(raw, classmethod):
            kind, func = classmethod, raw.__func__
        if getattr(func, _MARK, None) is not None or not callable(func):
            continue
        own = (name in vars(owner)) if isinstance(owner, type) else True
        # Builtins only: a Python function shared by two classes (pandas'
        # NDFrame.to_csv is DataFrame's and Series') gets one wrapper each,
        # so that each records its own name.
        share = shared is not None and not hasattr(func, "__get__")
        known = shared.get(id(func)) if share else None
        if known is not None and known[0] is func:
            wrapper = known[1]
        else:
            wrapper = wrap(func, group, enter, leave)
            if share:
                shared[id(func)] = (func, wrapper)
        try:
            setattr(owner, name, kind(wrapper) if kind else wrapper)
        except (AttributeError, TypeError):
            continue
        patched.append((owner, name, raw, own))


def unpatch(patched):
    """Put back what patch_module replaced (used by tests)."""
    while patched:
        owner, name, raw, own = patched.pop()
        try:
            if own:
                setattr(owner, name, raw)
            else:
                delattr(owner, name)
        except Exception:
            pass


class ImportWatcher(object):
    """A meta path finder that wraps a watched module's attributes right
    after the module has been executed, so that the connector never imports
    a library itself.  It finds nothing on its own: it asks the finders after
    it and only adds a step to the loader it gets."""

    def __init__(self, on_loaded):
        self.on_loaded = on_loaded  # name -> callback(module)
        self._busy = threading.local()

    def find_spec(self, name, path=None, target=None):
        callback = self.on_loaded.get(name)
        if callback is None:
            return None
        busy = getattr(self._busy, "names", None)
        if busy is None:
            busy = self._busy.names = set()
        if name in busy:
            return None
        busy.add(name)
        try:
            spec = None
            for finder in list(sys.meta_path):
                if finder is self:
                    continue
                find = getattr(finder, "find_spec", None)
                if find is None:
                    continue
                spec = find(name, path, target)
                if spec is not None:
                    break
        finally:
            busy.discard(name)
        if spec is None:
            return None
        loader = spec.loader
        unbound = getattr(type(loader), "exec_module", None)
        if unbound is None:
            return self._legacy(spec, name, callback)
        real_exec = unbound.__get__(loader, type(loader))

        def exec_module(module):
            # One loader object may serve several modules (a zip importer):
            # only ``name`` is this step's, and only once.
            if getattr(module, "__name__", None) != name:
                return real_exec(module)
            try:
                if vars(loader).get("exec_module") is exec_module:
                    del loader.exec_module
            except Exception:
                pass
            real_exec(module)
            callback(module)

        try:
            loader.exec_module = exec_module
        except Exception:
            pass
        return spec

    @staticmethod
    def _legacy(spec, name, callback):
        """Loaders with only load_module (PEP 302; e.g. zipimport before
        Python 3.10)."""
        loader = spec.loader
        unbound = getattr(type(loader), "load_module", None)
        if unbound is None:
            return spec
        real_load = unbound.__get__(loader, type(loader))

        def load_module(fullname):
            if fullname != name:
                return real_load(fullname)
            try:
                if vars(loader).get("load_module") is load_module:
                    del loader.load_module
            except Exception:
                pass
            module = real_load(fullname)
            callback(sys.modules.get(fullname, module))
            return module

        try:
            loader.load_module = load_module
        except Exception:
            pass
        return spec

    # Python < 3.4 protocol, never used here; present so that tools that
    # call it on every finder do not fail.
    def find_module(self, name, path=None):
        return None

    def invalidate_caches(self):
        pass


def expand_placeholders(value, package_dir, spool):
    if "{" not in value:
        return value
    # tempfile.gettempdir()'s first choices, without importing tempfile.
    tmp = os.environ.get("TMPDIR") or os.environ.get("TEMP") or os.environ.get("TMP") or "/tmp"
    subs = {
        "prefix": getattr(sys, "prefix", ""),
        "base_prefix": getattr(sys, "base_prefix", ""),
        "exec_prefix": getattr(sys, "exec_prefix", ""),
        "base_exec_prefix": getattr(sys, "base_exec_prefix", ""),
        "home": os.path.expanduser("~"),
        "tmp": tmp,
        "package": package_dir,
        "spool": spool,
    }
    out = value
    while "{" in out:
        start = out.index("{")
        end = out.index("}", start)
        key = out[start + 1:end]
        if key.startswith("env:"):
            sub = os.environ.get(key[4:], "")
        else:
            sub = subs.get(key, "")
        if not sub:
            return None
        out = out[:start] + sub + out[end + 1:]
    return out


class Excluder(object):
    """Compiled form of EXCLUDE for fast checks."""

    def __init__(self, rules, package_dir, spool, extra_dirs=()):
        self.suffix = []
        self.parts = []
        self.under = []
        self.starts = []
        for kind, value, directions in rules:
            value = expand_placeholders(value, package_dir, spool)
            if value is None:
                continue
            if kind == "under":
                value = os.path.abspath(value)
                if value == os.path.dirname(value):
                    continue  # never exclude a whole file system root
                row = (value.rstrip(os.sep) + os.sep, value, directions)
                if row not in self.under:
                    self.under.append(row)
            elif kind == "suffix":
                self.suffix.append((value.lower(), directions))
            elif kind == "part":
                self.parts.append((os.sep + value + os.sep, directions))
            elif kind == "starts":
                self.starts.append((value, directions))
        for value in extra_dirs:
            self.under.append((value.rstrip(os.sep) + os.sep, value, None))

    def excluded(self, path, direction):
        lower = path.lower()
        for value, directions in self.suffix:
            if lower.endswith(value) and (directions is None or direction in directions):
                return True
        for value, directions in self.parts:
            if value in path and (directions is None or direction in directions):
                return True
        for dir_sep, value, directions in self.under:
            if (path.startswith(dir_sep) or path == value) and (directions is None or direction in directions):
                return True
        for value, directions in self.starts:
            if path.startswith(value) and (directions is None or direction in directions):
                return True
        return False
