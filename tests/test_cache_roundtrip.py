"""A bundle read back from the build cache renders exactly as the bundle it was made from.

A build killed after storing an event's bundle but before storing its pages makes the next
build render those pages from the cached bundle; they must be the bytes a fresh build writes.
"""

from __future__ import annotations

import json
from dataclasses import replace

from helpers import VALID_EVENT

from factsheet.build import _summaries_only, event_bundle
from factsheet.cache import Cache, event_key
from factsheet.load import load_catalogue
from factsheet.load.reference import reference_for
from factsheet.render.event_json import event_json
from factsheet.render.site import for_catalogue


def test_a_cached_bundle_gives_the_same_json_bytes(catalogue, tmp_path):
    cat = load_catalogue(catalogue({"a.yaml": VALID_EVENT}))
    (event,) = cat.events
    reference = reference_for(cat.settings)
    made = event_bundle(event, cat.settings, reference)
    cache = Cache(tmp_path / "site")
    key = event_key(event, cat.settings)
    kept = cache.store(key, made, event, cat.settings, reference)
    read = Cache(tmp_path / "site").load(key, event, cat.settings, reference)
    assert read is not None
    fresh = json.dumps(event_json(_summaries_only(made.derived)), indent=2)
    assert json.dumps(event_json(read.derived), indent=2) == fresh
    # what the build keeps of a bundle it just made is the bundle a later build reads back
    assert json.dumps(event_json(kept.derived), indent=2) == fresh
    assert kept.files == {} and kept.key == key


def _stored(catalogue, tmp_path):
    """One event made and stored, then read back whole and lean by later builds."""
    cat = load_catalogue(catalogue({"a.yaml": VALID_EVENT}))
    (event,) = cat.events
    reference = reference_for(cat.settings)
    cache = Cache(tmp_path / "site")
    key = event_key(event, cat.settings)
    cache.store(key, event_bundle(event, cat.settings, reference), event, cat.settings, reference)
    whole = Cache(tmp_path / "site").load(key, event, cat.settings, reference)
    lean = Cache(tmp_path / "site").load(key, event, cat.settings, reference, lean=True)
    return cat, event, reference, cache, key, whole, lean


def test_a_lean_bundle_is_the_part_the_catalogue_keeps(catalogue, tmp_path):
    cat, event, reference, cache, key, whole, lean = _stored(catalogue, tmp_path)
    assert whole is not None and lean is not None and whole.derived.caveats
    assert lean == for_catalogue(whole)
    made = event_bundle(event, cat.settings, reference)
    kept = cache.store(key, made, event, cat.settings, reference, lean=True)
    assert kept == replace(lean, figure_seconds=made.figure_seconds)


def test_files_handed_on_one_at_a_time_are_recorded_once_all_passed(tmp_path):
    cache = Cache(tmp_path / "site")
    pairs = [("a.html", b"first"), ("b.xml", b"second")]
    passing = cache.recording("k1", iter(pairs))
    assert next(passing) == pairs[0]
    assert cache._entry("k1") is None  # nothing recorded before the last file has passed
    assert list(passing) == pairs[1:]
    recorded = cache._entry("k1")["files"]
    assert recorded == Cache(tmp_path / "site")._entry("k1")["files"]
    # what store_files records of the same files, to the byte
    cache.store_files("k2", dict(pairs))
    assert recorded == cache._entry("k2")["files"]
    stopped = cache.recording("k3", iter(pairs))
    next(stopped)
    stopped.close()  # the files stopped short: no entry
    assert cache._entry("k3") is None


def test_stamps_and_records_written_a_part_at_a_time_are_plain_json(tmp_path):
    from factsheet.cache import FORMAT, RECORDS, STAMPS

    cache = Cache(tmp_path / "site")
    names = ["events/a.html", 'odd "é" name.svg', "data/b.json"]
    for name in names:
        (tmp_path / "site" / name).parent.mkdir(parents=True, exist_ok=True)
        (tmp_path / "site" / name).write_bytes(name.encode())
    cache.stamp_site({name: "0" * 64 for name in [*names, "gone.svg"]})  # one file is gone
    text = (cache.root / STAMPS).read_text(encoding="utf-8")
    data = json.loads(text)
    assert data["format"] == FORMAT and list(data["files"]) == names
    assert text == json.dumps(data, separators=(",", ":"))  # as one json.dumps writes it
    records = {"a.yaml": '{"n":1}', "tab\there.yaml": '{"n":2}'}
    cache.write_records(records)
    assert cache.read_records() == records
    assert (cache.root / RECORDS).read_text(encoding="utf-8").count("\n") == len(records)


def test_a_lean_bundle_packs_its_summaries_and_gives_them_back_equal(catalogue, tmp_path):
    from factsheet.cache import PackedSummaries, packed_summaries

    *_, whole, lean = _stored(catalogue, tmp_path)
    assert whole is not None and lean is not None
    packed = lean.derived.quantities
    assert isinstance(packed, PackedSummaries)
    assert dict(packed) == dict(whole.derived.quantities) and list(packed) == list(
        whole.derived.quantities
    )
    spreads = [k for k, s in whole.derived.quantities.items() if s.fit_spread is not None]
    assert spreads and all(
        packed[k].fit_spread == whole.derived.quantities[k].fit_spread for k in spreads
    )
    assert "no_such_quantity" not in packed and packed.get("no_such_quantity") is None
    # numbers that are not floats keep their exact type: a plain dict of summaries
    odd = {
        "distance": {
            "median": 400,
            "low": 300.0,
            "high": 500.0,
            "unit": "Mpc",
            "level": 0.9,
            "methods": [],
        }
    }
    assert type(packed_summaries(odd)) is dict and packed_summaries(odd)["distance"].median == 400
