"""The installed name ``wetline`` as mypy sees it: ``wetline.core`` is the
repository's ``core/`` (a symbolic link). mypy cannot follow the editable
install's import hook, so ``[tool.mypy] mypy_path`` points here."""
