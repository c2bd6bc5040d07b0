"""Render stage: derived events and their figures in, pages and exports out.

:func:`render_site` renders every page (Jinja2, contexts from :mod:`.contexts`), the event JSON
(:mod:`.event_json`), the catalogue tables (:mod:`.tables`), the changes page and feed
(:mod:`.history`, :mod:`.feed`). :mod:`.figures` and :mod:`.assets` decide what the figures and
the chirp sound of a sheet show.
"""

from factsheet.render.site import Site, render_site

__all__ = ["Site", "render_site"]
