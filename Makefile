# lotwright: the two commands of the README's Quick start, and helpers.
#   make demo   install what a fresh machine lacks, build, plan the demo scenario
#   make test   install what a fresh machine lacks, run the whole test suite

DEMO ?= demo-data/harbor-bakeware

.PHONY: setup demo test lint

setup:
	@bash scripts/setup.sh

demo: setup
	cargo build --release
	./target/release/lotwright plan $(DEMO)

test: setup
	cargo test --release

lint:
	cargo fmt --all -- --check
	cargo clippy --all-targets -- -D warnings
