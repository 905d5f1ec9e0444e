//! The `rhoboard` binary: parses arguments, runs one command, maps the result to an
//! exit status (0 success, 1 findings, 2 bad usage or input).

use std::process::ExitCode;

use clap::{Parser, Subcommand};
use rhoboard::commands::Outcome;

/// rhoboard — density altitude, takeoff, landing, climb and wind against the
/// operator's minimums, for every leg of the day. A planning aid: the aircraft flight
/// manual, the pilot in command and local regulations govern.
#[derive(Parser, Debug)]
#[command(name = "rhoboard", version, about, long_about = None)]
struct Cli {
    #[command(subcommand)]
    command: Option<Command>,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Decodes METAR/SPECI reports (TEXT, or `-` for standard input).
    Metar(rhoboard::commands::metar::Args),
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    let mut out = std::io::stdout().lock();
    let result: anyhow::Result<Outcome> = match cli.command {
        None => Ok(Outcome::Success),
        Some(Command::Metar(args)) => rhoboard::commands::metar::run(&args, &mut out),
    };
    match result {
        Ok(outcome) => outcome.into(),
        Err(err) => {
            drop(out);
            eprintln!("rhoboard: {err:#}");
            Outcome::BadInput.into()
        }
    }
}
