#!/usr/bin/python3
"""Writes cathode_screening.ipynb from cathode_screening.py, so that the notebook and the script are one text.

Cells are the script's `# %%` blocks (`# %% [markdown]` blocks become markdown cells, their leading `# `
removed); the notebook is written without outputs. `--check` exits 1 when the committed notebook differs.
"""

import sys
from pathlib import Path

import nbformat

HERE = Path(__file__).resolve().parent
SCRIPT = HERE / "cathode_screening.py"
NOTEBOOK = HERE / "cathode_screening.ipynb"


def cells(text):
    blocks, kind, lines = [], None, []
    for line in text.splitlines():
        if line.startswith("# %%"):
            if kind is not None:
                blocks.append((kind, "\n".join(lines).strip("\n")))
            kind, lines = ("markdown" if "[markdown]" in line else "code"), []
        elif kind == "markdown":
            lines.append(line[2:] if line.startswith("# ") else line.lstrip("#"))
        elif kind is not None:
            lines.append(line)
    if kind is not None:
        blocks.append((kind, "\n".join(lines).strip("\n")))
    return blocks


def notebook_text():
    book = nbformat.v4.new_notebook()
    book.metadata = {"kernelspec": {"name": "python3", "display_name": "Python 3", "language": "python"},
                     "language_info": {"name": "python"}}
    for i, (kind, source) in enumerate(cells(SCRIPT.read_text(encoding="utf-8"))):
        cell = nbformat.v4.new_markdown_cell(source) if kind == "markdown" else nbformat.v4.new_code_cell(source)
        cell["id"] = f"cell-{i:02d}"  # stable ids: the file only changes when the script does
        book.cells.append(cell)
    return nbformat.writes(book) + "\n"


def main(argv):
    text = notebook_text()
    if "--check" in argv:
        if not NOTEBOOK.is_file() or NOTEBOOK.read_text(encoding="utf-8") != text:
            print(f"{NOTEBOOK.name} differs from {SCRIPT.name}: run /usr/bin/python3 {Path(__file__).name}", file=sys.stderr)
            return 1
        return 0
    NOTEBOOK.write_text(text, encoding="utf-8")
    print(f"wrote {NOTEBOOK}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
