"""factsheet: fact sheets for gravitational-wave merger detections, as a static website."""

__version__ = "0.1.0"
