"""The files of one sheet that take time to make: its figures and its chirp sounds.

:func:`event_files` runs in a build worker right after the event is derived. matplotlib is
loaded only here, when something is drawn.
"""

from __future__ import annotations

from factsheet.model import Audio, Derived, FigureInfo
from factsheet.render.sound import event_sound


def event_files(
    item: Derived,
) -> tuple[tuple[FigureInfo, ...], Audio, dict[str, bytes], float]:
    """The figures (as page information), the sound, every file's bytes by site path, and the
    seconds spent drawing."""
    from factsheet.render import figures  # matplotlib loads only where figures are drawn

    drawn = figures.event_figures(item)
    files = {fig.path: fig.svg for fig in drawn}
    audio, sounds = event_sound(item)
    files.update(sounds)
    seconds = sum(f.seconds for f in drawn)
    return tuple(f.info for f in drawn), audio, files, seconds
