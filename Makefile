# Two commands on a fresh machine: `make demo` and `make test`. Both create
# .venv when it is missing and install what they need; both are idempotent.
PYTHON ?= python3
VENV   := .venv
BIN    := $(VENV)/bin
STAMP  := $(VENV)/.installed-$(shell cat pyproject.toml | cksum | cut -d' ' -f1)

.PHONY: demo test lint bench clean venv

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(STAMP): $(BIN)/python pyproject.toml
	$(BIN)/python -m pip install --quiet -e '.[test]'
	rm -f $(VENV)/.installed-*
	touch $(STAMP)

venv: $(STAMP)

demo: venv
	$(BIN)/loadscope demo

lint: venv
	$(BIN)/ruff check loadscope tests bench
	$(BIN)/mypy loadscope/kernel

test: lint
	$(BIN)/python -m pytest

bench: venv
	$(BIN)/python bench/bench_solve.py
	$(BIN)/python bench/bench_widgets.py

clean:
	rm -rf $(VENV) build *.egg-info .pytest_cache .mypy_cache .ruff_cache
