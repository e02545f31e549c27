"""The desktop program's window: main window, file actions, the section
canvas (and its layers, labels and editor), panels, tables, chart and
dialogs. Views observe the document and edit it only through
:mod:`wetline.app.model.editing`."""
