"""The desktop program's window: main window, file actions, canvas, panels,
tables, chart and dialogs. Views observe the document and edit it only
through undo commands."""
