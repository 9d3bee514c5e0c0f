"""Build the Linesmith calculator page into dist/ and, on request, serve it.

    python build.py                  build into dist/
    python build.py serve [--port N] build, then serve dist/ on 127.0.0.1

The build uses only the standard library and jinja2. It needs the network once:
Pyodide's core comes from ``npm pack`` and the fluids and ht wheels from
``pip download``; both land in the git-ignored folder ``.buildcache/`` and are
checked against the hashes pinned in ``sitebuild/fetch.py``, so later builds
run offline. The code is in the package ``sitebuild/``, one module per job.
"""

import sys

from sitebuild.cli import main

if __name__ == "__main__":
    sys.exit(main())
