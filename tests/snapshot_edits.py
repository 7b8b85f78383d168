"""Helpers that edit a snapshot dict in place, for the bad-input tests."""

from __future__ import annotations

from typing import Any


def at(doc: Any, where: tuple) -> Any:
    """The part of ``doc`` at the key path ``where``."""
    for key in where:
        doc = doc[key]
    return doc


def setter(where: tuple, key: str, value: Any):
    """A mutation that sets ``key`` of the part at ``where`` to ``value``."""
    def mutate(doc: Any) -> None:
        at(doc, where)[key] = value
    return mutate


def popper(where: tuple, key: str):
    """A mutation that removes ``key`` from the part at ``where``."""
    return lambda doc: at(doc, where).pop(key)
