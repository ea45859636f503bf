//! The `segmask` command: a thin layer of argument parsing over the library.

mod cli;

fn main() -> std::process::ExitCode {
    cli::run()
}
