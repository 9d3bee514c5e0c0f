"""Test-session set-up: the Chromium every browser test launches; no test may fault the engine.

The session fixture ``chromium`` runs ``tests.browser_setup.ensure_chromium`` once, when the
first test that needs a browser sets up (a run without browser tests never touches it): it
finds a Chromium or installs one (Playwright's download, else the system's package), showing
its messages and the installers' output on the terminal as it goes. If there is none and none
could be installed, every browser test fails with the sentence saying what to install; the
browser tests are never skipped.

The autouse fixture ``no_engine_fault`` fails any test during which ``calc.edges.api.handle``
answered with a fault of the engine itself (its tracebacks are in ``calc.edges.api.FAULTS``).
"""

from __future__ import annotations

import os
from contextlib import contextmanager, nullcontext
from pathlib import Path

import pytest

from . import browser_setup


@contextmanager
def _on_the_terminal(config):
    """Show output live, past pytest's capture; yield a say(message) for our own lines.

    Our first line starts on a line of its own; afterwards the test file's name is written
    again, so the test's result letter lands after it as usual.
    """
    capture = config.pluginmanager.getplugin("capturemanager")
    reporter = config.pluginmanager.getplugin("terminalreporter")
    interrupted = []  # the reporter's current file, once we have broken its line

    def say(message: str) -> None:
        line = f"[browser set-up] {message}"
        if reporter is None:
            print(line, flush=True)
            return
        if not interrupted:
            interrupted.append(reporter.currentfspath)
            reporter.ensure_newline()  # after "tests/test_x.py ..."
            if getattr(reporter, "_width_of_current_line", 0):  # after the dots of `pytest -q`
                reporter.write("\n")
        reporter.write_line(line)
        reporter.flush()  # before an installer writes to the same terminal

    with capture.global_and_fixture_disabled() if capture is not None else nullcontext():
        try:
            yield say
        finally:
            if interrupted and isinstance(interrupted[0], Path):
                reporter.write(os.path.relpath(interrupted[0], reporter.startpath) + " ")
                reporter.currentfspath = interrupted[0]


@pytest.fixture(scope="session")
def chromium(request) -> browser_setup.Chromium:
    """The Chromium for the browser tests (found, or installed once per session)."""
    with _on_the_terminal(request.config) as say:
        try:
            return browser_setup.ensure_chromium(say=say)
        except browser_setup.BrowserSetupError as exc:
            failure = str(exc)
    pytest.fail(failure, pytrace=False)  # an error of every browser test, never a skip


@pytest.fixture(autouse=True)
def no_engine_fault():
    """Every test fails on a fault of the engine behind ``calc.edges.api.handle`` (an "internal
    error" reply), even one that does not read the reply: bad input must never reach one. A test
    that makes a fault on purpose clears ``calc.edges.api.FAULTS`` itself."""
    from calc.edges import api

    api.FAULTS.clear()
    yield
    if api.FAULTS:
        faults = "\n".join(api.FAULTS)
        api.FAULTS.clear()
        pytest.fail(f"the engine answered 'internal error' (calc.edges.api.FAULTS):\n{faults}", pytrace=False)
