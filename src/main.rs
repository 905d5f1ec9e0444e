//! The `rhoboard` binary: parses arguments, runs one command, maps the result to an
//! exit status (0 success, 1 findings, 2 bad usage or input).

use std::io::{IsTerminal, Write};
use std::process::ExitCode;

use clap::{Parser, Subcommand};
use rhoboard::commands::{self, Outcome};

/// rhoboard — density altitude, takeoff, landing, climb and wind against the
/// operator's minimums, for every leg of the day. A planning aid: the aircraft flight
/// manual, the pilot in command and local regulations govern.
#[derive(Parser, Debug)]
#[command(name = "rhoboard", version, about, long_about = None)]
#[command(args_conflicts_with_subcommands = true)]
struct Cli {
    #[command(subcommand)]
    command: Option<Command>,
    /// With no command, the board's own options open the board (`rhoboard --at …` is
    /// `rhoboard board --at …`).
    #[command(flatten)]
    board: commands::board::Args,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// The terminal board: live on an operator folder, or replaying a day.
    Board(commands::board::Args),
    /// Pressure and density altitude, density, ISA deviation and TAS factor at a field.
    Calc(commands::calc::Args),
    /// Assesses every leg of the day against the operator's minimums.
    Check(commands::check::Args),
    /// Today's runway state: closures, reduced distances, surface condition, end in use.
    Runway(commands::runway::Args),
    /// Re-plans a leg: see the re-assessment, then save safely.
    Leg(commands::leg::Args),
    /// Decodes METAR/SPECI reports (TEXT, or `-` for standard input).
    Metar(commands::metar::Args),
    /// Decodes TAFs and shows the forecast hour by hour (TEXT, or `-` for standard input).
    Taf(commands::taf::Args),
    /// Checks an operator folder and reports every problem (file, line, column, field).
    Validate(commands::validate::Args),
    /// Writes a new operator folder from the fictional demo, every value marked to replace.
    Init(commands::init::Args),
    /// Signs a leg off (or revokes a sign-off) in the operator's tamper-evident log.
    Signoff(commands::signoff::Args),
    /// Verifies or lists the sign-off log.
    Log(commands::log::Args),
    /// Writes the printable briefing sheet (markdown or HTML).
    Report(commands::report::Args),
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    // The board owns the terminal; with no subcommand it opens only on a terminal, and
    // piped output keeps the printed overview (unless a board option asks for the board,
    // which then says it needs a terminal).
    let board = match &cli.command {
        Some(Command::Board(args)) => Some(args.clone()),
        None if std::io::stdout().is_terminal() || cli.board.given() => Some(cli.board.clone()),
        _ => None,
    };
    if let Some(args) = board {
        return match commands::board::run(&args) {
            Ok(outcome) => outcome.into(),
            Err(err) => {
                eprintln!("rhoboard: {err:#}");
                Outcome::BadInput.into()
            }
        };
    }
    // Every printing command writes through the one pipe-safe path: a reader that
    // stops early (`| head -1`) cuts the output, never the verdict.
    let mut out = commands::output::PipeSafe::new(std::io::stdout().lock());
    let result: anyhow::Result<Outcome> = match cli.command {
        None | Some(Command::Board(_)) => commands::overview::run(&mut out),
        Some(Command::Calc(args)) => commands::calc::run(&args, &mut out),
        Some(Command::Check(args)) => commands::check::run(&args, &mut out),
        Some(Command::Runway(args)) => commands::runway::run(&args, &mut out),
        Some(Command::Leg(args)) => commands::leg::run(&args, &mut out),
        Some(Command::Metar(args)) => commands::metar::run(&args, &mut out),
        Some(Command::Taf(args)) => commands::taf::run(&args, &mut out),
        Some(Command::Validate(args)) => commands::validate::run(&args, &mut out),
        Some(Command::Init(args)) => commands::init::run(&args, &mut out),
        Some(Command::Signoff(args)) => commands::signoff::run(&args, &mut out),
        Some(Command::Log(args)) => commands::log::run(&args, &mut out),
        Some(Command::Report(args)) => commands::report::run(&args, &mut out),
    };
    // What is still buffered goes out now, so a failing flush is reported, not lost.
    let result = result.and_then(|outcome| {
        out.flush()
            .map_err(|e| anyhow::Error::new(e).context("writing standard output"))?;
        Ok(outcome)
    });
    match result {
        Ok(outcome) => outcome.into(),
        Err(err) => {
            drop(out);
            eprintln!("rhoboard: {err:#}");
            Outcome::BadInput.into()
        }
    }
}
