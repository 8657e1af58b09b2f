//! The `lotwright` binary: glue around the library (see `cli`).

mod cli;

fn main() {
    std::process::exit(cli::run());
}
