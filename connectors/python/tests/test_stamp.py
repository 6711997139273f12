"""Figures stamped with the run id, checked with decoders written from the
format specifications (tests/support.py) and, where installed, outside
tools (Pillow, qpdf, pdfinfo)."""

import os
import re
import subprocess
import textwrap
import unittest
import xml.etree.ElementTree as ET

from tests import support
from tests.support import io_table
from headwater import stamp

RUN = "0b0f3c2e-8d4a-4b59-9c61-3f1e2d7a9b10"
OTHER = "11111111-2222-4333-8444-555555555555"
SVG_NS = "{http://www.w3.org/2000/svg}"
RUN_TAG = "{urn:headwater:run}run"


def pixel(x, y):
    return ((x * 40) % 256, (y * 70) % 256, (x * y * 13) % 256, 255 - x)


class Png(support.TempDirTest):
    def test_text_chunk_before_iend_pixels_unchanged(self):
        original = support.make_png(7, 5, pixel)
        path = self.write("f.png", original)
        self.assertTrue(stamp.stamp_png(path, RUN))
        with open(path, "rb") as handle:
            stamped = handle.read()
        chunks = support.png_chunks(stamped)
        self.assertTrue(all(ok for _, _, _, ok in chunks), "a CRC is wrong")
        types = [c[0] for c in chunks]
        self.assertEqual(types, [b"IHDR", b"tEXt", b"IDAT", b"tEXt", b"IEND"])
        self.assertEqual(chunks[-2][1], b"headwater:run\x00" + RUN.encode())
        self.assertEqual(support.decode_png(stamped), support.decode_png(original))
        self.assertEqual(support.decode_png(original)[3][1][:4], bytes(pixel(0, 1)))
        # Everything before IEND is as it was.
        self.assertEqual(stamped[:len(original) - 12], original[:-12])
        self.assertIn(("Comment", "made by a test"), support.png_text(stamped))

    def test_idempotent_and_restamp_replaces(self):
        path = self.write("f.png", support.make_png(3, 3, pixel))
        stamp.stamp_png(path, RUN)
        with open(path, "rb") as handle:
            once = handle.read()
        stamp.stamp_png(path, RUN)
        with open(path, "rb") as handle:
            self.assertEqual(handle.read(), once)
        stamp.stamp_png(path, OTHER)
        with open(path, "rb") as handle:
            again = handle.read()
        self.assertEqual([t for t in support.png_text(again) if t[0] == "headwater:run"], [("headwater:run", OTHER)])
        self.assertTrue(all(ok for _, _, _, ok in support.png_chunks(again)))

    def test_not_a_png_or_damaged_left_alone(self):
        for name, data in (("a.png", b"not a png at all"),
                           ("b.png", support.make_png(2, 2, pixel)[:-5])):
            path = self.write(name, data)
            self.assertFalse(stamp.stamp_png(path, RUN))
            with open(path, "rb") as handle:
                self.assertEqual(handle.read(), data)

    def test_pillow_reads_the_stamp(self):
        try:
            from PIL import Image
        except ImportError:
            self.skipTest("Pillow is not installed")
        original = support.make_png(6, 4, pixel)
        path = self.write("f.png", original)
        stamp.stamp_png(path, RUN)
        with Image.open(path) as im:
            im.load()
            self.assertEqual(im.info.get("headwater:run"), RUN)
            stamped_pixels = list(im.getdata())
        with Image.open(self.write("g.png", original)) as im:
            self.assertEqual(list(im.getdata()), stamped_pixels)


SVG_DOC = b"""<?xml version="1.0" encoding="utf-8" standalone="no"?>
<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN"
  "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">
<!-- a comment with > inside -->
<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10" data-x='a>b' version="1.1">
 <metadata><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"/></metadata>
 <rect x="1" y="1" width="5" height="5"/>
</svg>
"""


class Svg(support.TempDirTest):
    def stamped(self, data, run_id=RUN):
        path = self.write("f.svg", data)
        ok = stamp.stamp_svg(path, run_id)
        with open(path, "rb") as handle:
            return ok, handle.read()

    def test_metadata_first_child_rest_unchanged(self):
        ok, out = self.stamped(SVG_DOC)
        self.assertTrue(ok)
        root = ET.fromstring(out)
        self.assertEqual(root.tag, SVG_NS + "svg")
        self.assertEqual(root[0].tag, SVG_NS + "metadata")
        self.assertEqual(root[0][0].tag, RUN_TAG)
        self.assertEqual(root[0][0].text, RUN)
        self.assertEqual(root[1].tag, SVG_NS + "metadata")  # the existing one
        self.assertEqual(root[2].tag, SVG_NS + "rect")
        inserted = ('<metadata><headwater:run xmlns:headwater="urn:headwater:run">%s</headwater:run>'
                    '</metadata>' % RUN).encode()
        self.assertEqual(out.replace(inserted, b""), SVG_DOC)

    def test_idempotent_and_restamp(self):
        _, once = self.stamped(SVG_DOC)
        path = self.write("g.svg", once)
        stamp.stamp_svg(path, RUN)
        with open(path, "rb") as handle:
            self.assertEqual(handle.read(), once)
        stamp.stamp_svg(path, OTHER)
        with open(path, "rb") as handle:
            root = ET.fromstring(handle.read())
        self.assertEqual([e.text for e in root.iter(RUN_TAG)], [OTHER])

    def test_self_closing_and_prefixed_roots(self):
        ok, out = self.stamped(b'<svg xmlns="http://www.w3.org/2000/svg"/>')
        self.assertTrue(ok)
        root = ET.fromstring(out)
        self.assertEqual(root[0][0].text, RUN)
        ok, out = self.stamped(b'<s:svg xmlns:s="http://www.w3.org/2000/svg"><s:g/></s:svg>')
        self.assertTrue(ok)
        root = ET.fromstring(out)
        self.assertEqual(root[0].tag, SVG_NS + "metadata")
        self.assertEqual(root[0][0].text, RUN)
        self.assertEqual(root[1].tag, SVG_NS + "g")

    def test_not_svg_left_alone(self):
        for data in (b"<html><body/></html>", b"<svg", b"plain text"):
            ok, out = self.stamped(data)
            self.assertFalse(ok)
            self.assertEqual(out, data)


class Pdf(support.TempDirTest):
    def check_update(self, original, xref_stream):
        path = self.write("f.pdf", original)
        self.assertTrue(stamp.stamp_pdf(path, RUN))
        with open(path, "rb") as handle:
            out = handle.read()
        # An incremental update only appends (ISO 32000-1 7.5.6).
        self.assertEqual(out[:len(original)], original)
        info, sections = support.pdf_info(out)
        self.assertEqual(len(sections), 2)
        old_at = int(re.search(rb"startxref\s+(\d+)", original[-64:]).group(1))
        self.assertEqual(sections[1][0], old_at)
        newest = sections[0][3]
        self.assertIn(b"/Prev %d" % old_at, newest)
        self.assertIn(b"/Root 1 0 R", newest)
        self.assertIn(b"/ID [<0123456789abcdef0123456789abcdef> <0123456789abcdef0123456789abcdef>]", newest)
        self.assertEqual(sections[0][1], "stream" if xref_stream else "table")
        size = int(re.search(rb"/Size (\d+)", newest).group(1))
        self.assertGreater(size, max(sections[0][2]))
        self.assertIn(b"/Title (A test)", info)
        self.assertIn(b"/Producer (hand made)", info)
        self.assertIn(b"/HeadwaterRun (%s)" % RUN.encode(), info)
        return path, out

    def test_table_update(self):
        path, out = self.check_update(support.make_pdf(), False)
        self.outside_tools(path)
        # Same id again: unchanged.  Another id: one more update.
        stamp.stamp_pdf(path, RUN)
        with open(path, "rb") as handle:
            self.assertEqual(handle.read(), out)
        stamp.stamp_pdf(path, OTHER)
        with open(path, "rb") as handle:
            again = handle.read()
        info, sections = support.pdf_info(again)
        self.assertEqual(len(sections), 3)
        self.assertIn(b"/HeadwaterRun (%s)" % OTHER.encode(), info)
        self.assertNotIn(RUN.encode(), info)
        self.assertIn(b"/Title (A test)", info)

    def test_xref_stream_update(self):
        path, _ = self.check_update(support.make_pdf(xref_stream=True), True)
        self.outside_tools(path)

    def test_no_info_dictionary(self):
        original = support.make_pdf().replace(b" /Info 5 0 R", b"")
        path = self.write("n.pdf", original)
        self.assertTrue(stamp.stamp_pdf(path, RUN))
        with open(path, "rb") as handle:
            info, _ = support.pdf_info(handle.read())
        self.assertEqual(info.strip(), b"<</HeadwaterRun (%s)>>" % RUN.encode())

    def test_encrypted_or_broken_left_alone(self):
        encrypted = support.make_pdf().replace(b"/Root 1 0 R /Info", b"/Root 1 0 R /Encrypt 5 0 R /Info")
        for name, data in (("e.pdf", encrypted), ("b.pdf", b"%PDF-1.4\nnothing else"), ("c.pdf", b"hello")):
            path = self.write(name, data)
            self.assertFalse(stamp.stamp_pdf(path, RUN))
            with open(path, "rb") as handle:
                self.assertEqual(handle.read(), data)

    def outside_tools(self, path):
        qpdf = support.tool("qpdf")
        if qpdf:
            done = subprocess.run([qpdf, "--check", path], stdout=subprocess.PIPE, stderr=subprocess.STDOUT)
            self.assertEqual(done.returncode, 0, done.stdout)
            self.assertIn(b"No syntax or stream encoding errors", done.stdout)
        pdfinfo = support.tool("pdfinfo")
        if pdfinfo:
            done = subprocess.run([pdfinfo, path], stdout=subprocess.PIPE, stderr=subprocess.PIPE)
            self.assertEqual(done.returncode, 0, done.stderr)
            self.assertIn(b"Title:", done.stdout)
            self.assertIn(b"A test", done.stdout)
            self.assertIn(b"Pages:", done.stdout)
            custom = subprocess.run([pdfinfo, "-custom", path], stdout=subprocess.PIPE, stderr=subprocess.PIPE)
            if custom.returncode == 0:
                self.assertIn(RUN.encode(), custom.stdout)


class StampedByARun(support.TempDirTest):
    """A run that writes figures: stamped after the script, hash after
    stamping, HEADWATER_STAMP=0 switches it off."""

    def script(self):
        self.write("src/p.png", support.make_png(4, 4, pixel))
        self.write("src/s.svg", SVG_DOC)
        self.write("src/d.pdf", support.make_pdf())
        return self.write("figs.py", textwrap.dedent("""
            import shutil, os
            for name in ("p.png", "s.svg", "d.pdf"):
                with open("src/" + name, "rb") as f:
                    data = f.read()
                with open("out_" + name, "wb") as f:
                    f.write(data)
                # The script sees its file as it wrote it.
                print(name, os.path.getsize("out_" + name) == len(data))
            shutil.copy("src/p.png", "tmp.png")
            os.replace("tmp.png", "moved.png")
            open("notes.txt", "w").write("not a figure")
        """))

    def test_stamped_and_hashed_after(self):
        script = self.script()
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"p.png True\ns.svg True\nd.pdf True\n")
        record = self.only_record(server)
        table = io_table(record)
        for name in ("out_p.png", "out_s.svg", "out_d.pdf", "moved.png"):
            direction = "rename_to" if name == "moved.png" else "write"
            entry = table[(self.path(name), direction)]
            self.assertIs(entry["stamped"], True, name)
            self.assertEqual(entry["sha256"], support.file_sha256(self.path(name)), name)
            self.assertEqual(entry["bytes"], os.path.getsize(self.path(name)), name)
        self.assertIs(table[(self.path("notes.txt"), "write")]["stamped"], False)
        # Inputs are not stamped.
        with open(self.path("src/p.png"), "rb") as handle:
            self.assertEqual(handle.read(), support.make_png(4, 4, pixel))
        with open(self.path("out_p.png"), "rb") as handle:
            self.assertIn(("headwater:run", record["run_id"]), support.png_text(handle.read()))
        with open(self.path("out_s.svg"), "rb") as handle:
            root = ET.fromstring(handle.read())
        self.assertEqual(root[0][0].text, record["run_id"])
        with open(self.path("out_d.pdf"), "rb") as handle:
            info, _ = support.pdf_info(handle.read())
        self.assertIn(b"/HeadwaterRun (%s)" % record["run_id"].encode(), info)

    def test_switched_off(self):
        script = self.script()
        server = self.server()
        done = self.run_captured(server, script, HEADWATER_STAMP="0")
        self.assertEqual(done.returncode, 0, done.stderr)
        record = self.only_record(server)
        for entry in record["io"]:
            self.assertIs(entry["stamped"], False)
        with open(self.path("out_p.png"), "rb") as handle:
            self.assertEqual(handle.read(), support.make_png(4, 4, pixel))
        with open(self.path("out_d.pdf"), "rb") as handle:
            self.assertEqual(handle.read(), support.make_pdf())



class StampEdgeCases(support.TempDirTest):
    def test_unwritable_output_left_alone_quietly(self):
        # As if the file could not be opened for update (read-only, gone):
        # the stamp raises OSError, which is no connector fault.
        script = self.write("ro.py", textwrap.dedent("""
            import headwater.stamp
            def refuse(path, run_id):
                raise PermissionError(13, "Permission denied", path)
            headwater.stamp.stamp_png = refuse
            open("f.png", "wb").write(open("src.png", "rb").read())
        """))
        self.write("src.png", support.make_png(2, 2, pixel))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.stderr, b"")
        entry = io_table(self.only_record(server))[(self.path("f.png"), "write")]
        self.assertIs(entry["stamped"], False)
        self.assertEqual(entry["sha256"], support.sha256(support.make_png(2, 2, pixel)))

if __name__ == "__main__":
    unittest.main()
