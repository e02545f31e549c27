"""The main window's file commands (a part of
:class:`~wetline.app.window.main_window.MainWindow`): ask to save changes,
new from a template, open, recent files, save and save as, export the
diagram, the preferences, and recovery copies after a crash."""

from __future__ import annotations

from pathlib import Path

from wetline.app.model import editing, recovery
from wetline.app.model.document import UNDO_LIMIT
from wetline.app.window import dialogs
from wetline.core.section_file import SectionFileError, read_design, write_design

__all__ = ["FileCommands"]

MAX_RECENT = 8


class FileCommands:
    """The file commands of the main window it is mixed into."""

    # ------------------------------------------------------------- files
    def maybe_save(self):
        """True if it is fine to drop the current document."""
        if not self.doc.is_modified:
            return True
        answer = dialogs.ask_save_changes(self, self.doc.display_name)
        if answer == "save":
            return self.save()
        return answer == "discard"

    def new_from_template(self):
        if not self.maybe_save():
            return False
        result = dialogs.ask_template(self, self.doc.units)
        if result is None:
            return False
        section, level = result
        editing.replace_section(self.doc, section, level,
                                text=f"New section: {section.name}")
        self.canvas.fit()
        return True

    def last_folder(self):
        """The folder a section file was last opened from or saved to
        (remembered in the settings), or "" if none is known or it is gone."""
        folder = self.settings.value("last_folder", "")
        folder = str(folder) if folder else ""
        return folder if folder and Path(folder).is_dir() else ""

    def _remember_folder(self, path):
        self.settings.setValue("last_folder", str(Path(path).resolve().parent))

    def open_dialog(self):
        if not self.maybe_save():
            return False
        folder = str(Path(self.doc.path).parent) if self.doc.path else self.last_folder()
        path = dialogs.ask_open_path(self, folder)
        return self.open_path(path, ask=False) if path else False

    def open_path(self, path, ask=True):
        """Open a section file; on failure say why and keep the document."""
        if ask and not self.maybe_save():
            return False
        try:
            design = read_design(path)
        except SectionFileError as exc:
            dialogs.show_error(self, "Cannot open the file", str(exc))
            return False
        except Exception as exc:  # an unexpected reader fault must not lose work
            dialogs.show_error(self, "Cannot open the file", f"{path}: {exc}")
            return False
        self.doc.load(design, path)
        self.canvas.fit_when_drawn()
        self._add_recent(path)
        self._remember_folder(path)
        self._status(f"Opened {path}")
        return True

    def save(self):
        if not self.doc.path:
            return self.save_as()
        return self._write(self.doc.path)

    def save_as(self):
        suggested = self.doc.path
        if not suggested:
            stem = (self.doc.section.name.strip() or "section").replace("/", "-")
            folder = self.last_folder()
            suggested = str(Path(folder) / f"{stem}.section.json") if folder \
                else f"{stem}.section.json"
        path = dialogs.ask_save_path(self, suggested)
        return self._write(path) if path else False

    def _write(self, path):
        design = recovery.design_to_save(self.doc.design)
        try:
            write_design(design, path)
        except OSError as exc:
            dialogs.show_error(self, "Cannot save", f"{path}: {exc.strerror or exc}")
            return False
        except ValueError as exc:
            dialogs.show_error(self, "Cannot save", f"{path}: {exc}")
            return False
        self.doc.mark_saved(path)
        self._add_recent(path)
        self._remember_folder(path)
        self._status(f"Saved {path}")
        return True

    def edit_report_info(self):
        """File > Calculation sheet header: one undo step if anything changed."""
        report = dialogs.ask_report_info(self, self.doc.case.report)
        return report is not None and editing.set_report_info(self.doc, report)

    def export_dialog(self):
        if self.transfer.refuse_stale("diagram"):
            return False
        base = Path(self.doc.path).name.split(".")[0] if self.doc.path else "diagram"
        folder = self.transfer._folder()  # beside the file, else the last folder used
        path = dialogs.ask_export_path(self, str(Path(folder) / f"{base}.png") if folder
                                       else f"{base}.png")
        return self.export_to(path) if path else False

    def export_to(self, path, size=None):
        """Write the pressure diagram PNG of the active case with its
        structure (through :mod:`wetline.app.render.png`, as ``wetline export
        --case``); refused while the outline being edited is invalid."""
        if self.transfer.refuse_stale("diagram"):
            return False
        try:
            from wetline.app.render import png
        except ImportError as exc:
            dialogs.show_error(self, "Export", f"PNG export is not available: {exc}")
            return False
        kwargs = {"units": self.doc.units.system}
        if size is not None:
            kwargs["size"] = size
        try:
            self.doc.flush()
            png.export_png(self.doc.design, path, case=self.doc.active_name, **kwargs)
        except Exception as exc:
            dialogs.show_error(self, "Export failed", str(exc))
            return False
        self.transfer.exported(path, "the diagram")
        return True

    def _add_recent(self, path):
        path = str(Path(path).resolve())
        recent = [p for p in self._recent() if p != path]
        recent.insert(0, path)
        self.settings.setValue("recent_files", recent[:MAX_RECENT])
        self._refresh_recent()

    def _recent(self):
        value = self.settings.value("recent_files", [])
        if isinstance(value, str):
            value = [value]
        return [str(v) for v in (value or [])]

    def _refresh_recent(self):
        self.recent_menu.clear()
        recent = self._recent()
        for p in recent:
            self.recent_menu.addAction(p, lambda _=False, p=p: self.open_path(p))
        self.recent_menu.setEnabled(bool(recent))

    # ------------------------------------------------ autosave, recovery
    def autosave_interval_s(self):
        """Seconds between recovery copies, from the settings (0: off)."""
        value = self.settings.value("autosave_interval_s", recovery.DEFAULT_INTERVAL_S)
        try:
            value = int(value)
        except (TypeError, ValueError):
            return recovery.DEFAULT_INTERVAL_S
        return value if value >= 0 else recovery.DEFAULT_INTERVAL_S

    def undo_limit(self):
        """Undo steps kept, from the settings."""
        value = self.settings.value("undo_limit", UNDO_LIMIT)
        try:
            value = int(value)
        except (TypeError, ValueError):
            return UNDO_LIMIT
        return value if value >= 1 else UNDO_LIMIT

    def edit_preferences(self):
        """Edit > Preferences: stored in the settings and applied (a new undo
        limit from the next section opened, if there is history now)."""
        values = dialogs.ask_preferences(
            self, {"autosave_interval_s": self.autosave_interval_s(),
                   "undo_limit": self.undo_limit()})
        if values is None:
            return False
        self.settings.setValue("autosave_interval_s", int(values["autosave_interval_s"]))
        self.settings.setValue("undo_limit", int(values["undo_limit"]))
        if self.autosaver is not None:
            self.autosaver.set_interval(self.autosave_interval_s())
        self.doc.set_undo_limit(self.undo_limit())
        return True

    def offer_recovery(self):
        """Offer the recovery copies a crash left (restore, discard, later);
        True if one was restored."""
        if self.autosaver is None:
            return False
        folder = self.autosaver.folder
        copies = recovery.list_copies(folder)
        while copies:
            answer, index = dialogs.ask_recovery(self, copies)
            if answer == "restore":
                return self.restore_recovery(copies[index])
            if answer != "discard":
                break  # later: every copy stays for the next start
            recovery.remove_copy(folder, copies.pop(index).id)
        return False

    def restore_recovery(self, copy):
        """Open a recovery copy as the document: modified, with its original
        file for Save. Once this program has its own copy the old one goes."""
        try:
            design = recovery.read_copy(copy)
        except SectionFileError as exc:
            dialogs.show_error(self, "Cannot restore the recovery copy", str(exc))
            return False
        self.doc.load(design, copy.original_path, saved=False)
        self.canvas.fit_when_drawn()
        if self.autosaver is not None and self.autosaver.write_now() is not None:
            recovery.remove_copy(self.autosaver.folder, copy.id)
        self._status(f"Restored {copy.describe()}: save it to keep it")
        return True

