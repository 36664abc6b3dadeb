# Two commands on a fresh clone: `make run` and `make test`. Each creates .venv when needed.
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin

.PHONY: run cards test lint bench clean

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(VENV)/.installed: pyproject.toml | $(BIN)/python
	$(BIN)/python -m pip install --quiet -e .
	touch $@

$(VENV)/.installed-test: pyproject.toml | $(BIN)/python
	$(BIN)/python -m pip install --quiet -e '.[test]'
	touch $@ $(VENV)/.installed

# Opens the app on the sample fleet; on a machine without a screen it writes the sample cards instead.
run: $(VENV)/.installed
	@if [ -n "$$DISPLAY$$WAYLAND_DISPLAY" ] || [ "$$(uname)" = Darwin ]; then \
		$(BIN)/kneeboard sample_aircraft; \
	else \
		echo "No screen found: writing the sample cards instead of opening the app."; \
		$(MAKE) --no-print-directory cards; \
	fi

cards: $(VENV)/.installed
	@mkdir -p out
	@for f in sample_aircraft/*.toml; do \
		$(BIN)/kneeboard table "$$f" > "out/$$(basename "$$f" .toml).txt" || exit $$?; \
	done
	@$(BIN)/kneeboard card sample_aircraft -o out/sample_cards.pdf --png 100
	@$(BIN)/kneeboard card sample_aircraft -o out/sample_sheets_letter.pdf --size 5x8 --sheet letter > /dev/null
	@echo "Sample tables and cards written to out/"

test: $(VENV)/.installed-test
	$(BIN)/python -m pytest -q

bench: $(VENV)/.installed-test
	$(BIN)/python -m benchmarks

lint: $(VENV)/.installed-test
	$(BIN)/ruff check kneeboard tests benchmarks

clean:
	rm -rf $(VENV) out .pytest_cache .hypothesis
