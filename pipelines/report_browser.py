"""A headless browser for the report: screenshots and the rendered page.

Used by the browser test (``tests/test_report_browser.py``) and to redraw the
README's picture of the demo report::

    python -m ionicity.pipelines.report_browser docs/report_demo.png

which scores ``datasets/demo/inventory.csv``, writes its report and
photographs it in Chromium (Debian's ``chromium`` package, or Google Chrome).
"""
from __future__ import annotations

import argparse
import os
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

__all__ = ["BROWSERS", "find_browser", "screenshot", "dump_dom", "demo_picture"]

#: executables tried, in order
BROWSERS = ("chromium", "chromium-browser", "google-chrome", "google-chrome-stable")


def find_browser() -> str | None:
    """The path of a Chromium-family browser on PATH, or None."""
    for name in BROWSERS:
        path = shutil.which(name)
        if path:
            return path
    return None


def _flags(browser: str) -> list[str]:
    flags = [browser, "--headless", "--disable-gpu", "--hide-scrollbars", "--no-first-run",
             "--disable-extensions", "--disable-background-networking", "--mute-audio"]
    if hasattr(os, "geteuid") and os.geteuid() == 0:
        flags.append("--no-sandbox")  # Chromium refuses to start its sandbox as root (CI runs as root)
    return flags


def _run(argv: list[str], timeout: float) -> subprocess.CompletedProcess:
    with tempfile.TemporaryDirectory(prefix="ionicity-browser-") as profile:
        return subprocess.run([*argv, f"--user-data-dir={profile}"], capture_output=True, timeout=timeout,
                              check=False, env={**os.environ, "HOME": profile})


def screenshot(page: str, png: str, width: int = 1280, height: int = 2000, *, browser: str | None = None,
               timeout: float = 120.0) -> None:
    """Photograph ``page`` (a path, optionally with ``#fragment``) into ``png``."""
    browser = browser or find_browser()
    if browser is None:
        raise RuntimeError(f"no Chromium-family browser found (tried {', '.join(BROWSERS)})")
    path, _, fragment = page.partition("#")
    url = Path(path).resolve().as_uri() + (f"#{fragment}" if fragment else "")
    done = _run([*_flags(browser), f"--screenshot={os.path.abspath(png)}", f"--window-size={width},{height}", url], timeout)
    if not os.path.exists(png):
        raise RuntimeError(f"{browser} wrote no screenshot: {done.stderr.decode(errors='replace')[-500:]}")


def dump_dom(page: str, *, browser: str | None = None, timeout: float = 120.0) -> str:
    """The page's DOM after the browser has rendered it, as HTML text."""
    browser = browser or find_browser()
    if browser is None:
        raise RuntimeError(f"no Chromium-family browser found (tried {', '.join(BROWSERS)})")
    done = _run([*_flags(browser), "--dump-dom", Path(page).resolve().as_uri()], timeout)
    return done.stdout.decode("utf-8", errors="replace")


#: what the README's picture leaves out of the page, so that one screen shows the cards and the figures
_PICTURE_STYLE = ("<style>#summary, #attention, #melting table, #melting p, #melting h3, #bond-map table,"
                  " #caution { display: none; }</style>")


def demo_picture(png: str, repo: str = ".", width: int = 1200, height: int = 3000) -> None:
    """Score the demo table, write its report and save a picture of it: the
    page as written, less its long tables (:data:`_PICTURE_STYLE`), so that
    the cards at the top and the figures fit one image."""
    from ionicity.pipelines.report_html import report_file
    from ionicity.pipelines.run import score_file

    with tempfile.TemporaryDirectory(prefix="ionicity-demo-") as tmp:
        scored = os.path.join(tmp, "inventory_scored.parquet")
        score_file(os.path.join(repo, "datasets", "demo", "inventory.csv"), scored, name_col="name", quiet=True)
        html = os.path.join(tmp, "inventory_report.html")
        report_file(scored, html)
        text = Path(html).read_text(encoding="utf-8").replace("</head>", _PICTURE_STYLE + "</head>", 1)
        Path(html).write_text(text, encoding="utf-8")
        screenshot(html, png, width=width, height=height)


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.report_browser",
                                     description="redraw the README's picture of the demo report")
    parser.add_argument("png", nargs="?", default="docs/report_demo.png")
    args = parser.parse_args(argv)
    if find_browser() is None:
        print(f"no Chromium-family browser found (tried {', '.join(BROWSERS)}); on Debian: apt-get install chromium",
              file=sys.stderr)
        return 2
    os.makedirs(os.path.dirname(os.path.abspath(args.png)), exist_ok=True)
    demo_picture(args.png)
    print(f"wrote {args.png}", file=sys.stderr)
    return 0


if __name__ == "__main__":
    sys.exit(main())
