"""A Chromium for the browser tests on a machine that has none: find one, else install one.

``ensure_chromium`` is called once per test session by the ``chromium`` fixture in
tests/conftest.py, when the first browser test asks for a browser (a run without browser
tests never calls it). In order:

1. Look for a Chromium (``browser_support.find_chromium``: $LINESMITH_CHROMIUM, then
   Playwright's managed Chromium, then /usr/bin/chromium or /usr/bin/chromium-browser).
   Found: use it, install nothing, print nothing. A $LINESMITH_CHROMIUM that is not a file
   is an error at once: a browser named by hand is never replaced by another.
2. ``python -m playwright install chromium``, Playwright's own download, with a time limit
   of PLAYWRIGHT_TIME_LIMIT_S seconds (where it cannot download it may hang instead of
   failing); its whole process group is killed when the limit is reached.
3. Where that gave no browser, and apt-get is there and we are root or have passwordless
   sudo: the system's chromium package, ``apt-get update`` then ``apt-get install -y
   chromium``, non-interactive, with a message saying so.
4. Nothing worked: BrowserSetupError(NOTHING_WORKED), one sentence saying what to install.

Every step is a parameter of ``ensure_chromium``, so tests/test_browser_setup.py can run
the logic with fakes that install nothing.
"""

from __future__ import annotations

import os
import shlex
import shutil
import signal
import subprocess
import sys
from dataclasses import dataclass
from typing import Callable, Sequence

from .browser_support import NoChromium, find_chromium

PLAYWRIGHT_TIME_LIMIT_S = 120
PLAYWRIGHT_INSTALL = [sys.executable, "-m", "playwright", "install", "chromium"]
# apt waits up to 5 minutes for a lock another apt or dpkg holds, instead of failing at once.
APT_LOCK_WAIT = ["-o", "DPkg::Lock::Timeout=300"]
APT_GET_UPDATE = ["apt-get", *APT_LOCK_WAIT, "update"]
APT_GET_INSTALL = ["apt-get", *APT_LOCK_WAIT, "install", "-y", "chromium"]
NONINTERACTIVE = "DEBIAN_FRONTEND=noninteractive"

NOTHING_WORKED = (
    "No Chromium for the browser tests and none could be installed automatically: install one with "
    "`python -m playwright install chromium` or your system's chromium package (`sudo apt-get install "
    "chromium` on Debian/Ubuntu), or set LINESMITH_CHROMIUM to the path of a Chromium executable."
)


class BrowserSetupError(RuntimeError):
    """No Chromium for the browser tests; the message says what to do."""


@dataclass(frozen=True)
class Chromium:
    """The browser the tests launch. ``executable`` None means Playwright's managed Chromium."""

    executable: str | None
    description: str


# ---------------------------------------------------------------- the real steps


def find_now() -> Chromium | None:
    """The Chromium find_chromium picks right now, or None when there is none."""
    from playwright.sync_api import sync_playwright

    with sync_playwright() as playwright:
        try:
            executable, description = find_chromium(playwright)
        except NoChromium:
            return None
        except RuntimeError as exc:  # a bad $LINESMITH_CHROMIUM
            raise BrowserSetupError(str(exc)) from None
    return Chromium(executable, description)


def run_command(command: Sequence[str], time_limit_s: float | None = None) -> int | None:
    """Run command with its output on the terminal; return its exit status.

    With a time limit the command runs in a session of its own; when the limit is reached
    its whole process group is killed (so a download helper it started cannot outlive it)
    and the result is None; an interrupted wait kills the group too, then re-raises.
    Without a time limit (apt-get: never kill a package install half-way) it runs in our
    process group, so Ctrl-C reaches it as usual. A command that cannot start gives 127.
    """
    try:
        process = subprocess.Popen(list(command), stdin=subprocess.DEVNULL,
                                   start_new_session=time_limit_s is not None)
    except OSError as exc:
        print(f"cannot run {shlex.join(command)}: {exc}", file=sys.stderr)
        return 127
    try:
        return process.wait(timeout=time_limit_s)
    except subprocess.TimeoutExpired:
        _kill_group(process.pid)
        process.wait()
        return None
    except BaseException:  # KeyboardInterrupt during the wait: leave nothing running behind us
        if time_limit_s is not None:
            _kill_group(process.pid)
        process.wait()
        raise


def _kill_group(pgid: int) -> None:
    try:
        os.killpg(pgid, signal.SIGKILL)
    except ProcessLookupError:
        pass


def admin_prefix(geteuid: Callable[[], int] = os.geteuid,
                 which: Callable[[str], str | None] = shutil.which,
                 sudo_works: Callable[[], bool] | None = None) -> list[str] | None:
    """How to run a command as root: [] when we are root, ["sudo", "-n"] with passwordless
    sudo, None when neither."""
    if geteuid() == 0:
        return []
    if which("sudo") is None:
        return None
    if sudo_works is None:
        sudo_works = _sudo_without_password
    return ["sudo", "-n"] if sudo_works() else None


def _sudo_without_password() -> bool:
    try:
        done = subprocess.run(["sudo", "-n", "true"], stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL,
                              stderr=subprocess.DEVNULL, timeout=30, check=False)
    except (OSError, subprocess.TimeoutExpired):
        return False
    return done.returncode == 0


def has_apt_get() -> bool:
    return shutil.which("apt-get") is not None


def system_install_commands(prefix: Sequence[str]) -> list[list[str]]:
    """apt-get update, then apt-get install -y chromium, non-interactive, run as root via prefix."""
    run_as = [*prefix, "env", NONINTERACTIVE]
    return [[*run_as, *APT_GET_UPDATE], [*run_as, *APT_GET_INSTALL]]


# ---------------------------------------------------------------- the logic


def ensure_chromium(*, find: Callable[[], Chromium | None] = find_now,
                    run: Callable[[Sequence[str], float | None], int | None] = run_command,
                    admin: Callable[[], list[str] | None] = admin_prefix,
                    apt_available: Callable[[], bool] = has_apt_get,
                    say: Callable[[str], None] = print) -> Chromium:
    """Return a Chromium for the browser tests, installing one if there is none (see the module doc).

    Raises BrowserSetupError when there is none and none could be installed.
    """
    found = find()
    if found is not None:
        return found

    say("No Chromium found for the browser tests (LINESMITH_CHROMIUM is unset, there is no "
        "Playwright-managed Chromium and no /usr/bin/chromium): running "
        f"`python -m playwright install chromium`, time limit {PLAYWRIGHT_TIME_LIMIT_S} s.")
    status = run(PLAYWRIGHT_INSTALL, PLAYWRIGHT_TIME_LIMIT_S)
    if status == 0:
        found = find()
        if found is not None:
            say(f"Playwright installed Chromium; the browser tests use {found.description}.")
            return found
        say("`python -m playwright install chromium` ended without error but left no Chromium to find.")
    elif status is None:
        say(f"`python -m playwright install chromium` did not finish within {PLAYWRIGHT_TIME_LIMIT_S} s "
            "and was stopped.")
    else:
        say(f"`python -m playwright install chromium` failed (exit status {status}).")

    if not apt_available():
        say("There is no apt-get here, so the system's chromium package cannot be installed automatically.")
        raise BrowserSetupError(NOTHING_WORKED)
    prefix = admin()
    if prefix is None:
        say("Not root and no passwordless sudo, so the system's chromium package cannot be installed "
            "automatically.")
        raise BrowserSetupError(NOTHING_WORKED)
    how = "as root" if not prefix else "with " + " ".join(prefix)
    say(f"Installing the system's chromium package instead, {how}: `apt-get update`, then "
        "`apt-get install -y chromium` (non-interactive).")
    for command in system_install_commands(prefix):
        status = run(command, None)
        if status != 0:
            say(f"`{shlex.join(command)}` failed (exit status {status}).")
            raise BrowserSetupError(NOTHING_WORKED)
    found = find()
    if found is not None:
        say(f"Installed the system's chromium package; the browser tests use {found.description}.")
        return found
    say("apt-get installed chromium, but no /usr/bin/chromium or /usr/bin/chromium-browser appeared.")
    raise BrowserSetupError(NOTHING_WORKED)
