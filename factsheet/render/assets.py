"""The files of one sheet that take time to make: its figures and its chirp sounds (and the
copy of its samples file, published beside the JSON).

:func:`event_files` runs in a build worker right after the event is derived. matplotlib is
loaded only here, when something is drawn.
"""

from __future__ import annotations

import hashlib
from collections.abc import Sequence

from factsheet.errors import BuildError
from factsheet.i18n import SOURCE, use_language
from factsheet.model import Audio, Derived, Event, FigureInfo
from factsheet.render.sound import event_sound


def event_files(
    item: Derived, languages: Sequence[str] = (SOURCE,)
) -> tuple[dict[str, tuple[FigureInfo, ...]], Audio, dict[str, bytes], float]:
    """The figures (as page information, by language), the sound, every file's bytes by site
    path, and the seconds spent drawing.

    Figures are drawn once per language (under :func:`~factsheet.i18n.use_language`), the
    others' files under ``<lang>/``; a figure whose file comes out byte for byte as the first
    language's (it has no words) is not published twice. The sound is made once."""
    from factsheet.render import figures  # matplotlib loads only where figures are drawn

    infos: dict[str, tuple[FigureInfo, ...]] = {}
    files: dict[str, bytes] = {}
    seconds = 0.0
    for n, language in enumerate(languages):
        with use_language(language):
            drawn = figures.event_figures(item)
        seconds += sum(f.seconds for f in drawn)
        placed = []
        for fig in drawn:
            path = fig.path
            if n and files.get(path) != fig.svg:
                path = language_path(language, path)
            files[path] = fig.svg
            placed.append(FigureInfo(path, fig.alt, fig.caption))
        infos[language] = tuple(placed)
    audio, sounds = event_sound(item)
    files.update(sounds)
    files.update(samples_copy(item))
    return infos, audio, files, seconds


def language_path(language: str, path: str) -> str:
    """Where a file of a language other than the site's first is published: ``<lang>/path``."""
    return f"{language}/{path}"


def samples_path(event: Event) -> str:
    """Where a sheet's samples file is published (empty when the input has none)."""
    if event.samples is None:
        return ""
    return f"data/{event.id}-samples{event.samples.path.suffix.lower()}"


def samples_copy(item: Derived) -> dict[str, bytes]:
    """The event's samples file as it was read (its digest is checked, so a file that changed
    since it was loaded fails the build instead of publishing other numbers)."""
    event = item.event
    if event.samples is None:
        return {}
    try:
        data = event.samples.path.read_bytes()
    except OSError as exc:
        raise BuildError(
            f"{event.samples.path}: cannot read the samples file ({exc.strerror})"
        ) from exc
    if hashlib.sha256(data).hexdigest() != event.samples.digest:
        raise BuildError(
            f"{event.samples.path}: the samples file changed during the build; build again"
        )
    return {samples_path(event): data}
