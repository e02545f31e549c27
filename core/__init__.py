"""Wetline core: exact hydrostatic loads on container cross-sections.

Pure computation, no Qt. Every quantity inside is a plain SI float or a
numpy array of them (m, m2, m3, Pa, N, N/m, kg/m3, m/s2); units are converted
only at the edges (section files in :mod:`wetline.core.section_file`, display units in
:mod:`wetline.core.units`).

Modules, one concern each:

- :mod:`wetline.core.section`: the validated, immutable :class:`~wetline.core.section.Section`.
- :mod:`wetline.core.hydrostatics`: :func:`~wetline.core.hydrostatics.solve`, per-edge and
  per-part loads at one fill level.
- :mod:`wetline.core.fill`: volume below a level and the level holding a volume.
- :mod:`wetline.core.level_table`: loads at many levels at once, for charts and CSV.
- :mod:`wetline.core.liquids`: densities of water, seawater and listed liquids.
- :mod:`wetline.core.units`: the one pint registry and the display unit systems.
- :mod:`wetline.core.case`: a section with its liquid, gravity and fill.
- :mod:`wetline.core.section_file`: read and write ``*.section.json`` files.
- :mod:`wetline.core.results`: the results record of ``wetline solve --json``, the caution.
- :mod:`wetline.core.templates`: parametric sections (open tank, hopper ...).
- :mod:`wetline.core.uplift`: the uplift check of lifted parts.
- :mod:`wetline.core.report_tables`: result tables in display units (CLI, CSV, sheet).
- :mod:`wetline.core.numbers`: the one number formatter and 1-2-5 steps.
- :mod:`wetline.core.force_scope`: what force values cover and their display unit.
- :mod:`wetline.core.dxf_io`: outlines from and to DXF drawings.
- :mod:`wetline.core.coordinates`: coordinate lists pasted from a spreadsheet or CSV.
- :mod:`wetline.core.limits`: the representable range of every input.
- :mod:`wetline.core.atomic_write`: every file written whole or not at all.
"""

STANDARD_GRAVITY = 9.80665
"""Standard acceleration of gravity [m/s2], exact (3rd CGPM, 1901)."""
