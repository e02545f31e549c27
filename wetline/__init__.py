"""Wetline: hydrostatic loads on the parts of a liquid-holding container.

The installed package holds the engine (:mod:`wetline.core`, pure numerics,
never Qt) and the program around it (:mod:`wetline.app`: the document model,
the window, the headless renderers and the command line). ``python3 -m
wetline`` and the ``wetline`` script start it.
"""

from importlib import metadata as _metadata

try:
    __version__ = _metadata.version("wetline")
except _metadata.PackageNotFoundError:  # pragma: no cover - run from a bare tree
    __version__ = "0+unknown"
