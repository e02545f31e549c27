"""Write files so that a failure never leaves half a file.

Every writer in Wetline (section files, PNG, SVG, PDF, DXF) writes to a
temporary file in the target's folder, gives it the mode a new file would
get, and renames it over the target only once it is complete. A failed write
removes the temporary file and leaves any old file as it was.
"""

from __future__ import annotations

import os
import tempfile
from contextlib import contextmanager
from pathlib import Path

__all__ = ["WriteError", "atomic_path", "check_target", "write_atomically"]


class WriteError(OSError, ValueError):
    """A file that cannot be written; the message says which and why.

    Both an OSError (it is one) and a ValueError (like every input error the
    command line reports in one line)."""


def check_target(path, what="the file"):
    """The target as a Path, after checking it can be a new or replaced file.

    Raises
    ------
    WriteError
        No file name, a missing folder, a folder in the way.
    """
    target = Path(os.fspath(path))
    folder = target.parent if str(target.parent) else Path(".")
    if target.name in ("", ".", ".."):
        raise WriteError(f"cannot write {what} to {str(target)!r}: give a file name")
    if not folder.is_dir():
        if folder.exists():
            raise WriteError(f"cannot write {target}: {folder} is not a folder")
        raise WriteError(f"cannot write {target}: the folder {folder} does not exist")
    if target.is_dir():
        raise WriteError(f"cannot write {target}: it is a folder")
    return target


def _new_file_mode(path):
    """Give ``path`` the mode a newly created file gets (mkstemp makes 0600)."""
    mask = os.umask(0)
    os.umask(mask)
    os.chmod(path, 0o666 & ~mask)


@contextmanager
def atomic_path(path):
    """Yield a temporary path beside ``path``; on a clean exit it replaces
    ``path``, on an error it is removed and the error passes on.

    OSErrors are turned into :class:`WriteError` naming the target.
    """
    target = check_target(path)
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp",
                                   dir=str(target.parent))
    except OSError as exc:
        raise WriteError(f"cannot write {target}: {exc.strerror or exc}") from None
    os.close(fd)
    try:
        yield tmp
        _new_file_mode(tmp)
        os.replace(tmp, target)
    except BaseException as exc:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        if isinstance(exc, OSError):
            raise WriteError(f"cannot write {target}: {exc.strerror or exc}") from None
        raise


def write_atomically(path, data):
    """Write ``data`` (bytes, or str as UTF-8) to ``path`` atomically, synced
    to disk before the rename."""
    if isinstance(data, str):
        data = data.encode("utf-8")
    with atomic_path(path) as tmp:
        with open(tmp, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
