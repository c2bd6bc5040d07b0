"""factsheet: fact sheets for gravitational-wave merger detections, as a static website.

For notebooks, :func:`factsheet.api.derive` derives one event from a mapping or a YAML file
without building a site.
"""

import warnings

from erfa import ErfaWarning

__version__ = "0.1.0"

# Merger times after the end of the leap-second table (the demo is set in 2034) are normal
# input here; ERFA's "dubious year" warning about them says nothing the reader can act on.
warnings.filterwarnings("ignore", message=".*dubious year.*", category=ErfaWarning)
