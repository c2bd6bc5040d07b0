"""A build says what it is doing in a log too (output redirected: CI, cron), not only on a
terminal."""

from __future__ import annotations

import io
import subprocess
import sys

from helpers import VALID_EVENT

from factsheet.progress import Progress


class Log(io.StringIO):
    def isatty(self) -> bool:
        return False


class Terminal(io.StringIO):
    def isatty(self) -> bool:
        return True


def test_a_log_gets_whole_lines_every_few_seconds_and_the_last_step():
    log = Log()
    progress = Progress(True, log, every=3600.0)  # nothing is due before the last step
    for done in range(1, 6):
        progress.step(done, 5, "events derived and drawn")
    assert log.getvalue() == "  5/5 events derived and drawn\n"
    log = Log()
    progress = Progress(True, log, every=0.0)  # every step is due
    for done in range(1, 4):
        progress.step(done, 3, "events derived and drawn")
        progress.tick(done, "pages and files written")
    assert log.getvalue().count("\n") == 6 and "\r" not in log.getvalue()


def test_a_terminal_gets_one_line_rewritten_in_place():
    screen = Terminal()
    progress = Progress(True, screen)
    for done in range(1, 4):
        progress.step(done, 3, "events derived and drawn")
    assert screen.getvalue() == (
        "\r  1/3 events derived and drawn\r  2/3 events derived and drawn"
        "\r  3/3 events derived and drawn\n"
    )


def test_a_build_with_its_output_in_a_file_reports_progress(catalogue, tmp_path):
    folder = catalogue({"a.yaml": VALID_EVENT})
    done = subprocess.run(
        [sys.executable, "-m", "factsheet.cli", "build", str(folder), "-o", str(tmp_path / "o")],
        capture_output=True,  # not a terminal
        text=True,
    )
    assert done.returncode == 0, done.stderr
    assert "  1/1 events derived and drawn\n" in done.stderr
    assert "pages and files written\n" in done.stderr
    assert done.stdout.startswith("built 1 fact sheet (")
