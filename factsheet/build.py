"""The build, stage by stage: load, select, derive, draw and render each event's page (per
event, cached, in parallel), render the catalogue pages, publish.

Everything is loaded and checked before any work starts; each event's bundle (derived numbers,
figures, sound) comes from the cache when its inputs are unchanged, else from a worker, which
also renders the event's page; the catalogue pages are rendered from the part of every bundle
they read, and the new site is swapped in whole at the end.
"""

from __future__ import annotations

import contextlib
import ctypes
import functools
import gc
import multiprocessing
import os
import signal
import sys
import threading
import time as clock
from collections.abc import Iterator
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass, replace
from pathlib import Path

import jinja2
import numpy as np
from astropy.time import Time

from factsheet import i18n
from factsheet.cache import Cache, code_fingerprint, content_key, event_key
from factsheet.errors import BuildError, InputError, Problem
from factsheet.i18n import use_language
from factsheet.load import load_catalogue
from factsheet.load.catalogue import Memory, load_event
from factsheet.load.reference import reference_for
from factsheet.load.remembered import needs_reading
from factsheet.model import (
    Catalogue,
    Derived,
    Event,
    EventBundle,
    Reference,
    Settings,
    SiteFigure,
)
from factsheet.progress import Progress
from factsheet.publish import HELD, OutputLock, Staging, check_output
from factsheet.render import Site, render_site
from factsheet.render.assets import event_files, language_path
from factsheet.render.environment import make_environment, templates_fingerprint
from factsheet.render.site import (
    Renderer,
    event_page_files,
    event_page_key,
    for_catalogue,
    plane_edges,
)


@dataclass(frozen=True)
class BuildReport:
    """What a build did, for the one-line summary."""

    built: int
    reused: int
    withheld_internal: int
    withheld_embargo: int
    seconds: float
    figure_seconds: float
    out: Path
    warnings: tuple[Problem, ...] = ()
    skipped: tuple[tuple[Path, str], ...] = ()  # files of the catalogue folder not read, and why


def build_time() -> Time:
    """The build's clock: ``SOURCE_DATE_EPOCH`` when set (reproducible builds), else now."""
    epoch = os.environ.get("SOURCE_DATE_EPOCH")
    if not epoch:
        return Time.now()
    if not epoch.strip().isdigit():
        raise BuildError(
            f"SOURCE_DATE_EPOCH: expected a whole number of seconds since 1970, got {epoch[:40]!r}"
        )
    return Time(int(epoch), format="unix")


def available_cores() -> int:
    """The cores this process may run on (its CPU affinity where the system has one, which a
    container or ``taskset`` narrows), the default number of build workers."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # no affinity on this system
        return os.cpu_count() or 1


def select_events(catalogue: Catalogue, audience: str, now: Time) -> tuple[list[Event], int, int]:
    """The events an audience may see, and how many were withheld as internal or embargoed."""
    if audience == "internal":
        return list(catalogue.events), 0, 0
    internal = [e for e in catalogue.events if e.visibility == "internal"]
    embargoed = [
        e
        for e in catalogue.events
        if e.visibility != "internal" and e.embargo_until is not None and e.embargo_until > now
    ]
    hidden = {e.id for e in internal + embargoed}
    return [e for e in catalogue.events if e.id not in hidden], len(internal), len(embargoed)


def build(
    catalogue_dir: str | Path,
    out: str | Path,
    audience: str = "public",
    force: bool = False,
    jobs: int | None = None,
    progress: bool = False,
    strict: bool = False,
) -> BuildReport:
    """Build the site for ``catalogue_dir`` into ``out``; ``strict`` makes warnings fatal.

    Nothing is written before the whole catalogue checks out and the output is known to be a
    safe place (:func:`~factsheet.publish.check_output`); one build at a time holds the output.
    """
    start, out = clock.perf_counter(), Path(out)
    check_output(out, Path(catalogue_dir))
    cache = Cache(out)
    memory = Memory(cache.read_records(), code_fingerprint())
    catalogue = load_catalogue(catalogue_dir, memory)
    if strict and catalogue.warnings:
        raise InputError(problems=list(catalogue.warnings))
    events, internal, embargoed = select_events(catalogue, audience, build_time())
    shown = Progress(progress)
    try:
        with OutputLock(out):
            made, index, count = _build_locked(
                events, catalogue, cache, out, audience, force, jobs, shown
            )
            cache.write_records(memory.fresh)
    except OSError as exc:
        raise BuildError(_os_problem(exc, out)) from exc
    figure_seconds = sum(b.figure_seconds for b in made) + sum(
        f.seconds for figs in index.values() for f in figs
    )
    return BuildReport(
        count,
        count - len(made),
        internal,
        embargoed,
        clock.perf_counter() - start,
        figure_seconds,
        out,
        catalogue.warnings,
        catalogue.skipped,
    )


def _build_locked(events, catalogue, cache, out, audience, force, jobs, progress: Progress):
    """The part of a build that writes: bundles, pages, the swap; the output's lock is held.

    Files an unchanged entry of the cache recorded are linked from the site being replaced;
    everything else is written afresh into the staging folder."""
    settings, templates = catalogue.settings, templates_fingerprint()
    jobs = jobs or available_cores()
    with Staging(out, force) as staging:
        bundles, made, premade = make_bundles(
            events,
            settings,
            cache,
            jobs,
            progress,
            staging,
            catalogue.root,
            audience,
            templates,
        )
        index = _index_figures(bundles, settings, cache, jobs)

        def memo(parts: tuple, make):
            key = content_key("page", *parts)
            if key in premade or cache.place(key, staging.link):
                return None  # already in place
            files = make()
            if isinstance(files, dict):
                cache.store_files(key, files)
                return files
            return cache.recording(key, files)  # pairs, recorded as they pass

        def whole(bundle: EventBundle) -> EventBundle:
            event = bundle.derived.event
            found = cache.load(bundle.key, event, settings, reference_for(settings), again=True)
            if found is None:  # damaged since it was read lean: the next build makes it afresh
                cache.forget(bundle.key)
                raise BuildError(
                    f"{cache.root / bundle.key}: the cache entry of {event.id} does not read "
                    "back whole; it was removed: build again (the earlier site is unchanged)"
                )
            return found

        site = StagedSite(staging, progress)
        render_site(
            bundles,
            settings,
            audience,
            index,
            site=site,
            memo=memo,
            templates=templates,
            whole=whole,
        )
        progress.step(site.written, site.written, "pages and files written")
        staging.commit()
        cache.stamp_site(staging.placed)
    cache.prune()
    return made, index, len(bundles)


def _os_problem(exc: OSError, out: Path) -> str:
    """One line for a file-system fault: the path it hit and what the system said."""
    where = exc.filename or out
    return f"{where}: {exc.strerror or exc}; the earlier site, if any, is unchanged"


class StagedSite(Site):
    """A :class:`Site` that writes each page straight into the staging folder (flat memory)."""

    def __init__(self, staging: Staging, progress: Progress | None = None):
        super().__init__()
        self.staging, self.progress, self.written = staging, progress or Progress(), 0

    def add(self, path: str, content: str | bytes) -> None:
        self.staging.write(path, content.encode("utf-8") if isinstance(content, str) else content)
        self.written += 1
        self.progress.tick(self.written, "pages and files written")


def make_bundles(
    events: list[Event],
    settings: Settings,
    cache: Cache,
    jobs: int,
    progress: Progress,
    staging: Staging,
    root: Path | None = None,
    audience: str = "public",
    templates: str = "",
) -> tuple[list[EventBundle], list[EventBundle], set[str]]:
    """Every event's bundle, from the cache or made afresh, its files placed in ``staging``;
    also the freshly made ones, and the memo keys of the pages made with them (each event's
    pages are rendered by the worker that drew it, and written into ``staging`` here). A
    cached bundle whose files the published site no longer holds as recorded is made
    again."""
    keys = [event_key(e, settings) for e in events]
    reference = reference_for(settings)
    bundles = [
        cache.load(k, e, settings, reference, lean=True) for k, e in zip(keys, events, strict=True)
    ]
    for i, bundle in enumerate(bundles):
        if bundle is not None:
            placed = cache.place(bundle.key, staging.link)
            bundles[i] = for_catalogue(bundle) if placed else None
    todo = [i for i, b in enumerate(bundles) if b is None]
    for i in todo:  # an event remembered from the last build keeps no sample values
        if needs_reading(events[i]):
            events[i] = _read_again(events[i], settings, root)
    made, failures, premade = [], [], set()
    ids = [None, *(e.id for e in events), None]  # ids[i] and ids[i + 2]: the neighbours
    tasks = [
        (events[i], settings, reference, PageJob(keys[i], audience, ids[i], ids[i + 2], templates))
        for i in todo
    ]
    for done, (i, result) in enumerate(_run(todo, tasks, jobs), 1):
        if isinstance(result, BaseException):
            failures.append(
                Problem(
                    events[i].source,
                    events[i].line,
                    events[i].id,
                    f"could not derive this event: {result}",
                )
            )
            continue
        for name, data in result.files.items():
            staging.write(name, data)
        for key, files in result.pages.items():
            for name, data in files.items():
                staging.write(name, data)
            cache.store_files(key, dict(files))
            premade.add(key)
        events[i] = without_sample_values(events[i])
        stored = cache.store(keys[i], result, events[i], settings, reference, lean=True)
        bundles[i] = for_catalogue(stored)
        made.append(bundles[i])
        progress.step(done, len(todo), "events derived and drawn")
    if failures:
        raise BuildError(problems=failures)
    return [b for b in bundles if b is not None], made, premade


def _read_again(event: Event, settings: Settings, root: Path | None) -> Event:
    """An event read and checked afresh from its file (its samples file's values included)."""
    problems: list[Problem] = []
    fresh = load_event(event.source, root or event.source.parent, settings, problems)
    if fresh is None:  # the file changed since it was found unchanged
        raise InputError(problems=problems)
    return fresh


def event_bundle(event: Event, settings: Settings, reference: Reference) -> EventBundle:
    """Derive one event and make its figures and chirp sound (the expensive part of a build)."""
    from factsheet.derive import derive_event  # cosmology and scipy load only when deriving

    item = derive_event(event, settings, reference)
    figures, audio, files, seconds = event_files(item, settings.languages)
    return EventBundle(_summaries_only(item), figures, audio, files, seconds)


def _summaries_only(item: Derived) -> Derived:
    """The derived event without its samples (or its samples file's values) or its sky map's
    level grid: the pages need only the summaries, and the bundle is kept in the cache and in
    memory for every event."""
    mapped = item.sky_map
    if mapped is not None:
        mapped = replace(mapped, levels=np.empty((0, 0), dtype=np.float32))
    return replace(item, event=without_sample_values(item.event), samples={}, sky_map=mapped)


def without_sample_values(event: Event) -> Event:
    """The event without its samples file's values (which columns it has are kept)."""
    if event.samples is None or not any(v.size for v in event.samples.values.values()):
        return event
    empty = {path: np.empty(0) for path in event.samples.values}
    return replace(event, samples=replace(event.samples, values=empty))


@dataclass(frozen=True)
class PageJob:
    """What a worker needs to render the pages of the event it draws: the event's cache key,
    the audience and the ids of its neighbours in the catalogue."""

    key: str
    audience: str
    previous: str | None
    following: str | None
    templates: str  # the templates' fingerprint, taken once per build


def _work(args: tuple[Event, Settings, Reference, PageJob]) -> EventBundle | BaseException:
    event, settings, reference, job = args
    try:
        bundle = replace(event_bundle(event, settings, reference), key=job.key)
        return replace(bundle, pages=_event_pages(bundle, settings, job))
    except Exception as exc:  # reported per event by the caller, nothing is published
        return exc


def _event_pages(bundle: EventBundle, settings: Settings, job: PageJob) -> dict[str, dict]:
    """The event's page (and JSON) in every language of the site, by memo key: rendered in the
    worker, beside the drawing, so that the build's own process does not render them one
    after another."""
    pages = {}
    for language in settings.languages:
        r = Renderer(_environment(), settings, job.audience, job.templates, language)
        with use_language(language):
            files = event_page_files(r, bundle, job.previous, job.following)
        key = event_page_key(r, bundle, job.previous, job.following)
        pages[content_key("page", *key)] = files
    return pages


@functools.cache
def _environment() -> jinja2.Environment:
    """The templates' environment, made once per process (it reloads a template that changed)."""
    return make_environment()


def _run(todo: list[int], tasks: list[tuple], jobs: int):
    """Yield (index, bundle or exception) for each event to make, in input order."""
    if jobs <= 1 or len(todo) <= 1:
        yield from zip(todo, map(_work, tasks), strict=True)
        return
    with _pool(min(jobs, len(todo))) as pool:
        yield from zip(todo, pool.map(_work, tasks, chunksize=1), strict=True)


@contextlib.contextmanager
def _pool(workers: int) -> Iterator[ProcessPoolExecutor]:
    """Worker processes, which end when the build does (:func:`_worker_started`).

    Forked workers share the build's memory until they write to it, and a garbage collection
    in a worker writes to every object it walks: each worker would soon hold its own copy of
    everything the build holds for every event. The build's objects are therefore frozen out of
    the collector's reach (``gc.freeze``) while the workers are forked and run, so that a
    worker's own memory does not grow with the catalogue (measured: 77 MB at 800 and 78 MB at
    1600 events, against 90 and 97 MB unfrozen)."""
    context = multiprocessing.get_context("fork" if sys.platform == "linux" else "spawn")
    gc.freeze()
    try:
        with ProcessPoolExecutor(
            max_workers=workers,
            mp_context=context,
            initializer=_worker_started,
            initargs=(os.getpid(),),
        ) as pool:
            yield pool
    finally:
        gc.unfreeze()


_PR_SET_PDEATHSIG = 1


def _worker_started(parent: int) -> None:
    """Make a worker die with the build that started it, and let go of the output's lock.

    On Linux the kernel sends SIGKILL to the worker when its parent dies (``prctl``
    ``PR_SET_PDEATHSIG``); everywhere, a watcher thread exits the worker once its parent is
    gone. A killed build therefore leaves no worker running.
    """
    for fd in list(HELD):  # the fork copied the lock's descriptor: only the build holds it
        with contextlib.suppress(OSError):
            os.close(fd)
    HELD.clear()
    with contextlib.suppress(OSError, AttributeError):
        libc = ctypes.CDLL(None, use_errno=True)
        libc.prctl(_PR_SET_PDEATHSIG, signal.SIGKILL)
    if os.getppid() != parent:  # the parent died before the line above took effect
        os._exit(1)
    threading.Thread(target=_exit_when_orphaned, args=(parent,), daemon=True).start()


def _exit_when_orphaned(parent: int) -> None:
    while os.getppid() == parent:
        clock.sleep(0.5)
    os._exit(1)


def _index_figures(
    bundles: list[EventBundle], settings: Settings, cache: Cache, jobs: int = 1
) -> dict[str, list[SiteFigure]]:
    """The index's figures by language (drawn in each, published once where they agree); with
    more than one job they are drawn in a worker, like every other figure, so that the build's
    own process never loads matplotlib."""
    edges = plane_edges(settings)
    rows = [
        (
            d.event.id,
            d.event.status,
            d.source_class,
            d.quantities["heavier_mass"],
            d.quantities["lighter_mass"],
            d.quantities["distance"],
            d.quantities["total_mass"],
        )
        for d in (b.derived for b in bundles)
    ]
    key = content_key("index", edges, settings.languages, rows)
    found = cache.files_and_notes(key)
    if found is not None:
        files, meta = found
        try:
            return {
                str(lang): [SiteFigure(p, files[p], alt, cap) for p, alt, cap in listed]
                for lang, listed in meta.items()  # kept words read back with the entry
            }
        except (KeyError, TypeError, ValueError, AttributeError):
            pass  # not what this build stores: draw them again
    task = (rows, edges, settings.languages)
    if jobs <= 1:
        files, stored = _draw_index(task)
    else:
        with _pool(1) as pool:
            files, stored = pool.submit(_draw_index, task).result()
    meta = {lang: [[f.path, f.alt, f.caption] for f in figs] for lang, figs in stored.items()}
    cache.store_files(key, files, i18n.to_json(meta))
    return stored


def _draw_index(
    task: tuple[list[tuple], dict[str, float], tuple[str, ...]],
) -> tuple[dict[str, bytes], dict[str, list[SiteFigure]]]:
    """The index's figures in each language, and their files by site path."""
    from factsheet.render import figures  # matplotlib loads only when drawing

    rows, edges, languages = task
    files: dict[str, bytes] = {}
    stored: dict[str, list[SiteFigure]] = {}
    for n, language in enumerate(languages):
        with use_language(language):
            drawn = figures.index_figures(rows, edges)
        for fig in drawn:
            if n and files.get(fig.path) != fig.svg:
                fig = replace(fig, path=language_path(language, fig.path))
            files[fig.path] = fig.svg
            stored.setdefault(language, []).append(fig)
    return files, stored
