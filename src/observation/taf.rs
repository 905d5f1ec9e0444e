//! A tolerant TAF decoder: WMO Manual on Codes No. 306, FM 51, and ICAO Annex 3, with US
//! practice (statute miles, `WS` low-level wind shear groups, `PROB30` on its own).
//!
//! [`decode`] never fails and never panics: it always returns a [`Taf`]. Wind, visibility,
//! weather and cloud groups are read by the same parsers as the METAR decoder. Groups it
//! cannot read are kept in [`Taf::not_understood`] with their column; a missing or
//! malformed group the forecast needs (station, issue time, validity, change-group
//! times, wind, visibility, cloud, TX/TN) goes into [`Taf::errors`] and makes the TAF
//! unusable. `NIL` and `CNL` also make it unusable.
//!
//! Times are resolved to full UTC instants: the issue time against the caller's
//! reference instant, everything else against the validity period, so a TAF issued on
//! the last day of a month and valid into the next gets the right dates.

use std::fmt;

use chrono::{DateTime, Duration, Utc};

use super::groups::{
    self, GroupParse, SkyGroup, VisibilityGroup, all_digits, describe_cloud, describe_sky_clear,
    describe_visibility, describe_weather, describe_wind, num, quote,
};
use super::metar::{MAX_TIME_DISTANCE_DAYS, resolve_nearest, resolve_time};
use super::{
    Bound, Ceiling, CloudLayer, Hazards, NotUnderstood, Report, SkyClear, Visibility, Weather, Wind,
};

/// Longest TAF accepted; a long 30-hour TAF with many change groups is under 1,000.
pub const MAX_TAF_LEN: usize = 4_000;

/// The longest validity accepted (WMO allows 30 hours; a little slack for odd issues).
pub const MAX_VALIDITY_HOURS: i64 = 36;

/// The groups a forecast needs, named in messages.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum TafGroupName {
    /// Station identifier.
    Station,
    /// Issue time `DDHHMMZ`.
    IssueTime,
    /// Validity period `DDHH/DDHH`.
    Validity,
    /// Time of a change group (`FM141200`, `BECMG 1412/1414`).
    ChangeTime,
    /// Surface wind.
    Wind,
    /// Prevailing visibility.
    Visibility,
    /// Cloud layer.
    Cloud,
    /// Forecast maximum or minimum temperature (`TX25/1415Z`).
    Temperature,
    /// Low-level wind shear (`WS020/27045KT`).
    WindShear,
}

impl TafGroupName {
    const fn example(self) -> &'static str {
        match self {
            TafGroupName::Station => "XQAB",
            TafGroupName::IssueTime => "140500Z",
            TafGroupName::Validity => "1406/1506",
            TafGroupName::ChangeTime => "FM141200 or TEMPO 1413/1416",
            TafGroupName::Wind => "27015KT",
            TafGroupName::Visibility => "9999, 6000 or P6SM",
            TafGroupName::Cloud => "BKN012",
            TafGroupName::Temperature => "TX25/1415Z",
            TafGroupName::WindShear => "WS020/27045KT",
        }
    }
}

impl fmt::Display for TafGroupName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            TafGroupName::Station => "station",
            TafGroupName::IssueTime => "issue time",
            TafGroupName::Validity => "validity",
            TafGroupName::ChangeTime => "change time",
            TafGroupName::Wind => "wind",
            TafGroupName::Visibility => "visibility",
            TafGroupName::Cloud => "cloud",
            TafGroupName::Temperature => "temperature",
            TafGroupName::WindShear => "wind shear",
        })
    }
}

/// Why a TAF is unusable.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum TafError {
    /// Nothing but blanks.
    #[error("empty forecast")]
    Empty,
    /// Longer than any TAF.
    #[error("forecast is {len} characters long; a TAF is at most {MAX_TAF_LEN}")]
    TooLong {
        /// Length in bytes.
        len: usize,
    },
    /// `NIL`.
    #[error("NIL: the station sent no forecast")]
    Nil,
    /// `CNL`.
    #[error("CNL: the forecast is cancelled")]
    Cancelled,
    /// Nothing in the text reads as a TAF.
    #[error("not a TAF: no station and validity, starting with '{start}'")]
    NotTaf {
        /// The first group, shortened and with control characters escaped.
        start: String,
    },
    /// A needed group is absent.
    #[error("{group} group missing{} (expected e.g. {})", in_part(.part), group.example())]
    Missing {
        /// Which group.
        group: TafGroupName,
        /// Which part of the TAF (`base`, `BECMG 1412/1414`), empty for the heading.
        part: String,
    },
    /// A needed group is present but cannot be read.
    #[error("{group} group '{text}' at column {column}: {problem}")]
    Malformed {
        /// Which group.
        group: TafGroupName,
        /// The group as given (shortened when very long).
        text: String,
        /// 1-based column in the normalised text.
        column: usize,
        /// What is wrong and what was expected.
        problem: String,
    },
}

fn in_part(part: &str) -> String {
    if part.is_empty() {
        String::new()
    } else {
        format!(" in {part}")
    }
}

/// Low-level wind shear forecast (`WS020/27045KT`, US practice).
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct WindShearAloft {
    /// Height of the shear layer above the aerodrome, feet.
    pub height_ft: f64,
    /// Wind at that height, degrees true.
    pub direction_deg: f64,
    /// Wind speed at that height, knots.
    pub speed_kt: f64,
}

/// The forecast elements given in one part of a TAF (the base, or one change group).
/// In a change group an absent element means "unchanged".
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Conditions {
    /// Surface wind.
    pub wind: Option<Wind>,
    /// `CAVOK`.
    pub cavok: bool,
    /// Prevailing visibility (CAVOK gives 10 km or more).
    pub visibility: Option<Visibility>,
    /// Forecast weather.
    pub weather: Vec<Weather>,
    /// `NSW`: the significant weather ends.
    pub no_significant_weather: bool,
    /// Cloud layers.
    pub clouds: Vec<CloudLayer>,
    /// `NSC` / `SKC` (and `NCD` / `CLR` if given).
    pub sky_clear: Option<SkyClear>,
    /// `WS020/27045KT`.
    pub wind_shear: Option<WindShearAloft>,
}

impl Conditions {
    /// Whether no element at all is given.
    pub fn is_empty(&self) -> bool {
        *self == Conditions::default()
    }

    /// The ceiling and hazards these elements give on their own (derived exactly as for
    /// a METAR: lowest BKN/OVC/VV layer; TS, CB/TCU, FZ precipitation, fog, severe).
    pub fn ceiling_and_hazards(&self) -> (Ceiling, Hazards) {
        let mut r = Report {
            cavok: self.cavok,
            weather: self.weather.clone(),
            clouds: self.clouds.clone(),
            sky_clear: self.sky_clear,
            ..Report::default()
        };
        r.derive();
        let mut h = r.hazards;
        h.wind_shear = self.wind_shear.is_some();
        (r.ceiling, h)
    }
}

/// What kind of change a group announces.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum ChangeKind {
    /// `FM DDHHMM`: from this time, these conditions replace all earlier ones.
    From,
    /// `BECMG DDHH/DDHH`: a lasting change at some time within the period.
    Becoming,
    /// `TEMPO DDHH/DDHH`: temporary fluctuations within the period.
    Tempo,
    /// `PROB30`/`PROB40 DDHH/DDHH`: a chance of these conditions within the period.
    Probability {
        /// 30 or 40.
        percent: u8,
    },
    /// `PROB30 TEMPO DDHH/DDHH`: a chance of temporary fluctuations.
    ProbabilityTempo {
        /// 30 or 40.
        percent: u8,
    },
}

impl ChangeKind {
    /// True for TEMPO and PROB groups: fluctuations that do not change the prevailing
    /// conditions, read as a worst case.
    pub const fn is_fluctuation(self) -> bool {
        !matches!(self, ChangeKind::From | ChangeKind::Becoming)
    }

    /// The code word(s), e.g. `PROB30 TEMPO`.
    pub fn code(self) -> String {
        match self {
            ChangeKind::From => "FM".into(),
            ChangeKind::Becoming => "BECMG".into(),
            ChangeKind::Tempo => "TEMPO".into(),
            ChangeKind::Probability { percent } => format!("PROB{percent}"),
            ChangeKind::ProbabilityTempo { percent } => format!("PROB{percent} TEMPO"),
        }
    }
}

/// One change group.
#[derive(Debug, Clone, PartialEq)]
pub struct Change {
    /// FM, BECMG, TEMPO or PROB.
    pub kind: ChangeKind,
    /// Start of its period.
    pub from: DateTime<Utc>,
    /// End of its period (for FM: the next FM, or the end of validity).
    pub to: DateTime<Utc>,
    /// The header as given (`FM141200`, `TEMPO 1413/1416`), for labels.
    pub label: String,
    /// 1-based column of the header.
    pub column: usize,
    /// The elements it gives.
    pub conditions: Conditions,
}

/// Whether a temperature group is a maximum or a minimum.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Extreme {
    /// `TX`.
    Max,
    /// `TN`.
    Min,
}

/// A forecast maximum or minimum temperature (`TX25/1415Z`, `TNM02/1506Z`).
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct TemperaturePoint {
    /// TX or TN.
    pub extreme: Extreme,
    /// The temperature, °C.
    pub temperature_c: f64,
    /// When it is expected.
    pub at: DateTime<Utc>,
}

/// The kind of a decoded group, for the group-by-group readable decode.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TafGroupKind {
    /// `TAF`.
    ReportType,
    /// `AMD`.
    Amendment,
    /// `COR`.
    Correction,
    /// Station.
    Station,
    /// Issue time.
    IssueTime,
    /// `NIL`.
    Nil,
    /// Validity.
    Validity,
    /// `CNL`.
    Cancelled,
    /// Header of change group number `n`.
    Change(u16),
    /// Wind of the part (`None` = base, `Some(n)` = change `n`).
    Wind(Option<u16>),
    /// `CAVOK` of the part.
    Cavok(Option<u16>),
    /// Visibility of the part.
    Visibility(Option<u16>),
    /// Weather group `k` of the part.
    Weather(Option<u16>, u16),
    /// `NSW` of the part.
    Nsw(Option<u16>),
    /// Cloud layer `k` of the part.
    Cloud(Option<u16>, u16),
    /// NSC / SKC of the part.
    SkyClear(Option<u16>),
    /// Wind shear of the part.
    WindShear(Option<u16>),
    /// Temperature group `k` of [`Taf::temperatures`].
    Temperature(u16),
    /// Remarks (kept as text).
    Remarks,
}

/// A decoded group's place in the text.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct TafGroup {
    /// What the group is.
    pub kind: TafGroupKind,
    /// Byte offset in [`Taf::text`].
    pub start: usize,
    /// Byte length.
    pub len: usize,
}

/// One decoded TAF.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Taf {
    /// The text as decoded (one line, one space between groups, upper case, no `=`).
    pub text: String,
    /// `AMD`: an amended forecast.
    pub amended: bool,
    /// `COR`: a corrected forecast.
    pub corrected: bool,
    /// Station identifier (empty when missing).
    pub station: String,
    /// The issue time as given (`140500Z`).
    pub issued_text: String,
    /// Issue time.
    pub issued_at: Option<DateTime<Utc>>,
    /// Start of validity.
    pub valid_from: Option<DateTime<Utc>>,
    /// End of validity.
    pub valid_to: Option<DateTime<Utc>>,
    /// `NIL`.
    pub nil: bool,
    /// `CNL`.
    pub cancelled: bool,
    /// The base conditions, from the start of validity.
    pub base: Conditions,
    /// Change groups in text order.
    pub changes: Vec<Change>,
    /// TX/TN groups in text order.
    pub temperatures: Vec<TemperaturePoint>,
    /// Remarks after `RMK`.
    pub remarks: Option<String>,
    /// Decoded groups in order.
    pub groups: Vec<TafGroup>,
    /// Groups not understood (kept, not fatal).
    pub not_understood: Vec<NotUnderstood>,
    /// Problems that make the forecast unusable.
    pub errors: Vec<TafError>,
}

impl Taf {
    /// Whether the forecast can be used: no errors (which covers NIL and CNL), station
    /// and validity present.
    pub fn usable(&self) -> bool {
        self.errors.is_empty()
            && !self.station.is_empty()
            && self.valid_from.is_some()
            && self.valid_to.is_some()
    }

    /// "forecast XQAB 140500Z" — the prefix of every message about this TAF.
    pub fn label(&self) -> String {
        let station = if self.station.is_empty() {
            "(no station)"
        } else {
            self.station.as_str()
        };
        let mut s = format!("forecast {station}");
        if !self.issued_text.is_empty() {
            s.push(' ');
            s.push_str(&self.issued_text);
        }
        if self.amended {
            s.push_str(" AMD");
        }
        s
    }

    /// Each error as one line, prefixed with [`Taf::label`].
    pub fn error_lines(&self) -> Vec<String> {
        self.errors
            .iter()
            .map(|e| format!("{}: {e}", self.label()))
            .collect()
    }

    /// Whether `t` lies within the validity (start inclusive, end exclusive).
    pub fn covers(&self, t: DateTime<Utc>) -> bool {
        matches!((self.valid_from, self.valid_to), (Some(a), Some(b)) if a <= t && t < b)
    }

    /// The forecast maximum (the first `TX`).
    pub fn max_temperature(&self) -> Option<TemperaturePoint> {
        self.temperatures
            .iter()
            .find(|p| p.extreme == Extreme::Max)
            .copied()
    }

    /// The forecast minimum (the first `TN`).
    pub fn min_temperature(&self) -> Option<TemperaturePoint> {
        self.temperatures
            .iter()
            .find(|p| p.extreme == Extreme::Min)
            .copied()
    }

    /// The text of a decoded group.
    pub fn group_text(&self, g: &TafGroup) -> &str {
        self.text
            .get(g.start..g.start.saturating_add(g.len))
            .unwrap_or("")
    }

    /// The conditions of a part: `None` = base, `Some(n)` = change `n`.
    pub fn part(&self, part: Option<u16>) -> Option<&Conditions> {
        match part {
            None => Some(&self.base),
            Some(n) => self.changes.get(usize::from(n)).map(|c| &c.conditions),
        }
    }
}

/// Splits a forecasts file into TAF texts: `(first line, text)`. A TAF may span lines;
/// a new one starts at a line beginning with `TAF`, after a line ending in `=`, or after
/// a blank line or a `#` comment line (which are skipped).
pub fn split_tafs(text: &str) -> Vec<(usize, String)> {
    let mut out: Vec<(usize, String)> = Vec::new();
    let mut open = false;
    for (k, raw) in text.lines().enumerate() {
        let line = raw.trim();
        if line.is_empty() || line.starts_with('#') {
            open = false;
            continue;
        }
        let head = line.get(..3).is_some_and(|h| h.eq_ignore_ascii_case("TAF"))
            && line.get(3..4).is_none_or(|c| c == " " || c == "\t");
        match out.last_mut() {
            Some((_, prev)) if open && !head => {
                prev.push(' ');
                prev.push_str(line);
            }
            _ => out.push((k + 1, line.to_string())),
        }
        open = !line.ends_with('=');
    }
    out
}

/// Decodes every TAF held under `forecasts/` in an operator's observation texts
/// (`Ops::observations`: (relative path, text)); other paths are skipped.
pub fn from_files(files: &[(String, String)], reference: DateTime<Utc>) -> Vec<Taf> {
    files
        .iter()
        .filter(|(path, _)| path.starts_with("forecasts/"))
        .flat_map(|(_, text)| split_tafs(text))
        .map(|(_, t)| decode(&t, reference))
        .collect()
}

/// The TAF to use for `station` at `t`: among the usable ones issued at or before
/// `as_of` whose validity covers `t`, the latest issued (an amendment replaces the
/// forecast it amends). A cancelled TAF issued later than the chosen one voids it.
pub fn select<'a>(
    tafs: &'a [Taf],
    station: &str,
    t: DateTime<Utc>,
    as_of: DateTime<Utc>,
) -> Option<&'a Taf> {
    let issued = |x: &Taf| x.issued_at.or(x.valid_from);
    let best = tafs
        .iter()
        .filter(|x| x.station == station && x.usable() && x.covers(t))
        .filter(|x| issued(x).is_some_and(|i| i <= as_of))
        .max_by_key(|x| issued(x))?;
    let cancelled_later = tafs.iter().any(|x| {
        x.station == station
            && x.cancelled
            && issued(x).is_some_and(|i| i <= as_of && Some(i) > issued(best))
    });
    (!cancelled_later).then_some(best)
}

/// Decodes one TAF. `reference` resolves the issue day (the latest matching UTC time not
/// after it, see [`resolve_time`]; the periods then the nearest to the issue). The text may start with `TAF`, end with `=`, span
/// lines, and be in lower case.
pub fn decode(text: &str, reference: DateTime<Utc>) -> Taf {
    let trimmed = text
        .trim_start_matches(|c: char| c.is_ascii_whitespace())
        .trim_end_matches(|c: char| c.is_ascii_whitespace() || c == '=');
    if trimmed.len() > MAX_TAF_LEN {
        let mut cut = 60;
        while !trimmed.is_char_boundary(cut) {
            cut -= 1;
        }
        let mut head = trimmed.get(..cut).unwrap_or("").to_string();
        head.push('…');
        return Taf {
            text: head,
            errors: vec![TafError::TooLong { len: trimmed.len() }],
            ..Taf::default()
        };
    }
    // `=` may end a TAF inside a multi-line text; a token is cut there.
    let (norm, spans) =
        groups::normalise(trimmed.split(|c: char| c.is_ascii_whitespace() || c == '='));
    if spans.is_empty() {
        return Taf {
            errors: vec![TafError::Empty],
            ..Taf::default()
        };
    }
    let mut d = Decoder {
        toks: groups::Tokens {
            text: &norm,
            spans: &spans,
        },
        reference,
        t: Taf::default(),
    };
    d.run();
    let mut t = d.t;
    t.text = norm;
    t
}

struct Decoder<'a> {
    toks: groups::Tokens<'a>,
    reference: DateTime<Utc>,
    t: Taf,
}

/// Which part of the TAF the decoder is in.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Part {
    Base,
    Change(u16),
    /// A change group whose time could not be read.
    Skipped,
}

impl Part {
    fn index(self) -> Option<u16> {
        match self {
            Part::Change(k) => Some(k),
            _ => None,
        }
    }
}

/// Which elements a part already has (a second one is not understood).
#[derive(Default)]
struct Seen {
    wind: bool,
    visibility: bool,
    wind_shear: bool,
}

fn is_period(tok: &str) -> bool {
    let b = tok.as_bytes();
    b.len() == 9 && b.get(4) == Some(&b'/') && all_digits(&tok[..4]) && all_digits(&tok[5..])
}

fn is_change_start(tok: &str) -> bool {
    matches!(tok, "BECMG" | "TEMPO" | "PROB30" | "PROB40")
        || (tok.starts_with("PROB") && tok.len() == 6 && all_digits(&tok[4..]))
        || (tok.len() >= 6
            && tok.starts_with("FM")
            && tok.as_bytes().get(2).is_some_and(u8::is_ascii_digit))
}

fn is_temperature_group(tok: &str) -> bool {
    (tok.starts_with("TX") || tok.starts_with("TN")) && tok.contains('/')
}

impl<'a> Decoder<'a> {
    fn group(&mut self, kind: TafGroupKind, i: usize, ntok: usize) {
        let (start, len) = self.toks.span(i, ntok);
        self.t.groups.push(TafGroup { kind, start, len });
    }

    fn error(&mut self, group: TafGroupName, i: usize, problem: impl Into<String>) {
        let (text, column) = self.toks.quoted(i);
        self.t.errors.push(TafError::Malformed {
            group,
            text,
            column,
            problem: problem.into(),
        });
    }

    fn not_understood(&mut self, i: usize, reason: impl Into<String>) {
        let n = self.toks.not_understood(i, reason);
        self.t.not_understood.push(n);
    }

    /// The instant against which day-hour groups inside the TAF are resolved.
    fn inner_reference(&self) -> DateTime<Utc> {
        match (self.t.valid_from, self.t.valid_to) {
            (Some(a), Some(b)) => a + (b - a) / 2,
            (Some(a), None) => a,
            _ => self.t.issued_at.unwrap_or(self.reference),
        }
    }

    /// Day + hour (hour 24 = the end of that day) + minute → UTC, near `reference`.
    fn resolve(
        day: u32,
        hour: u32,
        minute: u32,
        reference: DateTime<Utc>,
    ) -> Option<DateTime<Utc>> {
        if hour == 24 {
            if minute != 0 {
                return None;
            }
            return resolve_nearest(day, 0, 0, reference - Duration::days(1))
                .map(|t| t + Duration::days(1));
        }
        resolve_nearest(day, hour, minute, reference)
    }

    /// `DDHH/DDHH` → (start, end); an error message when malformed.
    fn period(
        &self,
        tok: &str,
        reference: DateTime<Utc>,
    ) -> Result<(DateTime<Utc>, DateTime<Utc>), String> {
        if !is_period(tok) {
            return Err(
                "expected DDHH/DDHH (day and hour of start and end), e.g. 1406/1506".into(),
            );
        }
        let n = |r: std::ops::Range<usize>| tok.get(r).and_then(num).unwrap_or(99);
        let (d1, h1, d2, h2) = (n(0..2), n(2..4), n(5..7), n(7..9));
        for (d, h) in [(d1, h1), (d2, h2)] {
            if !(1..=31).contains(&d) {
                return Err(format!("day {d} is not a day of the month"));
            }
            if h > 24 {
                return Err(format!("hour {h} is not an hour of the day (00-24)"));
            }
        }
        let a = Self::resolve(d1, h1, 0, reference);
        let Some(a) = a else {
            return Err(format!(
                "day {d1} does not fall within {MAX_TIME_DISTANCE_DAYS} days of the reference date {}",
                reference.format("%Y-%m-%d")
            ));
        };
        // The end follows the start: resolve it just after the start.
        let b = Self::resolve(d2, h2, 0, a + Duration::days(1));
        let Some(b) = b.filter(|b| *b > a) else {
            return Err("the period ends before it starts".into());
        };
        if (b - a).num_hours() > MAX_VALIDITY_HOURS {
            return Err(format!(
                "the period lasts {} hours; at most {MAX_VALIDITY_HOURS}",
                (b - a).num_hours()
            ));
        }
        Ok((a, b))
    }

    fn run(&mut self) {
        let n = self.toks.len();
        let mut i = 0;
        let mut recognised = false;
        if self.toks.tok(0) == "TAF" {
            self.group(TafGroupKind::ReportType, 0, 1);
            recognised = true;
            i = 1;
        }
        loop {
            match self.toks.tok(i) {
                "AMD" => {
                    self.t.amended = true;
                    self.group(TafGroupKind::Amendment, i, 1);
                }
                "COR" => {
                    self.t.corrected = true;
                    self.group(TafGroupKind::Correction, i, 1);
                }
                _ => break,
            }
            i += 1;
        }
        // Station.
        let tok = self.toks.tok(i);
        let b = tok.as_bytes();
        let station_ok = b.len() == 4
            && b.first().is_some_and(u8::is_ascii_uppercase)
            && b.iter()
                .all(|c| c.is_ascii_uppercase() || c.is_ascii_digit());
        if station_ok {
            self.t.station = tok.to_string();
            self.group(TafGroupKind::Station, i, 1);
            i += 1;
        } else if i < n && !tok.ends_with('Z') && !is_period(tok) {
            if !recognised {
                self.t.errors.push(TafError::NotTaf { start: quote(tok) });
                return;
            }
            self.error(
                TafGroupName::Station,
                i,
                "expected 4 letters or digits starting with a letter",
            );
            i += 1;
        } else {
            self.t.errors.push(TafError::Missing {
                group: TafGroupName::Station,
                part: String::new(),
            });
        }
        // Issue time (optional in some bulletins; the validity then resolves on its own).
        let tok = self.toks.tok(i);
        if tok.ends_with('Z') && tok.len() >= 2 && all_digits(&tok[..tok.len() - 1]) {
            self.issue_time(i);
            i += 1;
        }
        if self.toks.tok(i) == "NIL" {
            self.t.nil = true;
            self.group(TafGroupKind::Nil, i, 1);
            self.t.errors.push(TafError::Nil);
            for j in i + 1..n {
                self.not_understood(j, "after NIL");
            }
            return;
        }
        // Validity.
        let tok = self.toks.tok(i);
        if is_period(tok)
            || (tok.contains('/') && tok.len() <= 11 && all_digits(&tok.replace('/', "")))
        {
            let reference = self.t.issued_at.unwrap_or(self.reference);
            match self.period(tok, reference) {
                Ok((a, b)) => {
                    self.t.valid_from = Some(a);
                    self.t.valid_to = Some(b);
                }
                Err(p) => self.error(TafGroupName::Validity, i, p),
            }
            self.group(TafGroupKind::Validity, i, 1);
            i += 1;
        } else {
            if !recognised && self.t.station.is_empty() {
                self.t.errors = vec![TafError::NotTaf {
                    start: quote(self.toks.tok(0)),
                }];
                return;
            }
            self.t.errors.push(TafError::Missing {
                group: TafGroupName::Validity,
                part: String::new(),
            });
        }
        if self.toks.tok(i) == "CNL" {
            self.t.cancelled = true;
            self.group(TafGroupKind::Cancelled, i, 1);
            self.t.errors.push(TafError::Cancelled);
            for j in i + 1..n {
                self.not_understood(j, "after CNL");
            }
            return;
        }
        // Base conditions, then change groups.
        let mut part = Part::Base;
        let mut conditions = Conditions::default();
        let mut seen = Seen::default();
        while i < n {
            let tok = self.toks.tok(i);
            if tok == "RMK" {
                let text = self
                    .toks
                    .text
                    .get(self.toks.start(i + 1).min(self.toks.text.len())..self.toks.end(n - 1))
                    .unwrap_or("");
                self.t.remarks = Some(text.to_string());
                self.group(TafGroupKind::Remarks, i, n - i);
                break;
            }
            if is_change_start(tok) {
                self.close_part(part, std::mem::take(&mut conditions));
                seen = Seen::default();
                let (consumed, change) = self.change_header(i);
                match change {
                    Some(c) => {
                        self.t.changes.push(c);
                        let k = u16::try_from(self.t.changes.len() - 1).unwrap_or(u16::MAX);
                        self.group(TafGroupKind::Change(k), i, consumed);
                        part = Part::Change(k);
                    }
                    // A change group whose time cannot be read: its elements are skipped.
                    None => part = Part::Skipped,
                }
                i += consumed.max(1);
                continue;
            }
            if part == Part::Skipped {
                self.not_understood(i, "in a change group whose time is not readable");
                i += 1;
                continue;
            }
            if is_temperature_group(tok) {
                self.temperature(i);
                i += 1;
                continue;
            }
            i += self
                .element(i, part.index(), &mut conditions, &mut seen)
                .max(1);
        }
        self.close_part(part, conditions);
        self.finish();
    }

    fn close_part(&mut self, part: Part, conditions: Conditions) {
        match part {
            Part::Base => self.t.base = conditions,
            Part::Change(k) => {
                if let Some(c) = self.t.changes.get_mut(usize::from(k)) {
                    c.conditions = conditions;
                }
            }
            Part::Skipped => {}
        }
    }

    /// Reads a change-group header at `i`: (tokens consumed, the change with empty
    /// conditions). A malformed time is an error and gives no change.
    fn change_header(&mut self, i: usize) -> (usize, Option<Change>) {
        let tok = self.toks.tok(i);
        let reference = self.inner_reference();
        let column = self.toks.column(i);
        let end_of_validity = self.t.valid_to.unwrap_or(reference);
        let make = |kind, from, to, label: String| Change {
            kind,
            from,
            to,
            label,
            column,
            conditions: Conditions::default(),
        };
        if let Some(body) = tok.strip_prefix("FM") {
            if body.len() != 6 || !all_digits(body) {
                self.error(
                    TafGroupName::ChangeTime,
                    i,
                    "expected FM and 6 digits (day, hour, minute), e.g. FM141200",
                );
                return (1, None);
            }
            let n = |r: std::ops::Range<usize>| body.get(r).and_then(num).unwrap_or(99);
            let (d, h, m) = (n(0..2), n(2..4), n(4..6));
            let problem = if !(1..=31).contains(&d) {
                format!("day {d} is not a day of the month")
            } else if h > 24 || m > 59 {
                format!("{h:02}:{m:02} is not a time of day")
            } else {
                match Self::resolve(d, h, m, reference) {
                    Some(t) => {
                        let label = tok.to_string();
                        return (1, Some(make(ChangeKind::From, t, end_of_validity, label)));
                    }
                    None => "the time cannot be placed within the validity".to_string(),
                }
            };
            self.error(TafGroupName::ChangeTime, i, problem);
            return (1, None);
        }
        let (kind, mut consumed) = match tok {
            "BECMG" => (ChangeKind::Becoming, 1),
            "TEMPO" => (ChangeKind::Tempo, 1),
            _ => {
                let percent = tok.get(4..).and_then(num).unwrap_or(0);
                if percent != 30 && percent != 40 {
                    self.error(
                        TafGroupName::ChangeTime,
                        i,
                        "only PROB30 and PROB40 are allowed",
                    );
                    return (1, None);
                }
                let percent = u8::try_from(percent).unwrap_or(30);
                if self.toks.tok(i + 1) == "TEMPO" {
                    (ChangeKind::ProbabilityTempo { percent }, 2)
                } else {
                    (ChangeKind::Probability { percent }, 1)
                }
            }
        };
        let ptok = self.toks.tok(i + consumed);
        let looks = ptok.contains('/') && ptok.bytes().all(|c| c.is_ascii_digit() || c == b'/');
        if !looks {
            self.error(
                TafGroupName::ChangeTime,
                i,
                format!(
                    "expected the period DDHH/DDHH after {}, e.g. {} 1413/1416",
                    kind.code(),
                    kind.code()
                ),
            );
            return (consumed, None);
        }
        match self.period(ptok, reference) {
            Ok((a, b)) => {
                consumed += 1;
                let label = self
                    .toks
                    .text
                    .get(self.toks.start(i)..self.toks.end(i + consumed - 1))
                    .unwrap_or("")
                    .to_string();
                (consumed, Some(make(kind, a, b, label)))
            }
            Err(p) => {
                self.error(TafGroupName::ChangeTime, i + consumed, p);
                (consumed + 1, None)
            }
        }
    }

    /// Reads one forecast element at `i` into `c`; returns the tokens consumed.
    fn element(
        &mut self,
        i: usize,
        part: Option<u16>,
        c: &mut Conditions,
        seen: &mut Seen,
    ) -> usize {
        let tok = self.toks.tok(i);
        if tok == "NSW" {
            c.no_significant_weather = true;
            self.group(TafGroupKind::Nsw(part), i, 1);
            return 1;
        }
        if let Some(k) = self.wind_shear(i, part, c, seen) {
            return k;
        }
        if !seen.wind {
            match groups::wind(tok) {
                GroupParse::No => {}
                GroupParse::Bad(p) => {
                    seen.wind = true;
                    self.error(TafGroupName::Wind, i, p);
                    return 1;
                }
                GroupParse::Ok(w, k) => {
                    seen.wind = true;
                    c.wind = Some(w);
                    self.group(TafGroupKind::Wind(part), i, k);
                    return k;
                }
            }
        }
        if !seen.visibility {
            match groups::visibility(tok, self.toks.tok(i + 1)) {
                GroupParse::No => {}
                GroupParse::Bad(p) => {
                    seen.visibility = true;
                    self.error(TafGroupName::Visibility, i, p);
                    return 1;
                }
                GroupParse::Ok(VisibilityGroup::Cavok, _) => {
                    seen.visibility = true;
                    c.cavok = true;
                    c.visibility = Some(Visibility {
                        prevailing_m: 10_000.0,
                        bound: Bound::AtLeast,
                        ..Visibility::default()
                    });
                    self.group(TafGroupKind::Cavok(part), i, 1);
                    return 1;
                }
                GroupParse::Ok(VisibilityGroup::Visibility(v), k) => {
                    seen.visibility = true;
                    c.visibility = Some(v);
                    self.group(TafGroupKind::Visibility(part), i, k);
                    return k;
                }
            }
        }
        match groups::weather(tok) {
            GroupParse::No => {}
            GroupParse::Bad(p) => {
                self.not_understood(i, p);
                return 1;
            }
            GroupParse::Ok(w, k) => {
                c.weather.push(w);
                let n = u16::try_from(c.weather.len() - 1).unwrap_or(u16::MAX);
                self.group(TafGroupKind::Weather(part, n), i, k);
                return k;
            }
        }
        match groups::cloud(tok) {
            GroupParse::No => {}
            GroupParse::Bad(p) => {
                // A lost layer could hide a ceiling: the forecast cannot be trusted.
                self.error(TafGroupName::Cloud, i, p);
                return 1;
            }
            GroupParse::Ok(SkyGroup::Clear(s), k) => {
                c.sky_clear = Some(s);
                self.group(TafGroupKind::SkyClear(part), i, k);
                return k;
            }
            GroupParse::Ok(SkyGroup::Layer(l), k) => {
                c.clouds.push(l);
                let n = u16::try_from(c.clouds.len() - 1).unwrap_or(u16::MAX);
                self.group(TafGroupKind::Cloud(part, n), i, k);
                return k;
            }
        }
        let reason = if seen.wind && groups::wind(tok).is_ok() {
            "a second wind group in the same part"
        } else if seen.visibility && !matches!(groups::visibility(tok, ""), GroupParse::No) {
            "a second visibility group in the same part"
        } else {
            "not a group of a TAF, or out of place"
        };
        self.not_understood(i, reason);
        1
    }

    /// `WS020/27045KT`.
    fn wind_shear(
        &mut self,
        i: usize,
        part: Option<u16>,
        c: &mut Conditions,
        seen: &mut Seen,
    ) -> Option<usize> {
        let tok = self.toks.tok(i);
        let body = tok.strip_prefix("WS")?;
        let (h, w) = body.split_once('/')?;
        if seen.wind_shear {
            self.not_understood(i, "a second wind shear group in the same part");
            return Some(1);
        }
        seen.wind_shear = true;
        let bad = "expected WS, 3 digits of height in hundreds of feet, / and the wind there, e.g. WS020/27045KT";
        let Some(height) = num(h).filter(|_| h.len() == 3) else {
            self.error(TafGroupName::WindShear, i, bad);
            return Some(1);
        };
        let wind = match groups::wind(w) {
            GroupParse::Ok(wind, _) => wind,
            _ => {
                self.error(TafGroupName::WindShear, i, bad);
                return Some(1);
            }
        };
        let Some(direction_deg) = wind.direction_deg else {
            self.error(TafGroupName::WindShear, i, bad);
            return Some(1);
        };
        c.wind_shear = Some(WindShearAloft {
            height_ft: f64::from(height) * 100.0,
            direction_deg,
            speed_kt: wind.speed_kt,
        });
        self.group(TafGroupKind::WindShear(part), i, 1);
        Some(1)
    }

    /// `TX25/1415Z`, `TNM02/1506Z`.
    fn temperature(&mut self, i: usize) {
        let tok = self.toks.tok(i);
        let extreme = if tok.starts_with("TX") {
            Extreme::Max
        } else {
            Extreme::Min
        };
        let bad = "expected TX or TN, the temperature in whole °C (M for minus), / and DDHHZ, e.g. TX25/1415Z or TNM02/1506Z";
        let body = tok.get(2..).unwrap_or("");
        let Some((v, when)) = body.split_once('/') else {
            self.error(TafGroupName::Temperature, i, bad);
            return;
        };
        let (neg, digits) = match v.strip_prefix('M') {
            Some(d) => (true, d),
            None => (false, v),
        };
        let when = when.strip_suffix('Z').unwrap_or(when);
        let (Some(value), true) = (
            num(digits).filter(|_| (1..=2).contains(&digits.len())),
            when.len() == 4 && all_digits(when),
        ) else {
            self.error(TafGroupName::Temperature, i, bad);
            return;
        };
        let value = f64::from(value);
        let temperature_c = if neg { -value } else { value };
        let day = when.get(0..2).and_then(num).unwrap_or(99);
        let hour = when.get(2..4).and_then(num).unwrap_or(99);
        if !(1..=31).contains(&day) || hour > 24 {
            self.error(
                TafGroupName::Temperature,
                i,
                format!("{when} is not a day and hour"),
            );
            return;
        }
        let Some(at) = Self::resolve(day, hour, 0, self.inner_reference()) else {
            self.error(
                TafGroupName::Temperature,
                i,
                "the time cannot be placed within the validity",
            );
            return;
        };
        self.t.temperatures.push(TemperaturePoint {
            extreme,
            temperature_c,
            at,
        });
        let k = u16::try_from(self.t.temperatures.len() - 1).unwrap_or(u16::MAX);
        self.group(TafGroupKind::Temperature(k), i, 1);
    }

    fn finish(&mut self) {
        // Each FM lasts until the next FM (or the end of validity).
        let fm: Vec<usize> = (0..self.t.changes.len())
            .filter(|&k| {
                self.t
                    .changes
                    .get(k)
                    .is_some_and(|c| c.kind == ChangeKind::From)
            })
            .collect();
        for (a, b) in fm.iter().zip(fm.iter().skip(1)) {
            let next = self.t.changes.get(*b).map(|c| c.from);
            if let (Some(c), Some(next)) = (self.t.changes.get_mut(*a), next) {
                c.to = next;
            }
        }
        // Change periods must lie within the validity.
        if let (Some(a), Some(b)) = (self.t.valid_from, self.t.valid_to) {
            let mut outside = Vec::new();
            for c in &self.t.changes {
                if c.from < a || c.from > b || c.to > b {
                    outside.push(TafError::Malformed {
                        group: TafGroupName::ChangeTime,
                        text: quote(&c.label),
                        column: c.column,
                        problem: format!(
                            "the period is not within the validity {} to {}",
                            a.format("%d %H:%MZ"),
                            b.format("%d %H:%MZ")
                        ),
                    });
                }
            }
            self.t.errors.extend(outside);
        }
        let base = &self.t.base;
        if base.wind.is_none() && !self.has_error(TafGroupName::Wind) {
            self.t.errors.push(TafError::Missing {
                group: TafGroupName::Wind,
                part: "the base forecast".into(),
            });
        }
        let base = &self.t.base;
        if base.visibility.is_none() && !self.has_error(TafGroupName::Visibility) {
            self.t.errors.push(TafError::Missing {
                group: TafGroupName::Visibility,
                part: "the base forecast".into(),
            });
        }
        let base = &self.t.base;
        if !base.cavok
            && base.clouds.is_empty()
            && base.sky_clear.is_none()
            && !self.has_error(TafGroupName::Cloud)
        {
            self.t.errors.push(TafError::Missing {
                group: TafGroupName::Cloud,
                part: "the base forecast".into(),
            });
        }
        self.t.errors.sort_by_key(|e| match e {
            TafError::Missing {
                group: TafGroupName::Station | TafGroupName::Validity,
                ..
            } => 0,
            TafError::Malformed { column, .. } => *column,
            _ => usize::MAX,
        });
    }

    fn has_error(&self, g: TafGroupName) -> bool {
        self.t.errors.iter().any(|e| {
            matches!(e, TafError::Malformed { group, .. } | TafError::Missing { group, .. } if *group == g)
        })
    }

    fn issue_time(&mut self, i: usize) {
        let tok = self.toks.tok(i);
        self.t.issued_text = quote(tok);
        self.group(TafGroupKind::IssueTime, i, 1);
        let body = &tok[..tok.len() - 1];
        if body.len() != 6 {
            self.error(
                TafGroupName::IssueTime,
                i,
                format!(
                    "expected 6 digits (day, hour, minute) before Z, found {}",
                    body.len()
                ),
            );
            return;
        }
        let n = |r: std::ops::Range<usize>| body.get(r).and_then(num).unwrap_or(99);
        let (day, hour, minute) = (n(0..2), n(2..4), n(4..6));
        let problem = if !(1..=31).contains(&day) {
            format!("day {day} is not a day of the month")
        } else if hour > 23 {
            format!("hour {hour} is not an hour of the day (00-23)")
        } else if minute > 59 {
            format!("minute {minute} is not a minute (00-59)")
        } else if let Some(t) = resolve_time(day, hour, minute, self.reference) {
            self.t.issued_at = Some(t);
            return;
        } else {
            format!(
                "day {day} does not fall within {MAX_TIME_DISTANCE_DAYS} days of the reference date {}",
                self.reference.format("%Y-%m-%d")
            )
        };
        self.error(TafGroupName::IssueTime, i, problem);
    }
}

fn describe_period(c: &Change) -> String {
    format!(
        "{} to {}",
        c.from.format("%d %H:%MZ"),
        c.to.format("%d %H:%MZ")
    )
}

/// What a decoded group says, in plain words and units, for the readable decode.
pub fn describe(t: &Taf, g: &TafGroup) -> String {
    let part = |p: Option<u16>| -> String {
        match p.and_then(|k| t.changes.get(usize::from(k))) {
            Some(c) => format!(" ({})", c.label),
            None => String::new(),
        }
    };
    match g.kind {
        TafGroupKind::ReportType => "terminal aerodrome forecast (TAF)".into(),
        TafGroupKind::Amendment => "amended forecast".into(),
        TafGroupKind::Correction => "corrected forecast".into(),
        TafGroupKind::Station => format!("station {}", t.station),
        TafGroupKind::IssueTime => match t.issued_at {
            Some(i) => format!("issued {}", i.format("%Y-%m-%d %H:%M UTC")),
            None => "issue time not readable".into(),
        },
        TafGroupKind::Nil => "no forecast (NIL)".into(),
        TafGroupKind::Cancelled => "forecast cancelled (CNL)".into(),
        TafGroupKind::Validity => match (t.valid_from, t.valid_to) {
            (Some(a), Some(b)) => format!(
                "valid from {} to {}",
                a.format("%Y-%m-%d %H:%M UTC"),
                b.format("%Y-%m-%d %H:%M UTC")
            ),
            _ => "validity not readable".into(),
        },
        TafGroupKind::Change(k) => match t.changes.get(usize::from(k)) {
            None => String::new(),
            Some(c) => match c.kind {
                ChangeKind::From => format!(
                    "from {}: these conditions replace all earlier ones",
                    c.from.format("%d %H:%MZ")
                ),
                ChangeKind::Becoming => format!(
                    "becoming, at some time from {}: a lasting change",
                    describe_period(c)
                ),
                ChangeKind::Tempo => format!(
                    "temporarily, {}: fluctuations lasting under an hour each, under half the period in all",
                    describe_period(c)
                ),
                ChangeKind::Probability { percent } => {
                    format!("{percent} % chance, {}", describe_period(c))
                }
                ChangeKind::ProbabilityTempo { percent } => format!(
                    "{percent} % chance of temporary fluctuations, {}",
                    describe_period(c)
                ),
            },
        },
        TafGroupKind::Wind(p) => t
            .part(p)
            .and_then(|c| c.wind.as_ref())
            .map_or_else(String::new, |w| describe_wind(w) + &part(p)),
        TafGroupKind::Cavok(p) => format!(
            "CAVOK: visibility 10 km or more, no cloud below 5,000 ft, no cumulonimbus or towering cumulus, no significant weather{}",
            part(p)
        ),
        TafGroupKind::Visibility(p) => t
            .part(p)
            .and_then(|c| c.visibility.as_ref())
            .map_or_else(String::new, |v| describe_visibility(v) + &part(p)),
        TafGroupKind::Weather(p, k) => t
            .part(p)
            .and_then(|c| c.weather.get(usize::from(k)))
            .map_or_else(String::new, |w| describe_weather(w) + &part(p)),
        TafGroupKind::Nsw(p) => format!("no significant weather: the weather ends{}", part(p)),
        TafGroupKind::Cloud(p, k) => t
            .part(p)
            .and_then(|c| c.clouds.get(usize::from(k)))
            .map_or_else(String::new, |l| describe_cloud(l) + &part(p)),
        TafGroupKind::SkyClear(p) => t
            .part(p)
            .and_then(|c| c.sky_clear)
            .map_or_else(String::new, |s| describe_sky_clear(s).to_string() + &part(p)),
        TafGroupKind::WindShear(p) => t
            .part(p)
            .and_then(|c| c.wind_shear)
            .map_or_else(String::new, |w| {
                format!(
                    "low-level wind shear: wind {:03.0}° true at {:.0} kt at {:.0} ft above the aerodrome{}",
                    w.direction_deg, w.speed_kt, w.height_ft, part(p)
                )
            }),
        TafGroupKind::Temperature(k) => match t.temperatures.get(usize::from(k)) {
            None => String::new(),
            Some(p) => format!(
                "{} temperature {:.0} °C at {}",
                match p.extreme {
                    Extreme::Max => "maximum",
                    Extreme::Min => "minimum",
                },
                p.temperature_c,
                p.at.format("%d %H:%MZ")
            ),
        },
        TafGroupKind::Remarks => "remarks (kept as text)".into(),
    }
}
