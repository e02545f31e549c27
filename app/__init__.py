"""The program around the engine: installed as ``wetline.app``.

- :mod:`wetline.app.model`: the document model (no widgets): the document,
  its undo commands, the edits that build them, display units and numbers.
- :mod:`wetline.app.window`: the desktop program's window and its views.
- :mod:`wetline.app.render`: headless drawings for outputs: the diagram
  scene, PNG, SVG, the PDF calculation sheet and the chart image.
- :mod:`wetline.app.cli`: the command line (Qt only for images and sheets).
"""
