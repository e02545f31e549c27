"""Write files so that a failure never leaves half a file, nor a stray one.

Every file Wetline writes (section files, PNG, SVG, PDF, DXF, CSV) goes
through here. The data go to a temporary file beside the target, named
``.NAME.wetline-tmp-XXXXXXXX`` so that anyone can tell what it is, and that
file is renamed over the target only once it is complete and synced. Rules:

- A target that exists and is not a regular file (a device node, a pipe, a
  socket) is refused: "not a regular file". A folder is refused ("it is a
  folder"); a command that writes into a folder says so and passes the
  file's path inside it.
- A symbolic link is written through: the file it points to gets the new
  data and the link stays a link.
- A file that already exists keeps its permission bits (and, where the
  process may set them, its owner and group); a new file gets the mode a
  plain ``open`` would give it (0666 less the umask).
- A failed write (an error, an interrupt) removes its temporary file and
  leaves the old file as it was. A write killed outright cannot clean up;
  its temporary file is removed by the next successful write of the same
  target.
"""

from __future__ import annotations

import os
import stat
import tempfile
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path

__all__ = [
    "TEMP_MARK",
    "WriteError",
    "atomic_path",
    "check_target",
    "same_file",
    "write_atomically",
]

TEMP_MARK = ".wetline-tmp-"
"""What every temporary file's name holds: ``.NAME`` + this + random letters."""


class WriteError(OSError, ValueError):
    """A file that cannot be written; the message says which and why.

    Both an OSError (it is one) and a ValueError (like every input error the
    command line reports in one line)."""


PathLike = str | os.PathLike[str]


def _real_target(path: PathLike, what: str) -> tuple[Path, Path, os.stat_result | None]:
    """``(given, real, status)``: the path as given, the file the data go to
    (symbolic links followed) and its status (None if it does not exist yet),
    after checking it can be a new or replaced regular file."""
    given = Path(os.fspath(path))
    if given.name in ("", ".", ".."):
        raise WriteError(f"cannot write {what} to {str(given)!r}: give a file name")
    real = Path(os.path.realpath(given)) if given.is_symlink() else given
    folder = real.parent if str(real.parent) else Path(".")
    if not folder.is_dir():
        if folder.exists():
            raise WriteError(f"cannot write {given}: {folder} is not a folder")
        raise WriteError(f"cannot write {given}: the folder {folder} does not exist")
    try:
        status = os.stat(real)
    except FileNotFoundError:
        return given, real, None
    except OSError as exc:
        raise WriteError(f"cannot write {given}: {exc.strerror or exc}") from None
    if stat.S_ISDIR(status.st_mode):
        raise WriteError(f"cannot write {given}: it is a folder")
    if not stat.S_ISREG(status.st_mode):
        raise WriteError(f"cannot write {given}: not a regular file")
    return given, real, status


def check_target(path: PathLike, what: str = "the file") -> Path:
    """The target as a Path, after checking it can be a new or replaced file.

    Parameters
    ----------
    path : str or os.PathLike
        The file to write; a symbolic link is followed.
    what : str
        What is written, for the message (``"the PNG"``).

    Returns
    -------
    pathlib.Path
        ``path`` as given.

    Raises
    ------
    WriteError
        No file name, a missing folder, a folder in the way, an existing
        target that is not a regular file (a device, a pipe ...).
    """
    return _real_target(path, what)[0]


def same_file(a: PathLike, b: PathLike) -> bool:
    """True if ``a`` and ``b`` name one file: the same path, another path to
    it, a symbolic or a hard link (:func:`os.path.samefile`); for a path that
    does not exist yet, the same path once links are resolved.

    A writer checks its output against its inputs with this before reading
    anything, so a command never writes over its own input.

    Examples
    --------
    >>> same_file("a/b/../c.json", "a/c.json")
    True
    """
    try:
        return os.path.samefile(a, b)
    except OSError:  # one of them does not exist (yet), or cannot be reached
        return os.path.realpath(a) == os.path.realpath(b)
    except (TypeError, ValueError):  # not a path at all (a NUL byte ...)
        return False


def _give_mode(tmp: str, status: os.stat_result | None) -> None:
    """Give ``tmp`` the old file's mode (and owner, where allowed), or the
    mode a newly created file gets (mkstemp makes 0600)."""
    if status is None:
        mask = os.umask(0)
        os.umask(mask)
        os.chmod(tmp, 0o666 & ~mask)
        return
    if hasattr(os, "chown") and (status.st_uid, status.st_gid) != (os.geteuid(), os.getegid()):
        try:
            os.chown(tmp, status.st_uid, status.st_gid)
        except OSError:
            pass  # not allowed: the file then belongs to whoever saved it
    os.chmod(tmp, stat.S_IMODE(status.st_mode))


def _remove_stale(real: Path, keep: str) -> None:
    """Remove temporary files of earlier writes of ``real`` that were killed
    before they could clean up."""
    prefix = f".{real.name}{TEMP_MARK}"
    try:
        names = os.listdir(real.parent if str(real.parent) else ".")
    except OSError:
        return
    for name in names:
        if name.startswith(prefix) and len(name) > len(prefix):
            old = real.parent / name
            if str(old) == keep:
                continue
            try:
                if stat.S_ISREG(os.lstat(old).st_mode):
                    os.unlink(old)
            except OSError:
                pass


def _sync_folder(folder: Path) -> None:
    """Make a rename in ``folder`` durable where the system allows it."""
    try:
        fd = os.open(folder if str(folder) else ".", os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


@contextmanager
def atomic_path(path: PathLike) -> Iterator[str]:
    """Yield a temporary path beside the target; on a clean exit it replaces
    the target, on an error it is removed and the error passes on.

    Parameters
    ----------
    path : str or os.PathLike
        The file to write (see the module notes for links, modes and what is
        refused).

    Yields
    ------
    str
        The temporary file to write, already created and empty.

    Raises
    ------
    WriteError
        For a target that cannot be written, and for every OSError on the
        way, naming the target.
    """
    given, real, status = _real_target(path, "the file")
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{real.name}{TEMP_MARK}",
                                   dir=str(real.parent) if str(real.parent) else ".")
    except OSError as exc:
        raise WriteError(f"cannot write {given}: {exc.strerror or exc}") from None
    os.close(fd)
    try:
        yield tmp
        _give_mode(tmp, status)
        # Checked again: the target may have been replaced while the data
        # were written (by a device node, a folder).
        _real_target(path, "the file")
        os.replace(tmp, real)
    except BaseException as exc:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        if isinstance(exc, OSError) and not isinstance(exc, WriteError):
            raise WriteError(f"cannot write {given}: {exc.strerror or exc}") from None
        raise
    _sync_folder(real.parent)
    _remove_stale(real, keep=tmp)


def write_atomically(path: PathLike, data: bytes | str) -> None:
    """Write ``data`` (bytes, or str as UTF-8) to ``path`` atomically, synced
    to disk before the rename.

    Raises
    ------
    WriteError
        Naming the file and the reason.
    """
    if isinstance(data, str):
        data = data.encode("utf-8")
    with atomic_path(path) as tmp:
        with open(tmp, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
