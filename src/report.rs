//! The briefing sheet: operator, date, the observation basis, the caution, a table of
//! the day's legs (state, limiting check, margin, headroom, sign-off) with the sign-off
//! log's head, each airfield's density altitude, wind and runway in use, and the chain
//! behind every leg that is not `within` — as markdown or as one self-contained,
//! printable HTML file (inline CSS, no scripts, no external assets; every state shown
//! with its glyph and word, so it reads in greyscale).
//!
//! Pure: the caller assesses the legs and reads the log; nothing here reads a clock or
//! a file.

use std::fmt::Write as _;

use chrono::{DateTime, Utc};

use crate::assess::leg::{FieldWx, LimitingAt, PhaseResult, Side, percent_text};
use crate::assess::{Context, LegResult, State};
use crate::display::Show;
use crate::ops::Ops;
use crate::signoff::{Chain, Head, Standing, standing};

/// The sign-off column of one leg.
#[derive(Debug, Clone, PartialEq)]
pub enum Mark {
    /// No sign-off in force.
    None,
    /// Signed, and still standing on this assessment.
    Signed {
        /// Record number.
        seq: u64,
        /// Instructor.
        instructor: String,
        /// When signed (real time).
        signed_at: DateTime<Utc>,
        /// Signed with an override.
        overridden: bool,
    },
    /// Signed, but a later report undermines it.
    Recheck {
        /// Record number.
        seq: u64,
        /// Instructor.
        instructor: String,
        /// What changed.
        reasons: Vec<String>,
    },
}

impl Mark {
    /// Short text for the table.
    pub fn text(&self) -> String {
        match self {
            Mark::None => "—".to_string(),
            Mark::Signed {
                seq,
                instructor,
                signed_at,
                overridden,
            } => format!(
                "✎ signed #{seq} {instructor} {}{}",
                signed_at.format("%d %b %H%MZ"),
                if *overridden { " (OVERRIDE)" } else { "" }
            ),
            Mark::Recheck {
                seq, instructor, ..
            } => format!("↻ re-check #{seq} {instructor}"),
        }
    }
}

/// What the sheet says about the log.
#[derive(Debug, Clone, PartialEq)]
pub enum LogLine {
    /// No log could be read (the reason).
    Unavailable(String),
    /// Sound and empty.
    Empty,
    /// Sound, with this head.
    Sound(Head),
    /// Does not verify.
    Broken {
        /// Its last record, if any.
        head: Option<Head>,
        /// The first problem.
        first: String,
        /// How many.
        count: usize,
    },
}

impl LogLine {
    /// From a chain read from the log.
    pub fn of(chain: &Chain) -> LogLine {
        let mut problems: Vec<String> = chain.problems.iter().map(|p| p.to_string()).collect();
        if let Some(t) = &chain.torn {
            problems.push(t.to_string());
        }
        match (chain.head(), problems.first()) {
            (head, Some(first)) => LogLine::Broken {
                head,
                first: first.clone(),
                count: problems.len(),
            },
            (Some(h), None) => LogLine::Sound(h),
            (None, None) => LogLine::Empty,
        }
    }

    /// One line of text.
    pub fn text(&self) -> String {
        match self {
            LogLine::Unavailable(why) => format!("sign-off log not read: {why}"),
            LogLine::Empty => "sign-off log head: none (no sign-offs yet)".to_string(),
            LogLine::Sound(h) => format!(
                "sign-off log head {h} — check a later log against this sheet with `rhoboard log verify --head {h}`"
            ),
            LogLine::Broken { head, first, count } => format!(
                "SIGN-OFF LOG DOES NOT VERIFY ({count} problem(s); first: {first}); last record {}",
                head.as_ref().map_or("none".to_string(), |h| h.to_string())
            ),
        }
    }
}

/// One airfield's line.
#[derive(Debug, Clone, PartialEq)]
pub struct FieldLine {
    /// Id.
    pub id: String,
    /// Name.
    pub name: String,
    /// Elevation, ft.
    pub elevation_ft: f64,
    /// The latest report at the reference time: (observed at, age in minutes, text).
    pub report: Option<(DateTime<Utc>, i64, String)>,
    /// That report is older than the policy allows (no basis for a check).
    pub report_stale: bool,
    /// OAT, °C (shown in the sheet's display unit).
    pub oat_c: Option<f64>,
    /// Pressure altitude, ft.
    pub pressure_altitude_ft: Option<f64>,
    /// Density altitude, ft.
    pub density_altitude_ft: Option<f64>,
    /// The reported wind in words.
    pub wind: String,
    /// Runway in use at the sheet's time (on the report of the wind beside it), and why.
    pub runway: Option<(String, String)>,
}

/// One leg's row.
#[derive(Debug, Clone, PartialEq)]
pub struct LegRow {
    /// Departure, `HHMMZ`.
    pub departs: String,
    /// Leg id.
    pub leg: String,
    /// Aircraft.
    pub aircraft: String,
    /// `FROM–TO`.
    pub route: String,
    /// Category words.
    pub category: String,
    /// State.
    pub state: State,
    /// Limiting check (or the first reason).
    pub limiting: String,
    /// Its margin.
    pub margin: String,
    /// Headroom.
    pub headroom: String,
    /// Sign-off.
    pub mark: Mark,
}

/// The chain behind a leg that is not `within`.
#[derive(Debug, Clone, PartialEq)]
pub struct ChainBlock {
    /// Heading.
    pub heading: String,
    /// State.
    pub state: State,
    /// Sections: (title, lines).
    pub sections: Vec<(String, Vec<String>)>,
}

/// Everything the sheet shows.
#[derive(Debug, Clone, PartialEq)]
pub struct Sheet {
    /// Operator name.
    pub operator: String,
    /// The operator's display units, which every figure is shown in.
    pub show: Show,
    /// The reference time.
    pub at: DateTime<Utc>,
    /// Leg rows.
    pub legs: Vec<LegRow>,
    /// The log.
    pub log: LogLine,
    /// Airfields of the day's legs.
    pub fields: Vec<FieldLine>,
    /// Chains of the legs not `within`.
    pub chains: Vec<ChainBlock>,
    /// Legs whose sign-off needs a re-check: (leg, reasons).
    pub rechecks: Vec<(String, Vec<String>)>,
    /// The forecast look-ahead, where the operator has TAFs: (leg, forecast state,
    /// when it fails from, basis). Always labelled as a forecast.
    pub forecast: Vec<ForecastLine>,
}

/// One leg's forecast look-ahead on the sheet.
#[derive(Debug, Clone, PartialEq)]
pub struct ForecastLine {
    /// Leg id.
    pub leg: String,
    /// The forecast state, or `None` when no forecast covers the leg.
    pub state: Option<State>,
    /// In words: "would be below if flown from ~1311Z", "holds through the forecast",
    /// "below now".
    pub outlook: String,
    /// The leg is observed `no-data`: the forecast stands alone.
    pub observation_missing: bool,
}

impl FieldLine {
    /// The report column: `1300Z (0 min)`, `1200Z (120 min, STALE)`, `none`.
    pub fn report_cell(&self) -> String {
        self.report
            .as_ref()
            .map_or("none".to_string(), |(t, age, _)| {
                format!(
                    "{} ({age} min{})",
                    t.format("%H%MZ"),
                    if self.report_stale { ", STALE" } else { "" }
                )
            })
    }
}

/// The sheet's forecast lines from the look-ahead results.
/// A leg already gone at the sheet's time `at` says when it left or landed, never a
/// departure forecast as if still ahead (as the board's forecast column).
pub fn forecast_lines(
    ops: &crate::ops::Ops,
    at: chrono::DateTime<chrono::Utc>,
    results: &[LegResult],
    looks: &[Option<crate::assess::lookahead::LookAhead>],
) -> Vec<ForecastLine> {
    use crate::assess::lookahead::Progress;
    results
        .iter()
        .zip(looks)
        .map(|(r, l)| (r, l, ops.legs.get(r.index).map(|leg| Progress::of(leg, at))))
        .map(|(r, l, progress)| ForecastLine {
            leg: r.id.clone(),
            // A gone leg has no forecast state: "—".
            state: l
                .as_ref()
                .filter(|_| matches!(progress, Some(Progress::Ahead)))
                .map(|l| l.state),
            observation_missing: l.as_ref().is_some_and(|l| l.observation_missing),
            outlook: match (l, progress) {
                (_, Some(Progress::Airborne { left, .. })) => {
                    format!("left {}: departed, no forecast ahead", left.format("%H%MZ"))
                }
                (_, Some(Progress::Landed { landed, .. })) => {
                    format!(
                        "landed {}: flown, no forecast ahead",
                        landed.format("%H%MZ")
                    )
                }
                (None, _) => "no forecast covers it".to_string(),
                (Some(l), _) => {
                    let when = match l.fails_from {
                        Some(t) if l.fails_now => {
                            format!("would be below if flown now ({})", t.format("%H%MZ"))
                        }
                        Some(t) => format!("would be below if flown from ~{}", t.format("%H%MZ")),
                        None if r.state == State::Below => "below now".to_string(),
                        None => "holds through the forecast".to_string(),
                    };
                    if l.worst_case {
                        when + " (a TEMPO/PROB worst case)"
                    } else {
                        when
                    }
                }
            },
        })
        .collect()
}

fn forecast_state(l: &ForecastLine) -> String {
    match l.state {
        None => "—".to_string(),
        // Observed no-data: the forecast alone, never read as better than observed.
        Some(s) if l.observation_missing => format!(
            "forecast only: {} {} (no usable observation)",
            s.glyph(),
            s.word()
        ),
        Some(s) => format!("{} {}", s.glyph(), s.word()),
    }
}

fn wind_words(w: &crate::observation::Wind) -> String {
    if w.is_calm() {
        return "calm".to_string();
    }
    let mut s = match w.direction_deg {
        Some(d) if !w.variable => format!("{d:03.0}° {:.0} kt", w.speed_kt),
        _ => format!("variable {:.0} kt", w.speed_kt),
    };
    if let Some(g) = w.gust_kt {
        let _ = write!(s, " gusting {g:.0} kt");
    }
    if let (Some(a), Some(b)) = (w.variable_from_deg, w.variable_to_deg) {
        let _ = write!(s, " (varying {a:03.0}°–{b:03.0}°)");
    }
    s
}

fn opt(v: Option<f64>, f: impl Fn(f64) -> String) -> String {
    v.filter(|v| v.is_finite()).map_or("—".to_string(), f)
}

/// Builds the sheet from the day's assessed legs and the log (if it could be read).
pub fn build(ctx: &Context<'_>, results: &[LegResult], log: Result<&Chain, String>) -> Sheet {
    let ops: &Ops = ctx.ops;
    let show = Show::of(ops);
    let mut rechecks = Vec::new();
    let legs = results
        .iter()
        .map(|r| {
            let leg = ops.legs.get(r.index);
            let mark = match &log {
                Ok(chain) => match standing(chain, ops, r) {
                    Standing::Unsigned => Mark::None,
                    Standing::Signed(e) => Mark::Signed {
                        seq: e.record.seq,
                        instructor: e.record.instructor.clone(),
                        signed_at: e.record.signed_at,
                        overridden: e.record.override_reason.is_some(),
                    },
                    Standing::Recheck(e, reasons) => {
                        rechecks.push((r.id.clone(), reasons.clone()));
                        Mark::Recheck {
                            seq: e.record.seq,
                            instructor: e.record.instructor.clone(),
                            reasons,
                        }
                    }
                },
                Err(_) => Mark::None,
            };
            LegRow {
                departs: leg.map_or("—".to_string(), |l| {
                    l.departs_utc().format("%H%MZ").to_string()
                }),
                leg: r.id.clone(),
                aircraft: leg.map_or("—".to_string(), |l| l.aircraft.clone()),
                route: format!("{}–{}", r.departure.airfield, r.arrival.airfield),
                category: r.category.words().to_string(),
                state: r.state,
                limiting: match (&r.limiting, show.reasons(r).first()) {
                    (Some(l), _) => l.check.clone(),
                    (None, Some(why)) => why.clone(),
                    (None, None) => "—".to_string(),
                },
                margin: show.limiting_margin(r),
                headroom: r
                    .headroom
                    .map_or_else(|| "—".to_string(), |h| show.headroom(&h)),
                mark,
            }
        })
        .collect();
    let log = match log {
        Ok(c) => LogLine::of(c),
        Err(why) => LogLine::Unavailable(why),
    };
    let mut ids: Vec<&str> = Vec::new();
    for r in results {
        for a in [&r.departure.airfield, &r.arrival.airfield] {
            if !ids.contains(&a.as_str()) {
                ids.push(a);
            }
        }
    }
    let fields = ids
        .iter()
        .filter_map(|id| ops.airfield(id))
        .map(|a| {
            let valid = ctx.store.valid_at(&a.id, ctx.at);
            let wx = valid.and_then(|v| FieldWx::from_report(v.report, a.elevation_ft));
            // The runway in use at the sheet's time on the same report as the wind
            // beside it, as the board's Airfields pane has it.
            let runway = ops.airfield_position(&a.id).and_then(|fi| {
                let ends = ctx.model.field_ends_at(fi, ctx.at);
                let winds: Vec<_> = wx
                    .as_ref()
                    .map(|w| ends.iter().map(|e| w.on_end(e.heading_true_deg)).collect())
                    .unwrap_or_default();
                let usable: Vec<bool> = ends.iter().map(|e| e.usable_at(ctx.at)).collect();
                // On a stale report no runway is given (the board shows none either).
                if valid.is_some_and(|v| v.stale) {
                    return None;
                }
                let (k, why) = crate::assess::pairing::end_in_use(
                    ctx.model,
                    fi,
                    ctx.at,
                    wx.as_ref(),
                    &winds,
                    &usable,
                )?;
                let end = a.runway_ends.get(k)?;
                let closed: Vec<&str> = a
                    .runway_ends
                    .iter()
                    .zip(&usable)
                    .filter(|(_, u)| !**u)
                    .map(|(e, _)| e.designator.as_str())
                    .collect();
                Some((end.designator.clone(), why.words(&closed)))
            });
            FieldLine {
                id: a.id.clone(),
                name: a.name.clone(),
                elevation_ft: a.elevation_ft,
                report: valid.and_then(|v| {
                    v.report
                        .observed_at
                        .map(|t| (t, v.age.num_minutes(), v.report.text.clone()))
                }),
                report_stale: valid.is_some_and(|v| v.stale),
                oat_c: wx.map(|w| w.air.oat_c),
                pressure_altitude_ft: wx.map(|w| w.air.pressure_altitude_ft),
                // Rounded up, as the density-altitude limit's row shows it.
                density_altitude_ft: wx.map(|w| crate::units::up0(w.air.density_altitude_ft)),
                wind: valid
                    .and_then(|v| v.report.wind.as_ref())
                    .map_or("—".to_string(), wind_words),
                runway,
            }
        })
        .collect();
    let chains = results
        .iter()
        .filter(|r| r.state != State::Within)
        .map(|r| chain_block(ops, r, show))
        .collect();
    Sheet {
        operator: ops.operator.name.clone(),
        show,
        at: ctx.at,
        legs,
        log,
        fields,
        chains,
        rechecks,
        forecast: Vec::new(),
    }
}

/// The mark after the row that decides the leg's state ([`LegResult::limiting`]).
///
/// [`LegResult::limiting`]: crate::assess::leg::LegResult::limiting
const LIMITING_MARK: &str = " (limiting)";

/// `limiting`: the index of the check that decides the leg, when it is one of these.
fn phase_lines(
    name: &str,
    p: &PhaseResult,
    limiting: Option<usize>,
    show: Show,
    out: &mut Vec<String>,
) {
    let c = &p.chain;
    let mut s = format!(
        "{name} at {}: flight-manual table ground roll {}, 50 ft distance {}",
        show.mass_up(p.mass_kg),
        show.dist(c.table_ground_roll_m),
        show.dist(c.table_distance_50ft_m)
    );
    let _ = write!(
        s,
        "; wind: {} reported, {} counted ({}) → × {:.3}",
        crate::assess::leg::along_wind(c.headwind_reported_kt, 1),
        crate::assess::leg::along_wind(c.headwind_used_kt, 1),
        if c.wind_factoring_in_manual {
            "the manual's table factors the wind itself"
        } else {
            "policy factoring"
        },
        c.wind_factor
    );
    let _ = write!(
        s,
        "; {} → ground roll {}, 50 ft {}",
        c.surface.word(),
        show.dist(c.after_surface_ground_roll_m),
        show.dist(c.after_surface_distance_50ft_m)
    );
    if c.adverse_slope_percent > 0.0 {
        let _ = write!(
            s,
            "; adverse slope {:.1} % → × {:.3} ({})",
            c.adverse_slope_percent,
            c.slope_factor,
            c.slope_origin.word()
        );
    }
    let _ = write!(
        s,
        "; result: ground roll {}, 50 ft distance {}",
        show.dist(c.ground_roll_m),
        show.dist(c.distance_50ft_m)
    );
    out.push(s);
    for (i, k) in p.checks.iter().enumerate() {
        out.push(format!(
            "{} {}: {} × {} = {} required, {} available, margin {}{}; from {}",
            k.state.glyph(),
            k.rule,
            show.dist(k.result.figure_m),
            k.result.factor,
            show.dist(k.result.required_m),
            show.dist(k.result.available_m),
            percent_text(k.result.margin),
            if limiting == Some(i) {
                LIMITING_MARK
            } else {
                ""
            },
            k.source
        ));
    }
}

/// `limiting`: the check that decides the leg ([`Limiting::at`]), marked where it is a
/// row of this side.
///
/// [`Limiting::at`]: crate::assess::leg::Limiting::at
fn side_lines(
    label: &str,
    s: &Side,
    departure: bool,
    limiting: Option<LimitingAt>,
    show: Show,
) -> (String, Vec<String>) {
    let takeoff_at = match limiting {
        Some(LimitingAt::Takeoff(i)) if departure => Some(i),
        _ => None,
    };
    let landing_at = match limiting {
        Some(LimitingAt::Landing(i)) if !departure => Some(i),
        _ => None,
    };
    let mut out = Vec::new();
    match &s.observation {
        Some(o) => out.push(format!(
            "report {} ({} min old{}{}): {}",
            o.observed_at.format("%H%MZ"),
            o.age_min.round(),
            if o.stale { ", STALE" } else { "" },
            if o.as_of {
                ", latest at the reference time"
            } else {
                ""
            },
            o.text
        )),
        None => out.push("no report".to_string()),
    }
    if let Some(a) = &s.air {
        out.push(format!(
            "air: OAT {} (ISA {}), pressure altitude {:.0} ft, density altitude {:.0} ft",
            show.temp(a.oat_c),
            show.warming(a.isa_deviation_c),
            a.pressure_altitude_ft,
            crate::units::up0(a.density_altitude_ft)
        ));
    }
    if let (Some(rwy), Some(w)) = (&s.runway, &s.wind) {
        // As the board's detail words them.
        out.push(format!(
            "runway {rwy} ({}): {}, crosswind {:.0} kt from the {}",
            s.runway_reason,
            w.along_words(),
            w.crosswind_shown_kt(),
            serde_json::to_value(w.crosswind_from)
                .ok()
                .and_then(|v| v.as_str().map(str::to_string))
                .unwrap_or_default()
        ));
    }
    if departure {
        if let Some(p) = &s.takeoff {
            phase_lines("takeoff", p, takeoff_at, show, &mut out);
        }
        if let Some(c) = &s.climb {
            let ch = &c.chain;
            let mut l = format!(
                "{} climb: {:.0} ft/min (minimum {:.0}) at {:.1} kt TAS, ground speed {:.1} kt → {:.0} ft/NM",
                c.state.glyph(),
                ch.rate_fpm,
                ch.min_rate_fpm,
                ch.true_airspeed_kt,
                ch.ground_speed_kt,
                // Rounded down, as a figure against a minimum is shown (and the board).
                crate::units::down0(ch.gradient_ft_per_nm)
            );
            if let Some(g) = ch.required_gradient_ft_per_nm {
                let _ = write!(l, " (required {g:.0} ft/NM)");
            }
            let _ = write!(l, ", margin {}", percent_text(ch.margin()));
            if departure && limiting == Some(LimitingAt::Climb) {
                l.push_str(LIMITING_MARK);
            }
            out.push(l);
        }
    } else if let Some(p) = &s.landing {
        phase_lines("landing", p, landing_at, show, &mut out);
    }
    for (i, l) in s.limits.iter().enumerate() {
        let is_limiting = limiting
            == Some(LimitingAt::Limit {
                departure,
                index: i,
            });
        if l.state == State::Within && !is_limiting {
            continue;
        }
        let envelope = l.kind == crate::assess::limits::LimitKind::Envelope;
        // Where a margin is shown, the figures are those whose difference it is, in
        // the display unit.
        let (sh, unit) = show.limit_shown(l);
        let d = sh.decimals;
        let note = show.in_text(&l.note);
        let value = match (l.value, l.limit) {
            // The envelope's row carries its margin and where on the CG line it is read.
            (Some(_), Some(_)) if envelope && sh.margin.is_some() => format!(
                "{:.d$} {unit} against {:.d$} {unit}, margin {:+.d$} {unit} ({note})",
                sh.value.unwrap_or(f64::NAN),
                sh.limit.unwrap_or(f64::NAN),
                sh.margin.unwrap_or(f64::NAN),
            ),
            (Some(_), Some(_)) => format!(
                "{:.d$} {unit} against {:.d$} {unit}{}",
                sh.value.unwrap_or(f64::NAN),
                sh.limit.unwrap_or(f64::NAN),
                sh.margin
                    .map_or(String::new(), |m| format!(", margin {m:+.d$} {unit}"))
            ),
            // Nothing measured (no ceiling reported, unknown): the limit still shows.
            (None, Some(_)) if !l.unit.is_empty() => {
                let what = if note.is_empty() {
                    "no value".to_string()
                } else {
                    note
                };
                format!("{what}, limit {:.d$} {unit}", sh.limit.unwrap_or(f64::NAN))
            }
            _ => note,
        };
        out.push(format!(
            "{} {}: {value} — {}{}; from {}",
            l.state.glyph(),
            l.label(),
            l.state.word(),
            if is_limiting { LIMITING_MARK } else { "" },
            l.source
        ));
    }
    for g in &s.gaps {
        out.push(format!("? {}", show.in_text(g)));
    }
    (
        format!("{label} {} — {}", s.airfield, s.state),
        out.into_iter().collect(),
    )
}

fn chain_block(ops: &Ops, r: &LegResult, show: Show) -> ChainBlock {
    let leg = ops.legs.get(r.index);
    let heading = format!(
        "{} {} — {}–{}, {}, {}{}",
        r.id,
        r.state,
        r.departure.airfield,
        r.arrival.airfield,
        leg.map_or("—", |l| l.aircraft.as_str()),
        r.category.words(),
        leg.and_then(|l| ops.pilot(&l.pilot))
            .map_or(String::new(), |p| format!(", {}", p.name))
    );
    let mut sections = vec![("Why".to_string(), show.reasons(r))];
    let at = r.limiting.as_ref().map(|l| l.at);
    // Only the ends that are not `within`: the chain of what is short, not of all.
    if r.departure.state != State::Within {
        sections.push(side_lines("Departure", &r.departure, true, at, show));
    }
    if r.arrival.state != State::Within {
        sections.push(side_lines("Arrival", &r.arrival, false, at, show));
    }
    let mut tail = vec![format!(
        "headroom: {}",
        r.headroom.map_or_else(
            || format!("— ({})", r.headroom_absent_why()),
            |h| show.headroom_words(&h)
        )
    )];
    tail.extend(r.advice.iter().map(|a| show.in_text(a)));
    sections.push(("Headroom and advice".to_string(), tail));
    ChainBlock {
        heading,
        state: r.state,
        sections,
    }
}

fn md_cell(s: &str) -> String {
    s.replace('|', "\\|").replace('\n', " ")
}

/// The sheet as markdown.
pub fn markdown(s: &Sheet) -> String {
    let mut o = String::new();
    let _ = writeln!(o, "# Briefing sheet — {}", s.operator);
    let _ = writeln!(o);
    let _ = writeln!(
        o,
        "**Legs of {}**, assessed as of **{} UTC** on the reports known up to then.",
        s.at.format("%Y-%m-%d"),
        s.at.format("%H:%M")
    );
    let _ = writeln!(o);
    let _ = writeln!(o, "> **{}**", crate::CAUTION);
    let _ = writeln!(o);
    let _ = writeln!(o, "## Legs");
    let _ = writeln!(o);
    let _ = writeln!(
        o,
        "| Dep (UTC) | Leg | Aircraft | Route | Category | State | Limiting check | Margin | Headroom | Sign-off |"
    );
    let _ = writeln!(o, "|---|---|---|---|---|---|---|---:|---:|---|");
    for r in &s.legs {
        let _ = writeln!(
            o,
            "| {} | {} | {} | {} | {} | {} | {} | {} | {} | {} |",
            r.departs,
            r.leg,
            md_cell(&r.aircraft),
            r.route,
            r.category,
            r.state,
            md_cell(&r.limiting),
            md_cell(&r.margin),
            r.headroom,
            md_cell(&r.mark.text())
        );
    }
    if s.legs.is_empty() {
        let _ = writeln!(o, "| — | no legs on this date | | | | | | | | |");
    }
    let _ = writeln!(o);
    let _ = writeln!(
        o,
        "States: ✓ within · ~ thin · ✗ below · ? no-data. {}",
        s.log.text()
    );
    let _ = writeln!(o);
    if !s.rechecks.is_empty() {
        let _ = writeln!(o, "**Sign-offs to re-check:**");
        let _ = writeln!(o);
        for (leg, why) in &s.rechecks {
            let _ = writeln!(o, "- ↻ {leg}: {}", why.join("; "));
        }
        let _ = writeln!(o);
    }
    if !s.forecast.is_empty() {
        let _ = writeln!(
            o,
            "## Forecast look-ahead (from the TAFs — a forecast, not an observation)"
        );
        let _ = writeln!(o);
        let _ = writeln!(o, "| Leg | Forecast | Outlook |");
        let _ = writeln!(o, "| --- | --- | --- |");
        for f in &s.forecast {
            let _ = writeln!(
                o,
                "| {} | {} | {} |",
                md_cell(&f.leg),
                forecast_state(f),
                md_cell(&f.outlook)
            );
        }
        let _ = writeln!(o);
    }
    let _ = writeln!(o, "## Airfields at {}", s.at.format("%H%MZ"));
    let _ = writeln!(o);
    let _ = writeln!(
        o,
        "| Airfield | Elevation | Report | OAT | Pressure alt. | Density alt. | Wind | Runway in use |"
    );
    let _ = writeln!(o, "|---|---:|---|---:|---:|---:|---|---|");
    for f in &s.fields {
        let _ = writeln!(
            o,
            "| {} {} | {:.0} ft | {} | {} | {} | {} | {} | {} |",
            f.id,
            md_cell(&f.name),
            f.elevation_ft,
            f.report_cell(),
            opt(f.oat_c, |v| s.show.temp(v)),
            opt(f.pressure_altitude_ft, |v| format!("{v:.0} ft")),
            opt(f.density_altitude_ft, |v| format!("{v:.0} ft")),
            f.wind,
            f.runway
                .as_ref()
                .map_or("—".to_string(), |(r, why)| md_cell(&format!(
                    "{r} ({why})"
                )))
        );
    }
    let _ = writeln!(o);
    let _ = writeln!(o, "Observation basis (latest report at each airfield):");
    let _ = writeln!(o);
    for f in &s.fields {
        if let Some((_, _, text)) = &f.report {
            let _ = writeln!(o, "    {text}");
        }
    }
    let _ = writeln!(o);
    if !s.chains.is_empty() {
        let _ = writeln!(o, "## Legs not within minimums with buffer");
        for c in &s.chains {
            let _ = writeln!(o);
            let _ = writeln!(o, "### {}", c.heading);
            for (title, lines) in &c.sections {
                if lines.is_empty() {
                    continue;
                }
                let _ = writeln!(o);
                let _ = writeln!(o, "**{title}**");
                let _ = writeln!(o);
                for l in lines {
                    let _ = writeln!(o, "- {}", l.replace('\n', " "));
                }
            }
        }
        let _ = writeln!(o);
    }
    let _ = writeln!(o, "---");
    let _ = writeln!(o);
    let _ = writeln!(
        o,
        "rhoboard {} · {}",
        env!("CARGO_PKG_VERSION"),
        crate::CAUTION
    );
    o
}

/// Escapes text for HTML (and XML): `&`, `<`, `>`, `"`, `'`.
pub fn html_escape(s: &str) -> String {
    esc(s)
}

fn esc(s: &str) -> String {
    let mut o = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => o.push_str("&amp;"),
            '<' => o.push_str("&lt;"),
            '>' => o.push_str("&gt;"),
            '"' => o.push_str("&quot;"),
            '\'' => o.push_str("&#39;"),
            c => o.push(c),
        }
    }
    o
}

fn state_class(s: State) -> &'static str {
    match s {
        State::Within => "within",
        State::Thin => "thin",
        State::NoData => "nodata",
        State::Below => "below",
    }
}

const CSS: &str = "\
@page { size: A4 landscape; margin: 12mm; }
* { box-sizing: border-box; }
body { font-family: 'DejaVu Sans', 'Liberation Sans', Arial, sans-serif; font-size: 9.5pt; color: #000; background: #fff; margin: 0 auto; max-width: 290mm; padding: 6mm; }
h1 { font-size: 15pt; margin: 0 0 2mm 0; }
h2 { font-size: 12pt; margin: 5mm 0 2mm 0; border-bottom: 1.5pt solid #000; }
h3 { font-size: 10.5pt; margin: 4mm 0 1mm 0; }
p { margin: 1mm 0; }
.caution { border: 2pt solid #000; padding: 2mm 3mm; font-weight: bold; margin: 3mm 0; }
table { border-collapse: collapse; width: 100%; page-break-inside: auto; font-size: 8.5pt; }
td.nw { white-space: nowrap; }
.chains { column-count: 2; column-gap: 6mm; }
h2.chains-title { page-break-before: always; }
tr { page-break-inside: avoid; }
th, td { border: 0.6pt solid #555; padding: 1mm 1.5mm; text-align: left; vertical-align: top; }
th { background: #e6e6e6; }
td.num { text-align: right; white-space: nowrap; }
td.state { white-space: nowrap; font-weight: bold; }
tr.below td.state { border: 2pt solid #000; background: #d0d0d0; }
tr.thin td.state { border: 1.2pt dashed #000; }
tr.nodata td.state { border: 1.2pt dotted #000; font-style: italic; }
tr.below td { font-weight: bold; }
.recheck { border: 1.5pt solid #000; padding: 1mm 2mm; margin: 2mm 0; }
.legend, .foot { font-size: 8.5pt; }
.loghead { font-family: 'DejaVu Sans Mono', monospace; font-size: 8.5pt; word-break: break-all; }
pre { font-family: 'DejaVu Sans Mono', monospace; font-size: 8pt; white-space: pre-wrap; margin: 1mm 0; }
.chain { break-inside: avoid; page-break-inside: avoid; border-left: 3pt solid #000; padding-left: 3mm; margin: 0 0 3mm 0; font-size: 8.5pt; }
.chain.thin { border-left-style: dashed; }
.chain.nodata { border-left-style: dotted; }
.chain ul { margin: 0.5mm 0 1.5mm 0; padding-left: 5mm; }
.chain h4 { font-size: 9.5pt; margin: 1.5mm 0 0 0; }
";

/// The sheet as one self-contained, printable HTML file (XHTML-compatible markup).
pub fn html(s: &Sheet) -> String {
    let mut o = String::new();
    let title = format!(
        "Briefing sheet — {} — {}",
        s.operator,
        s.at.format("%Y-%m-%d %H%MZ")
    );
    let _ = writeln!(o, "<!DOCTYPE html>");
    let _ = writeln!(
        o,
        "<html xmlns=\"http://www.w3.org/1999/xhtml\" lang=\"en\" xml:lang=\"en\">"
    );
    let _ = writeln!(o, "<head>");
    let _ = writeln!(o, "<meta charset=\"utf-8\" />");
    let _ = writeln!(o, "<title>{}</title>", esc(&title));
    let _ = writeln!(o, "<style>\n{CSS}</style>");
    let _ = writeln!(o, "</head>");
    let _ = writeln!(o, "<body>");
    let _ = writeln!(o, "<h1>Briefing sheet — {}</h1>", esc(&s.operator));
    let _ = writeln!(
        o,
        "<p><strong>Legs of {}</strong>, assessed as of <strong>{} UTC</strong> on the reports known up to then.</p>",
        s.at.format("%Y-%m-%d"),
        s.at.format("%H:%M")
    );
    let _ = writeln!(o, "<p class=\"caution\">{}</p>", esc(crate::CAUTION));
    let _ = writeln!(o, "<h2>Legs</h2>");
    let _ = writeln!(o, "<table>");
    let _ = writeln!(
        o,
        "<thead><tr><th>Dep (UTC)</th><th>Leg</th><th>Aircraft</th><th>Route</th><th>Category</th><th>State</th><th>Limiting check</th><th>Margin</th><th>Headroom</th><th>Sign-off</th></tr></thead>"
    );
    let _ = writeln!(o, "<tbody>");
    for r in &s.legs {
        let _ = writeln!(
            o,
            "<tr class=\"{}\"><td class=\"nw\">{}</td><td class=\"nw\">{}</td><td class=\"nw\">{}</td><td class=\"nw\">{}</td><td class=\"nw\">{}</td><td class=\"state\">{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}</td></tr>",
            state_class(r.state),
            esc(&r.departs),
            esc(&r.leg),
            esc(&r.aircraft),
            esc(&r.route),
            esc(&r.category),
            esc(&r.state.to_string()),
            esc(&r.limiting),
            esc(&r.margin),
            esc(&r.headroom),
            esc(&r.mark.text())
        );
    }
    if s.legs.is_empty() {
        let _ = writeln!(o, "<tr><td colspan=\"10\">No legs on this date.</td></tr>");
    }
    let _ = writeln!(o, "</tbody>");
    let _ = writeln!(o, "</table>");
    let _ = writeln!(
        o,
        "<p class=\"legend\">States: ✓ within · ~ thin · ✗ below · ? no-data. ✎ signed · ↻ re-check.</p>"
    );
    let _ = writeln!(o, "<p class=\"loghead\">{}</p>", esc(&s.log.text()));
    if !s.rechecks.is_empty() {
        let _ = writeln!(
            o,
            "<div class=\"recheck\"><strong>Sign-offs to re-check:</strong><ul>"
        );
        for (leg, why) in &s.rechecks {
            let _ = writeln!(o, "<li>↻ {}: {}</li>", esc(leg), esc(&why.join("; ")));
        }
        let _ = writeln!(o, "</ul></div>");
    }
    if !s.forecast.is_empty() {
        let _ = writeln!(
            o,
            "<h2>Forecast look-ahead <small>(from the TAFs — a forecast, not an observation)</small></h2>"
        );
        let _ = writeln!(
            o,
            "<table><thead><tr><th>Leg</th><th>Forecast</th><th>Outlook</th></tr></thead><tbody>"
        );
        for f in &s.forecast {
            let _ = writeln!(
                o,
                "<tr><td>{}</td><td>{}</td><td>{}</td></tr>",
                esc(&f.leg),
                esc(&forecast_state(f)),
                esc(&f.outlook)
            );
        }
        let _ = writeln!(o, "</tbody></table>");
    }
    let _ = writeln!(o, "<h2>Airfields at {}</h2>", s.at.format("%H%MZ"));
    let _ = writeln!(o, "<table>");
    let _ = writeln!(
        o,
        "<thead><tr><th>Airfield</th><th>Elevation</th><th>Report</th><th>OAT</th><th>Pressure alt.</th><th>Density alt.</th><th>Wind</th><th>Runway in use</th></tr></thead>"
    );
    let _ = writeln!(o, "<tbody>");
    for f in &s.fields {
        let _ = writeln!(
            o,
            "<tr><td>{} {}</td><td class=\"num\">{:.0} ft</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}</td><td>{}</td></tr>",
            esc(&f.id),
            esc(&f.name),
            f.elevation_ft,
            f.report_cell(),
            opt(f.oat_c, |v| s.show.temp(v)),
            opt(f.pressure_altitude_ft, |v| format!("{v:.0} ft")),
            opt(f.density_altitude_ft, |v| format!("{v:.0} ft")),
            esc(&f.wind),
            f.runway
                .as_ref()
                .map_or("—".to_string(), |(r, why)| esc(&format!("{r} ({why})")))
        );
    }
    let _ = writeln!(o, "</tbody>");
    let _ = writeln!(o, "</table>");
    let _ = writeln!(
        o,
        "<p>Observation basis (latest report at each airfield):</p>"
    );
    let reports: Vec<String> = s
        .fields
        .iter()
        .filter_map(|f| f.report.as_ref().map(|(_, _, t)| esc(t)))
        .collect();
    let _ = writeln!(o, "<pre>{}</pre>", reports.join("\n"));
    if !s.chains.is_empty() {
        let _ = writeln!(
            o,
            "<h2 class=\"chains-title\">Legs not within minimums with buffer</h2>"
        );
        let _ = writeln!(o, "<div class=\"chains\">");
        for c in &s.chains {
            let _ = writeln!(o, "<div class=\"chain {}\">", state_class(c.state));
            let _ = writeln!(o, "<h3>{}</h3>", esc(&c.heading));
            for (title, lines) in &c.sections {
                if lines.is_empty() {
                    continue;
                }
                let _ = writeln!(o, "<h4>{}</h4>", esc(title));
                let _ = writeln!(o, "<ul>");
                for l in lines {
                    let _ = writeln!(o, "<li>{}</li>", esc(l));
                }
                let _ = writeln!(o, "</ul>");
            }
            let _ = writeln!(o, "</div>");
        }
        let _ = writeln!(o, "</div>");
    }
    let _ = writeln!(
        o,
        "<p class=\"foot\">rhoboard {} · {}</p>",
        env!("CARGO_PKG_VERSION"),
        esc(crate::CAUTION)
    );
    let _ = writeln!(o, "</body>");
    let _ = writeln!(o, "</html>");
    o
}
