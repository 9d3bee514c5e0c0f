"""Checks of the build's static server (sitebuild/serve.py) that need no browser."""

from __future__ import annotations

import urllib.error
import urllib.request

import pytest

from sitebuild.common import CONTENT_SECURITY_POLICY

from ..browser_support import serve_directory

PAGE_HEADERS = {
    "Content-Security-Policy": CONTENT_SECURITY_POLICY,
    "X-Content-Type-Options": "nosniff",
    "Cache-Control": "no-cache",
}


@pytest.fixture
def site(tmp_path):
    """A small site: an index page, a folder with files but no index.html, one with its own index."""
    (tmp_path / "index.html").write_text("<!doctype html><title>top</title>", encoding="utf-8")
    (tmp_path / "wheels").mkdir()
    (tmp_path / "wheels" / "secret-name.whl").write_bytes(b"PK")
    (tmp_path / "docs").mkdir()
    (tmp_path / "docs" / "index.html").write_text("<!doctype html><title>docs</title>", encoding="utf-8")
    with serve_directory(tmp_path) as url:
        yield url


def _get(url):
    """(status, headers, body) of a GET, following redirects, whatever the status."""
    try:
        with urllib.request.urlopen(url, timeout=10) as response:
            return response.status, response.headers, response.read()
    except urllib.error.HTTPError as error:
        with error:
            return error.code, error.headers, error.read()


def _assert_page_headers(headers):
    """Every response carries the page's security policy, nosniff and no-cache."""
    for name, value in PAGE_HEADERS.items():
        assert headers[name] == value, name


@pytest.mark.parametrize("path", ["wheels/", "wheels"])
def test_folder_without_index_is_not_found_and_not_listed(site, path):
    status, headers, body = _get(site + path)
    assert status == 404
    assert b"secret-name.whl" not in body and b"Directory listing" not in body
    _assert_page_headers(headers)


@pytest.mark.parametrize("path, title", [("", b"<title>top</title>"), ("docs/", b"<title>docs</title>")])
def test_folder_with_index_serves_it_with_the_page_headers(site, path, title):
    status, headers, body = _get(site + path)
    assert status == 200 and title in body
    _assert_page_headers(headers)


def test_file_is_served_with_the_page_headers(site):
    status, headers, body = _get(site + "wheels/secret-name.whl")
    assert status == 200 and body == b"PK"
    assert headers["Content-Type"] == "application/zip"
    _assert_page_headers(headers)
