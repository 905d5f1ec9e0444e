//! `rhoboard report`: the printable briefing sheet, markdown or HTML.

use std::io::Write;
use std::path::PathBuf;

use anyhow::Context as _;

use crate::assess::{Context, DaySettings, LegResult, Model, assess_leg};
use crate::commands::Outcome;
use crate::commands::check::legs_of_day;
use crate::commands::signoff::{load_operator, log_for};
use crate::report;

/// Output format of the sheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Format {
    /// Markdown.
    Markdown,
    /// One self-contained HTML file (inline CSS, no scripts, no external assets).
    Html,
}

/// Arguments of `rhoboard report`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The operator folder (default: the configured one, else the built-in demo).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Reference time, RFC 3339: reports after it are unknown. Default: now; for the
    /// built-in demo, 08:00Z on its demo day.
    #[arg(long, value_name = "TIME")]
    pub at: Option<String>,
    /// `markdown` or `html`.
    #[arg(long, value_enum, default_value_t = Format::Markdown)]
    pub format: Format,
    /// Write to this file instead of standard output.
    #[arg(long, value_name = "FILE")]
    pub out: Option<PathBuf>,
}

/// Runs `rhoboard report`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let (dir, loaded) = load_operator(args.ops.as_deref(), args.at.as_deref())?;
    let ops = &loaded.ops;
    let model = Model::new(ops, &DaySettings::for_date(ops, loaded.at.date_naive()));
    let ctx = Context {
        ops,
        model: &model,
        store: &loaded.store,
        at: loaded.at,
    };
    let results: Vec<LegResult> = legs_of_day(ops, loaded.at)
        .into_iter()
        .filter_map(|i| assess_leg(&ctx, i))
        .collect();
    let chain = log_for(dir.as_deref())
        .and_then(|log| Ok(log.read()?))
        .map_err(|e| format!("{e:#}"));
    let mut sheet = report::build(&ctx, &results, chain.as_ref().map_err(String::clone));
    let looks = crate::commands::check::look_aheads(&ctx, &loaded.store, &results);
    if looks.iter().any(Option::is_some) {
        sheet.forecast = report::forecast_lines(ops, loaded.at, &results, &looks);
    }
    let text = match args.format {
        Format::Markdown => report::markdown(&sheet),
        Format::Html => report::html(&sheet),
    };
    let all_ok = results.iter().all(|r| r.state.meets_minimums());
    match &args.out {
        Some(path) => {
            std::fs::write(path, text)
                .with_context(|| format!("writing the sheet to {}", path.display()))?;
            let short = results.iter().filter(|r| !r.state.meets_minimums()).count();
            eprintln!(
                "rhoboard: wrote the briefing sheet to {} ({} leg(s){})",
                path.display(),
                results.len(),
                if all_ok {
                    String::new()
                } else {
                    format!("; {short} below or no-data: exit 1")
                }
            );
        }
        None => out.write_all(text.as_bytes())?,
    }
    Ok(if all_ok {
        Outcome::Success
    } else {
        Outcome::Findings
    })
}
