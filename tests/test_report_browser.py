"""The report of the demo table in a real browser (headless Chromium).

CI installs Debian's ``chromium`` (``.ci/run``); the test skips, saying so,
only where no Chromium-family browser is on PATH. It renders the page,
checks that the screenshot is not blank (the variance of its pixels) and
that every section is present in the DOM the browser built. Properties of our own
page (common practice for a self-contained report); no scientific reference values.
"""
from __future__ import annotations

import struct
import zlib
from pathlib import Path

import numpy as np
import pytest

from ionicity.pipelines.report_browser import BROWSERS, dump_dom, find_browser, screenshot
from ionicity.pipelines.report_html import SECTIONS, report_file
from ionicity.pipelines.run import score_file

ROOT = Path(__file__).resolve().parents[1]
BROWSER = find_browser()
pytestmark = pytest.mark.skipif(
    BROWSER is None,
    reason=f"no Chromium-family browser on PATH (tried {', '.join(BROWSERS)}); .ci/run installs Debian's chromium as root",
)


@pytest.fixture(scope="module")
def page(tmp_path_factory):
    tmp = tmp_path_factory.mktemp("browser")
    scored = tmp / "demo.parquet"
    score_file(str(ROOT / "datasets" / "demo" / "inventory.csv"), str(scored), name_col="name", quiet=True)
    html = tmp / "demo.html"
    report_file(str(scored), str(html))
    return html


def read_png(path) -> np.ndarray:
    """RGB pixels in [0, 1] of an 8-bit, non-interlaced RGB or RGBA PNG (what Chromium writes), decoded by hand
    (PNG specification, W3C 2003, sections 11.2 and 9: IHDR, IDAT, the five row filters) so that the test needs
    no imaging library."""
    data = Path(path).read_bytes()
    assert data[:8] == b"\x89PNG\r\n\x1a\n"
    pos, idat, head = 8, b"", None
    while pos < len(data):
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            head = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            idat += body
        pos += 12 + length
    width, height, depth, colour, _, _, interlace = head
    assert depth == 8 and colour in (2, 6) and interlace == 0, head
    channels = 3 if colour == 2 else 4
    raw = np.frombuffer(zlib.decompress(idat), np.uint8).reshape(height, 1 + width * channels)
    out = np.zeros((height, width * channels), np.int32)
    prev = np.zeros(width * channels, np.int32)
    for r in range(height):
        kind, line = raw[r, 0], raw[r, 1:].astype(np.int32)
        if kind == 0:
            row = line
        elif kind == 2:
            row = (line + prev) & 255
        elif kind == 3 or kind == 1 or kind == 4:  # these refer to the pixel to the left: one pixel at a time
            row = np.zeros_like(line)
            for i in range(0, len(line), channels):
                left = row[i - channels:i] if i else np.zeros(channels, np.int32)
                up, upleft = prev[i:i + channels], (prev[i - channels:i] if i else np.zeros(channels, np.int32))
                if kind == 1:
                    pred = left
                elif kind == 3:
                    pred = (left + up) // 2
                else:
                    p = left + up - upleft
                    pa, pb, pc = np.abs(p - left), np.abs(p - up), np.abs(p - upleft)
                    pred = np.where((pa <= pb) & (pa <= pc), left, np.where(pb <= pc, up, upleft))
                row[i:i + channels] = (line[i:i + channels] + pred) & 255
        else:
            raise AssertionError(f"PNG filter {kind}")
        out[r], prev = row, row
    return out.reshape(height, width, channels)[:, :, :3] / 255.0


def test_the_rendered_page_is_not_blank(page, tmp_path):
    png = tmp_path / "shot.png"
    screenshot(str(page), str(png), width=1280, height=2400)
    pixels = read_png(png)
    assert pixels.shape[:2] == (2400, 1280)
    # a blank page has no variance; text, tables and figures give plenty (a white page with one
    # line of text is well below 0.005)
    assert float(np.var(pixels)) > 0.01
    # and not one colour: the caution box, the cards and the figures bring several
    assert len(np.unique((pixels * 255).astype(np.uint8).reshape(-1, 3), axis=0)) > 50


def test_every_section_is_in_the_rendered_dom(page):
    dom = dump_dom(str(page))
    assert "<svg" in dom  # the figures were parsed as inline SVG, not left as text
    for sid, title in SECTIONS:
        assert f'id="{sid}"' in dom, sid
        assert title in dom, title
    assert "Rows that could not be scored (status error): " in dom
    assert "Predicted to melt below 100 C" in dom
    assert dom.count("<svg") >= 4
