"""Recovery copies of modified documents, and finding them after a crash.

While a document has unsaved changes, an :class:`Autosaver` writes a copy
of it into the recovery folder (the user's application data folder,
``QStandardPaths.StandardLocation.AppDataLocation`` / ``recovery``; never beside the user's
own file): shortly after the first edit (:data:`FIRST_DELAY_S`), then at
most once per interval (:data:`DEFAULT_INTERVAL_S`, settable, 0 = off). A
clean save, or a close or an open that discards the changes, removes it.
A copy is three files named by one id:

``<id>.section.json``
    the document's design (its load cases, structure and ground with it),
    an ordinary section file (:func:`wetline.core.section_file.dumps_design`),
    so it opens like any other;
``<id>.recovery.json``
    what the copy is: ``{"format": "wetline-recovery", "version": 1,
    "name": ..., "saved_at": ISO 8601 time, "original_path": str or null}``;
``<id>.lock``
    a :class:`PySide6.QtCore.QLockFile` held while the program that writes
    the copy runs.

A copy whose lock no running program holds was left by a program that ended
without cleaning up (a crash, a kill, a power cut): :func:`list_copies`
finds those, the program offers them at start (restore, discard or keep
for later). Every file is written atomically
(:func:`wetline.core.atomic_write.write_atomically`), the section file first.

No widgets here: the window asks the questions.
"""

from __future__ import annotations

import json
import os
import time
import uuid
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path
from typing import TYPE_CHECKING

from PySide6.QtCore import QLockFile, QObject, QStandardPaths, QTimer, Signal

from wetline.core.atomic_write import write_atomically
from wetline.core.case import Case
from wetline.core.load_cases import Design
from wetline.core.section_file import dumps_design, read_design

if TYPE_CHECKING:
    from .document import Document

__all__ = ["RecoveryCopy", "Autosaver", "default_folder", "case_to_save", "design_to_save",
           "write_copy",
           "list_copies", "remove_copy", "read_copy", "DEFAULT_INTERVAL_S", "FIRST_DELAY_S",
           "SECTION_SUFFIX", "SIDECAR_SUFFIX", "LOCK_SUFFIX"]

DEFAULT_INTERVAL_S = 60
"""Seconds between recovery copies of a document being edited."""

FIRST_DELAY_S = 5.0
"""Seconds from the first edit after a clean state to the first copy."""

SECTION_SUFFIX = ".section.json"
SIDECAR_SUFFIX = ".recovery.json"
LOCK_SUFFIX = ".lock"
FORMAT = "wetline-recovery"
VERSION = 1


@dataclass(frozen=True)
class RecoveryCopy:
    """One recovery copy found in (or written to) the recovery folder.

    Attributes
    ----------
    id : str
        The name its three files share.
    name : str
        The document's name when it was written (file name or section name).
    saved_at : datetime.datetime
        When it was written (aware).
    original_path : str or None
        The file the document belonged to, None for an untitled one.
    section_path : pathlib.Path
        The section file holding the case.
    """

    id: str
    name: str
    saved_at: datetime
    original_path: str | None
    section_path: Path

    @property
    def sidecar_path(self) -> Path:
        return self.section_path.with_name(self.id + SIDECAR_SUFFIX)

    def describe(self) -> str:
        """One line for the user: name, local time, the file it belongs to."""
        when = self.saved_at.astimezone().strftime("%Y-%m-%d %H:%M:%S")
        where = self.original_path or "never saved"
        return f"{self.name}, saved {when} ({where})"


def default_folder() -> Path:
    """The recovery folder: ``recovery`` in the user's application data
    folder (QStandardPaths.StandardLocation.AppDataLocation, e.g. ``~/.local/share/Wetline/
    Wetline/recovery`` on Linux)."""
    base = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)
    return Path(base) / "recovery"


def case_to_save(case: Case) -> Case:
    """``case`` as a section file holds it: resistances of parts no longer in
    the outline (renamed, re-imported) stay in the document for undo but are
    not written (the file format names only loaded parts of its outline)."""
    loaded = set(case.section.loaded_part_names)
    for part, _ in case.resistances:
        if part not in loaded:
            case = case.with_resistance(part, None)
    return case


def design_to_save(design: Design | Case) -> Design:
    """``design`` as a section file holds it (see :func:`case_to_save`); a
    bare case is a design of one case."""
    if isinstance(design, Case):
        return Design(case_to_save(design))
    case = case_to_save(design.case)
    return design if case is design.case else design.with_case(case)


def _now() -> datetime:
    return datetime.now(UTC)


def write_copy(folder: str | os.PathLike[str], copy_id: str, case: Design | Case, name: str,
               original_path: str | None = None,
               saved_at: datetime | None = None) -> RecoveryCopy:
    """Write (or replace) the recovery copy ``copy_id`` of ``case``.

    Parameters
    ----------
    folder : str or os.PathLike
        The recovery folder; made if missing.
    copy_id : str
    case : wetline.core.load_cases.Design or wetline.core.case.Case
        The document's design (every case, the structure, the ground).
    name : str
        The document's name, shown when the copy is offered.
    original_path : str or None
        The document's file, restored with it.
    saved_at : datetime.datetime, optional
        Default: now.

    Returns
    -------
    RecoveryCopy

    Raises
    ------
    wetline.core.atomic_write.WriteError
        The folder or a file cannot be written (an OSError and a ValueError).
    """
    folder = Path(folder)
    folder.mkdir(parents=True, exist_ok=True)
    saved_at = saved_at or _now()
    section_path = folder / (copy_id + SECTION_SUFFIX)
    write_atomically(section_path, dumps_design(design_to_save(case)))
    copy = RecoveryCopy(copy_id, str(name), saved_at,
                        None if original_path is None else str(original_path), section_path)
    sidecar = {"format": FORMAT, "version": VERSION, "name": copy.name,
               "saved_at": saved_at.isoformat(), "original_path": copy.original_path}
    write_atomically(copy.sidecar_path, json.dumps(sidecar, indent=2) + "\n")
    return copy


def remove_copy(folder: str | os.PathLike[str], copy_id: str) -> None:
    """Remove the recovery copy ``copy_id`` (its section file and sidecar);
    nothing happens if it is not there."""
    folder = Path(folder)
    for suffix in (SIDECAR_SUFFIX, SECTION_SUFFIX):
        try:
            (folder / (copy_id + suffix)).unlink()
        except FileNotFoundError:
            pass


def _read_sidecar(path: Path) -> tuple[str, datetime, str | None] | None:
    """(name, saved_at, original_path) of a sidecar, or None if unreadable."""
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
        if not isinstance(data, dict) or data.get("format") != FORMAT:
            return None
        saved_at = datetime.fromisoformat(str(data["saved_at"]))
        if saved_at.tzinfo is None:
            saved_at = saved_at.replace(tzinfo=UTC)
        original = data.get("original_path")
        return str(data.get("name") or "Untitled"), saved_at, \
            None if original is None else str(original)
    except (OSError, ValueError, KeyError, TypeError):
        return None


def _in_use(folder: Path, copy_id: str) -> bool:
    """True if a running program holds the copy's lock."""
    lock = QLockFile(str(Path(folder) / (copy_id + LOCK_SUFFIX)))
    lock.setStaleLockTime(0)  # stale only when its program is gone, never by age
    if lock.tryLock(0):
        lock.unlock()  # nobody holds it: an orphan (the lock file goes too)
        return False
    return lock.error() == QLockFile.LockError.LockFailedError


def list_copies(folder: str | os.PathLike[str]) -> list[RecoveryCopy]:
    """The recovery copies in ``folder`` that no running program is writing
    (left by a crash, or kept for later), newest first.

    A copy whose sidecar is missing or unreadable is still listed (its work
    is in the section file), named after its id and timed by the file.
    """
    folder = Path(folder)
    if not folder.is_dir():
        return []
    copies = []
    for section_path in folder.glob("*" + SECTION_SUFFIX):
        copy_id = section_path.name[:-len(SECTION_SUFFIX)]
        if not copy_id or _in_use(folder, copy_id):
            continue
        info = _read_sidecar(folder / (copy_id + SIDECAR_SUFFIX))
        if info is None:
            try:
                mtime = section_path.stat().st_mtime
            except OSError:
                continue
            info = (f"unnamed recovery copy {copy_id}",
                    datetime.fromtimestamp(mtime, UTC), None)
        copies.append(RecoveryCopy(copy_id, info[0], info[1], info[2], section_path))
    copies.sort(key=lambda c: c.saved_at, reverse=True)
    return copies


def read_copy(copy: RecoveryCopy) -> Design:
    """The design held by a :class:`RecoveryCopy`.

    Raises
    ------
    wetline.core.section_file.SectionFileError
        The copy cannot be read (the message names the file and the fault).
    """
    return read_design(copy.section_path)


class Autosaver(QObject):
    """Keeps a recovery copy of one document while it has unsaved changes.

    Parameters
    ----------
    document : wetline.app.model.document.Document
    folder : str or os.PathLike
        The recovery folder (:func:`default_folder` for the program).
    interval_s : float
        Seconds between copies; 0 (or less) turns autosave off.
    first_delay_s : float
        Seconds from the first edit after a clean state to the first copy.

    Signals
    -------
    written(RecoveryCopy)
        A copy was written.
    failed(str)
        A copy could not be written (the reason, for the status bar); the
        next try is one interval later.
    """

    written = Signal(object)
    failed = Signal(str)

    def __init__(self, document: Document, folder: str | os.PathLike[str],
                 interval_s: float = DEFAULT_INTERVAL_S, first_delay_s: float = FIRST_DELAY_S,
                 parent: QObject | None = None) -> None:
        super().__init__(parent if parent is not None else document)
        self._doc = document
        self.folder = Path(folder)
        self.id = f"{datetime.now().strftime('%Y%m%d-%H%M%S')}-{uuid.uuid4().hex[:12]}"
        self._interval = float(interval_s)
        self._first_delay = float(first_delay_s)
        self._dirty = False
        self._last_write: float | None = None  # time.monotonic() of the last copy written
        self._on_disk = False  # a copy was (or may have been partly) written
        self.copy: RecoveryCopy | None = None
        """The :class:`RecoveryCopy` on disk, or None."""
        self._lock = QLockFile(str(self.folder / (self.id + LOCK_SUFFIX)))
        self._lock.setStaleLockTime(0)
        try:
            self.folder.mkdir(parents=True, exist_ok=True)
            self._locked = self._lock.tryLock(0)
        except OSError:
            self._locked = False
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.timeout.connect(self._on_timeout)
        for signal in (document.sectionChanged, document.liquidChanged, document.fillChanged,
                       document.upliftInputsChanged, document.reportChanged,
                       document.casesChanged, document.structureChanged,
                       document.pathChanged):
            signal.connect(self._on_changed)
        document.modifiedChanged.connect(self._on_changed)
        if document.is_modified:
            self._on_changed()

    @property
    def interval_s(self) -> float:
        """Seconds between copies (0: off)."""
        return self._interval

    @property
    def pending(self) -> bool:
        """True while a copy is due (changes not yet in the recovery copy)."""
        return self._dirty

    def set_interval(self, seconds: float) -> None:
        """Copy every ``seconds`` from now on; 0 turns autosave off and
        removes the copy (it would grow stale)."""
        self._interval = max(float(seconds), 0.0)
        self._timer.stop()
        if self._interval <= 0:
            self.remove()
        elif self._dirty:
            self._schedule()

    def _on_changed(self, *_: object) -> None:
        if not self._doc.is_modified:  # saved, or back to the saved state
            self.remove()
            return
        self._dirty = True
        self._schedule()

    def _schedule(self) -> None:
        if self._interval <= 0 or self._timer.isActive():
            return
        if self._last_write is None:
            delay = min(self._first_delay, self._interval)
        else:
            delay = max(0.0, self._interval - (time.monotonic() - self._last_write))
        self._timer.start(int(round(delay * 1000)))

    def _on_timeout(self) -> None:
        if self._dirty and self._doc.is_modified:
            self.write_now()

    def write_now(self) -> RecoveryCopy | None:
        """Write the copy now; the :class:`RecoveryCopy`, or None if it failed
        (:attr:`failed` says why)."""
        doc = self._doc
        self._last_write = time.monotonic()
        self._on_disk = True
        try:
            copy = write_copy(self.folder, self.id, doc.design, doc.display_name, doc.path)
        except (OSError, ValueError) as exc:
            self.failed.emit(f"Recovery copy not written: {exc}")
            self._schedule()
            return None
        self._dirty = False
        self.copy = copy
        self.written.emit(copy)
        return copy

    def remove(self) -> None:
        """Remove the copy (the changes are saved or given up)."""
        self._timer.stop()
        self._dirty = False
        self._last_write = None
        self.copy = None
        if self._on_disk:
            self._on_disk = False
            remove_copy(self.folder, self.id)

    def close(self) -> None:
        """The document closes cleanly: remove the copy and release the lock."""
        self.remove()
        if self._locked:
            self._lock.unlock()
            self._locked = False
