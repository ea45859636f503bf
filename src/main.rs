//! The `segmask` command: a thin layer of argument parsing over the library.

mod cli;
mod console;
mod watch;

fn main() -> std::process::ExitCode {
    cli::run()
}
