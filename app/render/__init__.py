"""Headless drawings for outputs, painted with QtGui only (no widgets).

- :mod:`~wetline.app.render.png`, :mod:`~wetline.app.render.svg`,
  :mod:`~wetline.app.render.sheet`: the diagram as a PNG or SVG file, the
  PDF calculation sheet (:mod:`~wetline.app.render.sheet_process` writes it
  in a process of its own for the window);
- :mod:`~wetline.app.render.scene`: the diagram laid out for a page
  (:class:`~wetline.app.render.scene.DiagramScene`), with its title block
  (:mod:`~wetline.app.render.title_block`), drawing area
  (:mod:`~wetline.app.render.diagram_view`) and layers
  (:mod:`~wetline.app.render.section_layers`,
  :mod:`~wetline.app.render.load_layers`);
- :mod:`~wetline.app.render.level_chart`: the loads-against-level chart image;
- shared with the window's canvas: :mod:`~wetline.app.render.geometry` (what
  is drawn), :mod:`~wetline.app.render.labels` (where labels go) and
  :mod:`~wetline.app.render.style` (colours, part palette, fonts);
- pieces: :mod:`~wetline.app.render.text_blocks`,
  :mod:`~wetline.app.render.label_painter`, :mod:`~wetline.app.render.marks`,
  :mod:`~wetline.app.render.output` (errors, checks, atomic writing).
"""
