"""The bundled sample sections (data files), installed as ``wetline.samples``.

The program opens on one of them when started without a file; see README.md
here for what each one models.
"""
