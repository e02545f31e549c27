"""Wetline: hydrostatic loads on the parts of a liquid-holding container.

The installed package holds the engine (:mod:`wetline.core`, pure numerics,
never Qt) and the program around it (:mod:`wetline.app`: the document model,
the window, the headless renderers and the command line). ``python3 -m
wetline`` and the ``wetline`` script start it.
"""


def __getattr__(name):
    """``__version__``, read from the installed metadata when first asked for
    (importing importlib.metadata costs about 0.05 s of every start)."""
    if name != "__version__":
        raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
    from importlib import metadata

    try:
        version = metadata.version("wetline")
    except metadata.PackageNotFoundError:  # pragma: no cover - run from a bare tree
        version = "0+unknown"
    globals()["__version__"] = version
    return version
