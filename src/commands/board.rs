//! `rhoboard board`: the terminal board on an operator folder, live or replaying a day.

use std::io::IsTerminal;
use std::path::PathBuf;

use anyhow::Context as _;
use chrono::{DateTime, NaiveDate, TimeDelta, Utc};

use crate::board::app::{NoteKind, end_of_day, replay_reports, stale_after};
use crate::board::{App, Feeds, Replay, Settings};
use crate::commands::Outcome;
use crate::commands::check::{self, parse_at};
use crate::observation::{Store, decode_all};
use crate::ops::config::{self, Choice};

/// Arguments of `rhoboard board`.
#[derive(Debug, Clone, Default, clap::Args)]
pub struct Args {
    /// The operator folder (default: the configured one, else the built-in demo, which
    /// always replays its day).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Replay a day of reports from FILE on a simulated clock instead of going live.
    #[arg(long, value_name = "FILE")]
    pub replay: Option<PathBuf>,
    /// Replay pace: ×1 plays one simulated hour in ten seconds.
    #[arg(long, value_name = "N")]
    pub speed: Option<f64>,
    /// Replay: where to start (RFC 3339, e.g. 2026-06-14T06:30:00Z). Live: the
    /// clock runs on from it instead of from now.
    #[arg(long, value_name = "TIME")]
    pub at: Option<String>,
    /// A command run on a schedule (through `sh -c`); its output is read as METAR lines.
    #[arg(long, value_name = "CMD")]
    pub feed_cmd: Option<String>,
    /// How often to run the feed command (`10m`, `30s`, `1h`).
    #[arg(long, value_name = "EVERY", default_value = "10m")]
    pub feed_every: String,
    /// Ring the terminal bell when a leg becomes `below`.
    #[arg(long)]
    pub bell: bool,
}

impl Args {
    /// Whether any option was given (a bare `rhoboard` with none prints the overview
    /// when its output is not a terminal; with one it means the board).
    pub fn given(&self) -> bool {
        self.ops.is_some()
            || self.replay.is_some()
            || self.speed.is_some()
            || self.at.is_some()
            || self.feed_cmd.is_some()
            || self.bell
            || !matches!(self.feed_every.as_str(), "" | "10m")
    }
}

/// A date `YYYY-MM-DD` inside a file name, if any.
fn date_in_name(p: &std::path::Path) -> Option<NaiveDate> {
    let name = p.file_name()?.to_string_lossy().into_owned();
    (0..name.len().saturating_sub(9)).find_map(|i| {
        name.get(i..i + 10)
            .and_then(|s| NaiveDate::parse_from_str(s, "%Y-%m-%d").ok())
    })
}

/// Builds the board's state and its feeds from the arguments (everything but the
/// terminal), with `now` as the wall clock.
pub fn prepare(args: &Args, now: DateTime<Utc>) -> anyhow::Result<(App, Feeds)> {
    if let Some(speed) = args.speed
        && !(speed.is_finite() && (0.1..=1000.0).contains(&speed))
    {
        anyhow::bail!(
            "--speed {speed}: expected a pace between 0.1 and 1000 (1 = an hour every ten seconds)"
        );
    }
    let choice = config::choose(args.ops.as_deref(), config::config_file().as_deref());
    let loaded = check::load(args.ops.as_deref(), &[], args.at.as_deref(), now)?;
    let settings = Settings {
        color: std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty()),
        bell: args.bell,
        demo: loaded.demo,
        live_offset: None,
        ops_dir: match &choice {
            Choice::Explicit(d) | Choice::Configured(d) if !loaded.demo => Some(d.clone()),
            _ => None,
        },
    };
    // The sign-off log and the legs files belong to the operator folder (the demo: none).
    let ops_dir = if loaded.demo {
        None
    } else {
        crate::commands::signoff::operator_dir(args.ops.as_deref())
    };
    let replaying = args.replay.is_some() || loaded.demo;
    let at = args.at.as_deref().map(parse_at).transpose()?;
    let mut feeds = Feeds::default();
    let mut settings = settings;
    if !replaying && let Some(t) = at {
        settings.live_offset = Some(t - now);
        feeds.clock_offset = t - now;
    }
    let mut app = if replaying {
        if args.feed_cmd.is_some() {
            anyhow::bail!(
                "--feed-cmd feeds the live board; it cannot be combined with a replay (--replay, or the built-in demo)"
            );
        }
        let day: DateTime<Utc> = match (at, &args.replay) {
            (Some(t), _) => t,
            (None, Some(f)) => date_in_name(f)
                .and_then(|d| d.and_hms_opt(12, 0, 0))
                .map(|d| d.and_utc())
                .unwrap_or(loaded.at),
            (None, None) => loaded.at,
        };
        let reports = match &args.replay {
            Some(f) => {
                let text = std::fs::read_to_string(f)
                    .with_context(|| format!("reading the replay file {}", f.display()))?;
                decode_all(&text, end_of_day(day))
                    .into_iter()
                    .map(|r| r.report)
                    .collect()
            }
            None => replay_reports(&loaded.ops, day),
        };
        let start = at.unwrap_or_else(|| {
            reports
                .iter()
                .filter_map(|r| r.observed_at)
                .min()
                .map_or(day, |t| t + TimeDelta::minutes(30))
        });
        let store = Store::new(stale_after(&loaded.ops));
        let replay = Replay::new(reports, start, args.speed.unwrap_or(1.0));
        App::new(loaded.ops, store, start, Some(replay), settings)
    } else {
        let every = crate::board::feed::parse_every(&args.feed_every)
            .map_err(|e| anyhow::anyhow!("--feed-every {e}"))?;
        if let Some(cmd) = &args.feed_cmd {
            feeds.command = Some((cmd.clone(), every));
        }
        if let Choice::Explicit(dir) | Choice::Configured(dir) = &choice {
            feeds.folder = Some((dir.join("observations"), crate::board::run::FOLDER_POLL));
            feeds.folder_loaded = loaded
                .ops
                .observations
                .iter()
                .filter(|(rel, _)| rel.starts_with("observations/"))
                .map(|(rel, text)| {
                    crate::observation::file::ObservationFile::read_already(dir.join(rel), text)
                })
                .collect();
            feeds.runway_state = Some(crate::board::feed::RunwayStateWatch::new(dir, &loaded.ops));
        }
        App::new(loaded.ops, loaded.store, loaded.at, None, settings)
    };
    for w in loaded.warnings {
        app.notice(NoteKind::Error, w);
    }
    app.attach_signoffs(
        crate::commands::signoff::log_for(ops_dir.as_deref()),
        crate::commands::signoff::data_hashes(ops_dir.as_deref()),
    );
    // Records written elsewhere (another board, `rhoboard signoff`) reach this board.
    if let Some(log) = &app.signoffs.log {
        feeds.signoff_log = Some(crate::board::feed::LogWatch::new(log.clone()));
    }
    app.attach_legs_files(ops_dir.as_deref());
    if app.settings.demo {
        app.notice(
            NoteKind::Info,
            "Demo (fictional): the day replays, an hour every 10 s. Enter opens a leg; ? shows every key."
                .into(),
        );
    }
    Ok((app, feeds))
}

/// Runs `rhoboard board`.
pub fn run(args: &Args) -> anyhow::Result<Outcome> {
    // Bad arguments and operator folders are reported first, terminal or not.
    let (app, feeds) = prepare(args, Utc::now())?;
    if !std::io::stdout().is_terminal() {
        anyhow::bail!(
            "the board needs a terminal; for text or JSON use `rhoboard check` (with --json)"
        );
    }
    if crate::board::run(app, feeds)? == crate::board::run::Ending::Interrupted {
        // The terminal is given back; a user interrupt exits 130 (docs/board.md).
        std::process::exit(i32::from(crate::board::run::INTERRUPTED_EXIT));
    }
    Ok(Outcome::Success)
}
