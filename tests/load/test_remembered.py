"""Events remembered between builds: the JSON round trip and when a record may be used."""

import json
import os
import time

import pytest
from helpers import VALID_EVENT, write_catalogue

from factsheet.errors import Problem
from factsheet.load import load_catalogue
from factsheet.load.catalogue import Memory, Packed
from factsheet.load.remembered import event_from_json, event_to_json, file_record, recall
from factsheet.resources import demo_dir


def _age(folder, seconds=3600):
    then = time.time() - seconds
    for path in folder.rglob("*"):
        os.utime(path, (then, then))


def test_every_demo_event_reads_back_equal():
    for event in load_catalogue(demo_dir()).events:
        back = event_from_json(event_to_json(event))
        assert back == event
        assert back.summary.versions == event.summary.versions  # editors' texts by language
        assert back.time.isot == event.time.isot and back.time.scale == event.time.scale
        if event.samples is not None:
            assert not any(len(v) for v in back.samples.values.values())  # values not kept


def test_json_names_only_the_models_classes():
    data = event_to_json(load_catalogue(demo_dir()).events[0])
    data["~"] = "Path"
    with pytest.raises(KeyError):
        event_from_json(data)


def test_a_record_is_used_only_while_its_file_is_unchanged(tmp_path):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    _age(cat)
    event = load_catalogue(cat).events[0]
    warning = Problem(event.source, 3, "id", "a warning")
    record = file_record(event, [warning])
    assert record is not None
    found = recall(record)
    assert found is not None and found[0] == event and found[1] == [warning]
    source = cat / "a.yaml"
    then = source.stat().st_mtime
    os.utime(source, (then + 10, then + 10))  # touched, same bytes: the hash says unchanged
    assert recall(record) is not None
    source.write_text(VALID_EVENT.replace("A test pair", "A test pair, edited"))
    assert recall(record) is None


def test_a_file_written_just_now_is_not_remembered(tmp_path):
    cat = write_catalogue(tmp_path / "cat", {"a.yaml": VALID_EVENT})
    assert file_record(load_catalogue(cat).events[0], []) is None


def test_loading_with_a_memory_reads_only_changed_files(tmp_path):
    cat = write_catalogue(
        tmp_path / "cat",
        {"a.yaml": VALID_EVENT, "b.yaml": VALID_EVENT.replace("id: TEST-1", "id: TEST-2")},
    )
    _age(cat)
    first = Memory({}, "code")
    before = load_catalogue(cat, first)
    assert first.recalled == 0 and len(first.fresh) == 2
    second = Memory(first.fresh, "code")
    again = load_catalogue(cat, second)
    assert second.recalled == 2 and again.events == before.events
    edit = VALID_EVENT.replace("id: TEST-1", "id: TEST-2").replace("A test pair", "Edited pair")
    (cat / "b.yaml").write_text(edit)
    third = Memory(second.fresh, "code")
    edited = load_catalogue(cat, third)
    assert third.recalled == 1 and "Edited pair" in str(edited.events[1].title)
    other_code = Memory(second.fresh, "other code")
    load_catalogue(cat, other_code)
    assert other_code.recalled == 0


def test_fresh_records_are_held_packed_and_read_back_whole():
    memory = Memory({}, "code")
    loaded = load_catalogue(demo_dir(), memory)
    texts = memory.fresh
    assert isinstance(texts, Packed) and len(texts) == len(loaded.events)
    plain = {name: texts[name] for name in texts}
    assert all(json.loads(text)["fingerprint"] == memory.fingerprint for text in plain.values())
    packed = sum(map(len, texts._packed.values()))
    assert packed < sum(len(t.encode()) for t in plain.values()) / 2  # held at under half
    again = Memory(dict(texts), "code")
    assert len(load_catalogue(demo_dir(), again).events) == len(loaded.events)
    assert again.recalled == len(plain)
