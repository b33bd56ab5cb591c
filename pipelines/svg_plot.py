"""A small plotting kit that writes SVG text: the figures of ``ionicity report``.

Enough for the report and no more: linear and log10 axes with nice ticks,
axis labels, a title and a note under the plot, filled cells (binned
densities), bars and stacked steps, polygons, lines, scatter markers (one
``<path>`` per group, so thousands of points stay light), a legend and a
colour bar. No plotting library is imported: drawing all the report's
figures this way takes under a tenth of a second, where matplotlib's import
and drawing cost about a second and a quarter per report (the fixed cost this module
removed; DEVELOPERS.md, "The report").

Coordinates: a :class:`Plot` maps data values to pixels of its plot area
through two :class:`Scale` objects; everything else (text, legend) is placed
in pixels. Every ``id`` in the output starts with the plot's ``key``, because
several figures share one HTML document and so one id namespace.

>>> p = Plot("demo", xscale=Scale(0, 10), yscale=Scale(0, 1), width=300, height=200)
>>> p.axes(xlabel="x (m)", ylabel="y (s)", title="t")
>>> import xml.etree.ElementTree as ET
>>> ET.fromstring(p.svg()).tag
'{http://www.w3.org/2000/svg}svg'
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field
from html import escape

import numpy as np

__all__ = ["nice_step", "nice_ticks", "log_ticks", "number", "Scale", "Plot", "ramp_colour", "text_px", "MARKER_PATHS"]

FONT_PX = 12                  # body text of a figure
SMALL_PX = 10.5               # ticks, legend, notes
CHAR_EM = 0.56                # mean advance of a sans-serif character in em (for layout only)
INK, MUTED, GRID = "#1a1a1a", "#555555", "#e3e6ea"


def nice_step(span: float, target: int = 6) -> float:
    """A tick step of 1, 2 or 5 times a power of ten giving about ``target`` ticks over ``span``.

    Heckbert's "nice numbers" (P. S. Heckbert, Nice Numbers for Graph Labels,
    in Graphics Gems, A. S. Glassner ed., Academic Press 1990, p. 61-63):
    the raw step is rounded to the nearest of 1, 2, 5, 10 of its decade.

    >>> nice_step(3.6), nice_step(3.6, target=8), nice_step(2500), nice_step(0.9)
    (1.0, 0.5, 500.0, 0.2)
    """
    if not span > 0 or not math.isfinite(span):
        return 1.0
    raw = span / max(target - 1, 1)
    decade = 10.0 ** math.floor(math.log10(raw))
    fraction = raw / decade
    # Heckbert's rounding: below 1.5 -> 1, below 3 -> 2, below 7 -> 5, else 10
    nice = 1.0 if fraction < 1.5 else 2.0 if fraction < 3.0 else 5.0 if fraction < 7.0 else 10.0
    return nice * decade


def nice_ticks(lo: float, hi: float, target: int = 6) -> list[float]:
    """Ticks at multiples of :func:`nice_step` inside [lo, hi].

    >>> nice_ticks(0.0, 3.6, target=8)
    [0.0, 0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5]
    >>> nice_ticks(1.5, 4.0)
    [1.5, 2.0, 2.5, 3.0, 3.5, 4.0]
    """
    step = nice_step(hi - lo, target)
    first = math.ceil(lo / step - 1e-9)
    ticks = []
    k = first
    while k * step <= hi + step * 1e-9:
        ticks.append(round(k * step, 12))
        k += 1
    return ticks


def log_ticks(lo: float, hi: float) -> list[float]:
    """Ticks 1, 3 (and, over at most two decades, 2 and 5) times powers of ten inside [lo, hi] (values, not logs).

    >>> log_ticks(100, 100000)
    [100.0, 300.0, 1000.0, 3000.0, 10000.0, 30000.0, 100000.0]
    """
    decades = math.log10(hi) - math.log10(lo)
    mantissas = (1, 2, 5) if decades <= 2 else (1, 3)
    out = []
    for e in range(math.floor(math.log10(lo)), math.ceil(math.log10(hi)) + 1):
        for m in mantissas:
            v = float(m * 10.0 ** e)
            if lo * (1 - 1e-9) <= v <= hi * (1 + 1e-9):
                out.append(v)
    return out


def number(v: float) -> str:
    """A tick label: thousands separated, no trailing zeros.

    >>> number(30000.0), number(2.5), number(-0.0), number(1e-13)
    ('30,000', '2.5', '0', '0')
    """
    if abs(v) < 1e-12:
        return "0"
    if abs(v) >= 1000:
        return f"{v:,.0f}"
    return f"{v:.6g}"


@dataclass
class Scale:
    """Data interval [lo, hi] (``log=True``: positive values, drawn on log10) mapped to pixels [p0, p1]."""

    lo: float
    hi: float
    log: bool = False
    p0: float = 0.0
    p1: float = 1.0
    target: int = 6


    def _t(self, v):
        return np.log10(v) if self.log else np.asarray(v, dtype=float)

    def __call__(self, v):
        a, b = self._t(self.lo), self._t(self.hi)
        with np.errstate(divide="ignore", invalid="ignore"):
            return self.p0 + (self._t(v) - a) * ((self.p1 - self.p0) / (b - a))

    def ticks(self) -> list[float]:
        return log_ticks(self.lo, self.hi) if self.log else nice_ticks(self.lo, self.hi, self.target)


def _hex(c: str) -> np.ndarray:
    return np.array([int(c[i:i + 2], 16) for i in (1, 3, 5)], dtype=float)


def ramp_colour(stops: tuple[str, ...], t: float) -> str:
    """The colour at ``t`` in [0, 1] along a ramp of hex colours (linear in sRGB between stops).

    >>> ramp_colour(("#000000", "#ffffff"), 0.5)
    '#808080'
    """
    t = min(max(float(t), 0.0), 1.0) * (len(stops) - 1)
    i = min(int(t), len(stops) - 2)
    rgb = _hex(stops[i]) + (t - i) * (_hex(stops[i + 1]) - _hex(stops[i]))
    return "#" + "".join(f"{int(round(c)):02x}" for c in rgb)


def _f(v: float) -> str:
    return f"{v:.1f}".rstrip("0").rstrip(".")


#: marker shape -> path of one marker centred at the current point, radius r (relative commands after a move)
MARKER_PATHS = {
    "circle": lambda r: f"m{-r:.1f},0a{r:.1f},{r:.1f} 0 1,0 {2 * r:.1f},0a{r:.1f},{r:.1f} 0 1,0 {-2 * r:.1f},0z",
    "square": lambda r: f"m{-r * .85:.1f},{-r * .85:.1f}h{r * 1.7:.1f}v{r * 1.7:.1f}h{-r * 1.7:.1f}z",
    "diamond": lambda r: f"m0,{-r * 1.2:.1f}l{r:.1f},{r * 1.2:.1f}l{-r:.1f},{r * 1.2:.1f}l{-r:.1f},{-r * 1.2:.1f}z",
    "triangle": lambda r: f"m0,{-r * 1.15:.1f}l{r * 1.1:.1f},{r * 1.9:.1f}h{-r * 2.2:.1f}z",
    "triangle_down": lambda r: f"m0,{r * 1.15:.1f}l{r * 1.1:.1f},{-r * 1.9:.1f}h{-r * 2.2:.1f}z",
    "plus": lambda r: (f"m{-r * .35:.1f},{-r:.1f}h{r * .7:.1f}v{r * .65:.1f}h{r * .65:.1f}v{r * .7:.1f}h{-r * .65:.1f}"
                       f"v{r * .65:.1f}h{-r * .7:.1f}v{-r * .65:.1f}h{-r * .65:.1f}v{-r * .7:.1f}h{r * .65:.1f}z"),
    "star": lambda r: "m" + "l".join(
        f"{dx:.1f},{dy:.1f}" for dx, dy in _star_steps(r * 1.3)) + "z",
    "cross": lambda r: (f"m{-r * .8:.1f},{-r * .8:.1f}l{r * 1.6:.1f},{r * 1.6:.1f}m0,{-r * 1.6:.1f}"
                        f"l{-r * 1.6:.1f},{r * 1.6:.1f}"),
}


def _star_steps(r: float):
    pts = [((r if k % 2 == 0 else r * 0.45) * math.sin(k * math.pi / 5),
            -(r if k % 2 == 0 else r * 0.45) * math.cos(k * math.pi / 5)) for k in range(10)]
    steps = [pts[0]] + [(b[0] - a[0], b[1] - a[1]) for a, b in zip(pts, pts[1:])]
    return steps


@dataclass
class Plot:
    """One figure: a plot area with two scales, margins for labels and a legend column at the right.

    Parameters
    ----------
    key : str
        Prefix of every id in the figure (unique on the page).
    xscale, yscale : Scale
        Data ranges of the axes; their pixel ranges are set here from the layout.
    width, height : int
        Size of the whole figure in CSS pixels (it scales with the page: ``viewBox``).
    legend_px : int
        Width of the legend column at the right (0: none).
    """

    key: str
    xscale: Scale
    yscale: Scale
    width: int = 760
    height: int = 480
    legend_px: int = 0
    left: int = 78
    top: int = 44
    bottom: int = 78
    parts: list[str] = field(default_factory=list)
    defs: list[str] = field(default_factory=list)
    legend_rows: list[tuple[str, str]] = field(default_factory=list)
    legend_title: str = ""

    def __post_init__(self):
        self.x0, self.x1 = self.left, self.width - self.legend_px - 16
        self.y0, self.y1 = self.height - self.bottom, self.top   # y grows downwards in SVG
        self.xscale.p0, self.xscale.p1 = self.x0, self.x1
        self.yscale.p0, self.yscale.p1 = self.y0, self.y1
        self.defs.append(f'<clipPath id="{self.key}-area"><rect x="{self.x0}" y="{self.y1}" width="{self.x1 - self.x0}"'
                         f' height="{self.y0 - self.y1}"/></clipPath>')

    # ---------------------------------------------------------------- data marks (clipped to the plot area)
    def _clipped(self, text: str) -> None:
        self.parts.append(f'<g clip-path="url(#{self.key}-area)">{text}</g>')

    def cells(self, x_lo, x_hi, y_lo, y_hi, colours, opacity: float = 1.0) -> None:
        """Filled rectangles, one per cell, between data edges (arrays of equal length)."""
        xa, xb = self.xscale(np.asarray(x_lo)), self.xscale(np.asarray(x_hi))
        ya, yb = self.yscale(np.asarray(y_lo)), self.yscale(np.asarray(y_hi))
        rects = "".join(
            f'<rect x="{_f(min(a, b))}" y="{_f(min(c, d))}" width="{_f(abs(b - a) + .3)}" height="{_f(abs(d - c) + .3)}"'
            f' fill="{col}"/>' for a, b, c, d, col in zip(xa, xb, ya, yb, colours))
        self._clipped(f'<g opacity="{opacity}" shape-rendering="crispEdges">{rects}</g>')

    def polygon(self, xs, ys, fill: str, stroke: str = "none", width: float = 1.0, extra: str = "") -> None:
        """A closed polygon through data points."""
        px, py = self.xscale(np.asarray(xs, float)), self.yscale(np.asarray(ys, float))
        d = "M" + "L".join(f"{_f(a)},{_f(b)}" for a, b in zip(px, py)) + "Z"
        self._clipped(f'<path d="{d}" fill="{fill}" stroke="{stroke}" stroke-width="{width}"{extra}/>')

    def line(self, xs, ys, colour: str = MUTED, width: float = 1.0, dash: str | None = None) -> None:
        px, py = self.xscale(np.asarray(xs, float)), self.yscale(np.asarray(ys, float))
        d = "M" + "L".join(f"{_f(a)},{_f(b)}" for a, b in zip(px, py))
        dash_attr = f' stroke-dasharray="{dash}"' if dash else ""
        self._clipped(f'<path d="{d}" fill="none" stroke="{colour}" stroke-width="{width}"{dash_attr}/>')

    def vline(self, x: float, label: str = "", colour: str = MUTED, row: int = 0) -> None:
        """A dashed vertical line at data ``x`` with a label at the top of the plot area (``row``: how many
        lines below the top, for labels of close lines)."""
        px = float(self.xscale(x))
        if not self.x0 <= px <= self.x1:
            return
        self.parts.append(f'<line x1="{_f(px)}" x2="{_f(px)}" y1="{self.y1}" y2="{self.y0}" stroke="{colour}"'
                          f' stroke-width="1" stroke-dasharray="5 3"/>')
        if label:
            self.text(px + 3, self.y1 + 12 + 13 * row, label, size=SMALL_PX)

    def scatter(self, xs, ys, colour: str, shape: str = "circle", r: float = 3.4, label: str | None = None) -> int:
        """Markers of one group as one path; returns how many were drawn (finite, inside the axes)."""
        px, py = self.xscale(np.asarray(xs, float)), self.yscale(np.asarray(ys, float))
        ok = np.isfinite(px) & np.isfinite(py) & (px >= self.x0) & (px <= self.x1) & (py <= self.y0) & (py >= self.y1)
        if not ok.any():
            return 0
        one = MARKER_PATHS[shape](r)
        d = "".join(f"M{_f(a)},{_f(b)}{one}" for a, b in zip(px[ok], py[ok]))
        if shape == "cross":
            paint = f'fill="none" stroke="{colour}" stroke-width="1.6"'
        else:
            paint = f'fill="{colour}" fill-opacity="0.9" stroke="#ffffff" stroke-width="0.6"'
        self.parts.append(f'<path d="{d}" {paint}/>')
        if label is not None:
            self.legend_rows.append((label, f'<path d="M0,0{one}" {paint}/>'))
        return int(ok.sum())

    def hatch(self, name: str, pattern: str, colour: str) -> str:
        """A fill of the colour with a hatch pattern (``//``, ``..``, ``xx``) over it; returns the fill attribute."""
        pid = f"{self.key}-{name}"
        marks = {"//": '<path d="M-1,1l2,-2M0,6l6,-6M5,7l2,-2" stroke="#ffffff" stroke-width="1.2"/>',
                 "..": '<circle cx="3" cy="3" r="1.1" fill="#ffffff"/>',
                 "xx": '<path d="M0,0l6,6M6,0l-6,6" stroke="#ffffff" stroke-width="1"/>'}.get(pattern, "")
        self.defs.append(f'<pattern id="{pid}" width="6" height="6" patternUnits="userSpaceOnUse">'
                         f'<rect width="6" height="6" fill="{colour}"/>{marks}</pattern>')
        return f"url(#{pid})"

    def legend_entry(self, label: str, fill: str) -> None:
        """A legend row with a filled swatch."""
        self.legend_rows.append((label, f'<rect x="-6" y="-6" width="12" height="12" fill="{fill}" stroke="#ffffff"/>'))

    # ---------------------------------------------------------------- text and frame (pixels)
    def text(self, x: float, y: float, s: str, size: float = FONT_PX, anchor: str = "start", colour: str = INK,
             rotate: float = 0.0, extra: str = "") -> None:
        rot = f' transform="rotate({rotate:g} {_f(x)} {_f(y)})"' if rotate else ""
        self.parts.append(f'<text x="{_f(x)}" y="{_f(y)}" font-size="{size:g}" text-anchor="{anchor}"'
                          f' fill="{colour}"{rot}{extra}>{escape(s)}</text>')

    def data_text(self, x: float, y: float, s: str, **kw) -> None:
        """Text at a data position."""
        self.text(float(self.xscale(x)), float(self.yscale(y)), s, **kw)

    def axes(self, xlabel: str, ylabel: str, title: str, note: str = "", xticks=None, yticks=None,
             xtick_labels=None, ytick_labels=None, grid: bool = True) -> None:
        """Frame, ticks, tick labels, axis labels, title and a note under the x label."""
        out = [f'<rect x="{self.x0}" y="{self.y1}" width="{self.x1 - self.x0}" height="{self.y0 - self.y1}" fill="none"'
               f' stroke="{MUTED}" stroke-width="1"/>']
        grid_lines = []
        xt = self.xscale.ticks() if xticks is None else list(xticks)
        yt = self.yscale.ticks() if yticks is None else list(yticks)
        for i, v in enumerate(xt):
            px = float(self.xscale(v))
            lab = number(v) if xtick_labels is None else xtick_labels[i]
            out.append(f'<line x1="{_f(px)}" x2="{_f(px)}" y1="{self.y0}" y2="{self.y0 + 5}" stroke="{MUTED}"/>'
                       f'<text x="{_f(px)}" y="{self.y0 + 18}" font-size="{SMALL_PX}" text-anchor="middle"'
                       f' fill="{INK}">{escape(lab)}</text>')
        for i, v in enumerate(yt):
            py = float(self.yscale(v))
            lab = number(v) if ytick_labels is None else ytick_labels[i]
            if grid:
                grid_lines.append(f'<line x1="{self.x0}" x2="{self.x1}" y1="{_f(py)}" y2="{_f(py)}" stroke="{GRID}"'
                                  ' stroke-width="0.8"/>')
            out.append(f'<line x1="{self.x0 - 5}" x2="{self.x0}" y1="{_f(py)}" y2="{_f(py)}" stroke="{MUTED}"/>'
                       f'<text x="{self.x0 - 8}" y="{_f(py + 3.5)}" font-size="{SMALL_PX}" text-anchor="end"'
                       f' fill="{INK}">{escape(lab)}</text>')
        # the grid goes under the marks; the frame, ticks and labels over them
        self.parts.insert(0, "".join(grid_lines))
        self.parts.append("".join(out))
        mid_x, mid_y = (self.x0 + self.x1) / 2, (self.y0 + self.y1) / 2
        self.text(mid_x, self.y0 + 38, xlabel, anchor="middle", extra=' class="axis-label"')
        self.text(18, mid_y, ylabel, anchor="middle", rotate=-90, extra=' class="axis-label"')
        self.text(self.x0, 22, title, size=FONT_PX + 3, extra=' font-weight="bold" class="title"')
        if note:
            self.text(self.x0, self.y0 + 58, note, size=SMALL_PX, colour=MUTED)

    def top_axis(self, ticks, labels, label: str) -> None:
        """A second x axis along the top (the same positions in other units)."""
        for v, lab in zip(ticks, labels):
            px = float(self.xscale(v))
            self.parts.append(f'<line x1="{_f(px)}" x2="{_f(px)}" y1="{self.y1 - 4}" y2="{self.y1}" stroke="{MUTED}"/>')
            self.text(px, self.y1 - 7, lab, size=SMALL_PX, anchor="middle")
        self.text(self.x1, self.y1 - 24, label, size=SMALL_PX, anchor="end", colour=MUTED, extra=' class="axis-label-top"')

    def colour_bar(self, stops: tuple[str, ...], lo: float, hi: float, label: str, x: float, y: float,
                   length: float = 150) -> None:
        """A vertical colour bar of a log10 ramp from ``lo`` to ``hi`` (counts), at pixel (x, y) top-left."""
        n = 24
        seg = "".join(f'<rect x="{_f(x)}" y="{_f(y + length * (1 - (k + 1) / n))}" width="10" height="{_f(length / n + .4)}"'
                      f' fill="{ramp_colour(stops, (k + .5) / n)}"/>' for k in range(n))
        self.parts.append(f'<g shape-rendering="crispEdges">{seg}</g><rect x="{_f(x)}" y="{_f(y)}" width="10"'
                          f' height="{_f(length)}" fill="none" stroke="{MUTED}" stroke-width="0.6"/>')
        span = math.log10(hi) - math.log10(lo) if hi > lo else 1.0
        for v in log_ticks(lo, hi) or [lo]:
            py = y + length * (1 - (math.log10(v) - math.log10(lo)) / span)
            self.text(x + 14, py + 3.5, number(v), size=SMALL_PX - 1)
        self.text(x + 10, y - 8, label, size=SMALL_PX - 1, colour=MUTED, anchor="end")  # leftwards: the legend is right

    def _legend(self) -> str:
        if not self.legend_rows or not self.legend_px:
            return ""
        x = self.x1 + 24
        y = self.y1 + 4
        out = []
        if self.legend_title:
            out.append(f'<text x="{x - 6}" y="{y}" font-size="{SMALL_PX}" font-weight="bold" fill="{INK}">'
                       f'{escape(self.legend_title)}</text>')
            y += 18
        for label, swatch in self.legend_rows:
            out.append(f'<g transform="translate({x},{y})">{swatch}</g><text x="{x + 12}" y="{y + 4}"'
                       f' font-size="{SMALL_PX}" fill="{INK}">{escape(label)}</text>')
            y += 18
        return f'<g class="legend">{"".join(out)}</g>'

    def svg(self, title: str = "") -> str:
        """The figure as one ``<svg>`` element (text stays text: searchable, selectable, printable)."""
        head = (f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {self.width} {self.height}" width="{self.width}"'
                f' height="{self.height}" role="img" font-family="system-ui, \'DejaVu Sans\', Arial, sans-serif">')
        desc = f"<title>{escape(title)}</title>" if title else ""
        return (f'{head}{desc}<defs>{"".join(self.defs)}</defs><rect width="100%" height="100%" fill="#ffffff"/>'
                f'{"".join(self.parts)}{self._legend()}</svg>')


def text_px(s: str, size: float = SMALL_PX) -> float:
    """An estimate of the width of ``s`` in pixels (layout of legends)."""
    return len(s) * size * CHAR_EM
