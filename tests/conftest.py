"""Test-session set-up: the Chromium every browser test launches.

The session fixture ``chromium`` runs ``tests.browser_setup.ensure_chromium`` once, when the
first test that needs a browser sets up (a run without browser tests never touches it): it
finds a Chromium or installs one (Playwright's download, else the system's package), showing
its messages and the installers' output on the terminal as it goes. If there is none and none
could be installed, every browser test fails with the sentence saying what to install; the
browser tests are never skipped.
"""

from __future__ import annotations

from contextlib import contextmanager, nullcontext

import pytest

from . import browser_setup


@contextmanager
def _on_the_terminal(config):
    """Show output live, past pytest's capture; yield a say(message) for our own lines."""
    capture = config.pluginmanager.getplugin("capturemanager")
    reporter = config.pluginmanager.getplugin("terminalreporter")
    with capture.global_and_fixture_disabled() if capture is not None else nullcontext():
        if reporter is not None:
            reporter.ensure_newline()  # after "tests/test_x.py ..."
            if getattr(reporter, "_width_of_current_line", 0):  # after the dots of `pytest -q`
                reporter.write("\n")

        def say(message: str) -> None:
            if reporter is not None:
                reporter.write_line(f"[browser set-up] {message}")
                reporter.flush()  # before an installer writes to the same terminal
            else:
                print(f"[browser set-up] {message}", flush=True)

        yield say


@pytest.fixture(scope="session")
def chromium(request) -> browser_setup.Chromium:
    """The Chromium for the browser tests (found, or installed once per session)."""
    with _on_the_terminal(request.config) as say:
        try:
            return browser_setup.ensure_chromium(say=say)
        except browser_setup.BrowserSetupError as exc:
            failure = str(exc)
    pytest.fail(failure, pytrace=False)  # an error of every browser test, never a skip
