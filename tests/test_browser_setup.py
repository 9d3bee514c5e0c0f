"""The browser set-up logic (tests/browser_setup.py, the ``chromium`` fixture), with fakes.

Nothing here installs anything: the install steps are replaced by fakes that record what
they were asked to do. The real ``run_command`` is exercised only with small Python child
processes (exit status, time limit, process group killed).
"""

from __future__ import annotations

import re
import sys
import time
from pathlib import Path

import pytest

from . import browser_setup, browser_support
from .browser_setup import (
    APT_GET_INSTALL,
    APT_GET_UPDATE,
    NOTHING_WORKED,
    PLAYWRIGHT_INSTALL,
    PLAYWRIGHT_TIME_LIMIT_S,
    BrowserSetupError,
    Chromium,
    admin_prefix,
    ensure_chromium,
    run_command,
    system_install_commands,
)

pytest_plugins = ["pytester"]

ROOT = Path(__file__).resolve().parent.parent
MANAGED = Chromium(None, "Playwright's managed Chromium (/fake/ms-playwright/chrome)")
SYSTEM = Chromium("/usr/bin/chromium", "/usr/bin/chromium")


class Machine:
    """A fake machine: records every step ensure_chromium takes, in order.

    finds: what each successive find() returns (the last one repeats);
    statuses: exit status (None: timed out) by command (a tuple), 0 for any other command;
    prefix: what admin() returns ([] root, ["sudo", "-n"], None neither); apt: apt-get there.
    """

    def __init__(self, finds, statuses=None, prefix=(), apt=True):
        self.finds = list(finds)
        self.statuses = {tuple(command): status for command, status in (statuses or {}).items()}
        self.prefix = None if prefix is None else list(prefix)
        self.apt = apt
        self.events: list = []
        self.said: list[str] = []

    def find(self):
        self.events.append("find")
        return self.finds.pop(0) if len(self.finds) > 1 else self.finds[0]

    def run(self, command, time_limit_s):
        self.events.append(("run", list(command), time_limit_s))
        return self.statuses.get(tuple(command), 0)

    def admin(self):
        self.events.append("admin")
        return self.prefix

    def apt_available(self):
        self.events.append("apt?")
        return self.apt

    def ensure(self):
        return ensure_chromium(find=self.find, run=self.run, admin=self.admin,
                               apt_available=self.apt_available, say=self.said.append)

    def commands(self):
        return [event[1] for event in self.events if isinstance(event, tuple)]


PW = tuple(PLAYWRIGHT_INSTALL)
APT_AS_ROOT = [["env", "DEBIAN_FRONTEND=noninteractive", *APT_GET_UPDATE],
               ["env", "DEBIAN_FRONTEND=noninteractive", *APT_GET_INSTALL]]


# ---------------------------------------------------------------- ensure_chromium


def test_a_browser_already_there_is_used_and_nothing_is_installed():
    machine = Machine([SYSTEM])
    assert machine.ensure() is SYSTEM
    assert machine.events == ["find"]
    assert machine.said == []


def test_playwright_download_comes_first_with_its_time_limit():
    machine = Machine([None, MANAGED])
    assert machine.ensure() is MANAGED
    assert machine.events == ["find", ("run", PLAYWRIGHT_INSTALL, 120), "find"]
    assert PLAYWRIGHT_INSTALL == [sys.executable, "-m", "playwright", "install", "chromium"]
    assert PLAYWRIGHT_TIME_LIMIT_S == 120
    assert "time limit 120 s" in machine.said[0]
    assert "Playwright installed Chromium" in machine.said[-1] and MANAGED.description in machine.said[-1]


def test_system_package_as_root_when_the_download_fails():
    machine = Machine([None, SYSTEM], statuses={PW: 1})
    assert machine.ensure() is SYSTEM
    assert machine.events == [
        "find",
        ("run", PLAYWRIGHT_INSTALL, 120),
        "apt?",
        "admin",
        ("run", APT_AS_ROOT[0], None),  # apt-get update, no time limit (never kill a package install)
        ("run", APT_AS_ROOT[1], None),  # apt-get install -y chromium
        "find",
    ]
    assert APT_GET_UPDATE[0] == "apt-get" and APT_GET_UPDATE[-1] == "update"
    assert APT_GET_INSTALL[0] == "apt-get" and APT_GET_INSTALL[-3:] == ["install", "-y", "chromium"]
    assert "failed (exit status 1)" in machine.said[1]
    assert machine.said[2].startswith("Installing the system's chromium package instead, as root:")
    assert "`apt-get update`, then `apt-get install -y chromium`" in machine.said[2]
    assert SYSTEM.description in machine.said[-1]


def test_system_package_with_sudo_when_the_download_times_out():
    machine = Machine([None, SYSTEM], statuses={PW: None}, prefix=["sudo", "-n"])
    assert machine.ensure() is SYSTEM
    assert machine.commands() == [PLAYWRIGHT_INSTALL,
                                  ["sudo", "-n", *APT_AS_ROOT[0]], ["sudo", "-n", *APT_AS_ROOT[1]]]
    assert "did not finish within 120 s" in machine.said[1]
    assert "with sudo -n" in machine.said[2]


def test_download_that_leaves_no_browser_falls_through_to_the_system_package():
    machine = Machine([None, None, SYSTEM])  # playwright "succeeds" but find still sees nothing
    assert machine.ensure() is SYSTEM
    assert machine.commands() == [PLAYWRIGHT_INSTALL, *APT_AS_ROOT]
    assert "left no Chromium" in machine.said[1]


def test_neither_root_nor_sudo_fails_with_the_one_sentence():
    machine = Machine([None], statuses={PW: 1}, prefix=None)
    with pytest.raises(BrowserSetupError) as caught:
        machine.ensure()
    assert str(caught.value) == NOTHING_WORKED
    assert machine.commands() == [PLAYWRIGHT_INSTALL]  # no apt-get without a way to be root
    assert "Not root and no passwordless sudo" in machine.said[-1]


def test_no_apt_get_fails_without_asking_for_root():
    machine = Machine([None], statuses={PW: 1}, apt=False)
    with pytest.raises(BrowserSetupError, match="^No Chromium for the browser tests"):
        machine.ensure()
    assert "admin" not in machine.events
    assert machine.commands() == [PLAYWRIGHT_INSTALL]


def test_failed_apt_get_update_stops_before_the_install():
    machine = Machine([None], statuses={PW: 1, tuple(APT_AS_ROOT[0]): 100})
    with pytest.raises(BrowserSetupError) as caught:
        machine.ensure()
    assert str(caught.value) == NOTHING_WORKED
    assert machine.commands() == [PLAYWRIGHT_INSTALL, APT_AS_ROOT[0]]
    assert "apt-get -o DPkg::Lock::Timeout=300 update` failed (exit status 100)" in machine.said[-1]


def test_package_installed_but_no_browser_appears_is_a_failure():
    machine = Machine([None], statuses={PW: 1})
    with pytest.raises(BrowserSetupError) as caught:
        machine.ensure()
    assert str(caught.value) == NOTHING_WORKED
    assert machine.commands() == [PLAYWRIGHT_INSTALL, *APT_AS_ROOT]
    assert machine.events[-1] == "find"


def test_a_bad_linesmith_chromium_is_an_error_and_nothing_is_installed(monkeypatch, tmp_path):
    monkeypatch.setenv("LINESMITH_CHROMIUM", str(tmp_path / "no-such-chromium"))
    machine = Machine([None])
    machine.find = browser_setup.find_now
    with pytest.raises(BrowserSetupError, match="LINESMITH_CHROMIUM=.*no-such-chromium.* is not an executable file"):
        machine.ensure()
    assert machine.events == []


def test_the_failure_message_is_one_sentence_naming_what_to_install():
    sentences = [s for s in re.split(r"(?<=\.)\s+", NOTHING_WORKED) if s]
    assert len(sentences) == 1 and NOTHING_WORKED.endswith(".")
    for remedy in ("python -m playwright install chromium", "apt-get install chromium", "LINESMITH_CHROMIUM"):
        assert remedy in NOTHING_WORKED


# ---------------------------------------------------------------- the real steps


class FakePlaywright:
    def __init__(self, managed_path):
        self._path = managed_path

    @property
    def chromium(self):
        return self

    @property
    def executable_path(self):
        if self._path is None:
            raise RuntimeError("no browsers installed")  # as some Playwright versions do
        return str(self._path)


def test_find_chromium_looks_in_the_documented_order(monkeypatch, tmp_path):
    named, managed, system, other = (tmp_path / n for n in ("named", "managed", "system", "system2"))
    for f in (named, managed, system, other):
        f.write_text("#!/bin/sh\n")
    monkeypatch.setattr(browser_support, "SYSTEM_CHROMIUMS", (str(system), str(other)))
    monkeypatch.setenv("LINESMITH_CHROMIUM", str(named))
    assert browser_support.find_chromium(FakePlaywright(managed)) == (str(named), f"LINESMITH_CHROMIUM ({named})")
    monkeypatch.delenv("LINESMITH_CHROMIUM")
    assert browser_support.find_chromium(FakePlaywright(managed))[0] is None  # Playwright's own
    assert browser_support.find_chromium(FakePlaywright(tmp_path / "gone")) == (str(system), str(system))
    system.unlink()
    assert browser_support.find_chromium(FakePlaywright(None)) == (str(other), str(other))
    other.unlink()
    with pytest.raises(browser_support.NoChromium):
        browser_support.find_chromium(FakePlaywright(None))


def test_the_system_places_are_usr_bin_chromium_then_chromium_browser():
    assert browser_support.SYSTEM_CHROMIUMS == ("/usr/bin/chromium", "/usr/bin/chromium-browser")


def test_admin_prefix_root_sudo_or_none():
    def must_not_ask():
        raise AssertionError("asked sudo")
    assert admin_prefix(geteuid=lambda: 0, which=lambda _: None, sudo_works=must_not_ask) == []
    assert admin_prefix(geteuid=lambda: 1000, which=lambda _: "/usr/bin/sudo", sudo_works=lambda: True) == ["sudo", "-n"]
    assert admin_prefix(geteuid=lambda: 1000, which=lambda _: "/usr/bin/sudo", sudo_works=lambda: False) is None
    assert admin_prefix(geteuid=lambda: 1000, which=lambda _: None, sudo_works=must_not_ask) is None


def test_system_install_commands_are_noninteractive():
    assert system_install_commands([]) == APT_AS_ROOT
    assert system_install_commands(["sudo", "-n"])[1] == [
        "sudo", "-n", "env", "DEBIAN_FRONTEND=noninteractive", "apt-get", "-o", "DPkg::Lock::Timeout=300",
        "install", "-y", "chromium"]


def test_run_command_gives_the_exit_status():
    assert run_command([sys.executable, "-c", "raise SystemExit(3)"]) == 3
    assert run_command([sys.executable, "-c", "pass"], 60) == 0
    assert run_command(["/nonexistent/linesmith-no-such-command"]) == 127


def test_run_command_stops_the_whole_process_group_at_the_time_limit(tmp_path):
    pid_file = tmp_path / "helper.pid"
    # A parent that starts a long-running helper (as a downloader might), then hangs itself.
    script = (
        "import subprocess, sys, time, pathlib\n"
        "helper = subprocess.Popen([sys.executable, '-c', 'import time; time.sleep(600)'])\n"
        f"pathlib.Path({str(pid_file)!r}).write_text(str(helper.pid))\n"
        "time.sleep(600)\n"
    )
    assert run_command([sys.executable, "-c", script], 3) is None
    helper = int(pid_file.read_text())
    assert _gone(helper), f"helper process {helper} outlived the time limit"


def _gone(pid, patience_s=10.0):
    """True once pid no longer runs (absent or a zombie waiting to be reaped)."""
    deadline = time.monotonic() + patience_s
    while True:
        try:
            state = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()[0]
        except (FileNotFoundError, ProcessLookupError):
            return True
        if state in ("Z", "X"):
            return True
        if time.monotonic() > deadline:
            return False
        time.sleep(0.1)


# ---------------------------------------------------------------- the fixture in conftest.py

BROWSER_TESTS = """
    def test_plain():
        assert 1 + 1 == 2

    def test_one(chromium):
        assert chromium.executable == "/fake/chromium"

    def test_two(chromium):
        assert chromium.description == "fake chromium"
"""


@pytest.fixture()
def fake_session(pytester, monkeypatch):
    """A pytester folder whose conftest uses our ``chromium`` fixture, and the calls it makes."""
    calls = []
    monkeypatch.setattr(browser_setup, "ensure_chromium", None)  # each test sets its own fake

    def use(fake):
        def ensure(*, say):
            calls.append("ensure")
            return fake(say)
        monkeypatch.setattr(browser_setup, "ensure_chromium", ensure)

    pytester.makeconftest("from tests.conftest import chromium  # noqa: F401\n")
    return pytester, calls, use


@pytest.mark.parametrize("options, lines", [
    ((), ["test_a.py .", "[[]browser set-up[]] fake set-up ran", "test_a.py .. *", "test_b.py . *"]),
    (("-q",), [".", "[[]browser set-up[]] fake set-up ran", "... *"]),
])
def test_fixture_sets_up_once_per_session_and_shows_its_messages(fake_session, options, lines):
    pytester, calls, use = fake_session

    def found(say):
        say("fake set-up ran")
        return Chromium("/fake/chromium", "fake chromium")

    use(found)
    pytester.makepyfile(test_a=BROWSER_TESTS, test_b="def test_three(chromium):\n    assert chromium\n")
    result = pytester.runpytest_inprocess(*options)
    result.assert_outcomes(passed=4)
    assert calls == ["ensure"]
    result.stdout.fnmatch_lines(lines, consecutive=True)


def test_fixture_is_not_used_without_browser_tests(fake_session):
    pytester, calls, use = fake_session
    use(lambda say: pytest.fail("set-up ran without a browser test"))
    pytester.makepyfile(test_a="def test_plain():\n    assert 2 * 2 == 4\n")
    pytester.runpytest_inprocess("-q").assert_outcomes(passed=1)
    assert calls == []


def test_fixture_failure_fails_the_browser_tests_and_never_skips(fake_session):
    pytester, calls, use = fake_session

    def nothing(say):
        raise BrowserSetupError(NOTHING_WORKED)

    use(nothing)
    pytester.makepyfile(test_a=BROWSER_TESTS)
    result = pytester.runpytest_inprocess("-q", "-rA")
    result.assert_outcomes(passed=1, errors=2, skipped=0)
    assert calls == ["ensure"]  # tried once, not once per test
    output = result.stdout.str()
    assert output.count(NOTHING_WORKED) >= 2  # the whole sentence under each browser test's error
    assert "During handling" not in output and "Traceback" not in output


# ---------------------------------------------------------------- the documents


def _readme_test_command():
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    block = re.search(r"Install what the tests need and run them:\s*```sh\n(.*?)\n```", readme, re.S)
    assert block, "README lost its test command"
    return readme, block.group(1).strip()


def test_ci_runs_exactly_the_readme_test_command():
    readme, command = _readme_test_command()
    assert command == 'pip install -e ".[test]" && python -m pytest'
    lines = [line.strip() for line in (ROOT / ".ci" / "run").read_text(encoding="utf-8").splitlines()]
    own = [line for line in lines if line and not line.startswith("#")
           and line not in ("set -euo pipefail", 'cd "$(dirname "$0")/.."')]
    assert own == [command]


def test_readme_states_the_download_time_limit():
    readme, _ = _readme_test_command()
    assert f"{PLAYWRIGHT_TIME_LIMIT_S} s" in readme
    assert "python -m playwright install chromium" in readme and "apt-get install -y chromium" in readme
