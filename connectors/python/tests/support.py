"""Test helpers: a loopback stand-in for the Headwater endpoint, child
processes, and format checkers written from the specifications (not from
the connector's code)."""

import importlib
import json
import os
import shutil
import socket
import struct
import subprocess
import sys
import tempfile
import threading
import unittest
import zlib
from http.server import BaseHTTPRequestHandler, HTTPServer

PY = sys.executable
CONNECTOR = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
REQUIRE_EXTERNAL = os.environ.get("HEADWATER_REQUIRE_EXTERNAL", "").strip().lower() == "true"


def require(module_name):
    """Import an optional outside library, or skip the test; with
    HEADWATER_REQUIRE_EXTERNAL=true a missing library fails instead."""
    try:
        return importlib.import_module(module_name)
    except ImportError as exc:
        if REQUIRE_EXTERNAL:
            raise AssertionError("HEADWATER_REQUIRE_EXTERNAL=true but %s is missing: %s" % (module_name, exc))
        raise unittest.SkipTest("%s is not installed for %s" % (module_name, PY))


def optional(module_name):
    """Import a library the tests use only when present (never required)."""
    try:
        return importlib.import_module(module_name)
    except ImportError:
        raise unittest.SkipTest("%s is not installed for %s" % (module_name, PY))


# ------------------------------------------------------------------ server
class RecordServer(object):
    """``POST /api/runs`` on 127.0.0.1 and a free port.  ``statuses`` is a
    list of HTTP statuses to answer, one per request (then 201)."""

    def __init__(self, statuses=None, port=0):
        self.records = []
        self.headers = []
        self.paths = []
        self.statuses = list(statuses or [])
        outer = self

        class Handler(BaseHTTPRequestHandler):
            def do_POST(self):
                length = int(self.headers.get("Content-Length") or 0)
                body = self.rfile.read(length)
                status = outer.statuses.pop(0) if outer.statuses else 201
                outer.paths.append(self.path)
                outer.headers.append(dict(self.headers.items()))
                if status < 300:
                    outer.records.append(json.loads(body.decode("utf-8")))
                reply = b'{"ok":true}' if status < 300 else b'{"error":"test says no"}'
                self.send_response(status)
                self.send_header("Content-Type", "application/json")
                self.send_header("Content-Length", str(len(reply)))
                self.end_headers()
                self.wfile.write(reply)

            def log_message(self, *args):
                pass

        self.httpd = HTTPServer(("127.0.0.1", port), Handler)
        self.port = self.httpd.server_address[1]
        self.url = "http://127.0.0.1:%d" % self.port
        self.thread = threading.Thread(target=self.httpd.serve_forever, daemon=True)
        self.thread.start()

    def close(self):
        self.httpd.shutdown()
        self.httpd.server_close()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()


def free_port():
    """A loopback port nothing listens on (connections are refused)."""
    with socket.socket(socket.AF_INET, socket.SOCK_STREAM) as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


# ---------------------------------------------------------- child processes
def base_env(**extra):
    """The test process's environment without any HEADWATER_* or Python
    start-up settings, plus ``extra`` (a value None removes the key)."""
    env = dict(os.environ)
    for key in list(env):
        if key.startswith("HEADWATER_") or key in ("PYTHONPATH", "PYTHONSTARTUP", "PYTHONSAFEPATH"):
            del env[key]
    env["NO_PROXY"] = env["no_proxy"] = "127.0.0.1,localhost"
    env["PYTHONDONTWRITEBYTECODE"] = "1"
    env["MPLBACKEND"] = "Agg"
    for key, value in extra.items():
        if value is None:
            env.pop(key, None)
        else:
            env[key] = value
    return env


def capture_env(url, spool, **extra):
    env = base_env(HEADWATER_URL=url, HEADWATER_SPOOL=spool)
    env.update({k: v for k, v in extra.items() if v is not None})
    return env


def run(args, env, cwd=None, timeout=120):
    return subprocess.run(args, env=env, cwd=cwd, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                          stdin=subprocess.DEVNULL, timeout=timeout)


def runner_cmd(script, *args):
    return [PY, "-m", "headwater", "run", script] + list(args)


def with_connector_path(env, *more):
    env = dict(env)
    env["PYTHONPATH"] = os.pathsep.join([CONNECTOR] + list(more))
    return env


class TempDirTest(unittest.TestCase):
    def setUp(self):
        self.dir = os.path.realpath(tempfile.mkdtemp(prefix="hw-test-"))
        self.spool = os.path.join(self.dir, "spool", "spool.ndjson")
        self.addCleanup(shutil.rmtree, self.dir, True)

    def path(self, *parts):
        return os.path.join(self.dir, *parts)

    def write(self, name, data):
        full = self.path(name)
        os.makedirs(os.path.dirname(full), exist_ok=True)
        with open(full, "wb" if isinstance(data, bytes) else "w") as handle:
            handle.write(data)
        return full

    def spooled(self):
        try:
            with open(self.spool, "r", encoding="utf-8") as handle:
                return [json.loads(line) for line in handle if line.strip()]
        except FileNotFoundError:
            return []

    def server(self, statuses=None):
        server = RecordServer(statuses)
        self.addCleanup(server.close)
        return server

    def run_captured(self, server, script, *args, **env_extra):
        """The script under ``python -m headwater run``."""
        env = with_connector_path(capture_env(server.url if server else "http://127.0.0.1:%d" % free_port(),
                                              self.spool, **env_extra))
        return run(runner_cmd(script, *args), env, cwd=self.dir)

    def run_plain(self, script, *args):
        return run([PY, script] + list(args), base_env(), cwd=self.dir)

    def only_record(self, server):
        self.assertEqual(len(server.records), 1, server.records)
        return server.records[0]


def io_table(record):
    """{(path, direction): entry}, checking (path, direction) is unique."""
    table = {}
    for entry in record["io"]:
        key = (entry["path"], entry["direction"])
        assert key not in table, "duplicate io entry %r" % (key,)
        table[key] = entry
    return table


# -------------------------------------------------------------------- PNG
# Written from the PNG specification (W3C / ISO 15948): 5.2 signature,
# 5.3 chunk layout and CRC-32, 11.2.2 IHDR, 7 scanlines, 9 filtering.
PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"


def png_chunks(data):
    assert data[:8] == PNG_SIGNATURE, "bad PNG signature"
    pos = 8
    out = []
    while pos < len(data):
        (length,) = struct.unpack(">I", data[pos:pos + 4])
        ctype = data[pos + 4:pos + 8]
        body = data[pos + 8:pos + 8 + length]
        (crc,) = struct.unpack(">I", data[pos + 8 + length:pos + 12 + length])
        out.append((ctype, body, crc, zlib.crc32(ctype + body) & 0xFFFFFFFF == crc))
        pos += 12 + length
        if ctype == b"IEND":
            break
    return out


def make_png(width, height, pixel, color_type=6, filters=(0, 1, 2, 3, 4)):
    """An 8-bit PNG with each row using the next filter type in turn."""
    channels = {0: 1, 2: 3, 4: 2, 6: 4}[color_type]
    raw_rows = []
    for y in range(height):
        raw_rows.append(bytes(b for x in range(width) for b in pixel(x, y)[:channels]))
    out = bytearray()
    prev = bytes(width * channels)
    for y, row in enumerate(raw_rows):
        kind = filters[y % len(filters)]
        line = bytearray()
        for i, value in enumerate(row):
            left = row[i - channels] if i >= channels else 0
            up = prev[i]
            upleft = prev[i - channels] if i >= channels else 0
            if kind == 0:
                pred = 0
            elif kind == 1:
                pred = left
            elif kind == 2:
                pred = up
            elif kind == 3:
                pred = (left + up) >> 1
            else:
                p = left + up - upleft
                pa, pb, pc = abs(p - left), abs(p - up), abs(p - upleft)
                pred = left if pa <= pb and pa <= pc else (up if pb <= pc else upleft)
            line.append((value - pred) & 0xFF)
        out += bytes([kind]) + line
        prev = row

    def chunk(ctype, body):
        return struct.pack(">I", len(body)) + ctype + body + struct.pack(">I", zlib.crc32(ctype + body) & 0xFFFFFFFF)

    ihdr = struct.pack(">IIBBBBB", width, height, 8, color_type, 0, 0, 0)
    return (PNG_SIGNATURE + chunk(b"IHDR", ihdr) + chunk(b"tEXt", b"Comment\0made by a test")
            + chunk(b"IDAT", zlib.compress(bytes(out))) + chunk(b"IEND", b""))


def decode_png(data):
    """(width, height, color type, pixel rows) of an 8-bit, non-interlaced
    PNG, unfiltered."""
    chunks = png_chunks(data)
    ihdr = chunks[0][1]
    width, height, depth, color_type, _, _, interlace = struct.unpack(">IIBBBBB", ihdr)
    assert depth == 8 and interlace == 0, "test decoder handles 8-bit non-interlaced only"
    channels = {0: 1, 2: 3, 3: 1, 4: 2, 6: 4}[color_type]
    raw = zlib.decompress(b"".join(body for ctype, body, _, _ in chunks if ctype == b"IDAT"))
    stride = width * channels
    rows = []
    prev = bytearray(stride)
    pos = 0
    for _ in range(height):
        kind = raw[pos]
        line = bytearray(raw[pos + 1:pos + 1 + stride])
        pos += 1 + stride
        for i in range(stride):
            left = line[i - channels] if i >= channels else 0
            up = prev[i]
            upleft = prev[i - channels] if i >= channels else 0
            if kind == 1:
                line[i] = (line[i] + left) & 0xFF
            elif kind == 2:
                line[i] = (line[i] + up) & 0xFF
            elif kind == 3:
                line[i] = (line[i] + ((left + up) >> 1)) & 0xFF
            elif kind == 4:
                p = left + up - upleft
                pa, pb, pc = abs(p - left), abs(p - up), abs(p - upleft)
                line[i] = (line[i] + (left if pa <= pb and pa <= pc else (up if pb <= pc else upleft))) & 0xFF
        rows.append(bytes(line))
        prev = line
    return width, height, color_type, rows


def png_text(data):
    """[(keyword, text)] of the tEXt chunks (PNG spec 11.3.4.3)."""
    out = []
    for ctype, body, _, _ in png_chunks(data):
        if ctype == b"tEXt":
            keyword, text = body.split(b"\0", 1)
            out.append((keyword.decode("latin-1"), text.decode("latin-1")))
    return out


# -------------------------------------------------------------------- PDF
# Written from ISO 32000-1: 7.5.4 cross-reference table, 7.5.5 trailer,
# 7.5.6 incremental updates, 7.5.8 cross-reference streams (uncompressed
# or FlateDecode without predictors here), 14.3.3 document information.
import re  # noqa: E402


def make_pdf(info_entries=b"/Title (A test) /Producer (hand made)", xref_stream=False):
    """A one-page PDF built by hand, with offsets computed here."""
    objects = [
        b"<< /Type /Catalog /Pages 2 0 R >>",
        b"<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
        b"<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] /Contents 4 0 R >>",
    ]
    content = b"0 0 1 rg 20 20 100 100 re f"
    objects.append(b"<< /Length %d >>\nstream\n" % len(content) + content + b"\nendstream")
    objects.append(b"<< " + info_entries + b" >>")
    out = bytearray(b"%PDF-1.5\n%\xe2\xe3\xcf\xd3\n")
    offsets = []
    for number, body in enumerate(objects, start=1):
        offsets.append(len(out))
        out += b"%d 0 obj\n" % number + body + b"\nendobj\n"
    ident = b"[<0123456789abcdef0123456789abcdef> <0123456789abcdef0123456789abcdef>]"
    if not xref_stream:
        xref_at = len(out)
        out += b"xref\n0 %d\n0000000000 65535 f\r\n" % (len(objects) + 1)
        for off in offsets:
            out += b"%010d 00000 n\r\n" % off
        out += b"trailer\n<< /Size %d /Root 1 0 R /Info 5 0 R /ID %s >>\n" % (len(objects) + 1, ident)
    else:
        number = len(objects) + 1
        xref_at = len(out)
        rows = b"\x00" + (0).to_bytes(4, "big") + b"\xff\xff"
        for off in offsets + [xref_at]:
            rows += b"\x01" + off.to_bytes(4, "big") + b"\x00\x00"
        out += (b"%d 0 obj\n<< /Type /XRef /Size %d /W [1 4 2] /Root 1 0 R /Info 5 0 R /ID %s /Length %d >>\nstream\n"
                % (number, number + 1, ident, len(rows)) + rows + b"\nendstream\nendobj\n")
    out += b"startxref\n%d\n%%%%EOF\n" % xref_at
    return bytes(out)


def _pdf_dict_at(data, pos):
    """The bytes of the dictionary starting at ``pos`` (balanced << >>,
    skipping strings)."""
    assert data[pos:pos + 2] == b"<<", data[pos:pos + 20]
    depth = 0
    i = pos
    while i < len(data):
        if data[i:i + 1] == b"(":
            nest = 0
            while True:
                c = data[i:i + 1]
                if c == b"\\":
                    i += 2
                    continue
                if c == b"(":
                    nest += 1
                elif c == b")":
                    nest -= 1
                    if nest == 0:
                        break
                i += 1
        elif data[i:i + 2] == b"<<":
            depth += 1
            i += 1
        elif data[i:i + 2] == b">>":
            depth -= 1
            i += 1
            if depth == 0:
                return data[pos:i + 1]
        i += 1
    raise AssertionError("unterminated dictionary")


def pdf_sections(data):
    """Walk the cross-reference chain from the last startxref.  Returns
    [(offset, kind, {number: offset}, trailer dict bytes)], newest first,
    and asserts that every in-use entry points at 'N G obj'."""
    assert data.startswith(b"%PDF-")
    tail = data[-1024:]
    m = list(re.finditer(rb"startxref\s+(\d+)\s+%%EOF", tail))
    assert m, "no startxref at the end"
    offset = int(m[-1].group(1))
    sections = []
    seen = set()
    while offset is not None:
        assert offset not in seen, "cross-reference loop"
        seen.add(offset)
        entries = {}
        if data[offset:offset + 4] == b"xref":
            i = offset + 4
            while True:
                hdr = re.compile(rb"\s*(\d+) (\d+)\s*\r?\n").match(data, i)
                if not hdr:
                    break
                first, count = int(hdr.group(1)), int(hdr.group(2))
                i = hdr.end()
                for k in range(count):
                    row = data[i:i + 20]
                    assert re.match(rb"\d{10} \d{5} [nf](\r\n| \n| \r)", row), row
                    if row[17:18] == b"n":
                        entries[first + k] = int(row[:10])
                    i += 20
            t = re.compile(rb"\s*trailer\s*").match(data, i)
            assert t, "no trailer after the table"
            trailer = _pdf_dict_at(data, t.end())
            kind = "table"
        else:
            obj = re.compile(rb"(\d+) 0 obj\s*").match(data, offset)
            assert obj, "startxref/Prev points at %r" % data[offset:offset + 20]
            trailer = _pdf_dict_at(data, obj.end())
            assert b"/XRef" in trailer
            length = int(re.search(rb"/Length (\d+)", trailer).group(1))
            s = data.index(b"stream", obj.end() + len(trailer)) + 6
            s += 2 if data[s:s + 2] == b"\r\n" else 1
            stream = data[s:s + length]
            if b"/FlateDecode" in trailer:
                stream = zlib.decompress(stream)
            w = [int(x) for x in re.search(rb"/W\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s*\]", trailer).groups()]
            index = re.search(rb"/Index\s*\[([\d\s]+)\]", trailer)
            size = int(re.search(rb"/Size (\d+)", trailer).group(1))
            pairs = [int(x) for x in index.group(1).split()] if index else [0, size]
            pos = 0
            for p in range(0, len(pairs), 2):
                for k in range(pairs[p + 1]):
                    fields = []
                    for width in w:
                        fields.append(int.from_bytes(stream[pos:pos + width], "big"))
                        pos += width
                    if fields[0] == 1:
                        entries[pairs[p] + k] = fields[1]
            kind = "stream"
        for number, off in entries.items():
            assert re.compile(rb"\s*%d \d+ obj" % number).match(data, off), \
                "xref entry of object %d points at %r" % (number, data[off:off + 20])
        sections.append((offset, kind, entries, trailer))
        prev = re.search(rb"/Prev (\d+)", trailer)
        offset = int(prev.group(1)) if prev else None
    return sections


def pdf_object(data, sections, number):
    """The newest definition of object ``number`` (its dictionary bytes)."""
    for _, _, entries, _ in sections:
        if number in entries:
            at = entries[number]
            m = re.compile(rb"\s*%d \d+ obj\s*" % number).match(data, at)
            return _pdf_dict_at(data, m.end())
    raise AssertionError("object %d not found" % number)


def pdf_info(data):
    sections = pdf_sections(data)
    trailer = sections[0][3]
    ref = re.search(rb"/Info (\d+) 0 R", trailer)
    assert ref, "no /Info in the newest trailer"
    return pdf_object(data, sections, int(ref.group(1))), sections


def tool(name):
    return shutil.which(name)


def sha256(data):
    import hashlib

    return hashlib.sha256(data).hexdigest()


def file_sha256(path):
    with open(path, "rb") as handle:
        return sha256(handle.read())
