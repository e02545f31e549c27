"""The document model the views observe, no widgets:
:mod:`~wetline.app.model.document` (the one open case and its results),
:mod:`~wetline.app.model.editing` (every user edit, built as an undo step),
:mod:`~wetline.app.model.commands` (the undo commands),
:mod:`~wetline.app.model.display` (the display unit choice) and
:mod:`~wetline.app.model.gravity` (gravity in the display system's unit)."""
