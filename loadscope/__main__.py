"""``python -m loadscope`` runs the command line."""

from .cli import entry

entry()
