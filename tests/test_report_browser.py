"""The report of the demo table in a real browser (headless Chromium).

CI installs Debian's ``chromium`` (``.ci/run``); the test skips, saying so,
only where no Chromium-family browser is on PATH. It renders the page,
checks that the screenshot is not blank (the variance of its pixels) and
that every section is present in the DOM the browser built. Properties of our own
page (common practice for a self-contained report); no scientific reference values.
"""
from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from ionicity.pipelines.report_browser import BROWSERS, dump_dom, find_browser, screenshot
from ionicity.pipelines.report_html import SECTIONS, report_file
from ionicity.pipelines.run import score_file

ROOT = Path(__file__).resolve().parents[1]
pytest.importorskip("matplotlib", reason="the report needs matplotlib (the report extra)")
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


def test_the_rendered_page_is_not_blank(page, tmp_path):
    from matplotlib import image

    png = tmp_path / "shot.png"
    screenshot(str(page), str(png), width=1280, height=2400)
    pixels = image.imread(str(png))[:, :, :3]
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
