"""File > Export and File > Import of the desktop program.

:class:`Transfer` holds what the menu actions do, so the main window only
builds menus. Exports: the PDF calculation sheet of the whole design (every
load case, the structure, flotation and the envelope, as ``wetline report``;
:mod:`wetline.app.render.sheet`, written by a child process with a progress
dialog), the SVG diagram of the active case with its structure (as
``wetline export --case``; :mod:`wetline.app.render.svg`), per-edge results
and the loads-against-level table as CSV (:mod:`wetline.core.report_tables`,
in the display units), and the outline as DXF
(:func:`wetline.core.dxf_io.write_outline`, in the case's length unit).
Imports: an outline from a DXF drawing (:mod:`wetline.core.dxf_io`) and a coordinate list from
a CSV file or the clipboard (:mod:`wetline.core.coordinates`, read in the display
length unit).

Every path is asked for through :mod:`wetline.app.window.dialogs`, every failure is shown
there too, and nothing that fails changes the document. While the outline
being edited is invalid every export refuses and says why (the results are
of the last valid outline: never exported as current). An import starts a
new untitled section (unsaved changes are asked about first; Save asks for
a name) as one undo step, keeping the liquid, the uplift inputs and, where
it still makes sense, the fill; a paste is an edit of the open section.
"""

from __future__ import annotations

import json
import sys
from pathlib import Path

from PySide6.QtCore import QObject, QProcess, QProcessEnvironment, Signal
from PySide6.QtWidgets import QApplication

from wetline.app.model import editing
from wetline.app.window import dialogs
from wetline.core.atomic_write import write_atomically
from wetline.core.coordinates import CoordinateError, format_coordinates, parse_coordinates
from wetline.core.report_tables import edges_table, level_load_table, to_csv
from wetline.core.section import SectionError

__all__ = ["Transfer", "PdfJob", "LEVEL_CSV_STEPS"]

LEVEL_CSV_STEPS = 51
"""Levels in the exported loads-against-level table (as ``wetline table --csv``)."""

DEFAULT_PART = "wall"

SHUTDOWN_WAIT_MS = 5000
"""How long a closing window waits for a cancelled sheet's process to end
before it ends it outright."""


class PdfJob(QObject):
    """Write the calculation sheet of an (immutable) design in a child process.

    The process is :mod:`wetline.app.render.sheet_process`, given the design
    as section-file text (which reads back exactly the same design) on its
    standard input. It runs beside the window's event loop and shares no
    lock with it: a worker thread in the window's own process could hang
    both (see that module's notes).

    Parameters
    ----------
    design : wetline.core.load_cases.Design
        Every case, the structure and the ground: the sheet has the
        load-case table, each case, and the envelope, as ``wetline report``.
    path : str or os.PathLike
    units : str
        ``"si"`` or ``"us"``.
    case : str, optional
        The sheet of this case alone; default every case.

    Signals
    -------
    progressed(step, steps, text)
        From :func:`wetline.app.render.sheet.write_report`'s progress callback.
    done(status, text)
        ``("ok", path)``, ``("failed", message)`` or ``("cancelled", "")``,
        once the process has ended.
    """

    progressed = Signal(int, int, str)
    done = Signal(str, str)

    ARGUMENTS = ("-m", "wetline.app.render.sheet_process")
    """What the process runs, after ``sys.executable``."""

    def __init__(self, design, path, units, parent=None, case=None):
        super().__init__(parent)
        self.design = design
        self.case = case
        self.path = str(path)
        self.units = units
        self._cancel = False
        self._last = None
        self.status = None
        proc = self._proc = QProcess(self)
        proc.setProgram(sys.executable)
        proc.setArguments(list(self.ARGUMENTS))
        env = QProcessEnvironment.systemEnvironment()
        env.insert("QT_QPA_PLATFORM", "offscreen")  # it paints a PDF, never a window
        proc.setProcessEnvironment(env)
        proc.readyReadStandardOutput.connect(self._read)
        proc.finished.connect(self._finished)
        proc.errorOccurred.connect(self._failed_to_start)

    def start(self):
        """Start the process and hand it the design (QProcess keeps what is
        written until the process has started)."""
        from wetline.core.section_file import dumps_design

        request = json.dumps({"path": self.path, "units": self.units, "case": self.case})
        self._proc.start()
        self._proc.write((request + "\n" + dumps_design(self.design)).encode("utf-8"))
        self._proc.closeWriteChannel()

    def process_id(self):
        """The child process's id (0 before it starts and after it ends)."""
        return self._proc.processId()

    def isRunning(self):  # the name QThread has: callers ask a job as they asked a thread
        """True until the process has ended and ``done`` was emitted."""
        return self.status is None and self._proc.state() != QProcess.ProcessState.NotRunning

    def wait(self, msecs=-1):
        """Block until the process ends (``done`` is emitted on the way);
        False if it still runs after ``msecs``."""
        if self._proc.state() == QProcess.ProcessState.NotRunning:
            return True
        return self._proc.waitForFinished(msecs)

    def cancel(self):
        """Stop now: the process is asked to end (SIGTERM) and writes nothing."""
        self._cancel = True
        if self._proc.state() != QProcess.ProcessState.NotRunning:
            if sys.platform == "win32":  # no SIGTERM: a console process only ends
                self._proc.kill()
            else:
                self._proc.terminate()

    def kill(self):
        """End the process outright (a window closing that cannot wait)."""
        self._cancel = True
        self._proc.kill()

    def _read(self):
        while self._proc.canReadLine():
            line = bytes(self._proc.readLine().data()).decode("utf-8", "replace").strip()
            try:
                item = json.loads(line)
            except ValueError:
                continue  # not the protocol's (a library's own print)
            if not isinstance(item, list) or not item:
                continue
            if item[0] == "progress" and len(item) == 4:
                self.progressed.emit(int(item[1]), int(item[2]), str(item[3]))
            elif item[0] in ("ok", "failed") and len(item) == 2:
                self._last = (item[0], str(item[1]))

    def _finished(self, code, exit_status):
        self._read()
        if self._last is not None:
            status = self._last
        elif self._cancel:
            status = ("cancelled", "")
        else:
            err = bytes(self._proc.readAllStandardError().data()).decode("utf-8", "replace")
            lines = [ln for ln in err.strip().splitlines() if ln.strip()]
            why = f": {lines[-1].strip()}" if lines else ""
            status = ("failed", f"the sheet writer stopped unexpectedly (exit code {code}){why}")
        self._emit(status)

    def _failed_to_start(self, error):
        if error == QProcess.ProcessError.FailedToStart:
            self._emit(("failed", f"cannot start the sheet writer ({sys.executable}): "
                                  f"{self._proc.errorString()}"))

    def _emit(self, status):
        if self.status is not None:
            return
        self.status = status
        self.done.emit(*status)


def _base_name(doc):
    if doc.path:
        return Path(doc.path).name.split(".")[0]
    return (doc.section.name.strip() or "section").replace("/", "-")


class Transfer(QObject):
    """The export and import actions of one main window.

    Parameters
    ----------
    window : wetline.app.window.main_window.MainWindow
        Parent of the dialogs; its ``doc`` is read and edited, its status bar
        told what happened, its canvas fitted to an imported outline.
    """

    pdfStarted = Signal(object)
    """A :class:`PdfJob` started (tests wait on its ``done``)."""

    def __init__(self, window):
        super().__init__(window)
        self._window = window
        self.doc = window.doc
        self.pdf_job = None
        self.progress = None
        self.pdf_result = None
        """(status, text) of the last sheet once handled: ("ok", path) ..."""
        self._updating = 0
        self._pending_done = None

    # ----------------------------------------------------------- helpers
    def _status(self, text):
        self._window.statusBar().showMessage(text, 8000)

    def exported(self, path, what):
        """Tell on the status line that ``what`` (``"the diagram"``, ...) of
        the active case went to ``path``: named by its case where the design
        has several, and said not to be the envelope while the window shows
        it (a diagram and per-edge results are of one case)."""
        doc = self.doc
        if len(doc.case_names) == 1 and doc.view_mode != "envelope":
            text = f"Exported {what} to {path}"
        else:
            text = f"Exported {what} of case '{doc.active_name}' to {path}"
            if doc.view_mode == "envelope":
                text += (" (an export of one case, not the envelope shown: the calculation "
                         "sheet has the envelope)")
        self._status(text)

    def _folder(self):
        if self.doc.path:
            return str(Path(self.doc.path).parent)
        last = getattr(self._window, "last_folder", None)
        return last() if last is not None else ""

    def _may_start_new(self):
        """An import starts a new section: ask about unsaved changes first."""
        ask = getattr(self._window, "maybe_save", None)
        return ask() if ask is not None else True

    def _ask(self, title, extension, file_filter):
        suggested = str(Path(self._folder()) / f"{_base_name(self.doc)}{extension}") \
            if self._folder() else f"{_base_name(self.doc)}{extension}"
        return dialogs.ask_export_file(self._window, title, suggested, file_filter, extension)

    def _error(self, title, exc):
        dialogs.show_error(self._window, title, str(exc) or type(exc).__name__)
        return False

    def refuse_stale(self, what):
        """True (after saying why) if the outline being edited is invalid:
        the results are of the last valid outline, and an export would pass
        them off as the section's. Every export asks this first."""
        fault = self.doc.fault()
        if fault is None:
            return False
        dialogs.show_error(
            self._window, f"Cannot export the {what}",
            f"The outline being edited is invalid: {fault[1]}. The results shown are of "
            "the last valid outline. Fix the outline, undo or discard it, then export "
            "again; nothing was written.")
        self._status(f"Not exported: the outline is invalid ({fault[1]})")
        return True

    # ------------------------------------------------------------ exports
    def export_pdf(self):
        if self.refuse_stale("calculation sheet"):
            return None
        path = self._ask("Export calculation sheet", ".pdf", "PDF files (*.pdf)")
        return self.export_pdf_to(path) if path else None

    def export_pdf_to(self, path):
        """Start writing the sheet to ``path``; returns the :class:`PdfJob`
        (None if one is still running)."""
        if self.pdf_job is not None and self.pdf_job.isRunning():
            self._status("A calculation sheet is still being written")
            return None
        if self.refuse_stale("calculation sheet"):
            return None
        self.doc.flush()
        job = PdfJob(self.doc.design, path, self.doc.units.system, self)
        self.progress = dialogs.make_progress(self._window, "Calculation sheet",
                                              f"Writing {Path(path).name} ...", 4)
        self.progress.canceled.connect(self._on_progress_canceled)
        job.progressed.connect(self._on_pdf_progressed)
        job.done.connect(self._on_pdf_done)
        self.pdf_job = job
        self.pdf_result = None
        job.start()
        self.pdfStarted.emit(job)
        return job

    def _on_progress_canceled(self):
        if self.pdf_job is not None and self.pdf_job.isRunning():
            self.pdf_job.cancel()
            if self.progress is not None:
                self.progress.setLabelText("Cancelling ...")

    def _on_pdf_progressed(self, step, steps, text):
        dlg = self.progress
        if dlg is None:
            return
        dlg.setLabelText(f"Writing the calculation sheet: {text} ...")
        dlg.setMaximum(steps)
        # setValue on a modal progress dialog processes events, which may
        # deliver the end of the job right here: that is handled (and the
        # dialog deleted) only once setValue has returned.
        self._updating += 1  # a count: progress may arrive inside setValue too
        try:
            dlg.setValue(step)
        finally:
            self._updating -= 1
        if not self._updating and self._pending_done is not None:
            pending, self._pending_done = self._pending_done, None
            self._on_pdf_done(*pending)

    def _close_progress(self):
        dlg, self.progress = self.progress, None
        if dlg is not None:
            dlg.canceled.disconnect(self._on_progress_canceled)
            dlg.close()
            dlg.deleteLater()

    def _on_pdf_done(self, status, text):
        if self._updating:
            self._pending_done = (status, text)
            return
        self._close_progress()
        self.pdf_result = (status, text)
        if status == "ok":
            self._status(f"Wrote the calculation sheet {text}")
        elif status == "cancelled":
            self._status("Calculation sheet cancelled; nothing written")
        else:
            dialogs.show_error(self._window, "Cannot write the calculation sheet", text)

    def shutdown(self):
        """Stop a running sheet (the window closes)."""
        job = self.pdf_job
        if job is not None and job.isRunning():
            job.cancel()
            if not job.wait(SHUTDOWN_WAIT_MS):
                job.kill()
                job.wait()
        self._close_progress()

    def export_svg(self):
        if self.refuse_stale("diagram"):
            return False
        path = self._ask("Export diagram as SVG", ".svg", "SVG drawings (*.svg)")
        return self.export_svg_to(path) if path else False

    def export_svg_to(self, path):
        from wetline.app.render.svg import export_svg

        if self.refuse_stale("diagram"):
            return False
        try:
            self.doc.flush()
            export_svg(self.doc.design, path, case=self.doc.active_name,
                       units=self.doc.units.system)
        except Exception as exc:
            return self._error("Cannot export the SVG", exc)
        self.exported(path, "the diagram")
        return True

    def export_edges_csv(self):
        if self.refuse_stale("per-edge results"):
            return False
        path = self._ask("Export per-edge results (CSV)", ".csv", "CSV files (*.csv)")
        return self.export_edges_csv_to(path) if path else False

    def export_edges_csv_to(self, path):
        if self.refuse_stale("per-edge results"):
            return False
        try:
            self.doc.flush()
            text = to_csv(edges_table(self.doc.solution, self.doc.units.units,
                                      self.doc.case.length_unit))
            write_atomically(path, text)
        except Exception as exc:
            return self._error("Cannot export the CSV", exc)
        self.exported(path, "per-edge results")
        return True

    def export_level_csv(self):
        if self.refuse_stale("loads against level"):
            return False
        path = self._ask("Export loads against level (CSV)", ".csv", "CSV files (*.csv)")
        return self.export_level_csv_to(path) if path else False

    def export_level_csv_to(self, path, steps=LEVEL_CSV_STEPS):
        if self.refuse_stale("loads against level"):
            return False
        try:
            text = to_csv(level_load_table(self.doc.case, self.doc.units.units, steps))
            write_atomically(path, text)
        except Exception as exc:
            return self._error("Cannot export the CSV", exc)
        self.exported(path, "loads against level")
        return True

    def export_dxf(self):
        if self.refuse_stale("outline"):
            return False
        path = self._ask("Export outline as DXF", ".dxf", "DXF drawings (*.dxf)")
        return self.export_dxf_to(path) if path else False

    def export_dxf_to(self, path):
        from wetline.core.dxf_io import write_outline

        if self.refuse_stale("outline"):
            return False
        case = self.doc.case
        try:
            write_outline(case.section, path, unit=case.length_unit)
        except Exception as exc:
            return self._error("Cannot export the DXF", exc)
        self._status(f"Exported the outline to {path} (in {case.length_unit})")
        return True

    # ------------------------------------------------------------ imports
    def _replace_section(self, section, text, new=False):
        """The outline replaced, as one undo step; ``new``: as a new untitled
        section (an import), else an edit of the open one (a paste)."""
        editing.import_section(self.doc, section, text, new=new)
        fit = getattr(self._window, "canvas", None)
        if fit is not None:
            fit.fit()

    def import_dxf(self):
        if not self._may_start_new():
            return False
        path = dialogs.ask_import_file(self._window, "Import outline from DXF", self._folder(),
                                       "DXF drawings (*.dxf);;All files (*)")
        return self.import_dxf_from(path) if path else False

    def import_dxf_from(self, path):
        """Replace the outline by a closed polyline of the drawing at
        ``path``; asks which one when there are several. One undo step."""
        from wetline.core.dxf_io import list_outlines

        name = Path(path).name
        try:
            outlines = list_outlines(path)
            if outlines[0].unit_assumed:  # the drawing states no units: ask
                unit = dialogs.ask_dxf_unit(self._window, name)
                if unit is None:
                    return False
                outlines = list_outlines(path, unit=unit)
        except Exception as exc:  # DxfError, or a reader fault: keep the work
            return self._error("Cannot import the drawing", exc)
        outline = outlines[0]
        if len(outlines) > 1:
            k = dialogs.ask_dxf_outline(self._window, name, [o.describe() for o in outlines])
            if k is None:
                return False
            outline = outlines[k]
        current = self.doc.section
        kwargs = {"kind": current.kind, "name": Path(path).stem}
        if current.kind == "plane":
            kwargs["width"] = current.width
        try:
            section = outline.to_section(**kwargs)
        except Exception as exc:
            return self._error("Cannot import the drawing", f"{name}: {exc}")
        self._replace_section(section, f"Import outline from {name} (#{outline.index}, "
                                       f"{outline.n_vertices} vertices)", new=True)
        if outline.warnings:
            dialogs.show_warning(self._window, "Imported with assumptions",
                                 f"{name}:\n" + "\n".join(outline.warnings))
        note = "" if outline.parts else "; every edge is a wall: mark the floor, lid and open edges"
        self._status(f"Imported {outline.describe()} from {name}{note}")
        return True

    def import_coordinates(self):
        if not self._may_start_new():
            return False
        path = dialogs.ask_import_file(self._window, "Import coordinate list", self._folder(),
                                       "Coordinate lists (*.csv *.txt *.tsv);;All files (*)")
        return self.import_coordinates_from(path) if path else False

    def import_coordinates_from(self, path):
        try:
            text = Path(path).read_text(encoding="utf-8-sig")
        except UnicodeDecodeError:
            return self._error("Cannot read the coordinates",
                               f"{Path(path).name} is not a UTF-8 text file")
        except OSError as exc:
            return self._error("Cannot read the coordinates",
                               f"{path}: {exc.strerror or exc}")
        return self.paste_coordinates_text(text, source=Path(path).name, new=True)

    def paste_coordinates(self):
        """Edit > Paste coordinates: the clipboard's text as the outline."""
        text = QApplication.clipboard().text()
        if not text.strip():
            dialogs.show_error(self._window, "Paste coordinates",
                               "The clipboard holds no text. Copy the x and z columns of a "
                               "spreadsheet (and an optional part column) first.")
            return False
        return self.paste_coordinates_text(text)

    def paste_coordinates_text(self, text, source="the clipboard", new=False):
        """Replace the outline by a coordinate list (display length unit).
        Parts: from a third column if there is one, else the current parts
        when the vertex count is unchanged, else all walls. One undo step;
        bad input shows the line at fault and changes nothing. ``new``: a new
        untitled section (File > Import), else an edit (Edit > Paste)."""
        doc = self.doc
        unit = doc.units.length_unit
        try:
            outline, parts = parse_coordinates(text, unit=unit)
        except CoordinateError as exc:
            return self._error("Cannot read the coordinates", f"{source}: {exc}")
        n = len(outline)
        current = doc.working_outline()[1]
        note = ""
        if parts is None:
            if len(current) == n:
                parts = tuple(current)
                note = "; parts kept"
            else:
                parts = (DEFAULT_PART,) * n
                note = "; every edge is a wall: mark the floor, lid and open edges"
        try:
            section = doc.section.replace(outline=outline, parts=parts)
        except SectionError as exc:
            return self._error("The coordinates are not a valid outline", f"{source}: {exc}")
        self._replace_section(section, f"Paste {n} vertices" if source == "the clipboard"
                              else f"Import {n} vertices from {source}", new=new)
        self._status(f"Read {n} vertices in {unit} from {source}{note}")
        return True

    def copy_coordinates(self):
        """Edit > Copy coordinates: the outline as tab-separated text."""
        outline, parts = self.doc.working_outline()
        unit = self.doc.units.length_unit
        QApplication.clipboard().setText(format_coordinates(outline, parts, unit))
        self._status(f"Copied {len(outline)} vertices in {unit}")
        return True
