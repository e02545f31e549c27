"""The HTML pieces every part of the calculation sheet is written with
(:mod:`wetline.app.render.sheet`, :mod:`~wetline.app.render.sheet_inputs`,
:mod:`~wetline.app.render.sheet_results`): escaping, the bordered table with
its header repeated on each page, the table of labels and values, and the
sheet's style sheet for :class:`QTextDocument`."""

from __future__ import annotations

import html

from wetline.app.render.style import INK, MUTED, NOT_OK_COLOUR, OK_COLOUR, RULE
from wetline.core.report_tables import cell_text

__all__ = ["escape", "table_html", "kv_html", "SHEET_CSS", "EDGE_PT", "HEAD_FILL",
           "FORMULA_FILL", "SHORT_TABLE"]

EDGE_PT = 7.2
"""Font size of the per-edge table [pt] (no text on the sheet is smaller)."""

HEAD_FILL = "#e9eef3"
"""Background of a table's header row."""
FORMULA_FILL = "#f4f6f8"
"""Background of the method's formulas."""


def escape(text):
    """``text`` as HTML, quotes escaped too."""
    return html.escape(str(text), quote=True)


SHORT_TABLE = 5
"""Rows of a table too short to repeat its header on a new page."""


def table_html(header, rows, *, align=None, cls="t", widths=None, verdict_col=None,
               repeat_header=True, padding=3):
    """An HTML table; numbers right-aligned, the header of a table of more
    than :data:`SHORT_TABLE` rows repeated on each page it runs onto.

    Qt repeats a ``<thead>`` on the next page as soon as any of the table
    (its bottom border) runs over, even with every row on the first page:
    the lone header then lies over the next heading. A short table has no
    header to repeat."""
    n = len(header)
    rows = list(rows)
    repeat_header = repeat_header and len(rows) > SHORT_TABLE
    align = align or (["left"] + ["right"] * (n - 1))
    out = [f'<table class="{cls}" width="100%" cellspacing="0" cellpadding="{padding}" border="1" '
           f'style="border-collapse: collapse; border-color: {RULE};">']
    head = "".join(
        f'<th align="{a}" bgcolor="{HEAD_FILL}"'
        + (f' width="{widths[k]:.2f}%"' if widths else "") + f">{escape(h)}</th>"
        for k, (h, a) in enumerate(zip(header, align, strict=True)))
    out.append(f"<thead><tr>{head}</tr></thead>" if repeat_header else f"<tr>{head}</tr>")
    for row in rows:
        cells = []
        for k, (v, a) in enumerate(zip(row, align, strict=True)):
            text = escape(cell_text(v))
            if verdict_col is not None and k == verdict_col:
                colour = OK_COLOUR if v == "OK" else NOT_OK_COLOUR
                text = f'<b><span style="color: {colour};">{text}</span></b>'
            cells.append(f'<td align="{a}">{text}</td>')
        out.append("<tr>" + "".join(cells) + "</tr>")
    out.append("</table>")
    return "".join(out)


def kv_html(rows):
    """A two-column table of labels and values (no borders)."""
    out = ['<table class="kv" width="100%" cellspacing="0" cellpadding="2">']
    for label, value in rows:
        out.append(f'<tr><td width="27%" style="color: {MUTED};">{escape(label)}</td>'
                   f"<td>{value}</td></tr>")
    out.append("</table>")
    return "".join(out)


SHEET_CSS = f"""
body {{ color: {INK}; }}
h1 {{ font-size: 15pt; font-weight: bold; margin-top: 0px; margin-bottom: 2px; }}
h2 {{ font-size: 11pt; font-weight: bold; margin-top: 14px; margin-bottom: 4px;
      color: {INK}; }}
h3 {{ font-size: 9pt; font-weight: bold; margin-top: 9px; margin-bottom: 3px; }}
p {{ margin-top: 2px; margin-bottom: 4px; }}
p.note {{ color: {MUTED}; font-size: 7.5pt; }}
p.f {{ margin-left: 14px; margin-top: 1px; margin-bottom: 1px; }}
p.sub {{ color: {MUTED}; font-size: 9pt; margin-bottom: 6px; }}
table.t {{ font-size: 7.5pt; margin-top: 2px; margin-bottom: 4px; }}
table.e {{ font-size: {EDGE_PT}pt; margin-top: 2px; }}
table.kv {{ font-size: 8.5pt; }}
th {{ font-weight: bold; }}
li {{ margin-bottom: 2px; }}
"""
