"""Headless drawings for outputs: the diagram scene (PNG, SVG, the PDF sheet),
its geometry shared with the live canvas, and the chart image."""
