"""The one writer of every file Wetline writes (core.atomic_write).

What is refused, what is written through, which mode a file keeps, how the
temporary files are named and that none is left behind, even after a save
killed half-way (a real subprocess killed with SIGKILL). The behaviour of
``os.replace`` these tests guard against is POSIX rename(2): it replaces
whatever the new name is, a symbolic link or (as root) a device node.
"""

import os
import signal
import stat
import subprocess
import sys
import textwrap
from pathlib import Path

import pytest

from wetline.core.atomic_write import TEMP_MARK, WriteError, atomic_path, write_atomically

posix_only = pytest.mark.skipif(os.name != "posix", reason="POSIX file types")


def temp_files(folder):
    return sorted(p.name for p in Path(folder).iterdir() if TEMP_MARK in p.name)


# ------------------------------------------------------------ what is refused


@posix_only
def test_a_named_pipe_is_refused_and_left_as_it_was(tmp_path):
    fifo = tmp_path / "out.png"
    os.mkfifo(fifo)
    with pytest.raises(WriteError) as info:
        write_atomically(fifo, b"data")
    assert str(info.value) == f"cannot write {fifo}: not a regular file"
    assert stat.S_ISFIFO(os.lstat(fifo).st_mode)
    assert temp_files(tmp_path) == []


@posix_only
@pytest.mark.skipif(not hasattr(os, "geteuid") or os.geteuid() != 0,
                    reason="making a device node needs root")
def test_a_device_node_is_refused_and_left_as_it_was(tmp_path):
    # As root, os.replace would put a plain file where the device was.
    node = tmp_path / "null"
    os.mknod(node, 0o666 | stat.S_IFCHR, os.makedev(1, 3))  # the null device's numbers
    with pytest.raises(WriteError, match="not a regular file"):
        write_atomically(node, b"data")
    assert stat.S_ISCHR(os.lstat(node).st_mode)


def test_dev_null_is_refused():
    if not os.path.exists("/dev/null"):
        pytest.skip("no /dev/null")
    with pytest.raises(WriteError, match="not a regular file"):
        with atomic_path("/dev/null"):
            pytest.fail("a temporary file was made for a device")  # pragma: no cover


def test_a_folder_is_refused(tmp_path):
    folder = tmp_path / "sheets"
    folder.mkdir()
    with pytest.raises(WriteError) as info:
        write_atomically(folder, b"data")
    assert str(info.value) == f"cannot write {folder}: it is a folder"
    assert folder.is_dir() and list(folder.iterdir()) == []


@posix_only
def test_a_link_to_a_folder_is_refused(tmp_path):
    (tmp_path / "sheets").mkdir()
    link = tmp_path / "link"
    link.symlink_to(tmp_path / "sheets")
    with pytest.raises(WriteError, match="it is a folder"):
        write_atomically(link, b"data")
    assert link.is_symlink()


@posix_only
def test_a_link_to_a_pipe_is_refused(tmp_path):
    os.mkfifo(tmp_path / "fifo")
    link = tmp_path / "out.csv"
    link.symlink_to("fifo")
    with pytest.raises(WriteError, match="not a regular file"):
        write_atomically(link, "a,b\n")
    assert link.is_symlink() and stat.S_ISFIFO(os.stat(link).st_mode)


@posix_only
def test_a_link_loop_is_refused_in_one_line(tmp_path):
    a, b = tmp_path / "a", tmp_path / "b"
    a.symlink_to(b)
    b.symlink_to(a)
    with pytest.raises(WriteError) as info:
        write_atomically(a, b"data")
    assert str(info.value).startswith(f"cannot write {a}: ")
    assert a.is_symlink() and b.is_symlink()


def test_a_missing_folder_is_refused(tmp_path):
    with pytest.raises(WriteError, match="does not exist"):
        write_atomically(tmp_path / "no" / "file.pdf", b"data")


# ---------------------------------------------------------- links and modes


@posix_only
def test_a_link_is_written_through_and_stays_a_link(tmp_path):
    real = tmp_path / "real.section.json"
    real.write_text("old")
    link = tmp_path / "link.section.json"
    link.symlink_to("real.section.json")
    write_atomically(link, "new")
    assert link.is_symlink() and os.readlink(link) == "real.section.json"
    assert real.read_text() == "new"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["link.section.json",
                                                          "real.section.json"]


@posix_only
def test_a_link_into_another_folder_gets_its_temporary_file_there(tmp_path):
    (tmp_path / "store").mkdir()
    (tmp_path / "work").mkdir()
    real = tmp_path / "store" / "tank.section.json"
    real.write_text("old")
    link = tmp_path / "work" / "tank.section.json"
    link.symlink_to(real)
    with atomic_path(link) as tmp:
        assert Path(tmp).parent == real.parent  # one file system: the rename is atomic
        Path(tmp).write_text("new")
    assert link.is_symlink() and real.read_text() == "new"


@posix_only
def test_a_dangling_link_creates_the_file_it_names(tmp_path):
    link = tmp_path / "out.svg"
    link.symlink_to("drawn.svg")
    write_atomically(link, "<svg/>")
    assert link.is_symlink() and (tmp_path / "drawn.svg").read_text() == "<svg/>"


@posix_only
@pytest.mark.parametrize("mode", [0o640, 0o600, 0o664, 0o444])
def test_an_existing_file_keeps_its_permission_bits(tmp_path, mode):
    path = tmp_path / "tank.section.json"
    path.write_text("old")
    os.chmod(path, mode)
    write_atomically(path, "new")
    assert stat.S_IMODE(os.stat(path).st_mode) == mode
    assert path.read_text() == "new"


@posix_only
def test_a_linked_file_keeps_its_permission_bits(tmp_path):
    real = tmp_path / "real.pdf"
    real.write_bytes(b"old")
    os.chmod(real, 0o604)
    link = tmp_path / "link.pdf"
    link.symlink_to(real)
    write_atomically(link, b"new")
    assert stat.S_IMODE(os.stat(real).st_mode) == 0o604


@posix_only
def test_a_new_file_gets_the_mode_open_would_give(tmp_path):
    mask = os.umask(0o027)
    try:
        write_atomically(tmp_path / "new.csv", "a\n")
        with open(tmp_path / "plain.csv", "w") as fh:
            fh.write("a\n")
    finally:
        os.umask(mask)
    assert (stat.S_IMODE(os.stat(tmp_path / "new.csv").st_mode)
            == stat.S_IMODE(os.stat(tmp_path / "plain.csv").st_mode) == 0o640)


# ------------------------------------------------------------ temporary files


def test_the_temporary_file_is_named_after_its_target(tmp_path):
    with atomic_path(tmp_path / "diagram.png") as tmp:
        name = Path(tmp).name
        assert Path(tmp).parent == tmp_path
        assert name.startswith(f".diagram.png{TEMP_MARK}") and len(name) > len(
            f".diagram.png{TEMP_MARK}")
        Path(tmp).write_bytes(b"png")
    assert (tmp_path / "diagram.png").read_bytes() == b"png"
    assert temp_files(tmp_path) == []


@pytest.mark.parametrize("error", [RuntimeError("render failed"), KeyboardInterrupt(),
                                   OSError(28, "No space left on device")])
def test_every_failure_removes_the_temporary_file(tmp_path, error):
    path = tmp_path / "sheet.pdf"
    path.write_bytes(b"old")
    with pytest.raises(type(error)):
        with atomic_path(path) as tmp:
            Path(tmp).write_bytes(b"half")
            raise error
    assert path.read_bytes() == b"old"
    assert temp_files(tmp_path) == []


def test_an_os_error_names_the_target(tmp_path):
    path = tmp_path / "sheet.pdf"
    with pytest.raises(WriteError) as info:
        with atomic_path(path):
            raise OSError(28, "No space left on device")
    assert str(info.value) == f"cannot write {path}: No space left on device"


def test_a_target_replaced_by_a_folder_while_writing_is_not_overwritten(tmp_path):
    path = tmp_path / "out.dxf"
    with pytest.raises(WriteError, match="it is a folder"):
        with atomic_path(path) as tmp:
            Path(tmp).write_text("dxf")
            path.mkdir()
    assert path.is_dir() and temp_files(tmp_path) == []


def test_stale_temporary_files_of_the_same_target_go_on_the_next_save(tmp_path):
    path = tmp_path / "tank.section.json"
    stale = tmp_path / f".tank.section.json{TEMP_MARK}abc123"
    other = tmp_path / f".other.section.json{TEMP_MARK}abc123"
    stale.write_text("half")
    other.write_text("half")
    write_atomically(path, "whole")
    assert path.read_text() == "whole"
    assert not stale.exists()
    assert other.exists()  # another target's: not ours to remove


KILLED_WRITER = textwrap.dedent("""\
    import os, sys, time
    import wetline.core.atomic_write as aw

    real_fsync = os.fsync

    def slow_fsync(fd):
        sys.stdout.write("writing\\n")
        sys.stdout.flush()
        time.sleep(60)          # killed here, the data written but not renamed
        real_fsync(fd)

    aw.os.fsync = slow_fsync
    aw.write_atomically(sys.argv[1], b"half of a new file")
""")


@pytest.mark.skipif(not hasattr(signal, "SIGKILL"), reason="needs SIGKILL")
def test_a_killed_save_leaves_the_old_file_and_the_next_save_cleans_up(tmp_path):
    path = tmp_path / "tank.section.json"
    path.write_text("the old file")
    proc = subprocess.Popen([sys.executable, "-c", KILLED_WRITER, str(path)],
                            stdout=subprocess.PIPE, text=True)
    try:
        assert proc.stdout.readline() == "writing\n"
    finally:
        proc.send_signal(signal.SIGKILL)
        proc.wait(timeout=30)
        proc.stdout.close()
    assert proc.returncode == -signal.SIGKILL
    assert path.read_text() == "the old file"
    left = temp_files(tmp_path)
    assert len(left) == 1 and left[0].startswith(f".tank.section.json{TEMP_MARK}")
    write_atomically(path, "the new file")
    assert path.read_text() == "the new file"
    assert temp_files(tmp_path) == []
