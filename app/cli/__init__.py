"""The command line: ``wetline solve|table|export|report|import`` (:mod:`wetline.app.cli.main`)."""
