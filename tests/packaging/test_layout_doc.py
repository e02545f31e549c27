"""DEVELOPERS.md's layout block names every module of app/ and core/, one
line each, so a newcomer finds any feature from the layout alone."""

import re


def test_every_module_has_its_line_in_the_layout(repo_root):
    text = (repo_root / "DEVELOPERS.md").read_text(encoding="utf-8")
    block = text.split("## Layout", 1)[1].split("```", 2)[1]
    listed = set(re.findall(r"^\s+(\w+\.py)\s", block, flags=re.M))
    for folder in ("app", "core"):
        for path in (repo_root / folder).rglob("*.py"):
            if path.name != "__init__.py":
                assert path.name in listed, f"{path.relative_to(repo_root)} is not in the layout"
