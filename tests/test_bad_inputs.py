"""Bad-input corpus, end to end through the command line in a subprocess.

Every case writes a small catalogue, runs ``factsheet check`` (or ``build``) and asserts exit
status 1, a ``FILE:LINE: key:`` line naming the problem, and no traceback. The subprocesses run
a few at a time in one module fixture, so the corpus stays quick on two cores.
"""

from __future__ import annotations

import os
import subprocess
import sys
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass, field
from pathlib import Path

import pytest
from helpers import VALID_EVENT

HEADER = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n"


def event(lines: dict[str, str] | None = None, drop: tuple[str, ...] = ()) -> str:
    """VALID_EVENT with keys replaced or dropped, each named by its key path.

    ``lines`` maps a key path (``estimate.heavier.mass``) to the text that takes the place of
    that key's line and of the lines nested under it; ``drop`` names keys left out with the
    lines nested under them.
    """
    lines = lines or {}
    out, seen, stack = [], set(), []
    for text in VALID_EVENT.splitlines():
        indent = len(text) - len(text.lstrip(" "))
        while stack and stack[-1][0] >= indent:
            stack.pop()
        stack.append((indent, text.strip().split(":", 1)[0]))
        path = ".".join(name for _, name in stack)
        seen.add(path)
        if any(path.startswith(f"{key}.") for key in (*lines, *drop)) or path in drop:
            continue
        out.append(lines.get(path, text))
    assert seen.issuperset({*lines, *drop}), "every key replaced or dropped is in VALID_EVENT"
    return "\n".join(out) + "\n"


def with_samples(csv: str | bytes, name: str = "s.csv") -> dict:
    return {"a.yaml": event() + f"samples: {name}\n", name: csv}


def alias_bomb(levels: int, width: int) -> str:
    rows = ["b0: &b0 [x, x]"]
    for i in range(1, levels):
        rows.append(f"b{i}: &b{i} [{', '.join([f'*b{i - 1}'] * width)}]")
    return "\n".join(rows) + "\n"


def nested(depth: int) -> str:
    return "".join(f"{'  ' * i}k{i}:\n" for i in range(depth)) + f"{'  ' * depth}v: 1\n"


@dataclass
class Case:
    files: dict
    where: str  # "FILE:LINE: key:" with FILE relative to the catalogue folder
    words: str  # a fragment of the message
    command: str = "check"
    links: dict = field(default_factory=dict)  # name -> target outside the catalogue
    # name -> "fifo", "folder", or "->TARGET" (a link to TARGET, relative, inside the folder)
    special: dict = field(default_factory=dict)


BOMB = alias_bomb(5, 30)  # more than 100 aliases
SMALL_BOMB = alias_bomb(9, 9)  # 73 aliases, 9**8 leaves if expanded: over the expanded size
TINY_BOMB = alias_bomb(4, 9)  # 27 aliases, 9**3 leaves: inside every limit
CASES = {
    # -- YAML syntax and size -------------------------------------------------------------
    "yaml_unclosed_bracket": Case(
        {"a.yaml": event({"detection.network": "  network: [A1, B1"})},
        "a.yaml:7: snr:",
        "not valid YAML",
    ),
    "yaml_tab_indent": Case(
        {"a.yaml": event({"estimate.lighter.mass": "\tmass: 29 Msun"})},
        "a.yaml:15:",
        "not valid YAML",
    ),
    "yaml_bad_indent": Case(
        {"a.yaml": event({"estimate.lighter.spin": "       spin: 0.0"})},
        "a.yaml:16: spin:",
        "is indented 7 spaces, more than line 15 above it",
    ),
    "alias_count": Case({"a.yaml": BOMB + event()}, "a.yaml:5: b4:", "more than 100 YAML aliases"),
    "alias_into_status": Case(
        {"a.yaml": TINY_BOMB + event({"status": "status: *b3"})},
        "a.yaml:8: status:",
        "invalid value",
    ),
    "alias_into_mass": Case(
        {"a.yaml": TINY_BOMB + event({"estimate.heavier.mass": "    mass: *b3"})},
        "a.yaml:16: estimate.heavier.mass:",
        "expected",
    ),
    "enormous_file": Case({"a.yaml": event() + "#" * 2_100_000 + "\n"}, "a.yaml:1:", "limit"),
    "deep_nesting_block": Case({"a.yaml": event() + nested(40)}, "a.yaml:", "nesting deeper"),
    "deep_nesting_flow": Case(
        {"a.yaml": event({"detection.network": "  network: " + "[" * 5000 + "]" * 5000})},
        "a.yaml:6: network:",
        "nesting deeper",
    ),
    "duplicate_key_top": Case(
        {"a.yaml": event() + "status: candidate\n"}, "a.yaml:19: status:", "duplicate key"
    ),
    "duplicate_key_nested": Case(
        {"a.yaml": event({"estimate.lighter.spin": "    mass: 30 Msun"})},
        "a.yaml:16: mass:",
        "duplicate key (first given on line 15)",
    ),
    "duplicate_id_across_files": Case(
        {"a.yaml": event(), "sub/b.yaml": event()}, "sub/b.yaml:1: id:", "duplicate id 'TEST-1'"
    ),
    "not_utf8": Case({"a.yaml": event().encode() + b"title2: caf\xe9\n"}, "a.yaml:19:", "UTF-8"),
    "binary_file": Case({"a.yaml": b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR"}, "a.yaml:1:", "UTF-8"),
    "nul_bytes": Case({"a.yaml": event().encode() + b"x: \x00\n"}, "a.yaml:19:", "NUL"),
    "empty_file": Case({"a.yaml": ""}, "a.yaml:1:", "empty"),
    "top_level_list": Case({"a.yaml": "- 1\n- 2\n"}, "a.yaml:1:", "mapping"),
    # -- leaving the catalogue and the output folder --------------------------------------
    "symlink_outside": Case(
        {"a.yaml": event()}, "b.yaml:", "outside the catalogue", links={"b.yaml": "outside.yaml"}
    ),
    "samples_path_escapes": Case(
        {"a.yaml": event() + "samples: ../outside.csv\n"}, "a.yaml:19: samples:", "outside"
    ),
    "samples_symlink_outside": Case(
        {"a.yaml": event() + "samples: s.csv\n"},
        "a.yaml:19: samples:",
        "outside",
        links={"s.csv": "outside.csv"},
    ),
    "id_with_dots": Case({"a.yaml": event({"id": "id: ../../etc"})}, "a.yaml:1: id:", "invalid id"),
    "id_absolute": Case({"a.yaml": event({"id": "id: /tmp/x"})}, "a.yaml:1: id:", "no slashes"),
    "id_dotdot": Case({"a.yaml": event({"id": 'id: ".."'})}, "a.yaml:1: id:", "invalid id"),
    "id_hidden": Case(
        {"a.yaml": event({"id": "id: .site"})}, "a.yaml:1: id:", "invalid id '.site'"
    ),
    "id_build": Case(
        {"a.yaml": event({"id": "id: ../escape"})}, "a.yaml:1: id:", "invalid id", command="build"
    ),
    # -- wrong types, units and ranges ------------------------------------------------------
    "mass_list": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: [36, 5]"})},
        "a.yaml:12: estimate.heavier.mass:",
        "expected",
    ),
    "mass_no_unit": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36 +5 -4"})},
        "a.yaml:12: estimate.heavier.mass:",
        "missing unit",
    ),
    "mass_wrong_unit": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36 +5 -4 Mpc"})},
        "a.yaml:12: estimate.heavier.mass:",
        "expected a mass",
    ),
    "distance_in_kg": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 440 kg"})},
        "a.yaml:17: estimate.distance:",
        "expected a length",
    ),
    "unknown_unit": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36 Msol"})},
        "a.yaml:12: estimate.heavier.mass:",
        "unknown unit",
    ),
    "log_unit": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36 dex(Msun)"})},
        "a.yaml:12: estimate.heavier.mass:",
        "logarithmic",
    ),
    "spin_out_of_range": Case(
        {"a.yaml": event({"estimate.heavier.spin": "    spin: 1.5"})},
        "a.yaml:13: estimate.heavier.spin:",
        "out of range",
    ),
    "negative_mass": Case(
        {"a.yaml": event({"estimate.lighter.mass": "    mass: -3 Msun"})},
        "a.yaml:15: estimate.lighter.mass:",
        "out of range",
    ),
    "snr_nan": Case(
        {"a.yaml": event({"detection.snr": "  snr: .nan"})}, "a.yaml:7: detection.snr:", "finite"
    ),
    "interval_inf": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36 +inf -4 Msun"})},
        "a.yaml:12: estimate.heavier.mass:",
        "expected",
    ),
    "huge_exponent": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: 36e999 Msun"})},
        "a.yaml:12: estimate.heavier.mass:",
        "finite",
    ),
    "huge_integer": Case(
        {
            "a.yaml": event(
                {"estimate.heavier.mass": "    mass: {median: " + "9" * 400 + ", unit: Msun}"}
            )
        },
        "a.yaml:12: estimate.heavier.mass:",
        "too large",
    ),
    "long_value_text": Case(
        {"a.yaml": event({"estimate.heavier.mass": "    mass: " + "1" * 5000 + " Msun"})},
        "a.yaml:12: estimate.heavier.mass:",
        "characters long",
    ),
    "bad_time": Case(
        {"a.yaml": event({"time": 'time: "2034-13-45"'})}, "a.yaml:3: time:", "bad time"
    ),
    "time_number": Case(
        {"a.yaml": event({"time": "time: 12"})}, "a.yaml:3: time:", "write the time in quotes"
    ),
    "missing_estimate": Case(
        {"a.yaml": event(drop=("estimate",))}, "a.yaml:1: estimate:", "missing required key"
    ),
    "estimate_not_mapping": Case(
        {"a.yaml": event({"estimate": "estimate: 36 Msun"})},
        "a.yaml:10: estimate:",
        "expected a mapping",
    ),
    "heavier_missing": Case(
        {"a.yaml": event(drop=("estimate.heavier",))},
        "a.yaml:11: estimate.heavier:",
        "missing required key",
    ),
    "body_not_mapping": Case(
        {"a.yaml": event({"estimate.heavier": "  heavier: 36 +5 -4 Msun"})},
        "a.yaml:11: estimate.heavier:",
        "expected a mapping {mass, spin, spin_magnitude, tilt}, e.g. {mass: 36 +5 -4 Msun}",
    ),
    "body_mass_missing": Case(
        {"a.yaml": event(drop=("estimate.lighter.mass",))},
        "a.yaml:15: estimate.lighter.mass:",
        "missing required key",
    ),
    "body_typo_key": Case(
        {"a.yaml": event({"estimate.heavier.spin": "    spn: 0.1"})},
        "a.yaml:13: estimate.heavier.spn:",
        "did you mean 'spin'",
    ),
    "detection_not_mapping": Case(
        {"a.yaml": event({"detection": "detection: [A1, B1]"})},
        "a.yaml:5: detection:",
        "expected a mapping {network, snr, false_alarm_rate, sky_area, sky_map}",
    ),
    "network_not_list": Case(
        {"a.yaml": event({"detection.network": "  network: {A1: B1}"})},
        "a.yaml:6: detection.network:",
        "list of labels",
    ),
    "typo_key": Case(
        {"a.yaml": event({"detection.snr": "  snrr: 14"})},
        "a.yaml:7: detection.snrr:",
        "did you mean 'snr'",
    ),
    "bad_status": Case(
        {"a.yaml": event({"status": "status: confimed"})}, "a.yaml:4: status:", "did you"
    ),
    "history_not_list": Case(
        {"a.yaml": event() + "history: 3\n"}, "a.yaml:19: history:", "list of earlier"
    ),
    "samples_path_nul": Case(
        {"a.yaml": event() + 'samples: "a\\0b.csv"\n'},
        "a.yaml:19: samples:",
        "control character (U+0000 NUL)",
    ),
    "mass_ratio_without_chirp_mass": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 440 Mpc\n  mass_ratio: 0.8"})},
        "a.yaml:18: estimate.mass_ratio:",
        "a mass ratio needs the chirp mass beside it",
    ),
    # -- contradictory inputs ---------------------------------------------------------------
    "effective_spin_and_body_spin": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 440 Mpc\n  effective_spin: 0.1"})},
        "a.yaml:18: estimate.effective_spin:",
        "give either effective_spin or the bodies' spin, not both",
    ),
    "redshift_disagrees": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 440 Mpc\n  redshift: 0.5"})},
        "a.yaml:18: estimate.redshift:",
        "disagrees with the luminosity distance",
    ),
    "lighter_heavier_than_heavier": Case(
        {"a.yaml": event({"estimate.lighter.mass": "    mass: 50 Msun"})},
        "a.yaml:15: estimate.lighter.mass:",
        "the lighter body's mass exceeds the heavier body's",
    ),
    # -- settings ---------------------------------------------------------------------------
    "unknown_cosmology": Case(
        {"a.yaml": event(), "catalogue.yaml": "cosmology: Planck19\n"},
        "catalogue.yaml:1: cosmology:",
        "did you mean",
    ),
    "credible_level_range": Case(
        {"a.yaml": event(), "catalogue.yaml": "credible_level: 1.5\n"},
        "catalogue.yaml:1: credible_level:",
        "out of range",
    ),
    "samples_count_text": Case(
        {"a.yaml": event(), "catalogue.yaml": "samples: many\n"},
        "catalogue.yaml:1: samples:",
        "whole number",
    ),
    "limit_negative": Case(
        {"a.yaml": event(), "catalogue.yaml": "limits:\n  max_depth: -1\n"},
        "catalogue.yaml:2: limits.max_depth:",
        "positive whole number",
    ),
    "limit_unknown": Case(
        {"a.yaml": event(), "catalogue.yaml": "limits:\n  max_rows: 5\n"},
        "catalogue.yaml:2: limits.max_rows:",
        "did you mean 'max_sample_rows'",
    ),
    "settings_wrong_type": Case(
        {"a.yaml": event(), "catalogue.yaml": "low_frequency: [20, Hz]\n"},
        "catalogue.yaml:1: low_frequency:",
        "expected",
    ),
    "settings_language_not_shipped": Case(
        {"a.yaml": event(), "catalogue.yaml": "languages: [en, fr]\n"},
        "catalogue.yaml:1: languages[1]:",
        "no translation for fr (available: en, es",
    ),
    "editorial_bad_language_code": Case(
        {"a.yaml": event({"summary": "summary:\n  en: A pair.\n  EN: A pair."})},
        "a.yaml:20: summary.EN:",
        "not a language code",
    ),
    # -- samples files ------------------------------------------------------------------------
    "samples_missing_column": Case(
        with_samples("heavier.mass [Msun],lighter.mass [Msun]\n30,20\n"),
        "s.csv:1: header:",
        "missing column(s): distance",
    ),
    "samples_bad_number": Case(
        with_samples(HEADER + "30,20,400\n30,x,400\n"), "s.csv:3: row:", "not a number"
    ),
    "samples_wrong_unit": Case(
        with_samples("heavier.mass [Mpc],lighter.mass [Msun],distance [Mpc]\n30,20,400\n"),
        "s.csv:1: heavier.mass:",
        "not a mass",
    ),
    "samples_out_of_range": Case(
        with_samples(HEADER + "30,20,400\n30,-2,400\n"), "s.csv:3: lighter.mass:", "physical range"
    ),
    "samples_too_many_rows": Case(
        {
            **with_samples(HEADER + "30,20,400\n" * 101),
            "catalogue.yaml": "limits:\n  max_sample_rows: 100\n",
        },
        "s.csv:102: row:",
        "more than 100 rows",
    ),
    "samples_million_rows": Case(
        with_samples(HEADER + "30,20,400\n" * 1_000_001), "s.csv:1000002: row:", "max_sample_rows"
    ),
    "samples_binary": Case(with_samples(b"\x00\x01\x02\xff"), "s.csv:1: file:", "not"),
    "samples_long_line": Case(with_samples(HEADER + "1," * 50_000), "s.csv:2: file:", "longer"),
    "samples_effective_spin_and_body_spin": Case(
        with_samples(
            "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc],effective_spin,heavier.spin\n"
            "30,20,400,0.1,0.1\n"
        ),
        "s.csv:1: effective_spin:",
        "give either effective_spin or the bodies' spin columns, not both",
    ),
    "samples_duplicate_column": Case(
        with_samples(
            "heavier.mass [Msun],lighter.mass [Msun],lighter.mass,distance [Mpc]\n1,1,1,1\n"
        ),
        "s.csv:1: lighter.mass:",
        "twice",
    ),
    "samples_tilt_without_magnitude": Case(
        with_samples(HEADER.rstrip() + ",heavier.tilt [deg]\n30,20,400,50\n"),
        "s.csv:1: heavier.tilt:",
        "needs the column heavier.spin_magnitude too",
    ),
    "samples_empty": Case(with_samples(""), "s.csv:1: file:", "empty"),
    "samples_in_build": Case(
        with_samples(HEADER + "30,20,inf\n"),
        "s.csv:2: distance:",
        "physical range",
        command="build",
    ),
    # -- files and folders that are not regular files (issue 11) ---------------------------
    "fifo_event_file": Case(
        {"a.yaml": event()}, "x.yaml:", "is a named pipe (FIFO)", special={"x.yaml": "fifo"}
    ),
    "fifo_catalogue_file": Case(
        {"a.yaml": event()},
        "catalogue.yaml:",
        "is a named pipe (FIFO)",
        special={"catalogue.yaml": "fifo"},
    ),
    "fifo_in_sub_folder": Case(
        {"a.yaml": event()}, "sub/y.yml:", "named pipe", special={"sub/y.yml": "fifo"}
    ),
    "fifo_samples_file": Case(
        {"a.yaml": event() + "samples: s.csv\n"},
        "a.yaml:19: samples:",
        "is a named pipe (FIFO)",
        special={"s.csv": "fifo"},
    ),
    "fifo_in_build": Case(
        {"a.yaml": event()}, "x.yaml:", "named pipe", command="build", special={"x.yaml": "fifo"}
    ),
    "symlink_loop_self": Case(
        {"a.yaml": event()}, "x.yaml:", "link loop", special={"x.yaml": "->x.yaml"}
    ),
    "symlink_loop_pair": Case(
        {"a.yaml": event()}, "x.yaml:", "link loop", special={"x.yaml": "->y", "y": "->x.yaml"}
    ),
    "symlink_loop_catalogue_file": Case(
        {"a.yaml": event()},
        "catalogue.yaml:",
        "link loop",
        special={"catalogue.yaml": "->catalogue.yaml"},
    ),
    "symlink_loop_samples": Case(
        {"a.yaml": event() + "samples: s.csv\n"},
        "a.yaml:19: samples:",
        "link loop",
        special={"s.csv": "->s.csv"},
    ),
    "symlink_dangling": Case(
        {"a.yaml": event()}, "x.yaml:", "dangling link", special={"x.yaml": "->gone.yaml"}
    ),
    "symlink_dangling_catalogue_file": Case(
        {"a.yaml": event()},
        "catalogue.yaml:",
        "dangling link",
        special={"catalogue.yaml": "->gone.yaml"},
    ),
    "symlink_dangling_samples": Case(
        {"a.yaml": event() + "samples: s.csv\n"},
        "a.yaml:19: samples:",
        "dangling link",
        special={"s.csv": "->gone.csv"},
    ),
    "folder_named_yaml": Case(
        {"a.yaml": event()}, "x.yaml:", "is a folder", special={"x.yaml": "folder"}
    ),
    "folder_named_yml_deep": Case(
        {"a.yaml": event()}, "sub/y.yml:", "is a folder", special={"sub/y.yml": "folder"}
    ),
    "folder_named_catalogue_yaml": Case(
        {"a.yaml": event()}, "catalogue.yaml:", "is a folder", special={"catalogue.yaml": "folder"}
    ),
    "folder_as_samples_file": Case(
        {"a.yaml": event() + "samples: s.csv\n"},
        "a.yaml:19: samples:",
        "is a folder",
        special={"s.csv": "folder"},
    ),
    # -- control characters and lone surrogates in any text (issue 11) ----------------------
    "text_esc_in_title": Case(
        {"a.yaml": event({"title": 'title: "\\e[31mred"'})},
        "a.yaml:2: title:",
        "control character (U+001B ESC)",
    ),
    "text_x1b_in_summary": Case(
        {"a.yaml": event({"summary": 'summary: "a \\x1b]0;owned\\x07 b"'})},
        "a.yaml:18: summary:",
        "U+001B ESC",
    ),
    "text_nul_in_label": Case(
        {"a.yaml": event({"detection.network": '  network: [A1, "B\\0"]'})},
        "a.yaml:6: detection.network[1]:",
        "U+0000 NUL",
    ),
    "text_surrogate_in_title": Case(
        {"a.yaml": event({"title": 'title: "\\ud800"'})},
        "a.yaml:2: title:",
        "lone surrogate U+D800",
    ),
    "text_surrogate_in_build": Case(
        {"a.yaml": event({"title": 'title: "x\\udcff"'})},
        "a.yaml:2: title:",
        "lone surrogate",
        command="build",
    ),
    "text_c1_in_caveat": Case(
        {"a.yaml": event() + 'caveats:\n  - fine\n  - "\\x9b2J"\n'},
        "a.yaml:21: caveats[1]:",
        "U+009B",
    ),
    "text_control_in_key": Case(
        {"a.yaml": event() + '"\\e[2J": 1\n'}, "a.yaml:19:", "a key contains a control character"
    ),
    "text_control_in_history_note": Case(
        {
            "a.yaml": event()
            + "history:\n  - date: 2034-04-12\n    label: First\n"
            + '    note: "\\a"\n    estimate: {heavier: {mass: 30 Msun}, '
            + "lighter: {mass: 20 Msun}, distance: 400 Mpc}\n"
        },
        "a.yaml:22: history[0].note:",
        "U+0007",
    ),
    "text_control_in_settings": Case(
        {"a.yaml": event(), "catalogue.yaml": 'description: "\\e[1mbold"\n'},
        "catalogue.yaml:1: description:",
        "U+001B ESC",
    ),
    "text_control_in_comparison_label": Case(
        {
            "a.yaml": event(),
            "catalogue.yaml": 'comparisons:\n  sun: {label: "the \\e Sun"}\n',
        },
        "catalogue.yaml:2: comparisons.sun.label:",
        "U+001B ESC",
    ),
    "text_control_in_samples_header": Case(
        with_samples(HEADER.rstrip() + ",note\x1b[31m\n30,20,400,1\n"),
        "s.csv:1: header:",
        "column 4's name contains a control character (U+001B ESC)",
    ),
    "text_c1_in_samples_header": Case(
        with_samples("\u009bheavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n30,20,400\n"),
        "s.csv:1: header:",
        "U+009B",
    ),
    "text_newline_in_title": Case(
        {"a.yaml": event({"title": 'title: "one\\ntwo"'})}, "a.yaml:2: title:", "one line"
    ),
    "text_newline_in_label": Case(
        {"a.yaml": event({"detection.network": '  network: [A1, "B\\n1"]'})},
        "a.yaml:6: detection.network:",
        "one line",
    ),
    # -- YAML means what a person wrote (issue 11) -------------------------------------------
    "yaml_merge_key": Case(
        {
            "a.yaml": "masses: &m {mass: 36 +5 -4 Msun}\n"
            + event({"estimate.heavier.mass": "    <<: *m"})
        },
        "a.yaml:13: estimate.heavier:",
        "merge keys are not supported: write the keys out",
    ),
    "yaml_merge_key_flow": Case(
        {"a.yaml": event({"detection": "detection: {<<: {snr: 3}}"})},
        "a.yaml:5: detection:",
        "merge keys are not supported",
    ),
    "yaml_yes_is_text": Case(
        {"a.yaml": event({"status": "status: yes"})}, "a.yaml:4: status:", "invalid value 'yes'"
    ),
    "yaml_sexagesimal_is_text": Case(
        {"a.yaml": event({"time": "time: 21:24"})}, "a.yaml:3: time:", "bad time '21:24'"
    ),
    "yaml_binary_tag": Case(
        {"a.yaml": event({"title": "title: !!binary aGk="})},
        "a.yaml:2: title:",
        "tag !!binary is not supported",
    ),
    "yaml_inf_snr": Case(
        {"a.yaml": event({"detection.snr": "  snr: .inf"})}, "a.yaml:7: detection.snr:", "finite"
    ),
    # -- amplification within the limits (issue 11) ------------------------------------------
    "expanded_alias_bomb": Case(
        {"a.yaml": SMALL_BOMB + event()}, "a.yaml:7:", "expands to more than 2000000 characters"
    ),
    "expanded_big_text": Case(
        {
            "a.yaml": event({"summary": "summary: &s " + "x" * 30_000})
            + "caveats:\n"
            + "  - *s\n" * 99
        },
        "a.yaml:85:",
        "expands to more than",
    ),
    "long_title": Case(
        {"a.yaml": event({"title": "title: " + "t" * 201})}, "a.yaml:2: title:", "at most 200"
    ),
    "long_history_label": Case(
        {
            "a.yaml": event()
            + "history:\n  - date: 2034-04-12\n    label: "
            + "l" * 300
            + "\n    estimate: {heavier: {mass: 30 Msun}, lighter: {mass: 20 Msun}, "
            + "distance: 400 Mpc}\n"
        },
        "a.yaml:21: history[0].label:",
        "at most 200",
    ),
    "long_summary": Case(
        {"a.yaml": event({"summary": "summary: " + "s" * 100_001})},
        "a.yaml:18: summary:",
        "at most 100000",
    ),
    # -- what check accepts the build must be able to do (issue 11) --------------------------
    "distance_beyond_table": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 2e7 Mpc"})},
        "a.yaml:17: estimate.distance:",
        "beyond",
    ),
    "distance_interval_beyond_table": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 1.3e7 +2e6 -1e6 Mpc"})},
        "a.yaml:17: estimate.distance:",
        "redshift 1000 under Planck18",
    ),
    "distance_beyond_table_build": Case(
        {"a.yaml": event({"estimate.distance": "  distance: 20000 Gpc"})},
        "a.yaml:17: estimate.distance:",
        "beyond",
        command="build",
    ),
    "distance_history_beyond_table": Case(
        {
            "a.yaml": event()
            + "history:\n  - date: 2034-04-12\n    label: First\n    estimate:\n"
            + "      heavier: {mass: 30 Msun}\n      lighter: {mass: 20 Msun}\n"
            + "      distance: 1e9 Mpc\n"
        },
        "a.yaml:25: history[0].estimate.distance:",
        "beyond",
    ),
    "distance_samples_row_beyond_table": Case(
        with_samples(HEADER + "30,20,400\n30,20,5e7\n"), "s.csv:3: distance:", "beyond"
    ),
    "sky_area_above_whole_sky": Case(
        {"a.yaml": event({"detection.sky_area": "  sky_area: 41253 deg2"})},
        "a.yaml:9: detection.sky_area:",
        "the whole sky is 41252.96 deg2",
    ),
    "sky_area_in_steradians": Case(
        {"a.yaml": event({"detection.sky_area": "  sky_area: 13 sr"})},
        "a.yaml:9: detection.sky_area:",
        "whole sky",
    ),
    "leap_second_that_does_not_exist": Case(
        {"a.yaml": event({"time": 'time: "2034-04-12T23:59:60"'})},
        "a.yaml:3: time:",
        "ends without a leap second",
    ),
    "leap_second_in_embargo": Case(
        {"a.yaml": event() + 'embargo_until: "2017-06-30T23:59:60"\n'},
        "a.yaml:19: embargo_until:",
        "ends without a leap second",
    ),
    "second_60_mid_day": Case(
        {"a.yaml": event({"time": 'time: "2034-04-12T12:00:60"'})}, "a.yaml:3: time:", "not exist"
    ),
    "year_999": Case(
        {"a.yaml": event({"time": 'time: "0999-04-12T07:26:41"'})},
        "a.yaml:3: time:",
        "year 999 is outside 1960 to 9999",
    ),
    "year_1": Case(
        {"a.yaml": event({"time": 'time: "0001-01-01"'})}, "a.yaml:3: time:", "year 1 is outside"
    ),
    "year_1899_history": Case(
        {
            "a.yaml": event()
            + "history:\n  - date: 1899-04-12\n    label: First\n"
            + "    estimate: {heavier: {mass: 30 Msun}, lighter: {mass: 20 Msun}, "
            + "distance: 400 Mpc}\n"
        },
        "a.yaml:20: history[0].date:",
        "year 1899",
    ),
    "id_trailing_newline": Case(
        {"a.yaml": event({"id": 'id: "X\\n"'})}, "a.yaml:1: id:", "invalid id"
    ),
    "id_trailing_newline_build": Case(
        {"a.yaml": event({"id": "id: |\n  X"})}, "a.yaml:1: id:", "invalid id", command="build"
    ),
    "id_with_space": Case({"a.yaml": event({"id": 'id: "X Y"'})}, "a.yaml:1: id:", "invalid id"),
    "ids_differ_in_case": Case(
        {"a.yaml": event(), "b.yaml": event({"id": "id: test-1"})},
        "b.yaml:1: id:",
        "only in letter case",
    ),
    "base_url_javascript": Case(
        {"a.yaml": event(), "catalogue.yaml": 'base_url: "javascript:alert(1)//"\n'},
        "catalogue.yaml:1: base_url:",
        "expected an http:// or https:// URL with a host",
    ),
    "base_url_no_host": Case(
        {"a.yaml": event(), "catalogue.yaml": "base_url: https:///sheets/\n"},
        "catalogue.yaml:1: base_url:",
        "with a host",
    ),
    "base_url_build": Case(
        {"a.yaml": event(), "catalogue.yaml": "base_url: data:text/html,x\n"},
        "catalogue.yaml:1: base_url:",
        "http",
        command="build",
    ),
}


def _write(root: Path, case: Case) -> Path:
    folder = root / "cat"
    for name, content in case.files.items():
        path = folder / name
        path.parent.mkdir(parents=True, exist_ok=True)
        if isinstance(content, bytes):
            path.write_bytes(content)
        else:
            path.write_text(content, encoding="utf-8")
    folder.mkdir(parents=True, exist_ok=True)
    for name, target in case.links.items():
        (root / target).write_text(event(), encoding="utf-8")
        os.symlink(root / target, folder / name)
    for name, kind in case.special.items():
        path = folder / name
        path.parent.mkdir(parents=True, exist_ok=True)
        if kind == "fifo":
            os.mkfifo(path)
        elif kind == "folder":
            path.mkdir()
        else:
            os.symlink(kind.removeprefix("->"), path)
    return folder


def _run(root: Path, case: Case) -> subprocess.CompletedProcess:
    folder = _write(root, case)
    extra = ["-o", str(root / "out")] if case.command == "build" else []
    command = [sys.executable, "-m", "factsheet.cli", case.command, str(folder), *extra]
    try:
        return subprocess.run(command, capture_output=True, text=True, timeout=300)
    except subprocess.TimeoutExpired:  # a reader blocked on a FIFO, say: fail this case only
        return subprocess.CompletedProcess(command, -1, "", "timed out after 300 s")


@pytest.fixture(scope="module")
def results(tmp_path_factory):
    """Run every case, a few subprocesses at a time."""
    roots = {name: tmp_path_factory.mktemp(name) for name in CASES}
    with ThreadPoolExecutor(max_workers=3) as pool:
        futures = {name: pool.submit(_run, roots[name], c) for name, c in CASES.items()}
        return {name: (roots[name] / "cat", f.result()) for name, f in futures.items()}


def test_corpus_is_large_enough():
    assert len(CASES) >= 40


@pytest.mark.parametrize("name", list(CASES))
def test_bad_input_is_reported_cleanly(results, name):
    folder, result = results[name]
    case = CASES[name]
    assert result.returncode == 1, result.stdout + result.stderr
    assert "Traceback" not in result.stderr
    expected = f"error: {folder}/{case.where}"
    lines = [line for line in result.stderr.splitlines() if line.startswith(expected)]
    assert lines, f"no line starting {expected!r} in:\n{result.stderr}"
    assert any(case.words in line for line in lines), result.stderr
    assert len(result.stderr) < 20_000  # nothing echoes a huge or expanded input back


def test_raised_limits_accept_what_the_defaults_refuse(tmp_path):
    settings = (
        "limits:\n  max_file_bytes: 3000000\n  max_depth: 60\n  max_aliases: 200\n"
        "  max_sample_rows: 2000000\n"
    )
    labels = "  network: [&d A1" + ", *d" * 150 + "]"
    files = {
        "catalogue.yaml": settings,
        "a.yaml": event({"detection.network": labels}) + "#" * 2_100_000,
    }
    result = _run(tmp_path, Case(files, "", ""))
    assert result.returncode == 0, result.stderr
    assert "no problems found" in result.stdout


def test_failed_build_keeps_the_existing_site(tmp_path):
    good = _run(tmp_path, Case({"a.yaml": event()}, "", "", command="build"))
    assert good.returncode == 0, good.stderr
    before = _snapshot(tmp_path / "out")
    (tmp_path / "cat" / "a.yaml").write_text(
        event({"detection.snr": "  snr: -1"}), encoding="utf-8"
    )
    bad = subprocess.run(
        [
            sys.executable,
            "-m",
            "factsheet.cli",
            "build",
            str(tmp_path / "cat"),
            "-o",
            str(tmp_path / "out"),
        ],
        capture_output=True,
        text=True,
    )
    assert bad.returncode == 1 and "Traceback" not in bad.stderr
    assert f"{tmp_path / 'cat' / 'a.yaml'}:7: detection.snr:" in bad.stderr
    assert _snapshot(tmp_path / "out") == before


def test_missing_catalogue_folder(tmp_path):
    result = subprocess.run(
        [sys.executable, "-m", "factsheet.cli", "check", str(tmp_path / "nowhere")],
        capture_output=True,
        text=True,
    )
    assert result.returncode == 1 and "Traceback" not in result.stderr
    assert "catalogue folder not found" in result.stderr


def _snapshot(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes() for p in folder.rglob("*") if p.is_file()}
