"""The build of the Linesmith page: everything behind ``python build.py``.

One module per job; ``build.py`` at the repository root is only the command.

    common          paths, BuildError, file hashes, the page's security policy
    fetch           Pyodide's core (``npm pack``) and the fluids and ht wheels (``pip download``),
                    checked against pinned hashes and cached in ``.buildcache/``
    wheel           our own wheel of ``calc/``, byte-reproducible
    bytecode        Python 3.14 bytecode of the engine, compiled by the shipped Pyodide under
                    Node.js (compile_in_pyodide.mjs drives compile_in_pyodide.py)
    render          index.html from the jinja2 templates and the engine's job model
    service_worker  sw.js's precache list and build hash; dist/manifest.json
    assemble        build(): all of the above into a fresh folder, moved into place
    serve           the static server with the page's headers
    cli             ``python build.py [serve [--port N]]``

This package is build-time only: it is neither part of the calc wheel nor installed with calc.
"""
