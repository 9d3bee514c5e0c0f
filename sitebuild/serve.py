"""Serving a built site on 127.0.0.1 with the page's security policy as headers."""

from __future__ import annotations

import functools
import http.server
from http import HTTPStatus
from pathlib import Path

from .common import CONTENT_SECURITY_POLICY, DIST_DIR


class SiteHandler(http.server.SimpleHTTPRequestHandler):
    """Static handler for dist/: the page's headers on every response, no directory listings."""

    extensions_map = {
        **http.server.SimpleHTTPRequestHandler.extensions_map,
        ".mjs": "text/javascript",
        ".js": "text/javascript",
        ".wasm": "application/wasm",
        ".json": "application/json",
        ".whl": "application/zip",
        ".md": "text/plain; charset=utf-8",
        ".svg": "image/svg+xml",
        ".png": "image/png",
        ".webmanifest": "application/manifest+json",
        ".txt": "text/plain; charset=utf-8",
    }

    def end_headers(self):
        self.send_header("Content-Security-Policy", CONTENT_SECURITY_POLICY)
        self.send_header("X-Content-Type-Options", "nosniff")
        self.send_header("Cache-Control", "no-cache")
        super().end_headers()

    def list_directory(self, path):
        """A folder without index.html is not found: the site never lists its files."""
        self.send_error(HTTPStatus.NOT_FOUND, "File not found")
        return None

    def log_message(self, format, *args):  # noqa: A002 - signature fixed by http.server
        if getattr(self.server, "quiet", False):
            return
        super().log_message(format, *args)


def make_server(directory: Path = DIST_DIR, port: int = 8000, quiet: bool = False):
    """Return a threaded HTTP server for directory on 127.0.0.1:port (0 = any free port)."""
    handler = functools.partial(SiteHandler, directory=str(directory))
    server = http.server.ThreadingHTTPServer(("127.0.0.1", port), handler)
    server.daemon_threads = True
    server.quiet = quiet
    return server


def serve_until_stopped(server) -> None:
    """Print the site's address and serve until Ctrl+C."""
    host, port = server.server_address[:2]
    print(f"Linesmith is at http://{host}:{port}/  (press Ctrl+C to stop)", flush=True)
    try:
        server.serve_forever()
    except KeyboardInterrupt:
        print("\nStopped.")
    finally:
        server.server_close()
