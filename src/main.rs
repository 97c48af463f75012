//! The `loopside` binary: the command line, and with no subcommand the app window.

use clap::Parser;
use loopside::cli::{run_command, Cli};

fn main() {
    let cli = Cli::parse();
    match cli.command {
        Some(command) => {
            let mut stdout = std::io::stdout().lock();
            if let Err(e) = run_command(command, &mut stdout) {
                eprintln!("error: {e}");
                std::process::exit(e.exit_code());
            }
        }
        None => open_app(),
    }
}

/// With no subcommand: the app window (store in the platform data folder).
#[cfg(all(feature = "ui", not(target_os = "android")))]
fn open_app() {
    if let Err(e) = loopside::app::run_desktop() {
        eprintln!("error: {e}");
        std::process::exit(1);
    }
}

/// Built without the `ui` feature there is no window: print the help text instead.
#[cfg(not(all(feature = "ui", not(target_os = "android"))))]
fn open_app() {
    use clap::CommandFactory;
    let _ = Cli::command().print_help();
}
