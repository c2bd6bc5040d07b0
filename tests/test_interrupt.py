"""Nothing lost: builds killed with SIGKILL, failed builds, and folders factsheet did not make.

After every kill the output folder holds either the earlier site, byte for byte, or the complete
new one; never a mix. The next build succeeds and leaves no staging folder behind.
"""

from __future__ import annotations

import os
import random
import re
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

from factsheet.resources import demo_dir

DEMO_SUBSET = ("catalogue.yaml", "mer34-001.yaml", "mer34-001.ecsv")
ENV = {**os.environ, "SOURCE_DATE_EPOCH": "2050000000"}


def _command(catalogue: Path, out: Path, *extra: str) -> list[str]:
    return [sys.executable, "-m", "factsheet.cli", "build", str(catalogue), "-o", str(out), *extra]


def _build(catalogue: Path, out: Path, *extra: str) -> subprocess.CompletedProcess:
    return subprocess.run(
        _command(catalogue, out, *extra), capture_output=True, text=True, env=ENV, timeout=600
    )


def _snapshot(folder: Path) -> dict[str, bytes]:
    return {
        str(p.relative_to(folder)): p.read_bytes() for p in sorted(folder.rglob("*")) if p.is_file()
    }


def _catalogues(tmp_path: Path) -> tuple[Path, Path]:
    old, new = tmp_path / "old", tmp_path / "new"
    for folder in (old, new):
        folder.mkdir()
        for name in DEMO_SUBSET:
            shutil.copy(demo_dir() / name, folder / name)
    text = (new / "mer34-001.yaml").read_text(encoding="utf-8")
    revised = re.sub(r"(?m)^(title:\n  en: )", r"\1Revised - ", text, count=1)
    assert revised != text
    (new / "mer34-001.yaml").write_text(revised, encoding="utf-8")
    return old, new


def test_sigkill_during_build_leaves_old_or_new_site(tmp_path):
    old, new = _catalogues(tmp_path)
    reference = tmp_path / "reference" / "site"
    assert _build(new, reference).returncode == 0
    expected_new = _snapshot(reference)
    out = tmp_path / "pub" / "site"
    start = time.monotonic()
    assert _build(old, out).returncode == 0
    duration = time.monotonic() - start
    expected_old = _snapshot(out)
    assert expected_old != expected_new
    rng = random.Random(20340412)
    outcomes = []
    for fraction in (0.2, 0.5, 0.8, 0.95):
        current = _snapshot(out)
        process = subprocess.Popen(
            _command(new, out), env=ENV, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL
        )
        time.sleep(duration * fraction * rng.uniform(0.9, 1.1))
        process.send_signal(signal.SIGKILL)
        process.wait()
        after = _snapshot(out)
        differ = sorted(
            k for k in set(after) | set(expected_new) if after.get(k) != expected_new.get(k)
        )
        assert after in (current, expected_new), (
            f"mixed site after a kill at {fraction:.0%}; differs from the new site in {differ[:8]}"
        )
        outcomes.append(after == expected_new)
        if after == expected_new:  # the swap completed: go back to the old site and go on
            assert _build(old, out).returncode == 0
    final = _build(new, out)
    assert final.returncode == 0, final.stderr
    assert _snapshot(out) == expected_new
    assert not list(out.parent.glob(".factsheet-new-*"))
    assert not list(out.parent.glob(".factsheet-old-*"))
    assert len(outcomes) == 4


def test_refuses_a_foreign_folder_unless_forced(tmp_path):
    old, _ = _catalogues(tmp_path)
    out = tmp_path / "mine"
    out.mkdir()
    (out / "notes.txt").write_text("not a site\n", encoding="utf-8")
    refused = _build(old, out)
    assert refused.returncode == 1 and "Traceback" not in refused.stderr
    assert "refusing to replace" in refused.stderr and str(out) in refused.stderr
    assert _snapshot(out) == {"notes.txt": b"not a site\n"}
    assert not list(tmp_path.glob(".factsheet-new-*"))
    forced = _build(old, out, "--force")
    assert forced.returncode == 0, forced.stderr
    assert (out / "index.html").is_file() and not (out / "notes.txt").exists()


def test_placeholder_folder_is_replaced(tmp_path):
    old, _ = _catalogues(tmp_path)
    out = tmp_path / "site"
    out.mkdir()
    (out / "README.txt").write_text("placeholder\n", encoding="utf-8")
    result = _build(old, out)
    assert result.returncode == 0, result.stderr
    assert (out / "index.html").is_file()


def test_failed_build_leaves_existing_folder_whole(tmp_path):
    old, _ = _catalogues(tmp_path)
    out = tmp_path / "site"
    assert _build(old, out).returncode == 0
    before = _snapshot(out)
    (old / "mer34-001.ecsv").write_text("heavier.mass [Msun]\n1\n", encoding="utf-8")
    failed = _build(old, out)
    assert failed.returncode == 1 and "Traceback" not in failed.stderr
    assert f"{old / 'mer34-001.ecsv'}:1: file: not an ECSV file" in failed.stderr
    assert _snapshot(out) == before


def _alive_with(text: str) -> list[int]:
    """Processes (not zombies) whose command line mentions ``text``."""
    found = []
    for proc in Path("/proc").iterdir():
        if not proc.name.isdigit():
            continue
        try:
            cmdline = (proc / "cmdline").read_bytes().replace(b"\0", b" ").decode()
            state = (proc / "status").read_text().split("State:")[1].split()[0]
        except (OSError, IndexError):
            continue
        if text in cmdline and state != "Z":
            found.append(int(proc.name))
    return found


def test_workers_die_with_a_killed_build(tmp_path):
    if not Path("/proc/self/cmdline").exists():
        raise AssertionError("this test reads /proc (Linux)")
    cat = tmp_path / "cat"
    shutil.copytree(demo_dir(), cat)
    out = tmp_path / "unique-output-name"
    for _attempt in range(5):
        process = subprocess.Popen(
            _command(cat, out, "-j", "2"),
            env=ENV,
            stdout=subprocess.DEVNULL,
            stderr=subprocess.DEVNULL,
        )
        deadline = time.monotonic() + 60
        while len(_alive_with(str(out))) < 3 and time.monotonic() < deadline:
            time.sleep(0.05)  # the build and its two workers are running
        workers = [pid for pid in _alive_with(str(out)) if pid != process.pid]
        process.send_signal(signal.SIGKILL)
        process.wait()
        deadline = time.monotonic() + 10
        while _alive_with(str(out)) and time.monotonic() < deadline:
            time.sleep(0.1)
        assert not _alive_with(str(out)), f"workers {workers} outlived the killed build"
        if len(workers) == 2:
            break
    else:
        raise AssertionError("the build never ran two workers to kill")
    assert _build(cat, out).returncode == 0  # and the next build goes ahead
