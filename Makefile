# Two commands on a fresh machine: `make demo` and `make test`. Both create
# .venv when it is missing and install what they need; both are idempotent.
PYTHON ?= python3
VENV   := .venv
BIN    := $(VENV)/bin
STAMP  := $(VENV)/.installed-$(shell cat pyproject.toml | cksum | cut -d' ' -f1)

CHROMIUM := /usr/bin/chromium

.PHONY: demo test lint bench clean venv chromium plotly-basic

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(STAMP): $(BIN)/python pyproject.toml
	$(BIN)/python -m pip install --quiet -e '.[test]'
	rm -f $(VENV)/.installed-*
	touch $(STAMP)

venv: $(STAMP)

# serves the dashboards on http://127.0.0.1:8866/ (Ctrl-C stops); `loadscope demo` prints the loads instead
demo: venv
	$(BIN)/loadscope serve

# the browser tests drive Debian's chromium (never a browser download of Playwright's own)
chromium:
	@test -x $(CHROMIUM) || { echo "installing chromium with apt-get (about 20 s)"; \
	  (apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium) >/dev/null 2>&1 \
	  || echo "could not install chromium: the browser tests will be skipped"; }

lint: venv
	$(BIN)/ruff check loadscope tests bench
	$(BIN)/mypy loadscope/kernel

test: lint chromium
	$(BIN)/python -m pytest

bench: venv
	$(BIN)/python bench/bench_solve.py
	$(BIN)/python bench/bench_widgets.py
	$(BIN)/python bench/bench_dashboard.py

# fetches plotly.js's 2D bundle again (npm) at the installed plotly's plotly.js version
plotly-basic: venv
	PYTHON=$(BIN)/python tools/fetch_plotly_basic.sh

clean:
	rm -rf $(VENV) build *.egg-info .pytest_cache .mypy_cache .ruff_cache
