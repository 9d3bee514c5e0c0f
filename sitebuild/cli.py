"""The command: ``python build.py`` builds dist/, ``python build.py serve [--port N]`` also serves it."""

from __future__ import annotations

import argparse
import sys
import time

from .assemble import build
from .common import DIST_DIR, BuildError
from .serve import make_server, serve_until_stopped


def main(argv: list[str] | None = None) -> int:
    """Run the command with argv (default: sys.argv[1:]); return the exit status."""
    parser = argparse.ArgumentParser(description="Build (and optionally serve) the Linesmith page.")
    sub = parser.add_subparsers(dest="command")
    serve = sub.add_parser("serve", help="build, then serve dist/ on 127.0.0.1")
    serve.add_argument("--port", type=int, default=8000, help="port to listen on (default 8000)")
    args = parser.parse_args(argv)

    started = time.perf_counter()
    try:
        manifest = build()
    except BuildError as exc:
        print(exc, file=sys.stderr)
        return 1
    seconds = time.perf_counter() - started
    print(f"Built dist/ in {seconds:.1f} s: {len(manifest['files'])} files, "
          f"{manifest['total_bytes'] / 1e6:.1f} MB, build {manifest['build'][:12]}")

    if args.command == "serve":
        try:
            server = make_server(DIST_DIR, args.port)
        except OSError as exc:
            print(f"Cannot listen on 127.0.0.1:{args.port} ({exc.strerror}); "
                  "pick another port with --port N.", file=sys.stderr)
            return 1
        serve_until_stopped(server)
    return 0
