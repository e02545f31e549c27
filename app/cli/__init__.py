"""The command line: ``wetline solve|table|cases|export|report|import``."""
