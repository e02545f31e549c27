"""The document model the views observe: the document, its undo commands, the edits
that build them, display-unit choices and number parsing and formatting. No widgets."""
