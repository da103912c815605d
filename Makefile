# Two commands for a newcomer: `make demo` and `make test`.
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin

.PHONY: demo test lint clean

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(VENV)/.installed: pyproject.toml | $(BIN)/python
	$(BIN)/python -m pip install --quiet -e '.[test]'
	touch $@

demo: $(VENV)/.installed
	$(BIN)/rostertui demo --unit clinic

test: $(VENV)/.installed
	$(BIN)/ruff check rostertui tests bench
	$(BIN)/mypy rostertui
	$(BIN)/python -m pytest

clean:
	rm -rf $(VENV) build dist .pytest_cache .ruff_cache .mypy_cache
