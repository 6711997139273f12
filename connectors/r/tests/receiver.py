"""A loopback HTTP receiver for the R connector's tests.

    python3 receiver.py PORT_FILE BODIES_FILE [STATUS]

Listens on 127.0.0.1 on a free port, writes "PORT PID" to PORT_FILE, and for
every POST appends one line to BODIES_FILE: the request path, the
Authorization header (or "-") and the body, tab-separated, the body as it
came (one JSON document, no newlines in it).  Answers STATUS (default 201).
Stops after 120 seconds.
"""

import os
import sys
import threading
from http.server import BaseHTTPRequestHandler, HTTPServer

port_file, bodies_file = sys.argv[1], sys.argv[2]
status = int(sys.argv[3]) if len(sys.argv) > 3 else 201
lock = threading.Lock()


class Handler(BaseHTTPRequestHandler):
    def do_POST(self):
        length = int(self.headers.get("Content-Length") or 0)
        body = self.rfile.read(length)
        auth = self.headers.get("Authorization") or "-"
        with lock:
            with open(bodies_file, "ab") as out:
                out.write(self.path.encode() + b"\t" + auth.encode() + b"\t" + body + b"\n")
        reply = b'{"ok":true}' if status < 300 else b'{"error":"test"}'
        self.send_response(status)
        self.send_header("Content-Type", "application/json")
        self.send_header("Content-Length", str(len(reply)))
        self.end_headers()
        self.wfile.write(reply)

    def log_message(self, *args):
        pass


server = HTTPServer(("127.0.0.1", 0), Handler)
with open(port_file + ".tmp", "w") as f:
    f.write("%d %d" % (server.server_address[1], os.getpid()))
os.replace(port_file + ".tmp", port_file)
timer = threading.Timer(120, server.shutdown)
timer.daemon = True
timer.start()
server.serve_forever()
