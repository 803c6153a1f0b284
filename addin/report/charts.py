"""Native spreadsheet charts (openpyxl) for the report, drawn from cells already on a sheet.

* :func:`rheogram` — shear stress against shear rate on log–log axes: viscometer readings as
  markers only, each fitted model as a smooth line without markers.
* :func:`pressure_breakdown` — horizontal bars, one per part of the circulating system.
* :func:`depth_profile` — equivalent densities (ESD, ECD, pore, fracture) against true vertical
  depth, depth increasing downward.
* :func:`rate_curves` — quantities against flow rate (the operating-window sweep), with the
  window ends as vertical marker lines.
* :func:`operating_curve` — a slurry line's frictional gradient against velocity, with the
  carrier alone, the deposition velocity as a vertical line and the curve's minimum marked.
* :func:`nice_axis` — axis limits on round steps around the values a chart shows.

Each builder takes column ranges as ``(sheet, col, first_row, last_row)`` tuples so the chart
always refers to what the table shows.
"""

from __future__ import annotations

import numpy as np
from openpyxl.chart import BarChart, Reference, ScatterChart, Series
from openpyxl.chart.layout import Layout, ManualLayout
from openpyxl.chart.shapes import GraphicalProperties
from openpyxl.chart.text import RichText, Text
from openpyxl.chart.title import Title
from openpyxl.drawing.line import LineProperties
from openpyxl.drawing.text import (
    CharacterProperties,
    Paragraph,
    ParagraphProperties,
    RegularTextRun,
)

from addin.xlsx_cells import PALETTE

__all__ = [
    "depth_profile",
    "nice_axis",
    "operating_curve",
    "pressure_breakdown",
    "rate_curves",
    "rheogram",
    "temperature_profile",
]

_SERIES_COLOURS = ("1F5FA8", "C08A2B", "2E7D4F", "8E44AD", "B03A2E", "17808A", "6B7785")


def nice_axis(lo: float, hi: float, ticks: int = 8) -> tuple[float, float, float]:
    """Axis limits on round steps (1, 2, 2.5 or 5 × 10^k) around [lo, hi].

    >>> nice_axis(8.6, 15.2)
    (8.0, 16.0, 1.0)
    """
    raw = max(hi - lo, 1e-9) / ticks
    mag = 10.0 ** np.floor(np.log10(raw))
    step = float(next(m * mag for m in (1.0, 2.0, 2.5, 5.0, 10.0) if m * mag >= raw))
    return float(np.floor(lo / step) * step), float(np.ceil(hi / step) * step), step


def _ref(ws, col, r0, r1):
    return Reference(ws, min_col=col, min_row=r0, max_row=r1)


def _axis_common(axis, title: str):
    axis.title = title
    axis.delete = False
    axis.majorTickMark = "out"
    axis.minorTickMark = "none"


def _line(series, colour, *, width=19050, dash=None, marker=None, smooth=False):
    series.graphicalProperties = GraphicalProperties(ln=LineProperties(solidFill=colour, w=width))
    if dash:
        series.graphicalProperties.line.dashStyle = dash
    series.smooth = smooth
    if marker is None:
        series.marker.symbol = "none"
    else:
        series.marker.symbol = marker
        series.marker.size = 7
        series.marker.graphicalProperties = GraphicalProperties(solidFill=colour)
        series.marker.graphicalProperties.line.solidFill = colour


def _points_only(series, colour, marker="circle"):
    series.marker.symbol = marker
    series.marker.size = 8
    series.marker.graphicalProperties = GraphicalProperties(solidFill=colour)
    series.marker.graphicalProperties.line.solidFill = colour
    series.graphicalProperties = GraphicalProperties()
    series.graphicalProperties.line.noFill = True
    series.smooth = False


def rheogram(
    readings: list[tuple[str, tuple]],
    models: list[tuple[str, tuple]],
    shear_rate_cols: dict,
    *,
    stress_unit: str,
    title: str = "Rheogram",
) -> ScatterChart:
    """Log–log rheogram.

    readings
        ``[(label, (ws, stress_col, r0, r1)), ...]`` — measured stresses (markers only).
    models
        ``[(label, (ws, stress_col, r0, r1)), ...]`` — model curves (lines only).
    shear_rate_cols
        ``{"readings": (ws, col, r0, r1), "models": (ws, col, r0, r1)}`` — x values; one range
        per kind (each readings/model range must have the same rows as its x range).
    """
    ch = ScatterChart()
    ch.title = title
    ch.style = 2
    ch.height, ch.width = 9.5, 16.0
    _axis_common(ch.x_axis, "shear rate [1/s]")
    _axis_common(ch.y_axis, f"shear stress [{stress_unit}]")
    ch.x_axis.scaling.logBase = 10
    ch.y_axis.scaling.logBase = 10
    ch.x_axis.scaling.min = 1
    ch.x_axis.scaling.max = 2000
    ch.y_axis.scaling.min = 1
    ch.legend.position = "b"
    k = 0
    xr = shear_rate_cols["models"]
    for name, (ws, col, r0, r1) in models:
        s = Series(_ref(ws, col, r0, r1), _ref(*xr), title=name)
        _line(s, _SERIES_COLOURS[k % len(_SERIES_COLOURS)], smooth=True)
        ch.series.append(s)
        k += 1
    xr = shear_rate_cols["readings"]
    markers = ("circle", "diamond", "triangle", "square")
    for j, (name, (ws, col, r0, r1)) in enumerate(readings):
        s = Series(_ref(ws, col, r0, r1), _ref(*xr), title=name)
        _points_only(s, ("000000", PALETTE["bad"], PALETTE["muted"])[j % 3], markers[j % 4])
        ch.series.append(s)
    return ch


def pressure_breakdown(
    categories: tuple, values: tuple, *, pressure_unit: str, title="Where the pump pressure goes"
) -> BarChart:
    """Horizontal bars of the pressure losses, top to bottom in circulation order."""
    ch = BarChart()
    ch.type = "bar"
    ch.style = 2
    ch.title = title
    ch.height, ch.width = 7.5, 16.0
    ch.grouping = "clustered"
    ch.varyColors = False
    data = _ref(*values)
    ch.add_data(data, titles_from_data=False)
    ch.set_categories(_ref(*categories))
    _axis_common(ch.y_axis, f"pressure loss [{pressure_unit}]")
    _axis_common(ch.x_axis, "")
    ch.x_axis.title = None
    ch.x_axis.scaling.orientation = "maxMin"  # first part of the loop at the top
    ch.legend = None
    s = ch.series[0]
    s.graphicalProperties = GraphicalProperties(solidFill=PALETTE["slate"])
    s.graphicalProperties.line.solidFill = PALETTE["slate"]
    ch.gapWidth = 60
    return ch


def depth_profile(
    depth: tuple,
    curves: list[tuple[str, tuple, str]],
    *,
    density_unit: str,
    depth_unit: str,
    title="Equivalent density against depth",
    x_limits: tuple[float, float] | None = None,
    y_max: float | None = None,
) -> ScatterChart:
    """EMW curves against TVD, depth increasing downward.

    curves
        ``[(label, (ws, col, r0, r1), role), ...]`` with role one of ``"ecd"``,
        ``"ecd_loaded"`` (with the cuttings load), ``"esd"``,
        ``"pore"``, ``"fracture"``, ``"point"`` (markers only, e.g. a downhole gauge reading).
        ``depth`` is the shared TVD range, unless a curve's range is a 2-tuple
        ``(y_range, x_range)`` of its own.
    """
    style = {
        "ecd": dict(colour=PALETTE["check"], width=28575),
        "ecd_loaded": dict(colour=PALETTE["warn"], width=19050, dash="dash"),
        "esd": dict(colour=PALETTE["ok"], width=19050),
        "pore": dict(colour="7A4F9A", width=19050, dash="dash"),
        "fracture": dict(colour=PALETTE["bad"], width=19050, dash="dash"),
    }
    ch = ScatterChart()
    ch.title = title
    ch.style = 2
    ch.height, ch.width = 14.0, 15.0
    _axis_common(ch.x_axis, f"equivalent density [{density_unit}]")
    _axis_common(ch.y_axis, f"true vertical depth [{depth_unit}]")
    ch.y_axis.scaling.orientation = "maxMin"
    ch.y_axis.scaling.min = 0
    if y_max is not None:
        ch.y_axis.scaling.max = y_max
    if x_limits is not None:
        ch.x_axis.scaling.min, ch.x_axis.scaling.max = x_limits
    ch.legend.position = "b"
    for name, rng, role in curves:
        if len(rng) == 2:
            yr, xr = rng
        else:
            yr, xr = depth, rng
        s = Series(_ref(*yr), _ref(*xr), title=name)  # values: TVD (y); xvalues: density
        if role == "point":
            _points_only(s, PALETTE["warn"], "diamond")
        else:
            st = style[role]
            _line(s, st["colour"], width=st["width"], dash=st.get("dash"))
        ch.series.append(s)
    ch.layout = Layout(manualLayout=ManualLayout(x=0.02, y=0.08, w=0.96, h=0.72))
    return ch


def rate_curves(
    rate: tuple,
    curves: list[tuple[str, tuple, str]],
    *,
    rate_unit: str,
    y_title: str,
    title: str,
    y_limits: tuple[float, float, float] | None = None,
    x_limits: tuple[float, float, float] | None = None,
    markers: list[tuple[str, tuple, tuple]] = (),
    x_title: str | None = None,
) -> ScatterChart:
    """Curves against flow rate (x) for the operating-window sheet (or against another x
    quantity titled ``x_title``, e.g. the pumped volume of the cement-job sheet).

    curves
        ``[(label, (ws, col, r0, r1), role), ...]``; role ``"value"`` (solid), ``"limit"``
        (dashed) or ``"value2"`` / ``"limit2"`` (a second colour pair).
    markers
        ``[(label, x_range, y_range), ...]`` — two-point vertical lines (the window ends).
    x_limits, y_limits
        ``(min, max, major unit)`` of the rate and value axes.
    """
    style = {
        "value": dict(colour=PALETTE["check"], width=28575),
        "limit": dict(colour=PALETTE["bad"], width=19050, dash="dash"),
        "value2": dict(colour=PALETTE["ochre"], width=28575),
        "limit2": dict(colour="7A4F9A", width=19050, dash="dash"),
    }
    ch = ScatterChart()
    ch.title = _small_title(title)
    ch.style = 2
    ch.height, ch.width = 11.5, 9.2
    _axis_common(ch.x_axis, x_title or f"flow rate [{rate_unit}]")
    _axis_common(ch.y_axis, y_title)
    if x_limits is not None:
        ch.x_axis.scaling.min, ch.x_axis.scaling.max, ch.x_axis.majorUnit = x_limits
    if y_limits is not None:
        ch.y_axis.scaling.min, ch.y_axis.scaling.max, ch.y_axis.majorUnit = y_limits
        ch.y_axis.number_format = "#,##0" if y_limits[2] >= 1 else "0.0#"
    ch.x_axis.number_format = "#,##0"
    ch.x_axis.crosses = "min"  # rate labels under the plot, also when the values go negative
    ch.legend.position = "b"
    for name, rng, role in curves:
        s = Series(_ref(*rng), _ref(*rate), title=name)
        st = style[role]
        _line(s, st["colour"], width=st["width"], dash=st.get("dash"))
        ch.series.append(s)
    for name, xr, yr in markers:
        s = Series(_ref(*yr), _ref(*xr), title=name)
        _line(s, PALETTE["ink"], width=12700, dash="sysDash")
        ch.series.append(s)
    return ch


def operating_curve(
    velocity: tuple,
    slurry: tuple,
    carrier: tuple,
    *,
    markers: list[tuple[str, tuple, tuple]],
    points: tuple[str, tuple, tuple] | None = None,
    velocity_unit: str,
    gradient_unit: str,
    title: str,
    x_limits: tuple[float, float, float] | None = None,
    y_limits: tuple[float, float, float] | None = None,
) -> ScatterChart:
    """Gradient against velocity: the slurry (solid), the carrier alone (dashed), ``markers``
    (two-point vertical lines: the deposition velocity, the minimum) and the operating
    ``points`` as markers only; ranges are ``(ws, col, r0, r1)``."""
    ch = ScatterChart()
    ch.title = _small_title(title)
    ch.style = 2
    ch.height, ch.width = 11.5, 17.0
    _axis_common(ch.x_axis, f"mean velocity [{velocity_unit}]")
    _axis_common(ch.y_axis, f"frictional gradient [{gradient_unit}]")
    if x_limits is not None:
        ch.x_axis.scaling.min, ch.x_axis.scaling.max, ch.x_axis.majorUnit = x_limits
    if y_limits is not None:
        ch.y_axis.scaling.min, ch.y_axis.scaling.max, ch.y_axis.majorUnit = y_limits
    ch.x_axis.number_format = "#,##0.##"
    ch.y_axis.number_format = "#,##0.###"
    ch.x_axis.crosses = "min"
    ch.legend.position = "b"
    s = Series(_ref(*slurry), _ref(*velocity), title="slurry")
    _line(s, PALETTE["check"], width=28575)
    ch.series.append(s)
    s = Series(_ref(*carrier), _ref(*velocity), title="carrier alone")
    _line(s, PALETTE["ochre"], width=19050, dash="dash")
    ch.series.append(s)
    for (name, xr, yr), colour in zip(markers, (PALETTE["bad"], PALETTE["ink"]), strict=False):
        s = Series(_ref(*yr), _ref(*xr), title=name)
        _line(s, colour, width=15875, dash="sysDash")
        ch.series.append(s)
    if points is not None:
        name, xr, yr = points
        s = Series(_ref(*yr), _ref(*xr), title=name)
        _points_only(s, _SERIES_COLOURS[2], marker="diamond")
        ch.series.append(s)
    return ch


def _small_title(text: str, size_pt: float = 10.0):
    """A chart title in a modest bold font (the default is large for a one-third-page chart)."""
    cp = CharacterProperties(sz=int(size_pt * 100), b=True)
    para = Paragraph(pPr=ParagraphProperties(defRPr=cp), r=[RegularTextRun(rPr=cp, t=text)])
    return Title(tx=Text(rich=RichText(p=[para])), overlay=False)


def temperature_profile(
    depth: tuple,
    curves: list[tuple[str, tuple, str]],
    *,
    temperature_unit: str,
    depth_unit: str,
    title="Temperature against depth",
    x_limits: tuple[float, float] | None = None,
) -> ScatterChart:
    """Temperature curves against TVD, depth increasing downward.

    curves
        ``[(label, (ws, col, r0, r1), role), ...]`` with role one of ``"static"`` (the
        formation), ``"string"``, ``"annulus"`` (circulating); ``depth`` the shared TVD range.
    """
    style = {
        "static": dict(colour=PALETTE["ok"], width=19050, dash="dash"),
        "string": dict(colour="7A4F9A", width=19050),
        "annulus": dict(colour=PALETTE["check"], width=28575),
    }
    ch = ScatterChart()
    ch.title = title
    ch.style = 2
    ch.height, ch.width = 14.0, 15.0
    _axis_common(ch.x_axis, f"temperature [{temperature_unit}]")
    _axis_common(ch.y_axis, f"true vertical depth [{depth_unit}]")
    ch.y_axis.scaling.orientation = "maxMin"
    ch.y_axis.scaling.min = 0
    if x_limits is not None:
        ch.x_axis.scaling.min, ch.x_axis.scaling.max = x_limits
    ch.legend.position = "b"
    for name, rng, role in curves:
        s = Series(_ref(*depth), _ref(*rng), title=name)  # values: TVD (y); xvalues: T
        st = style[role]
        _line(s, st["colour"], width=st["width"], dash=st.get("dash"))
        ch.series.append(s)
    ch.layout = Layout(manualLayout=ManualLayout(x=0.02, y=0.08, w=0.96, h=0.72))
    return ch
