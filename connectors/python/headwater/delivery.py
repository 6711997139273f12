"""Sending run records to ``POST {HEADWATER_URL}/api/runs``, and the local
spool for records that could not be sent.

The spool is an append-only file of JSON lines.  Appends and rewrites hold
an exclusive lock on ``<spool>.lock``; a flush sends lines without holding
the lock, then, under the lock, re-reads the file and writes it back without
the lines it sent (to a temporary file, then ``os.replace``), so a record
appended meanwhile by another process is kept.  The server deduplicates by
run id, so a line sent twice (two flushes at once) is harmless.
"""

import json
import os
import time

from headwater import CLIENT, config, log
from headwater.hooks import internal

SENT = "sent"
SPOOLED = "spooled"
DROPPED = "dropped"

# Outcome of one POST: SENT, RETRY (keep it spooled) or DROPPED.
RETRY = "retry"

LOCK_TIMEOUT_S = 5.0


def encode(record):
    """One line of JSON.  Non-ASCII text stays as it is, except when the
    record holds strings UTF-8 cannot carry (file names or arguments with
    undecodable bytes, which Python keeps as lone surrogates): then every
    non-ASCII character is written as a \\u escape (RFC 8259, section 7)."""
    line = json.dumps(record, ensure_ascii=False, separators=(",", ":"))
    try:
        line.encode("utf-8")
    except UnicodeEncodeError:
        line = json.dumps(record, ensure_ascii=True, separators=(",", ":"))
    return line


def endpoint(url):
    return url.rstrip("/") + "/api/runs"


def classify(status):
    """What to do after an HTTP status.  2xx: sent.  408, 429 and 5xx: the
    server may take it later (RFC 9110 15.5.9 Request Timeout, RFC 6585 4
    Too Many Requests, RFC 9110 15.6 server errors), keep it.  Any other
    4xx: the server will never take this record as it is, drop it.  Other
    codes (1xx, 3xx) mean a wrong URL, keep it until that is fixed."""
    if 200 <= status < 300:
        return SENT
    if status in (408, 429) or 500 <= status < 600:
        return RETRY
    if 400 <= status < 500:
        return DROPPED
    return RETRY


def post(body, cfg):
    """POST one record (bytes).  Returns (SENT|RETRY|DROPPED, reason).
    http.client directly (lighter to import at every exit than
    urllib.request); urllib is used when a proxy is configured, so the usual
    *_proxy variables are honoured."""
    url = cfg.url
    if not url:
        return RETRY, "HEADWATER_URL is not set"
    if not url.lower().startswith(("http://", "https://")):
        log.once("url-scheme", "HEADWATER_URL must start with http:// or https://; run records are spooled")
        return RETRY, "HEADWATER_URL is not an http(s) URL"
    headers = {"Content-Type": "application/json", "Accept": "application/json", "User-Agent": CLIENT}
    if cfg.token:
        headers["Authorization"] = "Bearer " + cfg.token
    target = endpoint(url)
    try:
        if _proxied(target):
            status, detail = _post_urllib(target, body, headers, cfg.timeout)
        else:
            status, detail = _post_direct(target, body, headers, cfg.timeout)
    except Exception as exc:  # OSError, timeouts, http.client.HTTPException, bad answers
        return RETRY, "server unreachable (%s)" % (getattr(exc, "reason", None) or exc)
    outcome = classify(status)
    reason = "HTTP %d" % status
    text = detail.decode("utf-8", "replace").strip()
    if text:
        reason += ": " + " ".join(text.split())[:200]
    return outcome, reason


def _proxied(target):
    names = ("https_proxy", "HTTPS_PROXY") if target.lower().startswith("https:") else ("http_proxy", "HTTP_PROXY")
    if not any(os.environ.get(n) for n in names + ("all_proxy", "ALL_PROXY")):
        return False
    import urllib.request
    from urllib.parse import urlsplit

    return not urllib.request.proxy_bypass(urlsplit(target).hostname or "")


def _post_plain_http(host, port, path, body, headers, timeout):
    """One HTTP/1.1 POST over a plain socket with "Connection: close"
    (RFC 9112: request line, header fields, Content-Length body; the
    response's status line and body up to 64 KiB).  For http:// only; it
    spares every captured process the import of http.client and the email
    package at exit."""
    import socket

    host_header = host if port in (None, 80) else "%s:%d" % (host, port)
    if ":" in host and not host.startswith("["):
        host_header = "[%s]" % host if port in (None, 80) else "[%s]:%d" % (host, port)
    lines = ["POST %s HTTP/1.1" % path, "Host: %s" % host_header, "Content-Length: %d" % len(body),
             "Connection: close"]
    lines += ["%s: %s" % item for item in headers.items()]
    request = ("\r\n".join(lines) + "\r\n\r\n").encode("latin-1") + body
    with socket.create_connection((host, port or 80), timeout=timeout) as sock:
        sock.sendall(request)
        chunks = []
        received = 0
        while received < 65536:
            data = sock.recv(65536)
            if not data:
                break
            chunks.append(data)
            received += len(data)
            joined = b"".join(chunks)
            head_end = joined.find(b"\r\n\r\n")
            if head_end >= 0:
                length = None
                for line in joined[:head_end].split(b"\r\n")[1:]:
                    name, _, value = line.partition(b":")
                    if name.strip().lower() == b"content-length":
                        try:
                            length = int(value.strip())
                        except ValueError:
                            length = None
                if length is not None and len(joined) - head_end - 4 >= length:
                    break
    response = b"".join(chunks)
    status_line = response.split(b"\r\n", 1)[0].split(None, 2)
    if len(status_line) < 2 or not status_line[0].startswith(b"HTTP/") or not status_line[1].isdigit():
        raise ValueError("not an HTTP response")
    status = int(status_line[1])
    head_end = response.find(b"\r\n\r\n")
    detail = response[head_end + 4:] if head_end >= 0 else b""
    return status, (detail[:300] if status >= 300 else b"")


def _post_direct(target, body, headers, timeout):
    from urllib.parse import urlsplit

    parts = urlsplit(target)
    path = parts.path or "/"
    if parts.query:
        path += "?" + parts.query
    if parts.scheme.lower() == "http":
        return _post_plain_http(parts.hostname, parts.port, path, body, headers, timeout)
    import http.client

    if parts.scheme.lower() == "https":
        import ssl

        conn = http.client.HTTPSConnection(parts.hostname, parts.port, timeout=timeout,
                                           context=ssl.create_default_context())
    else:
        conn = http.client.HTTPConnection(parts.hostname, parts.port, timeout=timeout)
    try:
        conn.request("POST", path, body=body, headers=headers)
        response = conn.getresponse()
        detail = response.read(65536)
        return response.status, (detail[:300] if response.status >= 300 else b"")
    finally:
        conn.close()


def _post_urllib(target, body, headers, timeout):
    import urllib.error
    import urllib.request

    class NoRedirect(urllib.request.HTTPRedirectHandler):
        def redirect_request(self, *args, **kwargs):
            return None

    request = urllib.request.Request(target, data=body, headers=headers, method="POST")
    opener = urllib.request.build_opener(NoRedirect)
    try:
        with opener.open(request, timeout=timeout) as response:
            response.read(65536)
            return response.status, b""
    except urllib.error.HTTPError as exc:
        try:
            detail = exc.read(300) or b""
        except Exception:
            detail = b""
        exc.close()
        return exc.code, detail


class SpoolLock(object):
    """Exclusive lock on ``<spool>.lock`` (flock on POSIX, msvcrt on
    Windows), given up after LOCK_TIMEOUT_S; ``held`` tells whether it was
    obtained."""

    def __init__(self, spool, timeout=LOCK_TIMEOUT_S):
        self.path = spool + ".lock"
        self.timeout = timeout
        self.fd = None
        self.held = False

    def __enter__(self):
        try:
            self.fd = os.open(self.path, os.O_RDWR | os.O_CREAT, 0o600)
        except OSError:
            return self
        deadline = time.monotonic() + self.timeout
        while True:
            try:
                if os.name == "nt":
                    import msvcrt

                    msvcrt.locking(self.fd, msvcrt.LK_NBLCK, 1)
                else:
                    import fcntl

                    fcntl.flock(self.fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                self.held = True
                return self
            except (OSError, IOError):
                if time.monotonic() >= deadline:
                    return self
                time.sleep(0.01)

    def __exit__(self, *exc):
        if self.fd is not None:
            try:
                if self.held:
                    if os.name == "nt":
                        import msvcrt

                        os.lseek(self.fd, 0, 0)
                        msvcrt.locking(self.fd, msvcrt.LK_UNLCK, 1)
                    else:
                        import fcntl

                        fcntl.flock(self.fd, fcntl.LOCK_UN)
            finally:
                os.close(self.fd)
                self.fd = None
        return False


def _ensure_dir(spool):
    folder = os.path.dirname(spool)
    if folder and not os.path.isdir(folder):
        os.makedirs(folder, 0o700, exist_ok=True)


def spool_append(line, spool):
    with internal():
        _ensure_dir(spool)
        data = (line.rstrip("\n") + "\n").encode("utf-8")
        with SpoolLock(spool) as lock:
            if not lock.held:
                log.once("spool-lock", "could not lock %s.lock; appending without the lock" % spool)
            fd = os.open(spool, os.O_WRONLY | os.O_APPEND | os.O_CREAT, 0o600)
            try:
                view = memoryview(data)
                while view:
                    n = os.write(fd, view)
                    view = view[n:]
            finally:
                os.close(fd)


def _read_lines(spool):
    try:
        with open(spool, "rb") as handle:
            raw = handle.read()
    except FileNotFoundError:
        return []
    return raw.decode("utf-8", "replace").splitlines()


def flush(cfg, budget_s=None, max_records=None):
    """Send spooled records, oldest first, stopping at the first one the
    server cannot take now.  Returns counts: sent, dropped, kept, and
    unreachable (True when sending stopped because of the server)."""
    stats = {"sent": 0, "dropped": 0, "kept": 0, "unreachable": False}
    with internal():
        spool = cfg.spool
        try:
            if os.path.getsize(spool) == 0:
                return stats
        except OSError:
            return stats
        with SpoolLock(spool):
            lines = _read_lines(spool)
        started = time.monotonic()
        done = set()
        tried = 0
        for line in lines:
            if line in done:
                continue
            if not line.strip():
                done.add(line)
                continue
            if max_records is not None and tried >= max_records:
                break
            if budget_s is not None and time.monotonic() - started > budget_s:
                break
            try:
                record = json.loads(line)
            except ValueError:
                log.once("spool-corrupt", "dropped an unreadable line of %s" % spool)
                done.add(line)
                stats["dropped"] += 1
                continue
            tried += 1
            outcome, reason = post(line.encode("utf-8"), cfg)
            if outcome == SENT:
                done.add(line)
                stats["sent"] += 1
                log.info("sent spooled run %s" % record.get("run_id"))
            elif outcome == DROPPED:
                done.add(line)
                stats["dropped"] += 1
                log.once("drop:" + reason, "the server refused spooled run %s (%s); dropped it"
                         % (record.get("run_id"), reason))
            else:
                stats["unreachable"] = True
                log.info("spooled runs kept: %s" % reason)
                break
        if done:
            with SpoolLock(spool) as lock:
                if lock.held:
                    current = _read_lines(spool)
                    keep = [line for line in current if line not in done]
                    _rewrite(spool, keep)
                    stats["kept"] = len([line for line in keep if line.strip()])
                else:
                    log.once("spool-lock-flush", "could not lock %s.lock; sent lines stay in the spool "
                                                 "(the server ignores repeats)" % spool)
                    stats["kept"] = len([line for line in lines if line.strip() and line not in done])
        else:
            stats["kept"] = len([line for line in lines if line.strip()])
    return stats


def _rewrite(spool, lines):
    folder = os.path.dirname(spool) or "."
    tmp = os.path.join(folder, ".%s.%d.tmp" % (os.path.basename(spool), os.getpid()))
    data = "".join(line + "\n" for line in lines).encode("utf-8")
    fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_TRUNC, 0o600)
    try:
        view = memoryview(data)
        while view:
            n = os.write(fd, view)
            view = view[n:]
        os.fsync(fd)
    finally:
        os.close(fd)
    os.replace(tmp, spool)


def deliver(record, cfg):
    """At the end of a run: first the backlog (bounded in time and count),
    then this record; what cannot be sent now is spooled.  Returns SENT,
    SPOOLED or DROPPED."""
    line = encode(record)
    run_id = record.get("run_id")
    if not cfg.url:
        spool_append(line, cfg.spool)
        log.info("HEADWATER_URL is not set; run %s spooled to %s" % (run_id, cfg.spool))
        return SPOOLED
    backlog = flush(cfg, config.EXIT_FLUSH_BUDGET_S, config.EXIT_FLUSH_MAX_RECORDS)
    if backlog["unreachable"]:
        spool_append(line, cfg.spool)
        log.info("server unreachable; run %s spooled to %s" % (run_id, cfg.spool))
        return SPOOLED
    outcome, reason = post(line.encode("utf-8"), cfg)
    if outcome == SENT:
        log.info("sent run %s" % run_id)
        return SENT
    if outcome == DROPPED:
        log.once("drop:" + reason, "the server refused run %s (%s); the record was dropped, not spooled"
                 % (run_id, reason))
        return DROPPED
    spool_append(line, cfg.spool)
    log.info("run %s spooled to %s: %s" % (run_id, cfg.spool, reason))
    return SPOOLED
