# Two commands on a fresh clone: `make run` and `make test`. Each creates .venv when needed.
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin
# make run's private copy of the sample fleet (ignored by git, never removed by make)
FLEET := my-fleet

.PHONY: run cards test lint bench bundle catalogues clean

$(BIN)/python:
	@echo "Creating $(VENV) with $(PYTHON)..."
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(VENV)/.installed: pyproject.toml | $(BIN)/python
	@echo "Installing kneeboard and its dependencies into $(VENV) (about a minute the first time)..."
	$(BIN)/python -m pip install --progress-bar off -e .
	touch $@

$(VENV)/.installed-test: pyproject.toml | $(BIN)/python
	@echo "Installing kneeboard with its test tools into $(VENV) (about two minutes the first time)..."
	$(BIN)/python -m pip install --progress-bar off -e '.[test]'
	touch $@ $(VENV)/.installed $(VENV)/.installed-bundle

$(VENV)/.installed-bundle: pyproject.toml | $(BIN)/python
	@echo "Installing kneeboard with PyInstaller into $(VENV)..."
	$(BIN)/python -m pip install --progress-bar off -e '.[bundle]'
	touch $@ $(VENV)/.installed

# Opens the app on a private copy of the sample fleet (made once; edit it freely, the tracked sample_aircraft/
# stays as it is); on a machine without a screen it writes the sample cards instead.
run: $(VENV)/.installed
	@if [ -n "$$DISPLAY$$WAYLAND_DISPLAY" ] || [ "$$(uname)" = Darwin ]; then \
		[ -d "$(FLEET)" ] || $(BIN)/kneeboard samples "$(FLEET)" > /dev/null || exit $$?; \
		echo "Opening the app on $(FLEET)/, your own copy of the invented sample fleet."; \
		$(BIN)/kneeboard "$(FLEET)"; \
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

# The standalone program (PyInstaller, see packaging/bundle.py): one folder under dist/ that runs without Python.
# Its work stays in build/bundle/ and is reused; the last line printed is the path of the executable.
bundle: $(VENV)/.installed-bundle
	@$(BIN)/python packaging/bundle.py

bench: $(VENV)/.installed-test
	$(BIN)/python -m benchmarks

# The translation catalogues: extract the marked messages, bring translations/*.po up to date, compile the .mo files
# the package carries (README, "Languages"). After translating, run it again (or `packaging/catalogues.py compile`).
catalogues: $(VENV)/.installed-test
	$(BIN)/python packaging/catalogues.py

lint: $(VENV)/.installed-test
	$(BIN)/ruff check kneeboard tests benchmarks packaging

clean:
	rm -rf $(VENV) out .pytest_cache .hypothesis build dist
