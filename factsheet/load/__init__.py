"""Load stage: a catalogue folder of YAML files (and samples files) in, typed records out.

:func:`load_catalogue` reads and checks a whole folder; every problem names its file, line and
key. The records it returns are in :mod:`factsheet.model`.
"""

from factsheet.load.catalogue import load_catalogue, load_event, load_settings

__all__ = ["load_catalogue", "load_event", "load_settings"]
