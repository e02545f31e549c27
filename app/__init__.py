"""Wetline application layer: the desktop program and the command line.

The command line (:mod:`app.cli`) imports no Qt except for ``wetline export``;
the desktop program starts from :func:`app.gui.launch`.
"""
