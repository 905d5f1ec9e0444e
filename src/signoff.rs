//! Instructor sign-offs: the record of what a sign-off was based on, the rules that
//! refuse one, revocation and supersession, and the test for a sign-off that a later
//! report has undermined (`re-check`). The append-only, hash-chained log that keeps the
//! records is in [`log`].
//!
//! Pure apart from [`log`]: the signing time, the basis time and the hashes of the
//! operator's files are parameters, never read here.

pub mod log;

use std::fmt;

use chrono::{DateTime, NaiveDate, Utc};
use serde::{Deserialize, Serialize};
use sha2::{Digest, Sha256};

use crate::assess::leg::{PhaseResult, Side};
use crate::assess::limits::LimitKind;
use crate::assess::{LegResult, State};
use crate::ops::operator::SignOffPolicy;
use crate::ops::{Category, Ops, OpsFiles};

pub use log::{AppendOptions, Appended, Chain, Entry, Head, Log, LogError, Problem};

/// The record format this build writes and reads.
pub const SCHEMA_VERSION: u32 = 1;

/// The `prev_sha256` of the first record of a log.
pub const GENESIS_SHA256: &str = "0000000000000000000000000000000000000000000000000000000000000000";

/// Lower-case hex SHA-256 of some bytes.
pub fn sha256_hex(bytes: &[u8]) -> String {
    use std::fmt::Write as _;
    let digest = Sha256::digest(bytes);
    let mut s = String::with_capacity(64);
    for b in digest.iter() {
        let _ = write!(s, "{b:02x}");
    }
    s
}

/// What a record says.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Kind {
    /// The instructor signs the leg off.
    SignOff,
    /// The instructor withdraws an earlier sign-off (`revokes_seq`).
    Revocation,
}

/// One operator data file and its SHA-256.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FileHash {
    /// Relative path in the operator folder.
    pub path: String,
    /// SHA-256 of its bytes, lower-case hex.
    pub sha256: String,
}

/// The hashes of the operator data a sign-off was computed from.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DataHashes {
    /// SHA-256 over the lines `path␠sha256\n` of every file, in path order.
    pub combined_sha256: String,
    /// Each file.
    pub files: Vec<FileHash>,
}

impl DataHashes {
    /// Hashes the operator's files (the folder's, or the built-in demo's).
    pub fn of(files: &OpsFiles) -> DataHashes {
        let files: Vec<FileHash> = files
            .files
            .iter()
            .map(|(path, text)| FileHash {
                path: path.clone(),
                sha256: sha256_hex(text.as_bytes()),
            })
            .collect();
        let listing: String = files
            .iter()
            .map(|f| format!("{} {}\n", f.path, f.sha256))
            .collect();
        DataHashes {
            combined_sha256: sha256_hex(listing.as_bytes()),
            files,
        }
    }
}

/// A report a sign-off was based on, as received.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ReportUsed {
    /// Station.
    pub station: String,
    /// Observation time.
    pub observed_at: DateTime<Utc>,
    /// The raw text.
    pub text: String,
    /// Age at the time it stood for, minutes.
    pub age_min: f64,
    /// Older than the policy allows.
    pub stale: bool,
    /// The event was after the basis time: the latest report then ("as of").
    pub as_of: bool,
}

/// A distance check, required against available.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CheckFigure {
    /// `takeoff` or `landing`.
    pub phase: String,
    /// The rule, e.g. `distance_50ft × 1.33 ≤ TODA`.
    pub rule: String,
    /// Required (figure × factor), m.
    pub required_m: f64,
    /// Available, m.
    pub available_m: f64,
    /// Margin, percent.
    pub margin_percent: Option<f64>,
}

/// Climb at the departure.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ClimbFigure {
    /// Rate of climb, ft/min.
    pub rate_fpm: f64,
    /// Climb gradient, ft/NM.
    pub gradient_ft_per_nm: f64,
    /// The category's minimum rate, ft/min.
    pub min_rate_fpm: f64,
    /// The runway end's required gradient, ft/NM.
    pub required_gradient_ft_per_nm: Option<f64>,
}

/// The key figures at one end of the leg.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct EndFigures {
    /// Airfield id.
    pub airfield: String,
    /// Runway in use.
    pub runway: Option<String>,
    /// The report used.
    pub report: Option<ReportUsed>,
    /// Pressure altitude, ft.
    pub pressure_altitude_ft: Option<f64>,
    /// Density altitude, ft.
    pub density_altitude_ft: Option<f64>,
    /// Outside air temperature, °C.
    pub oat_c: Option<f64>,
    /// Headwind component (negative: tailwind), kt.
    pub headwind_kt: Option<f64>,
    /// Crosswind component with the gust, kt.
    pub crosswind_kt: Option<f64>,
    /// Side the crosswind comes from.
    pub crosswind_from: Option<String>,
    /// Takeoff (departure) or landing (arrival) checks.
    pub checks: Vec<CheckFigure>,
    /// Climb (departure only).
    pub climb: Option<ClimbFigure>,
    /// Today's runway state of the end in use, in words, when one was set.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub runway_today: Option<String>,
    /// Every limit checked at this end — weather, wind, density altitude, daylight,
    /// endorsements, the pilot's own limits, mass and balance — with where it comes from.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub limits: Vec<LimitFigure>,
    /// State of this end.
    pub state: String,
}

/// One limit as it stood when the leg was signed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LimitFigure {
    /// What it is about, e.g. `crosswind`, `daylight`, `endorsement`.
    pub kind: String,
    /// The value, in `unit`.
    pub value: Option<f64>,
    /// The limit, in `unit`.
    pub limit: Option<f64>,
    /// The unit.
    pub unit: String,
    /// `within`, `thin`, `below` or `no-data`.
    pub state: String,
    /// Where the limit comes from (category, pilot, regulation, type).
    pub source: String,
    /// A plain sentence.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub note: String,
}

/// What the assessment showed when the leg was signed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Figures {
    /// The leg's state word (`within`, `thin`, `below`, `no-data`).
    pub state: String,
    /// The limiting check.
    pub limiting_check: Option<String>,
    /// Its margin, as shown.
    pub limiting_margin: Option<String>,
    /// Degrees of warming left, °C.
    pub headroom_c: Option<f64>,
    /// The headroom stops where the manual's table ends.
    pub headroom_table_ends: bool,
    /// Takeoff mass, kg.
    pub takeoff_mass_kg: Option<f64>,
    /// Landing mass, kg.
    pub landing_mass_kg: Option<f64>,
    /// Departure.
    pub departure: EndFigures,
    /// Arrival.
    pub arrival: EndFigures,
    /// Why the leg is not `within`, as the assessment said.
    pub reasons: Vec<String>,
}

impl Figures {
    /// The figures of an assessed leg.
    pub fn of(r: &LegResult) -> Figures {
        Figures {
            state: r.state.word().to_string(),
            limiting_check: r.limiting.as_ref().map(|l| l.check.clone()),
            limiting_margin: r
                .limiting
                .as_ref()
                .and_then(|l| l.margin_words().map(str::to_string)),
            headroom_c: r.headroom.map(|h| h.warming_c).filter(|h| h.is_finite()),
            headroom_table_ends: r.headroom.is_some_and(|h| h.table_ends),
            takeoff_mass_kg: r.takeoff_mass_kg,
            landing_mass_kg: r.landing_mass_kg,
            departure: end_figures(&r.departure, "takeoff", &r.departure.takeoff),
            arrival: end_figures(&r.arrival, "landing", &r.arrival.landing),
            reasons: r.reasons.clone(),
        }
    }

    /// The state as signed, if the word is one this build knows.
    pub fn signed_state(&self) -> Option<State> {
        state_from_word(&self.state)
    }
}

/// The state named by its word.
pub fn state_from_word(word: &str) -> Option<State> {
    [State::Within, State::Thin, State::NoData, State::Below]
        .into_iter()
        .find(|s| s.word() == word)
}

fn finite(v: f64) -> Option<f64> {
    v.is_finite().then_some(v)
}

fn end_figures(s: &Side, phase: &str, p: &Option<PhaseResult>) -> EndFigures {
    EndFigures {
        airfield: s.airfield.clone(),
        runway: s.runway.clone(),
        report: s.observation.as_ref().map(|o| ReportUsed {
            station: o.station.clone(),
            observed_at: o.observed_at,
            text: o.text.clone(),
            age_min: o.age_min,
            stale: o.stale,
            as_of: o.as_of,
        }),
        pressure_altitude_ft: s.air.map(|a| a.pressure_altitude_ft).and_then(finite),
        density_altitude_ft: s.air.map(|a| a.density_altitude_ft).and_then(finite),
        oat_c: s.air.map(|a| a.oat_c).and_then(finite),
        headwind_kt: s.wind.map(|w| w.headwind_kt).and_then(finite),
        crosswind_kt: s.wind.map(|w| w.crosswind_kt).and_then(finite),
        crosswind_from: s.wind.and_then(|w| {
            serde_json::to_value(w.crosswind_from)
                .ok()
                .and_then(|v| v.as_str().map(str::to_string))
        }),
        checks: p
            .iter()
            .flat_map(|p| &p.checks)
            .map(|c| CheckFigure {
                phase: phase.to_string(),
                rule: c.rule.clone(),
                required_m: c.result.required_m,
                available_m: c.result.available_m,
                margin_percent: finite(c.result.margin * 100.0),
            })
            .collect(),
        climb: s.climb.as_ref().map(|c| ClimbFigure {
            rate_fpm: c.chain.rate_fpm,
            gradient_ft_per_nm: c.chain.gradient_ft_per_nm,
            min_rate_fpm: c.chain.min_rate_fpm,
            required_gradient_ft_per_nm: c.chain.required_gradient_ft_per_nm,
        }),
        runway_today: s
            .ends
            .iter()
            .find(|e| e.in_use)
            .and_then(|e| e.today.clone()),
        limits: s
            .limits
            .iter()
            .map(|l| LimitFigure {
                kind: l.kind.word().to_string(),
                value: l.value.and_then(finite),
                limit: l.limit.and_then(finite),
                unit: l.unit.to_string(),
                state: l.state.word().to_string(),
                source: l.source.clone(),
                note: l.note.clone(),
            })
            .collect(),
        state: s.state.word().to_string(),
    }
}

/// One record of the log (without its own hash, which the log line carries after it).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Record {
    /// Record format; this build writes [`SCHEMA_VERSION`].
    pub schema_version: u32,
    /// Position in the chain, from 1.
    pub seq: u64,
    /// The `sha256` of the record before (or [`GENESIS_SHA256`]).
    pub prev_sha256: String,
    /// Sign-off or revocation.
    pub kind: Kind,
    /// Leg id.
    pub leg: String,
    /// UTC date of the leg's departure (leg ids repeat from day to day).
    pub leg_date: NaiveDate,
    /// Aircraft registration.
    pub aircraft: String,
    /// Pilot id.
    pub pilot: String,
    /// Pilot category of the leg.
    pub category: Category,
    /// The instructor signing.
    pub instructor: String,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub note: String,
    /// When it was signed (real UTC time).
    pub signed_at: DateTime<Utc>,
    /// The reference time of the assessment (`--at`): reports after it were unknown.
    pub basis_at: DateTime<Utc>,
    /// Why a `below` or `no-data` leg was signed anyway.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub override_reason: Option<String>,
    /// The earlier sign-off of this leg that this one replaces.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub supersedes_seq: Option<u64>,
    /// The sign-off a revocation withdraws.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub revokes_seq: Option<u64>,
    /// What the assessment showed (sign-offs only).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub figures: Option<Figures>,
    /// The rhoboard version that wrote it.
    pub rhoboard_version: String,
    /// The operator data it was computed from.
    pub data: DataHashes,
}

/// Why a sign-off was refused.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum Refusal {
    /// No instructor named.
    #[error("no instructor named: give --instructor NAME")]
    NoInstructor,
    /// The leg is not in the operator's legs.
    #[error("leg '{0}' is not one of the operator's legs")]
    UnknownLeg(String),
    /// A student solo whose solo endorsement has lapsed or is missing.
    #[error(
        "leg {leg}: student solo cannot be signed — {detail}; renew the endorsement first (pilots.json in the operator folder)"
    )]
    EndorsementLapsed {
        /// Leg id.
        leg: String,
        /// What the limits said.
        detail: String,
    },
    /// The leg is `below` or `no-data` and no override was given.
    #[error(
        "leg {leg} is {state}: {why}; signing it needs --override REASON (allowed for: {allowed})"
    )]
    NotMet {
        /// Leg id.
        leg: String,
        /// Its state.
        state: State,
        /// The first reason.
        why: String,
        /// The categories whose overrides the policy allows.
        allowed: String,
    },
    /// The leg is `below` or `no-data` and the policy allows no override for its
    /// category, so it cannot be signed: said whether or not an override was given, so
    /// nobody is sent to write a reason that would be refused anyway.
    #[error(
        "leg {leg} is {state}: {why}; it cannot be signed: the policy allows no override for {category} legs (policy.sign_off.override_categories: {allowed})"
    )]
    OverrideNotAllowed {
        /// Leg id.
        leg: String,
        /// Its state.
        state: State,
        /// The first reason.
        why: String,
        /// The leg's category.
        category: &'static str,
        /// The categories whose overrides the policy allows.
        allowed: String,
    },
    /// `--override` was given with empty text.
    #[error("--override needs a reason in words")]
    EmptyOverride,
    /// A revocation, but the leg has no sign-off in force.
    #[error("leg {leg} of {date} has no sign-off in force to revoke")]
    NothingToRevoke {
        /// Leg id.
        leg: String,
        /// Its date.
        date: NaiveDate,
    },
    /// The log does not verify: no record is added to a broken chain.
    #[error(
        "the sign-off log does not verify ({0}); nothing was written — run `rhoboard log verify`"
    )]
    LogBroken(String),
}

/// Who signs, when, on what basis.
#[derive(Debug, Clone)]
pub struct Request<'a> {
    /// The instructor.
    pub instructor: &'a str,
    /// Free text.
    pub note: &'a str,
    /// `--override REASON`.
    pub override_reason: Option<&'a str>,
    /// The real time of signing (the caller reads the clock).
    pub signed_at: DateTime<Utc>,
    /// The assessment's reference time.
    pub basis_at: DateTime<Utc>,
    /// The operator data's hashes.
    pub data: &'a DataHashes,
}

fn allowed_text(p: &SignOffPolicy) -> String {
    if p.override_categories.is_empty() {
        "none".to_string()
    } else {
        p.override_categories
            .iter()
            .map(|c| c.name())
            .collect::<Vec<_>>()
            .join(", ")
    }
}

/// The endorsement problem of a student solo, if any (the limits flag it `below`).
fn lapsed_endorsement(r: &LegResult) -> Option<String> {
    if r.category != Category::StudentSolo {
        return None;
    }
    [&r.departure, &r.arrival]
        .into_iter()
        .flat_map(|s| &s.limits)
        .find(|l| l.kind == LimitKind::Endorsement && l.state == State::Below)
        .map(|l| l.note.clone())
}

/// The sign-off record for an assessed leg, or why it cannot be signed. The log fills
/// in `seq`, `prev_sha256` and `supersedes_seq` when it appends.
pub fn draft(ops: &Ops, r: &LegResult, req: &Request<'_>) -> Result<Record, Refusal> {
    let instructor = req.instructor.trim();
    if instructor.is_empty() {
        return Err(Refusal::NoInstructor);
    }
    let leg = ops
        .legs
        .get(r.index)
        .filter(|l| l.id == r.id)
        .ok_or_else(|| Refusal::UnknownLeg(r.id.clone()))?;
    if let Some(detail) = lapsed_endorsement(r) {
        return Err(Refusal::EndorsementLapsed {
            leg: r.id.clone(),
            detail,
        });
    }
    let override_reason = match req.override_reason.map(str::trim) {
        Some("") => return Err(Refusal::EmptyOverride),
        other => other.map(str::to_string),
    };
    let policy = &ops.operator.policy.sign_off;
    if !r.state.meets_minimums() {
        let why = r
            .reasons
            .first()
            .cloned()
            .unwrap_or_else(|| "no reason given".to_string());
        // The category first: where no override is allowed, `--override` is no way out
        // and the refusal must not suggest it.
        if !policy.override_categories.contains(&r.category) {
            return Err(Refusal::OverrideNotAllowed {
                leg: r.id.clone(),
                state: r.state,
                why,
                category: r.category.name(),
                allowed: allowed_text(policy),
            });
        }
        if override_reason.is_none() {
            return Err(Refusal::NotMet {
                leg: r.id.clone(),
                state: r.state,
                why,
                allowed: allowed_text(policy),
            });
        }
    }
    Ok(Record {
        schema_version: SCHEMA_VERSION,
        seq: 0,
        prev_sha256: String::new(),
        kind: Kind::SignOff,
        leg: r.id.clone(),
        leg_date: leg.departs_utc().date_naive(),
        aircraft: leg.aircraft.clone(),
        pilot: leg.pilot.clone(),
        category: r.category,
        instructor: instructor.to_string(),
        note: req.note.trim().to_string(),
        signed_at: req.signed_at,
        basis_at: req.basis_at,
        // Recorded only where it was needed, so a record says plainly it was overridden.
        override_reason: if r.state.meets_minimums() {
            None
        } else {
            override_reason
        },
        supersedes_seq: None,
        revokes_seq: None,
        figures: Some(Figures::of(r)),
        rhoboard_version: env!("CARGO_PKG_VERSION").to_string(),
        data: req.data.clone(),
    })
}

/// A revocation of the sign-off in force for a leg (the log fills in `revokes_seq`).
pub fn draft_revocation(ops: &Ops, leg_index: usize, req: &Request<'_>) -> Result<Record, Refusal> {
    let instructor = req.instructor.trim();
    if instructor.is_empty() {
        return Err(Refusal::NoInstructor);
    }
    let leg = ops
        .legs
        .get(leg_index)
        .ok_or_else(|| Refusal::UnknownLeg(leg_index.to_string()))?;
    let category = leg.category;
    Ok(Record {
        schema_version: SCHEMA_VERSION,
        seq: 0,
        prev_sha256: String::new(),
        kind: Kind::Revocation,
        leg: leg.id.clone(),
        leg_date: leg.departs_utc().date_naive(),
        aircraft: leg.aircraft.clone(),
        pilot: leg.pilot.clone(),
        category,
        instructor: instructor.to_string(),
        note: req.note.trim().to_string(),
        signed_at: req.signed_at,
        basis_at: req.basis_at,
        override_reason: None,
        supersedes_seq: None,
        revokes_seq: None,
        figures: None,
        rhoboard_version: env!("CARGO_PKG_VERSION").to_string(),
        data: req.data.clone(),
    })
}

/// Whether a sign-off still stands on the latest assessment.
#[derive(Debug, Clone, PartialEq)]
pub enum Freshness {
    /// Nothing the policy names has changed for the worse.
    Current,
    /// The instructor should look again; each reason says what changed.
    Recheck(Vec<String>),
}

impl Freshness {
    /// Whether a re-check is due.
    pub fn is_recheck(&self) -> bool {
        matches!(self, Freshness::Recheck(_))
    }
}

impl fmt::Display for Freshness {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Freshness::Current => f.write_str("current"),
            Freshness::Recheck(why) => write!(f, "re-check: {}", why.join("; ")),
        }
    }
}

/// Decides whether a signed leg needs a re-check on its new assessment: the state got
/// worse, the density altitude at either end rose by more than the policy's step, the
/// headroom fell below the policy's floor — or the leg was re-planned (another
/// airfield at either end, a higher takeoff or landing mass). Pure; the board calls it after every
/// new report for each leg with a sign-off in force.
pub fn recheck(signed: &Record, now: &LegResult, policy: &SignOffPolicy) -> Freshness {
    let Some(fig) = &signed.figures else {
        return Freshness::Current;
    };
    let mut why = Vec::new();
    match fig.signed_state() {
        Some(before) if now.state > before => why.push(format!(
            "state went from {before} to {} since the sign-off",
            now.state
        )),
        Some(_) => {}
        None => why.push(format!(
            "the sign-off's state '{}' is unknown to this build",
            fig.state
        )),
    }
    for (end, before, side) in [
        ("departure", &fig.departure, &now.departure),
        ("arrival", &fig.arrival, &now.arrival),
    ] {
        if let (Some(b), Some(n)) = (
            before.density_altitude_ft,
            side.air.map(|a| a.density_altitude_ft),
        ) {
            let rise = n - b;
            if rise > policy.recheck_density_altitude_rise_ft {
                // Each figure rounded up, as the limits' rows show density altitude.
                let (bs, ns) = (crate::units::up0(b), crate::units::up0(n));
                why.push(format!(
                    "{end} {} density altitude rose {:.0} ft ({bs:.0} → {ns:.0} ft; step {:.0} ft)",
                    side.airfield,
                    ns - bs,
                    policy.recheck_density_altitude_rise_ft
                ));
            }
        }
    }
    for (end, before, side) in [
        (
            "departure",
            &fig.departure.airfield,
            &now.departure.airfield,
        ),
        ("arrival", &fig.arrival.airfield, &now.arrival.airfield),
    ] {
        if before != side {
            why.push(format!("the {end} is now {side}, signed for {before}"));
        }
    }
    for (what, before, after) in [
        ("takeoff", fig.takeoff_mass_kg, now.takeoff_mass_kg),
        ("landing", fig.landing_mass_kg, now.landing_mass_kg),
    ] {
        if let (Some(b), Some(n)) = (before, after)
            && n > b + 0.5
        {
            why.push(format!(
                "{what} mass rose {:.0} kg ({b:.0} → {n:.0} kg)",
                n - b
            ));
        }
    }
    let floor = policy.recheck_headroom_floor_c;
    if let Some(n) = now.headroom.map(|h| h.warming_c) {
        let fell = match fig.headroom_c {
            Some(b) => n < b && (b >= floor || n < b - 0.05),
            None => true,
        };
        if n < floor && fell {
            why.push(format!(
                "headroom {n:+.1} °C is under the floor of {floor:+.1} °C (signed at {})",
                fig.headroom_c
                    .map_or("—".to_string(), |b| format!("{b:+.1} °C"))
            ));
        }
    }
    if why.is_empty() {
        Freshness::Current
    } else {
        Freshness::Recheck(why)
    }
}

/// Signs an assessed leg and appends the record to the log: the board's sign-off key
/// calls this with the selected leg's result (after showing [`draft`]'s record, or its
/// refusal, as the confirmation). The sign-off in force for the leg, if any, is
/// superseded. Returns once the record is on disk.
pub fn sign(
    log: &Log,
    ops: &Ops,
    result: &LegResult,
    req: &Request<'_>,
    opts: &AppendOptions,
) -> Result<Appended, LogError> {
    let record = draft(ops, result, req)?;
    log.append(record, opts, |chain, mut r| {
        r.supersedes_seq = chain.in_force(&r.leg, r.leg_date).map(|e| e.record.seq);
        Ok(r)
    })
}

/// Revokes the sign-off in force for a leg.
pub fn revoke(
    log: &Log,
    ops: &Ops,
    leg_index: usize,
    req: &Request<'_>,
    opts: &AppendOptions,
) -> Result<Appended, LogError> {
    let record = draft_revocation(ops, leg_index, req)?;
    log.append(record, opts, |chain, mut r: Record| {
        let current = chain
            .in_force(&r.leg, r.leg_date)
            .ok_or(Refusal::NothingToRevoke {
                leg: r.leg.clone(),
                date: r.leg_date,
            })?;
        r.revokes_seq = Some(current.record.seq);
        Ok(r)
    })
}

/// Where an assessed leg stands with its sign-off.
#[derive(Debug, Clone, PartialEq)]
pub enum Standing<'c> {
    /// No sign-off in force.
    Unsigned,
    /// Signed, and nothing the policy names has changed for the worse.
    Signed(&'c Entry),
    /// Signed, but the new assessment undermines it: the reasons.
    Recheck(&'c Entry, Vec<String>),
}

/// The sign-off standing of an assessed leg on the chain: the sign-off in force for the
/// leg (by id and departure date) and [`recheck`] against its new result. Pure; the
/// board calls it for every leg after each new report, the sheet for its sign-off column.
pub fn standing<'c>(chain: &'c Chain, ops: &Ops, r: &LegResult) -> Standing<'c> {
    let Some(leg) = ops.legs.get(r.index).filter(|l| l.id == r.id) else {
        return Standing::Unsigned;
    };
    let Some(e) = chain.in_force(&r.id, leg.departs_utc().date_naive()) else {
        return Standing::Unsigned;
    };
    // A leg re-planned since (`rhoboard leg set`) is not the leg that was signed.
    let mut why = Vec::new();
    for (what, before, now) in [
        ("aircraft", &e.record.aircraft, &leg.aircraft),
        ("pilot", &e.record.pilot, &leg.pilot),
    ] {
        if before != now {
            why.push(format!("{what} is now {now}, signed for {before}"));
        }
    }
    if let Freshness::Recheck(more) = recheck(&e.record, r, &ops.operator.policy.sign_off) {
        why.extend(more);
    }
    if why.is_empty() {
        Standing::Signed(e)
    } else {
        Standing::Recheck(e, why)
    }
}
