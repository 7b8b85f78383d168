"""Arrives with its own issue (see DEVELOPERS.md)."""
