"""PEP 517 build backend for the headwater connector.

Where setuptools (with its bdist_wheel command) can be imported, every hook is setuptools.build_meta's (with
setup.py adding headwater_capture.pth).  Where it cannot -- pip's isolated
build environment, offline, since pyproject.toml requires nothing -- the
hooks below build the same wheel and sdist with the standard library only,
following the binary distribution format (PEP 427, "Binary distribution
format" in the Python Packaging User Guide), core metadata 2.1 and the
source distribution format (PEP 517/625).  No editable installs without
setuptools: use PYTHONPATH=connectors/python instead.
"""

import base64
import hashlib
import io
import os
import re
import tarfile
import time
import zipfile

try:  # pragma: no cover - depends on the build environment
    if os.environ.get("HEADWATER_BUILD_STDLIB") == "1":
        raise ImportError("stdlib build requested")
    from setuptools import build_meta as _setuptools

    try:  # setuptools >= 70.1 has bdist_wheel itself, older ones need wheel
        import setuptools.command.bdist_wheel  # noqa: F401
    except ImportError:
        import wheel.bdist_wheel  # noqa: F401
except ImportError:
    _setuptools = None

HERE = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
PACKAGE = "headwater"
PTH = "headwater_capture.pth"
SDIST_FILES = ["pyproject.toml", "setup.py", "README.md", PTH, "sitecustomize.py"]
SDIST_DIRS = [PACKAGE, "_build", "tests", "bench"]


def _project():
    """name, version, description, requires-python, license text, scripts
    from pyproject.toml (tomllib where present, else a reader for the
    simple `key = "value"` lines this file uses)."""
    with open(os.path.join(HERE, "pyproject.toml"), "rb") as handle:
        raw = handle.read()
    try:
        import tomllib
    except ImportError:
        tomllib = None
    if tomllib is not None:
        data = tomllib.loads(raw.decode("utf-8"))
        project = data["project"]
        return {
            "name": project["name"],
            "version": project["version"],
            "description": project.get("description", ""),
            "requires-python": project.get("requires-python"),
            "license": (project.get("license") or {}).get("text"),
            "classifiers": project.get("classifiers", []),
            "scripts": project.get("scripts", {}),
        }
    out = {"scripts": {}, "classifiers": []}
    section = None
    in_classifiers = False
    for line in raw.decode("utf-8").splitlines():
        stripped = line.strip()
        if stripped.startswith("["):
            m = re.match(r"\[([^\]]+)\]", stripped)
            if m:
                section = m.group(1)
                continue
        if in_classifiers:
            if stripped.startswith("]"):
                in_classifiers = False
            else:
                m = re.match(r'"([^"]*)"', stripped)
                if m:
                    out["classifiers"].append(m.group(1))
            continue
        m = re.match(r'([A-Za-z0-9_.-]+)\s*=\s*"([^"]*)"', stripped)
        if section == "project":
            if stripped.startswith("classifiers") and stripped.endswith("["):
                in_classifiers = True
            elif m:
                out[m.group(1)] = m.group(2)
            else:
                lic = re.match(r'license\s*=\s*\{\s*text\s*=\s*"([^"]*)"', stripped)
                if lic:
                    out["license"] = lic.group(1)
        elif section == "project.scripts" and m:
            out["scripts"][m.group(1)] = m.group(2)
    return out


def _dist_info(project):
    return "%s-%s.dist-info" % (project["name"], project["version"])


def _metadata(project):
    with open(os.path.join(HERE, "README.md"), "r", encoding="utf-8") as handle:
        readme = handle.read()
    lines = [
        "Metadata-Version: 2.1",
        "Name: %s" % project["name"],
        "Version: %s" % project["version"],
        "Summary: %s" % project.get("description", ""),
    ]
    if project.get("license"):
        lines.append("License: %s" % project["license"])
    for classifier in project.get("classifiers", []):
        lines.append("Classifier: %s" % classifier)
    if project.get("requires-python"):
        lines.append("Requires-Python: %s" % project["requires-python"])
    lines.append("Description-Content-Type: text/markdown")
    return ("\n".join(lines) + "\n\n" + readme).encode("utf-8")


def _entry_points(project):
    if not project.get("scripts"):
        return None
    body = "[console_scripts]\n" + "".join("%s = %s\n" % kv for kv in sorted(project["scripts"].items()))
    return body.encode("utf-8")


def _package_files():
    files = []
    root = os.path.join(HERE, PACKAGE)
    for folder, dirs, names in os.walk(root):
        dirs[:] = sorted(d for d in dirs if d != "__pycache__")
        for name in sorted(names):
            if name.endswith(".py"):
                full = os.path.join(folder, name)
                files.append((os.path.relpath(full, HERE).replace(os.sep, "/"), full))
    files.append((PTH, os.path.join(HERE, PTH)))
    return files


def _record_line(name, data):
    digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode("ascii")
    return "%s,sha256=%s,%d" % (name, digest, len(data))


def _zip_write(archive, name, data):
    info = zipfile.ZipInfo(name, date_time=(2020, 1, 1, 0, 0, 0))
    info.external_attr = 0o644 << 16
    info.compress_type = zipfile.ZIP_DEFLATED
    archive.writestr(info, data)


def _metadata_files(project):
    dist_info = _dist_info(project)
    files = [
        (dist_info + "/METADATA", _metadata(project)),
        (dist_info + "/WHEEL", b"Wheel-Version: 1.0\nGenerator: headwater_build\nRoot-Is-Purelib: true\nTag: py3-none-any\n"),
        (dist_info + "/top_level.txt", (PACKAGE + "\n").encode("ascii")),
    ]
    entry_points = _entry_points(project)
    if entry_points:
        files.append((dist_info + "/entry_points.txt", entry_points))
    return files


# --------------------------------------------------------------- the hooks
def get_requires_for_build_wheel(config_settings=None):
    if _setuptools is not None:
        return _setuptools.get_requires_for_build_wheel(config_settings)
    return []


def get_requires_for_build_sdist(config_settings=None):
    if _setuptools is not None:
        return _setuptools.get_requires_for_build_sdist(config_settings)
    return []


def prepare_metadata_for_build_wheel(metadata_directory, config_settings=None):
    if _setuptools is not None:
        return _setuptools.prepare_metadata_for_build_wheel(metadata_directory, config_settings)
    project = _project()
    dist_info = _dist_info(project)
    for name, data in _metadata_files(project):
        path = os.path.join(metadata_directory, name)
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "wb") as handle:
            handle.write(data)
    return dist_info


def build_wheel(wheel_directory, config_settings=None, metadata_directory=None):
    if _setuptools is not None:
        return _setuptools.build_wheel(wheel_directory, config_settings, metadata_directory)
    project = _project()
    name = "%s-%s-py3-none-any.whl" % (project["name"], project["version"])
    records = []
    path = os.path.join(wheel_directory, name)
    with zipfile.ZipFile(path, "w") as archive:
        for arcname, full in _package_files():
            with open(full, "rb") as handle:
                data = handle.read()
            _zip_write(archive, arcname, data)
            records.append(_record_line(arcname, data))
        for arcname, data in _metadata_files(project):
            _zip_write(archive, arcname, data)
            records.append(_record_line(arcname, data))
        record_name = _dist_info(project) + "/RECORD"
        records.append(record_name + ",,")
        _zip_write(archive, record_name, ("\n".join(records) + "\n").encode("utf-8"))
    return name


if _setuptools is not None and hasattr(_setuptools, "build_editable"):
    def get_requires_for_build_editable(config_settings=None):
        return _setuptools.get_requires_for_build_editable(config_settings)

    def prepare_metadata_for_build_editable(metadata_directory, config_settings=None):
        return _setuptools.prepare_metadata_for_build_editable(metadata_directory, config_settings)

    def build_editable(wheel_directory, config_settings=None, metadata_directory=None):
        return _setuptools.build_editable(wheel_directory, config_settings, metadata_directory)


def build_sdist(sdist_directory, config_settings=None):
    if _setuptools is not None:
        return _setuptools.build_sdist(sdist_directory, config_settings)
    project = _project()
    base = "%s-%s" % (project["name"], project["version"])
    name = base + ".tar.gz"
    members = [(f, os.path.join(HERE, f)) for f in SDIST_FILES]
    for folder in SDIST_DIRS:
        for root, dirs, names in os.walk(os.path.join(HERE, folder)):
            dirs[:] = sorted(d for d in dirs if d != "__pycache__")
            for file_name in sorted(names):
                if file_name.endswith((".pyc", ".pyo")):
                    continue
                full = os.path.join(root, file_name)
                members.append((os.path.relpath(full, HERE).replace(os.sep, "/"), full))
    with tarfile.open(os.path.join(sdist_directory, name), "w:gz", format=tarfile.PAX_FORMAT) as archive:
        pkg_info = _metadata(project)
        info = tarfile.TarInfo(base + "/PKG-INFO")
        info.size = len(pkg_info)
        info.mtime = int(time.time())
        info.mode = 0o644
        archive.addfile(info, io.BytesIO(pkg_info))
        for arcname, full in members:
            if os.path.exists(full):
                archive.add(full, arcname=base + "/" + arcname, recursive=False)
    return name
