//! The `hueproof` binary: parse the command line, hand it to the library,
//! and turn the outcome into an exit code. All work happens in the library.

use std::process::ExitCode;

fn main() -> ExitCode {
    hueproof::cli::main_with_args(std::env::args_os())
}
