"""Pure physics of factsheet: functions of astropy Quantities, numpy arrays inside.

This package imports only numpy and astropy (a test walks its imports). Every public function
names its method and reference in its docstring and registers the method in
:mod:`factsheet.physics.registry`.
"""
