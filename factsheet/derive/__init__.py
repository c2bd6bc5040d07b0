"""Derive stage: one loaded event in, a :class:`~factsheet.model.Derived` record out.

Samples are drawn from the summary intervals (or read from the samples file), the physics runs
on all of them at once, and every quantity is summarised with its credible level, methods and
caveats. Pure computation: no file is read or written here.
"""

from factsheet.derive.event import derive_event

__all__ = ["derive_event"]
