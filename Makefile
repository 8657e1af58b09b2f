# lotwright: the two commands of the README's Quick start, and helpers.
#   make demo   install what a fresh machine lacks, build, plan the demo scenario
#   make test   install what a fresh machine lacks, run the whole test suite
#   make fuzz   100000 randomly mutated scenarios through the library (release; a few minutes)

DEMO ?= demo-data/harbor-bakeware

.PHONY: setup demo test lint fuzz

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

fuzz: setup
	LOTWRIGHT_FUZZ_CASES=100000 cargo test --release --test mutation
