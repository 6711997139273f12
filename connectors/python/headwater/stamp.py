"""Writing the run id into a figure's own metadata, after the library wrote
the file.

* PNG: a ``tEXt`` chunk, keyword ``headwater:run``, placed just before
  ``IEND`` (PNG specification, W3C/ISO 15948, 11.3.4.3 tEXt and 5.6 chunk
  ordering: tEXt may be anywhere between IHDR and IEND).  Image data chunks
  are not touched.
* SVG: ``<metadata><headwater:run xmlns:headwater="urn:headwater:run">ID
  </headwater:run></metadata>`` as the first child of the root ``svg``
  element (SVG 1.1, 21.2 The 'metadata' element).  The text is edited in
  place, the rest of the document is left byte for byte.
* PDF: an incremental update (ISO 32000-1, 7.5.6): a new document
  information dictionary (14.3.3) holding the old entries plus
  ``/HeadwaterRun (ID)``, a new cross-reference section (a table, or a
  cross-reference stream when the file uses those, 7.5.8) and a trailer with
  ``/Prev``.  Encrypted files are left alone.

Each function returns True when the file carries the stamp afterwards and
False when it was left unchanged (not that format, damaged, encrypted...).
A second call with the same id does not change the file again.
"""

import re
import struct
import zlib

PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"
PNG_KEYWORD = b"headwater:run"
SVG_NS = "http://www.w3.org/2000/svg"
RUN_NS = "urn:headwater:run"
PDF_KEY = b"HeadwaterRun"


def _read(path):
    with open(path, "rb") as handle:
        return handle.read()


def _write_changed(path, old, new):
    """Rewrite only from the first differing byte (for an appended update,
    only the appended bytes are written)."""
    if old == new:
        return
    common = 0
    limit = min(len(old), len(new))
    step = 1 << 16
    while common < limit and old[common:common + step] == new[common:common + step]:
        common += step
    common = min(common, limit)
    while common > 0 and old[:common] != new[:common]:
        common -= 1
    while common < limit and old[common] == new[common]:
        common += 1
    with open(path, "r+b") as handle:
        handle.seek(common)
        handle.write(new[common:])
        handle.truncate(len(new))


# --------------------------------------------------------------------- PNG
def png_chunks(data):
    """[(offset, type, body, end)] up to and including IEND; raises
    ValueError for a damaged file (bad length or CRC)."""
    if not data.startswith(PNG_SIGNATURE):
        raise ValueError("not a PNG")
    out = []
    pos = len(PNG_SIGNATURE)
    while True:
        if pos + 12 > len(data):
            raise ValueError("truncated PNG")
        (length,) = struct.unpack(">I", data[pos:pos + 4])
        ctype = data[pos + 4:pos + 8]
        end = pos + 12 + length
        if end > len(data):
            raise ValueError("truncated PNG chunk")
        body = data[pos + 8:pos + 8 + length]
        (crc,) = struct.unpack(">I", data[end - 4:end])
        if zlib.crc32(ctype + body) & 0xFFFFFFFF != crc:
            raise ValueError("bad CRC in %r chunk" % ctype)
        out.append((pos, ctype, body, end))
        pos = end
        if ctype == b"IEND":
            return out


def png_chunk(ctype, body):
    return struct.pack(">I", len(body)) + ctype + body + struct.pack(">I", zlib.crc32(ctype + body) & 0xFFFFFFFF)


def stamp_png(path, run_id):
    data = _read(path)
    try:
        chunks = png_chunks(data)
    except ValueError:
        return False
    ours = [c for c in chunks if c[1] == b"tEXt" and c[2].split(b"\0", 1)[0] == PNG_KEYWORD]
    text = run_id.encode("latin-1")
    if len(ours) == 1 and ours[0][2] == PNG_KEYWORD + b"\0" + text:
        return True
    iend = chunks[-1]
    kept = [data[c[0]:c[3]] for c in chunks[:-1] if c not in ours]
    new = (PNG_SIGNATURE + b"".join(kept) + png_chunk(b"tEXt", PNG_KEYWORD + b"\0" + text)
           + data[iend[0]:iend[3]] + data[iend[3]:])
    _write_changed(path, data, new)
    return True


# --------------------------------------------------------------------- SVG
_SVG_STAMP = re.compile(
    rb'(<headwater:run xmlns:headwater="urn:headwater:run">)([^<]*)(</headwater:run>)'
)


def _skip_prolog(data, i):
    """Index of the root element's '<', past the XML declaration,
    processing instructions, comments, the DOCTYPE and white space."""
    n = len(data)
    while i < n:
        c = data[i:i + 1]
        if c in (b" ", b"\t", b"\r", b"\n"):
            i += 1
        elif data.startswith(b"<?", i):
            i = data.index(b"?>", i) + 2
        elif data.startswith(b"<!--", i):
            i = data.index(b"-->", i) + 3
        elif data.startswith(b"<!DOCTYPE", i):
            depth = 0
            quote = None
            i += 9
            while True:
                c = data[i:i + 1]
                if not c:
                    raise ValueError("unterminated DOCTYPE")
                if quote:
                    if c == quote:
                        quote = None
                elif c in (b'"', b"'"):
                    quote = c
                elif c == b"[":
                    depth += 1
                elif c == b"]":
                    depth -= 1
                elif c == b">" and depth <= 0:
                    i += 1
                    break
                i += 1
        elif c == b"<":
            return i
        else:
            raise ValueError("text before the root element")
    raise ValueError("no root element")


def _start_tag_end(data, i):
    """(index just past the root start tag's '>', self-closing?)."""
    quote = None
    j = i + 1
    while j < len(data):
        c = data[j:j + 1]
        if quote:
            if c == quote:
                quote = None
        elif c in (b'"', b"'"):
            quote = c
        elif c == b">":
            return j + 1, data[j - 1:j] == b"/"
        j += 1
    raise ValueError("unterminated start tag")


def _svg_root_ok(data, run_id):
    import xml.etree.ElementTree as ET

    root = ET.fromstring(data)
    if root.tag not in ("{%s}svg" % SVG_NS, "svg"):
        return False
    if run_id is None:
        return True
    ns = root.tag[:-3]
    first = root[0] if len(root) else None
    return (first is not None and first.tag == ns + "metadata" and len(first)
            and first[0].tag == "{%s}run" % RUN_NS and first[0].text == run_id)


def stamp_svg(path, run_id):
    data = _read(path)
    if data.startswith((b"\xff\xfe", b"\xfe\xff")):
        return False  # UTF-16: left alone
    try:
        if not _svg_root_ok(data, None):
            return False
    except Exception:
        return False
    ident = run_id.encode("ascii")
    found = _SVG_STAMP.search(data)
    if found:
        if found.group(2) == ident:
            return True
        new = data[:found.start(2)] + ident + data[found.end(2):]
    else:
        start = 3 if data.startswith(b"\xef\xbb\xbf") else 0
        try:
            root_at = _skip_prolog(data, start)
            tag_end, self_closing = _start_tag_end(data, root_at)
        except ValueError:
            return False
        name = re.match(rb"<([^\s/>]+)", data[root_at:]).group(1)
        prefix = name[:name.index(b":") + 1] if b":" in name else b""
        meta = (b"<" + prefix + b"metadata><headwater:run xmlns:headwater=\"urn:headwater:run\">" + ident
                + b"</headwater:run></" + prefix + b"metadata>")
        if self_closing:
            new = data[:tag_end - 2] + b">" + meta + b"</" + name + b">" + data[tag_end:]
        else:
            new = data[:tag_end] + meta + data[tag_end:]
        try:
            if not _svg_root_ok(new, run_id):
                return False
        except Exception:
            return False
    _write_changed(path, data, new)
    return True


# --------------------------------------------------------------------- PDF
_WS = b"\x00\t\n\x0c\r "
_DELIM = b"()<>[]{}/%"


class PdfError(ValueError):
    pass


class Ref(tuple):
    """An indirect reference (number, generation)."""


class Name(bytes):
    pass


class Raw(object):
    """A value kept as its bytes in the file (strings, arrays we only copy)."""

    def __init__(self, data):
        self.data = data


def _ws(data, i):
    n = len(data)
    while i < n:
        c = data[i]
        if c in _WS:
            i += 1
        elif c == 0x25:  # % comment
            while i < n and data[i] not in b"\r\n":
                i += 1
        else:
            break
    return i


def _token_end(data, i):
    n = len(data)
    while i < n and data[i] not in _WS and data[i] not in _DELIM:
        i += 1
    return i


_NUMBER = re.compile(rb"[+-]?(\d+\.?\d*|\.\d+)")
_INT = re.compile(rb"\d+")


def parse_value(data, i):
    """(value, end) of the PDF object at ``i``: int/float, Name, Ref,
    bool, None, list, dict (see parse_dict) or Raw (strings)."""
    i = _ws(data, i)
    if i >= len(data):
        raise PdfError("unexpected end")
    c = data[i:i + 1]
    if c == b"/":
        end = _token_end(data, i + 1)
        return Name(data[i + 1:end]), end
    if data.startswith(b"<<", i):
        return parse_dict(data, i)
    if c == b"<":
        end = data.index(b">", i) + 1
        return Raw(data[i:end]), end
    if c == b"(":
        depth = 0
        j = i
        while j < len(data):
            ch = data[j:j + 1]
            if ch == b"\\":
                j += 2
                continue
            if ch == b"(":
                depth += 1
            elif ch == b")":
                depth -= 1
                if depth == 0:
                    return Raw(data[i:j + 1]), j + 1
            j += 1
        raise PdfError("unterminated string")
    if c == b"[":
        items = []
        j = i + 1
        while True:
            j = _ws(data, j)
            if data.startswith(b"]", j):
                return items, j + 1
            value, j = parse_value(data, j)
            items.append(value)
    m = _NUMBER.match(data, i)
    if m:
        text = m.group(0)
        end = m.end()
        if b"." not in text and text[:1] not in b"+-":
            # "n g R" is a reference.
            j = _ws(data, end)
            m2 = _INT.match(data, j)
            if m2:
                k = _ws(data, m2.end())
                if data.startswith(b"R", k) and _token_end(data, k) == k + 1:
                    return Ref((int(text), int(m2.group(0)))), k + 1
            return int(text), end
        return float(text), end
    end = _token_end(data, i)
    word = data[i:end]
    if word == b"true":
        return True, end
    if word == b"false":
        return False, end
    if word == b"null":
        return None, end
    raise PdfError("unexpected %r" % data[i:i + 20])


class PdfDict(object):
    """A parsed dictionary; ``spans`` keeps each entry's bytes for copying."""

    def __init__(self):
        self.values = {}
        self.spans = []  # (key, start, end) of "/Key value"

    def get(self, key, default=None):
        return self.values.get(key, default)


def parse_dict(data, i):
    i = _ws(data, i)
    if not data.startswith(b"<<", i):
        raise PdfError("expected a dictionary")
    out = PdfDict()
    j = i + 2
    while True:
        j = _ws(data, j)
        if data.startswith(b">>", j):
            return out, j + 2
        start = j
        key, j = parse_value(data, j)
        if not isinstance(key, Name):
            raise PdfError("dictionary key is not a name")
        value, j = parse_value(data, j)
        out.values[bytes(key)] = value
        out.spans.append((bytes(key), start, j))


def _unpredict(raw, columns, predictor):
    """Undo PNG predictors (ISO 32000-1 7.4.4.4, PNG spec 9 filtering)."""
    if predictor < 10:
        return raw
    row = columns + 1
    out = bytearray()
    prev = bytearray(columns)
    for r in range(0, len(raw), row):
        kind = raw[r]
        line = bytearray(raw[r + 1:r + row])
        for x in range(len(line)):
            left = line[x - 1] if x else 0
            up = prev[x]
            upleft = prev[x - 1] if x else 0
            if kind == 1:
                line[x] = (line[x] + left) & 0xFF
            elif kind == 2:
                line[x] = (line[x] + up) & 0xFF
            elif kind == 3:
                line[x] = (line[x] + ((left + up) >> 1)) & 0xFF
            elif kind == 4:
                p = left + up - upleft
                pa, pb, pc = abs(p - left), abs(p - up), abs(p - upleft)
                pred = left if pa <= pb and pa <= pc else (up if pb <= pc else upleft)
                line[x] = (line[x] + pred) & 0xFF
        out += line
        prev = line
    return bytes(out)


class Pdf(object):
    """Just enough of a PDF reader to find the trailer and one object."""

    def __init__(self, data):
        self.data = data
        tail = data[-2048:]
        at = tail.rfind(b"startxref")
        if at < 0:
            raise PdfError("no startxref")
        value, _ = parse_value(tail, at + 9)
        self.startxref = value
        self.offsets = {}  # number -> ("n", offset) or ("c", stream number, index)
        self.trailer = None
        self.uses_stream = None
        seen = set()
        offset = self.startxref
        while offset is not None and offset not in seen:
            seen.add(offset)
            trailer, is_stream = self._section(offset)
            if self.trailer is None:
                self.trailer = trailer
                self.uses_stream = is_stream
            stm = trailer.get(b"XRefStm")
            if isinstance(stm, int) and stm not in seen:
                seen.add(stm)
                self._section(stm)
            prev = trailer.get(b"Prev")
            offset = prev if isinstance(prev, int) else None

    def _section(self, offset):
        data = self.data
        i = _ws(data, offset)
        if data.startswith(b"xref", i):
            i += 4
            while True:
                i = _ws(data, i)
                if data.startswith(b"trailer", i):
                    trailer, _ = parse_dict(data, i + 7)
                    return trailer, False
                first, i = parse_value(data, i)
                count, i = parse_value(data, i)
                for k in range(count):
                    i = _ws(data, i)
                    m = re.compile(rb"(\d{1,10})\s+(\d{1,5})\s+([nf])").match(data, i)
                    if not m:
                        raise PdfError("bad xref entry")
                    i = m.end()
                    if first + k not in self.offsets:
                        # A newer free entry hides older versions of the object.
                        self.offsets[first + k] = ("n", int(m.group(1))) if m.group(3) == b"n" else ("f",)
        num, dictionary, stream = self._object_at(i)
        if dictionary is None or dictionary.get(b"Type") != b"XRef" or stream is None:
            raise PdfError("startxref points at neither a table nor a cross-reference stream")
        widths = dictionary.get(b"W")
        size = dictionary.get(b"Size")
        index = dictionary.get(b"Index") or [0, size]
        row = sum(widths)
        pos = 0
        for s in range(0, len(index), 2):
            first, count = index[s], index[s + 1]
            for k in range(count):
                fields = []
                for w in widths:
                    fields.append(int.from_bytes(stream[pos:pos + w], "big") if w else None)
                    pos += w
                kind = fields[0] if widths[0] else 1
                number = first + k
                if number in self.offsets:
                    continue
                if kind == 1:
                    self.offsets[number] = ("n", fields[1])
                elif kind == 2:
                    self.offsets[number] = ("c", fields[1], fields[2])
                else:
                    self.offsets[number] = ("f",)
        if pos > len(stream) + row:
            raise PdfError("short cross-reference stream")
        return dictionary, True

    def _object_at(self, offset):
        """(number, dictionary or other value, decoded stream bytes or None)."""
        data = self.data
        m = re.compile(rb"\s*(\d+)\s+(\d+)\s+obj").match(data, offset)
        if not m:
            raise PdfError("no object at %d" % offset)
        value, i = parse_value(data, m.end())
        stream = None
        j = _ws(data, i)
        if isinstance(value, PdfDict) and data.startswith(b"stream", j):
            j += 6
            if data.startswith(b"\r\n", j):
                j += 2
            elif data.startswith(b"\n", j):
                j += 1
            length = value.get(b"Length")
            if isinstance(length, Ref):
                length = self.value_of(length)
            if not isinstance(length, int):
                length = data.index(b"endstream", j) - j
            stream = data[j:j + length]
            filters = value.get(b"Filter")
            if isinstance(filters, Name):
                filters = [filters]
            params = value.get(b"DecodeParms")
            if isinstance(params, list):
                params = params[0] if params else None
            for f in filters or []:
                if f != b"FlateDecode":
                    raise PdfError("unsupported filter %r" % f)
                stream = zlib.decompress(stream)
                if isinstance(params, PdfDict):
                    stream = _unpredict(stream, params.get(b"Columns", 1), params.get(b"Predictor", 1))
        return int(m.group(1)), value, stream

    def value_of(self, ref):
        where = self.offsets.get(ref[0])
        if where is None or where[0] == "f":
            return None
        if where[0] == "n":
            return self._object_at(where[1])[1]
        # In an object stream (7.5.7): "n1 off1 n2 off2 ..." then objects.
        _, container, stream = self._object_at(self.offsets[where[1]][1])
        first = container.get(b"First")
        count = container.get(b"N")
        header = stream[:first]
        numbers = [int(x) for x in header.split()[: 2 * count]]
        for k in range(count):
            if numbers[2 * k] == ref[0]:
                value, _ = parse_value(stream, first + numbers[2 * k + 1])
                return value
        return None


def pdf_string(text):
    escaped = text.encode("latin-1").replace(b"\\", b"\\\\").replace(b"(", b"\\(").replace(b")", b"\\)")
    return b"(" + escaped + b")"


def _raw_value(data, value):
    """Bytes for a parsed trailer value we copy (Root, ID)."""
    if isinstance(value, Ref):
        return b"%d %d R" % value
    if isinstance(value, Raw):
        return value.data
    if isinstance(value, list):
        return b"[" + b" ".join(_raw_value(data, v) for v in value) + b"]"
    if isinstance(value, int):
        return b"%d" % value
    raise PdfError("cannot copy %r" % (value,))


def stamp_pdf(path, run_id):
    data = _read(path)
    if not data.startswith(b"%PDF-"):
        return False
    try:
        pdf = Pdf(data)
        trailer = pdf.trailer
        if trailer.get(b"Encrypt") is not None:
            return False
        size = trailer.get(b"Size")
        root = trailer.get(b"Root")
        if not isinstance(size, int) or not isinstance(root, Ref):
            return False
        entries = b""
        info_ref = trailer.get(b"Info")
        if isinstance(info_ref, Ref):
            info = pdf.value_of(info_ref)
            if not isinstance(info, PdfDict):
                return False
            current = info.get(PDF_KEY)
            if isinstance(current, Raw) and current.data == pdf_string(run_id):
                return True
            # Copy every other entry as it is written.
            where = pdf.offsets.get(info_ref[0])
            if where[0] == "n":
                source = data
                m = re.compile(rb"\s*(\d+)\s+(\d+)\s+obj").match(data, where[1])
                info, _ = parse_dict(data, m.end())
            else:
                source = None
            if source is not None:
                parts = [source[s:e] for key, s, e in info.spans if key != PDF_KEY]
            else:
                parts = []
                for key, value in info.values.items():
                    if key != PDF_KEY:
                        parts.append(b"/" + key + b" " + _raw_value(data, value))
            entries = b" ".join(parts)
        ident = trailer.get(b"ID")
        number = size
        sep = b"" if data.endswith((b"\n", b"\r")) else b"\n"
        info_at = len(data) + len(sep)
        body = b"%d 0 obj\n<<%s%s/%s %s>>\nendobj\n" % (
            number, entries, b" " if entries else b"", PDF_KEY, pdf_string(run_id))
        xref_at = info_at + len(body)
        common = b"/Root " + _raw_value(data, root) + b" /Info %d 0 R /Prev %d" % (number, pdf.startxref)
        if ident is not None:
            common += b" /ID " + _raw_value(data, ident)
        if pdf.uses_stream:
            xref_number = number + 1
            width = 4 if xref_at < (1 << 32) else 8
            rows = b"".join(
                b"\x01" + off.to_bytes(width, "big") + b"\x00\x00" for off in (info_at, xref_at)
            )
            section = (b"%d 0 obj\n<</Type /XRef /Size %d /Index [%d 2] /W [1 %d 2] %s /Length %d>>\nstream\r\n"
                       % (xref_number, max(size, xref_number + 1), number, width, common, len(rows))
                       + rows + b"\r\nendstream\nendobj\n")
        else:
            section = (b"xref\n%d 1\n%010d 00000 n\r\ntrailer\n<</Size %d %s>>\n"
                       % (number, info_at, max(size, number + 1), common))
        update = sep + body + section + b"startxref\n%d\n%%%%EOF\n" % xref_at
    except (PdfError, ValueError, KeyError, IndexError, TypeError, AttributeError, zlib.error):
        return False
    with open(path, "ab") as handle:
        handle.write(update)
    return True
