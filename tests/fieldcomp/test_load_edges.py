"""The load path's edges: what a job file may be (a regular UTF-8 file, with or without a byte-order
mark, CRLF or LF, at most 20 MB, nested at most MAX_NESTING deep) and how everything else is
refused: by kind for devices, pipes, FIFOs, sockets and folders (never by reading them), with a
message that names the file and, where there is one, the beam and the field."""

from __future__ import annotations

import os
import signal
import socket
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.jobfile import JobFileError, load_job, parse_job, save_job
from fieldcomp.jobs.nesting import MAX_NESTING

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
BOM = b"\xef\xbb\xbf"  # the UTF-8 encoding of U+FEFF (Unicode Standard, ch. 23.8 "Byte Order Mark")


@pytest.fixture
def no_hang():
    """Fail, rather than hang, if anything blocks (a FIFO opened for reading waits for a writer:
    POSIX open(), O_NONBLOCK not set)."""
    def hung(signum, frame):
        raise AssertionError("blocked: the file was opened or read as if it were a regular file")
    previous = signal.signal(signal.SIGALRM, hung)
    signal.alarm(10)
    yield
    signal.alarm(0)
    signal.signal(signal.SIGALRM, previous)


def test_a_job_saved_with_a_byte_order_mark_loads_like_the_same_job_without(tmp_path):
    plain, marked = tmp_path / "plain.toml", tmp_path / "marked.toml"
    plain.write_bytes(DEMO.read_bytes())
    marked.write_bytes(BOM + DEMO.read_bytes())
    assert load_job(marked).job == load_job(plain).job
    assert main(["check", str(marked)]) == main(["check", str(plain)])


def test_crlf_line_endings_load(tmp_path):
    crlf = tmp_path / "crlf.toml"
    crlf.write_bytes(DEMO.read_bytes().replace(b"\n", b"\r\n"))  # TOML 1.0: newline is LF or CRLF
    assert load_job(crlf).job == load_job(DEMO).job


def test_line_endings_and_byte_order_mark_are_kept_on_save(tmp_path):
    path = tmp_path / "crlf.toml"
    path.write_bytes(BOM + DEMO.read_bytes().replace(b"\n", b"\r\n"))
    loaded = load_job(path)
    renamed = loaded.job.model_copy(update={"project": loaded.job.project.model_copy(update={"name": "Renamed"})})
    save_job(renamed, path, expected_digest=loaded.digest)
    data = path.read_bytes()
    assert data.startswith(BOM)
    assert data.count(b"\r\n") == data.count(b"\n")  # every line still ends CRLF
    assert load_job(path).job == renamed


def test_utf16_is_refused_with_a_hint(tmp_path):
    path = tmp_path / "utf16.toml"
    path.write_bytes(DEMO.read_text(encoding="utf-8").encode("utf-16"))  # starts with the BOM FF FE
    with pytest.raises(JobFileError, match=r"not UTF-8 text.*UTF-16"):
        load_job(path)


def _fifo(tmp_path: Path) -> Path:
    path = tmp_path / "fifo.toml"
    os.mkfifo(path)
    return path


def _socket(tmp_path: Path) -> tuple[Path, socket.socket]:
    path = tmp_path / "sock.toml"
    sock = socket.socket(socket.AF_UNIX)
    sock.bind(str(path))
    return path, sock


@pytest.mark.parametrize("kind, expected", [("fifo", "a pipe or FIFO"), ("zero", "a character device"),
                                            ("null", "a character device"), ("folder", "a folder"), ("socket", "a socket")])
def test_devices_pipes_fifos_sockets_and_folders_are_refused_by_kind(tmp_path, no_hang, kind, expected):
    sock = None
    if kind == "fifo":
        path = _fifo(tmp_path)
    elif kind == "socket":
        path, sock = _socket(tmp_path)
    elif kind == "folder":
        path = tmp_path
    else:
        path = Path("/dev/zero" if kind == "zero" else "/dev/null")  # /dev/zero reads forever (POSIX: zero)
    try:
        with pytest.raises(JobFileError) as info:
            load_job(path)
    finally:
        if sock is not None:
            sock.close()
    assert str(path) in str(info.value) and expected in str(info.value)
    assert "regular files" in str(info.value)


def test_a_pipe_given_as_the_job_is_refused(tmp_path, no_hang):
    read, write = os.pipe()
    try:
        with pytest.raises(JobFileError, match="a pipe or FIFO"):
            load_job(f"/dev/fd/{read}")
    finally:
        os.close(read)
        os.close(write)


def test_size_limit_holds_for_a_sparse_file(tmp_path):
    big = tmp_path / "sparse.toml"
    with big.open("wb") as fh:
        fh.truncate(64 * 2**30)  # 64 GB that take no disk: refused by its size, never read
    with pytest.raises(JobFileError, match=r"68719\.5 MB; job files over 20 MB are refused"):
        load_job(big)


MINIMAL = """[project]
name = "Edges"
[[slab]]
id = "S"
topping = "6 in"
concrete_pcf = 145
fc_ksi = 4.0
[[beam]]
mark = "B-9"
shape = "W18X35"
span = "30 ft"
spacing_left = "10 ft"
spacing_right = "10 ft"
slab = "S"
[beam.studs]
length = "5 in"
count = 20
"""


@pytest.mark.parametrize("depth", [MAX_NESTING + 1, 300, 5000])
@pytest.mark.parametrize("open_, close", [("[", "]"), ("{a = ", "}")])
def test_deep_brackets_are_refused_with_line_key_and_table(depth, open_, close):
    text = MINIMAL.replace("count = 20", f"count = {open_ * depth}1{close * depth}")
    with pytest.raises(JobFileError) as info:
        parse_job(text, "deep.toml")
    message = str(info.value)
    assert "deep.toml: line 17, key 'count' under [beam.studs]" in message
    assert f"nested more than {MAX_NESTING} deep" in message


def test_deep_dotted_keys_are_refused_naming_the_table_and_field():
    keys = ".".join(f"k{i}" for i in range(5000))  # TOML 1.0 dotted keys: one table per part
    with pytest.raises(JobFileError) as info:
        parse_job(MINIMAL.replace('name = "Edges"', f'name = "Edges"\n{keys} = 1'), "dotted.toml")
    assert "dotted.toml: project, field 'k0.k1.k2'" in str(info.value)
    assert f"nested more than {MAX_NESTING} deep" in str(info.value)


def test_deep_nesting_through_the_cli_exits_2(tmp_path, capsys):
    path = tmp_path / "deep.toml"
    path.write_text(MINIMAL.replace("count = 20", "count = " + "[" * 400 + "1" + "]" * 400))
    for argv in (["check", str(path)], ["camber", str(path)], ["marks", str(path), "--all"],
                 ["findings", str(path), "--beam", "B-9"], ["open", str(path)]):
        assert main(argv) == 2
        assert f"error: {path}: line 17" in capsys.readouterr().err


def test_brackets_inside_strings_and_comments_are_not_nesting():
    text = MINIMAL.replace('mark = "B-9"', 'mark = "[[[[[[[[[[[[[[[["  # ]]]]]]]]]]]]]]]] [[[[[[[[[[[[[[[[')
    text = text.replace('name = "Edges"', "name = '''{{{{{{{{{{{{{{{{{{'''")
    job = parse_job(text)
    assert job.beam[0].mark == "[" * 16 and job.project.name == "{" * 18


def test_nesting_the_job_itself_needs_is_accepted():
    loads = 'point_loads = [{ at = "10 ft", dead_kips = 1.0 }]'
    text = MINIMAL.replace('slab = "S"\n[beam.studs]', f'slab = "S"\n{loads}\n[beam.studs]')
    assert parse_job(text).beam[0].point_loads[0].dead_kips == 1.0


VERBS = (["check"], ["check", "--json"], ["camber"], ["marks", "--all"], ["findings", "--beam", "B-9"], ["open"])


@pytest.mark.parametrize("kind", ["fifo", "zero", "folder", "socket", "missing"])
def test_every_verb_refuses_what_is_not_a_job_file_with_exit_2(tmp_path, capsys, no_hang, kind):
    sock = None
    if kind == "fifo":
        path = _fifo(tmp_path)
    elif kind == "socket":
        path, sock = _socket(tmp_path)
    elif kind == "folder":
        path = tmp_path
    elif kind == "zero":
        path = Path("/dev/zero")
    else:
        path = tmp_path / "missing.toml"
    try:
        for verb in VERBS:
            assert main([verb[0], str(path), *verb[1:]]) == 2, verb  # "open" refuses before the app starts
            err = capsys.readouterr().err
            assert err.startswith(f"error: {path}: ") and ("regular files" in err or "cannot read" in err), (verb, err)
    finally:
        if sock is not None:
            sock.close()
