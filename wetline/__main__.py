"""Entry point: ``wetline`` / ``python3 -m wetline``.

``wetline`` alone opens the desktop program on a bundled sample,
``wetline FILE`` opens that file, ``wetline solve|table|export ...`` runs
headless (see ``wetline --help``).
"""

import sys


def main(argv=None):
    """Run the command line or the desktop program; return the exit status."""
    from wetline.app.cli.main import main as cli_main

    return cli_main(sys.argv[1:] if argv is None else argv)


if __name__ == "__main__":
    sys.exit(main())
