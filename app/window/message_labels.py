"""The red line under a panel's or dialog's fields that says why a typed
value was refused (and, in another colour, a note), shown only while it
has something to say."""

from __future__ import annotations

from PySide6.QtWidgets import QLabel

__all__ = ["ERROR_STYLE", "message_label", "show_message"]

ERROR_STYLE = "color: #b00020;"
"""The style sheet of a refusal's text."""


def message_label(style=ERROR_STYLE):
    """A word-wrapped label for refusals (or notes, with ``style``), hidden
    until :func:`show_message` gives it a text."""
    label = QLabel()
    label.setWordWrap(True)
    label.setStyleSheet(style)
    label.hide()
    return label


def show_message(label, text, style=ERROR_STYLE):
    """Show ``text`` in ``label`` with ``style``, or hide it (empty text).
    Only what changed is set: a style sheet change is costly, and a panel
    shows its message again at every step of a drag."""
    if label.styleSheet() != style:
        label.setStyleSheet(style)
    if label.text() != text:
        label.setText(text)
    if label.isHidden() == bool(text):
        label.setVisible(bool(text))
