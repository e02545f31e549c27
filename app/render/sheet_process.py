"""The calculation sheet written by a process of its own, for the desktop program.

    python -m wetline.app.render.sheet_process

The window's File > Export > Calculation sheet starts this module as a child
process (:class:`wetline.app.window.files.PdfJob`) instead of writing the
sheet in a thread beside its event loop. In one process, PySide6 keeps the
GIL through most calls into Qt: a worker thread laying out the sheet's text
(it creates Qt objects, which takes Qt's signal-slot locks) while the event
loop deletes a Qt object (which holds such a lock and asks Python for an
override) waits for the other for ever. That hang was seen about once in a
hundred sheets. A child process shares no lock with the window, and the
window stays free while a long sheet is laid out.

Standard input, in this order:

1. one line, a JSON object: ``path`` (the PDF to write), ``units`` (``"si"``
   or ``"us"``) and ``case`` (a load case's name, or null for every case);
2. the rest: the design as section-file text
   (:func:`wetline.core.section_file.dumps_design`, which reads back exactly
   the same design).

Standard output: one JSON array a line, ``["progress", step, steps, text]``
as the sheet goes on, then ``["ok", path]`` or ``["failed", message]``.

The exit status is 0 (written), 1 (refused or failed: the message says why),
2 (a request this module cannot read) or 3 (cancelled). SIGTERM cancels: the
sheet stops at once, its temporary file is removed
(:mod:`wetline.core.atomic_write`) and nothing is written.
"""

from __future__ import annotations

import json
import signal
import sys
from typing import Any, TextIO

__all__ = ["CANCELLED", "FAILED", "BAD_REQUEST", "Cancelled", "main", "read_request"]

FAILED = 1
BAD_REQUEST = 2
CANCELLED = 3


class Cancelled(BaseException):
    """Raised by SIGTERM: a BaseException, so no ``except Exception`` on the
    way turns a cancel into a failure."""


def _cancel(signum: int, frame: Any) -> None:
    raise Cancelled()


def _say(out: TextIO, *item: object) -> None:
    out.write(json.dumps(list(item)) + "\n")
    out.flush()


def read_request(stream: TextIO) -> tuple[dict[str, Any], str]:
    """``(request, design_text)`` from ``stream`` (see the module notes).

    Raises
    ------
    ValueError
        A first line that is not a JSON object with ``path``, ``units`` and
        ``case``.
    """
    head = json.loads(stream.readline())
    if not isinstance(head, dict) or set(head) != {"path", "units", "case"}:
        raise ValueError("the first line must give path, units and case")
    return head, stream.read()


def main(stdin: TextIO | None = None, stdout: TextIO | None = None) -> int:
    """Write the sheet asked for on ``stdin``; return the exit status."""
    stdin = sys.stdin if stdin is None else stdin
    stdout = sys.stdout if stdout is None else stdout
    signal.signal(signal.SIGTERM, _cancel)
    try:
        try:
            head, text = read_request(stdin)
        except ValueError as exc:
            _say(stdout, "failed", f"the sheet's request cannot be read: {exc}")
            return BAD_REQUEST
        from wetline.app.render.sheet import write_report
        from wetline.core.section_file import loads_design

        try:
            design = loads_design(text, "the design to print")
            write_report(design, head["path"], units=head["units"], case=head["case"],
                         progress=lambda step, steps, what: _say(
                             stdout, "progress", step, steps, what))
        except Exception as exc:  # told to the window, never a traceback
            _say(stdout, "failed", str(exc) or type(exc).__name__)
            return FAILED
        _say(stdout, "ok", head["path"])
        return 0
    except Cancelled:
        return CANCELLED


if __name__ == "__main__":
    sys.exit(main())
