"""Wetline core: exact hydrostatic loads on container cross-sections.

Pure computation, no Qt. Every quantity inside is a plain SI float or a
numpy array of them (m, m2, m3, Pa, N, N/m, kg/m3, m/s2); units are converted
only at the edges (section files in :mod:`core.section_file`, display units in
:mod:`core.units`).

Modules, one concern each:

- :mod:`core.section`: the validated, immutable :class:`~core.section.Section`.
- :mod:`core.hydrostatics`: :func:`~core.hydrostatics.solve`, per-edge and
  per-part loads at one fill level.
- :mod:`core.fill`: volume below a level and the level holding a volume.
- :mod:`core.level_table`: loads at many levels at once, for charts and CSV.
- :mod:`core.liquids`: densities of water, seawater and listed liquids.
- :mod:`core.units`: the one pint registry and the display unit systems.
- :mod:`core.case`: a section with its liquid, gravity and fill.
- :mod:`core.section_file`: read and write ``*.section.json`` files.
- :mod:`core.results`: the results record of ``wetline solve --json``.
- :mod:`core.templates`: parametric sections (open tank, hopper ...).
- :mod:`core.uplift`: the uplift check of lifted parts.
- :mod:`core.report_tables`: result tables in display units (CLI, CSV, sheet).
- :mod:`core.dxf_io`: outlines from and to DXF drawings.
- :mod:`core.coordinates`: coordinate lists pasted from a spreadsheet or CSV.
"""

STANDARD_GRAVITY = 9.80665
"""Standard acceleration of gravity [m/s2], exact (3rd CGPM, 1901)."""
