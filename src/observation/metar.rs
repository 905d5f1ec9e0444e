//! A tolerant METAR/SPECI decoder: WMO Manual on Codes No. 306, FM 15, and ICAO Annex 3,
//! with US practice (statute miles, `A` altimeter, `RMK` `T` group).
//!
//! [`decode`] never fails and never panics: it always returns a [`Report`]. Optional groups
//! it cannot read are kept in [`Report::not_understood`] with their column; a missing or
//! malformed group the assessment needs (station, time, wind, temperature and dew point,
//! altimeter) goes into [`Report::errors`] and makes the report unusable for performance.

use std::fmt;

use chrono::{DateTime, Datelike, Duration, NaiveDate, Utc};

use super::groups::{
    self, GroupParse, SkyGroup, VisibilityGroup, all_digits, bound_prefix, bound_word,
    describe_cloud, describe_sky_clear, describe_visibility, describe_weather, describe_wind, num,
    quote, weather_body,
};
use super::{
    Bound, DIRECTIONS, Group, GroupKind, Intensity, Kind, Report, Rvr, Visibility, Wind, WindShear,
};
use crate::units::{HPA_PER_INHG, M_PER_FT};

/// Longest report accepted; a real METAR with remarks is a few hundred characters.
pub const MAX_REPORT_LEN: usize = 2_000;

/// How far from the reference instant a day-hour-minute may resolve (WMO reports are
/// read within hours; a generous bound still gets month and year rollover right).
pub const MAX_TIME_DISTANCE_DAYS: i64 = 16;

/// The groups the assessment needs, named in messages.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "lowercase")]
pub enum GroupName {
    /// Station identifier.
    Station,
    /// Day-hour-minute.
    Time,
    /// Surface wind.
    Wind,
    /// Temperature and dew point.
    Temperature,
    /// Altimeter setting.
    Altimeter,
}

impl GroupName {
    const fn example(self) -> &'static str {
        match self {
            GroupName::Station => "XQAB",
            GroupName::Time => "141250Z",
            GroupName::Wind => "27015KT",
            GroupName::Temperature => "15/08",
            GroupName::Altimeter => "Q1013 or A2992",
        }
    }
}

impl fmt::Display for GroupName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            GroupName::Station => "station",
            GroupName::Time => "time",
            GroupName::Wind => "wind",
            GroupName::Temperature => "temperature/dew point",
            GroupName::Altimeter => "altimeter",
        })
    }
}

/// Why a report is unusable for performance.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum DecodeError {
    /// Nothing but blanks.
    #[error("empty report")]
    Empty,
    /// Longer than any METAR.
    #[error("report is {len} characters long; a METAR is at most {MAX_REPORT_LEN}")]
    TooLong {
        /// Length in bytes.
        len: usize,
    },
    /// `NIL`.
    #[error("NIL: the station sent no observation")]
    Nil,
    /// Nothing in the text reads as a METAR group.
    #[error("not a METAR: no group recognised, starting with '{start}'")]
    NotMetar {
        /// The first group, shortened and with control characters escaped.
        start: String,
    },
    /// A needed group is absent.
    #[error("{group} group missing (expected e.g. {})", group.example())]
    Missing {
        /// Which group.
        group: GroupName,
    },
    /// A needed group is present but cannot be read.
    #[error("{group} group '{text}' at column {column}: {problem}")]
    Malformed {
        /// Which group.
        group: GroupName,
        /// The group as reported (shortened when very long).
        text: String,
        /// 1-based column in the report.
        column: usize,
        /// What is wrong and what was expected.
        problem: String,
    },
}

impl DecodeError {
    /// The group this error is about, if any.
    pub fn group(&self) -> Option<GroupName> {
        match self {
            DecodeError::Missing { group } | DecodeError::Malformed { group, .. } => Some(*group),
            _ => None,
        }
    }
}

/// Decodes one METAR or SPECI. `reference` is the instant the day-hour-minute is resolved
/// against (the latest matching UTC time not after it, see [`resolve_time`]).
///
/// The text may start with `METAR`/`SPECI`, end with `=`, and use any whitespace between
/// groups; lower case is read as upper case.
pub fn decode(text: &str, reference: DateTime<Utc>) -> Report {
    let trimmed = text
        .trim_start_matches(|c: char| c.is_ascii_whitespace())
        .trim_end_matches(|c: char| c.is_ascii_whitespace() || c == '=');
    if trimmed.len() > MAX_REPORT_LEN {
        let mut cut = 60;
        while !trimmed.is_char_boundary(cut) {
            cut -= 1;
        }
        let mut head = trimmed.get(..cut).unwrap_or("").to_string();
        head.push('…');
        return Report {
            text: head,
            errors: vec![DecodeError::TooLong { len: trimmed.len() }],
            ..Report::default()
        };
    }
    // Normalise: one space between groups, upper case. Token spans index `norm`.
    let (norm, spans) = groups::normalise(trimmed.split_ascii_whitespace());
    if spans.is_empty() {
        return Report {
            errors: vec![DecodeError::Empty],
            ..Report::default()
        };
    }
    let mut d = Decoder {
        toks: groups::Tokens {
            text: &norm,
            spans: &spans,
        },
        reference,
        r: Report::default(),
        wind_done: false,
        sector_done: false,
        vis_done: false,
        minvis_done: false,
        temp_done: false,
        altimeters: 0,
    };
    d.run();
    let mut r = d.r;
    r.text = norm;
    r.derive();
    r
}

/// How far after the reference instant an observation or issue time may lie and still
/// be taken as just now (a clock a little behind across midnight), minutes.
pub const MAX_AHEAD_MINUTES: i64 = 120;

/// Resolves the day-hour-minute of an observation or a forecast's issue, which lie in
/// the past: a day up to the reference's own is this month, a later day the month
/// before — or further back until the month has that day (day 31 read on 1 March is
/// 31 January). Only a time at most [`MAX_AHEAD_MINUTES`] ahead of `reference`, across
/// midnight, is taken as the next day. `None` for an hour or minute out of range.
pub fn resolve_time(
    day: u32,
    hour: u32,
    minute: u32,
    reference: DateTime<Utc>,
) -> Option<DateTime<Utc>> {
    let r = reference.date_naive();
    let at = |date: NaiveDate| date.and_hms_opt(hour, minute, 0).map(|t| t.and_utc());
    if let Some(next) = r.succ_opt()
        && next.day() == day
        && let Some(t) = at(next)
        && t - reference <= Duration::minutes(MAX_AHEAD_MINUTES)
    {
        return Some(t);
    }
    // Three months back always reaches a month with any day 1–31.
    (0..=3).find_map(|back: i32| {
        if back == 0 && day > r.day() {
            return None;
        }
        let months = r.year() * 12 + r.month0() as i32 - back;
        let (y, m0) = (months.div_euclid(12), months.rem_euclid(12));
        NaiveDate::from_ymd_opt(y, m0 as u32 + 1, day).and_then(at)
    })
}

/// Resolves a day-hour-minute to the UTC instant nearest `reference` (this month, the one
/// before or the one after), or `None` when none lies within [`MAX_TIME_DISTANCE_DAYS`]:
/// for a forecast's periods, which may lie ahead of its issue.
pub fn resolve_nearest(
    day: u32,
    hour: u32,
    minute: u32,
    reference: DateTime<Utc>,
) -> Option<DateTime<Utc>> {
    let r = reference.date_naive();
    let mut best: Option<(i64, DateTime<Utc>)> = None;
    for delta in [-1i32, 0, 1] {
        let months = r.year() * 12 + r.month0() as i32 + delta;
        let (y, m0) = (months.div_euclid(12), months.rem_euclid(12));
        let Some(date) = NaiveDate::from_ymd_opt(y, m0 as u32 + 1, day) else {
            continue;
        };
        let Some(dt) = date.and_hms_opt(hour, minute, 0) else {
            continue;
        };
        let dt = dt.and_utc();
        let dist = (dt - reference).num_seconds().abs();
        if best.is_none_or(|(b, _)| dist < b) {
            best = Some((dist, dt));
        }
    }
    best.filter(|(d, _)| *d <= Duration::days(MAX_TIME_DISTANCE_DAYS).num_seconds())
        .map(|(_, dt)| dt)
}

/// What a group parser made of a token.
enum Parsed {
    /// Not this kind of group.
    No,
    /// Decoded; this many tokens consumed.
    Ok(usize),
    /// Clearly this kind of group, but malformed: what is wrong.
    Bad(String),
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
enum Stage {
    Modifier,
    Wind,
    WindSector,
    Visibility,
    MinVisibility,
    Rvr,
    Weather,
    Cloud,
    Temperature,
    Altimeter,
    Recent,
    WindShear,
}

const STAGES: [Stage; 12] = [
    Stage::Modifier,
    Stage::Wind,
    Stage::WindSector,
    Stage::Visibility,
    Stage::MinVisibility,
    Stage::Rvr,
    Stage::Weather,
    Stage::Cloud,
    Stage::Temperature,
    Stage::Altimeter,
    Stage::Recent,
    Stage::WindShear,
];

struct Decoder<'a> {
    toks: groups::Tokens<'a>,
    reference: DateTime<Utc>,
    r: Report,
    wind_done: bool,
    sector_done: bool,
    vis_done: bool,
    minvis_done: bool,
    temp_done: bool,
    altimeters: u8,
}

/// Temperature `15`, `M05` in °C; `None` for `//`; error otherwise.
fn temp_value(s: &str) -> Result<Option<f64>, ()> {
    if s == "//" {
        return Ok(None);
    }
    let (neg, digits) = match s.strip_prefix('M') {
        Some(d) => (true, d),
        None => (false, s),
    };
    if digits.len() != 2 {
        return Err(());
    }
    let v = f64::from(num(digits).ok_or(())?);
    Ok(Some(if neg { -v } else { v }))
}

/// `T02330139` remark: tenths of °C, sign digit 1 = minus.
fn remark_temperature(tok: &str) -> Option<(f64, Option<f64>)> {
    let body = tok.strip_prefix('T')?;
    if !all_digits(body) || (body.len() != 4 && body.len() != 8) {
        return None;
    }
    let tenths = |s: &str| -> Option<f64> {
        let sign = match s.get(..1)? {
            "0" => 1.0,
            "1" => -1.0,
            _ => return None,
        };
        Some(sign * f64::from(num(s.get(1..4)?)?) / 10.0)
    };
    let t = tenths(body.get(..4)?)?;
    let d = match body.get(4..8) {
        Some(s) => Some(tenths(s)?),
        None => None,
    };
    Some((t, d))
}

impl<'a> Decoder<'a> {
    fn group(&mut self, kind: GroupKind, i: usize, ntok: usize) {
        let (start, len) = self.toks.span(i, ntok);
        self.r.groups.push(Group { kind, start, len });
    }

    fn error(&mut self, group: GroupName, i: usize, problem: String) {
        let (text, column) = self.toks.quoted(i);
        self.r.errors.push(DecodeError::Malformed {
            group,
            text,
            column,
            problem,
        });
    }

    fn not_understood(&mut self, i: usize, reason: impl Into<String>) {
        let n = self.toks.not_understood(i, reason);
        self.r.not_understood.push(n);
    }

    fn run(&mut self) {
        let n = self.toks.len();
        let mut i = 0;
        match self.toks.tok(0) {
            "METAR" => {
                self.r.kind = Some(Kind::Metar);
                self.group(GroupKind::ReportType, 0, 1);
                i = 1;
            }
            "SPECI" => {
                self.r.kind = Some(Kind::Speci);
                self.group(GroupKind::ReportType, 0, 1);
                i = 1;
            }
            _ => self.r.kind = Some(Kind::Metar),
        }
        if self.toks.tok(i) == "COR" {
            self.r.corrected = true;
            self.group(GroupKind::Correction, i, 1);
            i += 1;
        }
        i = self.station(i);
        i = self.time(i);

        let mut stage = Stage::Modifier;
        while i < n {
            let tok = self.toks.tok(i);
            if tok == "RMK" {
                self.remarks(i);
                break;
            }
            if matches!(tok, "NOSIG" | "BECMG" | "TEMPO") {
                let mut j = i;
                while j < n && self.toks.tok(j) != "RMK" {
                    j += 1;
                }
                self.r.trend = self
                    .toks
                    .text
                    .get(self.toks.start(i)..self.toks.end(j.saturating_sub(1)))
                    .map(str::to_string);
                self.group(GroupKind::Trend, i, j - i);
                i = j;
                continue;
            }
            let mut handled = false;
            for &s in STAGES.iter().filter(|s| **s >= stage) {
                if !self.open(s) {
                    continue;
                }
                match self.parse(s, i) {
                    Parsed::No => continue,
                    Parsed::Ok(k) => {
                        i += k.max(1);
                        stage = s;
                        handled = true;
                        break;
                    }
                    Parsed::Bad(problem) => {
                        match s {
                            Stage::Wind => {
                                self.wind_done = true;
                                self.error(GroupName::Wind, i, problem);
                            }
                            Stage::Temperature => {
                                self.temp_done = true;
                                self.error(GroupName::Temperature, i, problem);
                            }
                            Stage::Altimeter => {
                                self.altimeters += 1;
                                self.error(GroupName::Altimeter, i, problem);
                            }
                            _ => self.not_understood(i, problem),
                        }
                        i += 1;
                        stage = s;
                        handled = true;
                        break;
                    }
                }
            }
            if !handled {
                // Out of order: still decode it (a ceiling must not be lost), but only
                // when it reads cleanly.
                for &s in STAGES.iter().filter(|s| **s < stage) {
                    if !self.open(s) {
                        continue;
                    }
                    if let Parsed::Ok(k) = self.parse(s, i) {
                        i += k.max(1);
                        handled = true;
                        break;
                    }
                }
            }
            if !handled {
                let reason = if self.r.nil {
                    "after NIL"
                } else if stage == Stage::Modifier && !self.wind_done {
                    "not a group of a METAR"
                } else {
                    "not a group of a METAR, or out of place"
                };
                self.not_understood(i, reason);
                i += 1;
            }
        }
        self.finish();
    }

    /// Whether stage `s` can still take a group.
    fn open(&self, s: Stage) -> bool {
        match s {
            Stage::Wind => !self.wind_done,
            Stage::WindSector => !self.sector_done && self.wind_done,
            Stage::Visibility => !self.vis_done,
            Stage::MinVisibility => !self.minvis_done && self.vis_done,
            Stage::Temperature => !self.temp_done,
            Stage::Altimeter => self.altimeters < 2,
            _ => true,
        }
    }

    fn parse(&mut self, s: Stage, i: usize) -> Parsed {
        match s {
            Stage::Modifier => self.modifier(i),
            Stage::Wind => self.wind(i),
            Stage::WindSector => self.sector(i),
            Stage::Visibility => self.visibility(i),
            Stage::MinVisibility => self.min_visibility(i),
            Stage::Rvr => self.rvr(i),
            Stage::Weather => self.weather(i),
            Stage::Cloud => self.cloud(i),
            Stage::Temperature => self.temperature(i),
            Stage::Altimeter => self.altimeter(i),
            Stage::Recent => self.recent(i),
            Stage::WindShear => self.wind_shear(i),
        }
    }

    fn finish(&mut self) {
        // Nothing read, or only a word that could be a station ("this is not a metar"
        // reads THIS): not a METAR, rather than a report missing its time group.
        let only_a_station = self.r.groups.len() <= self.r.not_understood.len() + 1
            && !matches!(self.toks.tok(0), "METAR" | "SPECI")
            && self.r.observed_at.is_none()
            && self.r.time_text.is_empty();
        if self.r.groups.is_empty() || only_a_station {
            self.r.errors = vec![DecodeError::NotMetar {
                start: quote(self.toks.tok(0)),
            }];
            return;
        }
        if self.r.nil {
            self.r.errors.push(DecodeError::Nil);
            return;
        }
        let has = |r: &Report, g: GroupName| r.errors.iter().any(|e| e.group() == Some(g));
        if self.r.wind.is_none() && !has(&self.r, GroupName::Wind) {
            self.r.errors.push(DecodeError::Missing {
                group: GroupName::Wind,
            });
        }
        if (self.r.temperature_c.is_none() || self.r.dewpoint_c.is_none())
            && !has(&self.r, GroupName::Temperature)
        {
            self.r.errors.push(DecodeError::Missing {
                group: GroupName::Temperature,
            });
        }
        if self.r.altimeter_hpa.is_none() && !has(&self.r, GroupName::Altimeter) {
            self.r.errors.push(DecodeError::Missing {
                group: GroupName::Altimeter,
            });
        }
        // Errors in report order: station, time, then the body groups by column.
        self.r.errors.sort_by_key(|e| match e {
            DecodeError::Missing {
                group: GroupName::Station | GroupName::Time,
            } => 0,
            DecodeError::Malformed { column, .. } => *column,
            _ => usize::MAX,
        });
    }

    fn looks_like_time(tok: &str) -> bool {
        let body = tok.strip_suffix('Z').unwrap_or(tok);
        all_digits(body) && (tok.ends_with('Z') || body.len() == 6)
    }

    fn station(&mut self, i: usize) -> usize {
        let tok = self.toks.tok(i);
        let b = tok.as_bytes();
        let ok = b.len() == 4
            && b.first().is_some_and(u8::is_ascii_uppercase)
            && b.iter()
                .all(|c| c.is_ascii_uppercase() || c.is_ascii_digit());
        if ok {
            self.r.station = tok.to_string();
            self.group(GroupKind::Station, i, 1);
            return i + 1;
        }
        if i >= self.toks.len() || Self::looks_like_time(tok) {
            self.r.errors.push(DecodeError::Missing {
                group: GroupName::Station,
            });
            return i;
        }
        self.error(
            GroupName::Station,
            i,
            "expected 4 letters or digits starting with a letter".to_string(),
        );
        i + 1
    }

    fn time(&mut self, i: usize) -> usize {
        let tok = self.toks.tok(i);
        if !Self::looks_like_time(tok) {
            self.r.errors.push(DecodeError::Missing {
                group: GroupName::Time,
            });
            return i;
        }
        let problem = match tok.strip_suffix('Z') {
            None => Some("the Z (UTC) is missing after day, hour and minute".to_string()),
            Some(b) if b.len() != 6 => Some(format!(
                "expected 6 digits (day, hour, minute) before Z, found {}",
                b.len()
            )),
            Some(b) => {
                let day = num(b.get(0..2).unwrap_or("")).unwrap_or(99);
                let hour = num(b.get(2..4).unwrap_or("")).unwrap_or(99);
                let minute = num(b.get(4..6).unwrap_or("")).unwrap_or(99);
                if !(1..=31).contains(&day) {
                    Some(format!("day {day} is not a day of the month"))
                } else if hour > 23 {
                    Some(format!("hour {hour} is not an hour of the day (00-23)"))
                } else if minute > 59 {
                    Some(format!("minute {minute} is not a minute (00-59)"))
                } else if let Some(t) = resolve_time(day, hour, minute, self.reference) {
                    self.r.observed_at = Some(t);
                    None
                } else {
                    Some(format!(
                        "day {day} does not fall within {MAX_TIME_DISTANCE_DAYS} days of the reference date {}",
                        self.reference.format("%Y-%m-%d")
                    ))
                }
            }
        };
        self.r.time_text = quote(tok);
        self.group(GroupKind::Time, i, 1);
        if let Some(p) = problem {
            self.error(GroupName::Time, i, p);
        }
        i + 1
    }

    fn modifier(&mut self, i: usize) -> Parsed {
        match self.toks.tok(i) {
            "AUTO" => {
                self.r.auto = true;
                self.group(GroupKind::Auto, i, 1);
                Parsed::Ok(1)
            }
            "COR" => {
                self.r.corrected = true;
                self.group(GroupKind::Correction, i, 1);
                Parsed::Ok(1)
            }
            "NIL" => {
                self.r.nil = true;
                self.group(GroupKind::Nil, i, 1);
                Parsed::Ok(1)
            }
            _ => Parsed::No,
        }
    }

    fn wind(&mut self, i: usize) -> Parsed {
        match groups::wind(self.toks.tok(i)) {
            GroupParse::No => Parsed::No,
            GroupParse::Bad(p) => Parsed::Bad(p),
            GroupParse::Ok(w, _) => {
                self.r.wind = Some(w);
                self.wind_done = true;
                self.group(GroupKind::Wind, i, 1);
                Parsed::Ok(1)
            }
        }
    }

    fn sector(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        let Some((a, b)) = tok.split_once('V') else {
            return Parsed::No;
        };
        if !(all_digits(a) && all_digits(b)) {
            return Parsed::No;
        }
        let (Some(from), Some(to)) = (
            num(a).filter(|_| a.len() == 3),
            num(b).filter(|_| b.len() == 3),
        ) else {
            return Parsed::Bad("expected dddVddd, e.g. 240V300".into());
        };
        if from > 360 || to > 360 {
            return Parsed::Bad("a sector direction is more than 360°".into());
        }
        if let Some(w) = self.r.wind.as_mut() {
            w.variable_from_deg = Some(f64::from(from));
            w.variable_to_deg = Some(f64::from(to));
        }
        self.sector_done = true;
        self.group(GroupKind::WindSector, i, 1);
        Parsed::Ok(1)
    }

    fn set_visibility(&mut self, v: Visibility, i: usize, ntok: usize) -> Parsed {
        self.r.visibility = Some(v);
        self.vis_done = true;
        self.group(GroupKind::Visibility, i, ntok);
        Parsed::Ok(ntok)
    }

    fn visibility(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        match groups::visibility(tok, self.toks.tok(i + 1)) {
            GroupParse::No => Parsed::No,
            GroupParse::Bad(p) => {
                if tok == "////" || tok == "////SM" {
                    self.vis_done = true;
                }
                Parsed::Bad(p)
            }
            GroupParse::Ok(VisibilityGroup::Cavok, _) => {
                self.r.cavok = true;
                self.vis_done = true;
                self.r.visibility = Some(Visibility {
                    prevailing_m: 10_000.0,
                    bound: Bound::AtLeast,
                    ..Visibility::default()
                });
                self.group(GroupKind::Cavok, i, 1);
                Parsed::Ok(1)
            }
            GroupParse::Ok(VisibilityGroup::Visibility(v), n) => self.set_visibility(v, i, n),
        }
    }

    fn min_visibility(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        let (Some(digits), Some(dir)) = (tok.get(..4), tok.get(4..)) else {
            return Parsed::No;
        };
        if !all_digits(digits) {
            return Parsed::No;
        }
        let Some(idx) = DIRECTIONS.iter().position(|d| *d == dir) else {
            return Parsed::No;
        };
        if let Some(v) = self.r.visibility.as_mut() {
            v.minimum_m = Some(f64::from(num(digits).unwrap_or(0)));
            v.minimum_direction = u8::try_from(idx).ok();
        }
        self.minvis_done = true;
        self.group(GroupKind::MinimumVisibility, i, 1);
        Parsed::Ok(1)
    }

    fn rvr(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        let Some(body) = tok.strip_prefix('R') else {
            return Parsed::No;
        };
        if !body.as_bytes().first().is_some_and(u8::is_ascii_digit) || !body.contains('/') {
            return Parsed::No;
        }
        let bad = || {
            Parsed::Bad(
                "expected R<runway>/<4 digits>[V<4 digits>][FT][/U, /D or /N], e.g. R28L/P1500N"
                    .into(),
            )
        };
        let Some((runway, mut rest)) = body.split_once('/') else {
            return bad();
        };
        let rb = runway.as_bytes();
        let runway_ok = (rb.len() == 2 || rb.len() == 3)
            && rb.iter().take(2).all(u8::is_ascii_digit)
            && rb.get(2).is_none_or(|c| matches!(c, b'L' | b'C' | b'R'));
        if !runway_ok {
            return bad();
        }
        let mut tendency = None;
        for (suffix, t) in [
            ("/U", 'U'),
            ("/D", 'D'),
            ("/N", 'N'),
            ("U", 'U'),
            ("D", 'D'),
            ("N", 'N'),
        ] {
            if let Some(r) = rest.strip_suffix(suffix) {
                tendency = Some(t);
                rest = r;
                break;
            }
        }
        let (rest, in_feet) = match rest.strip_suffix("FT") {
            Some(r) => (r, true),
            None => (rest, false),
        };
        let (low, high) = match rest.split_once('V') {
            Some((l, h)) => (l, Some(h)),
            None => (rest, None),
        };
        let value = |s: &str| -> Option<(Bound, f64)> {
            let (b, v) = bound_prefix(s);
            (v.len() == 4).then(|| num(v).map(|n| (b, f64::from(n))))?
        };
        let Some((bound, range)) = value(low) else {
            return bad();
        };
        let (variable_bound, variable_to) = match high {
            None => (Bound::Exact, None),
            Some(h) => match value(h) {
                Some((b, v)) => (b, Some(v)),
                None => return bad(),
            },
        };
        let to_m = |v: f64| if in_feet { v * M_PER_FT } else { v };
        self.r.rvr.push(Rvr {
            runway: runway.to_string(),
            range_m: to_m(range),
            bound,
            variable_to_m: variable_to.map(to_m),
            variable_bound,
            in_feet,
            tendency,
        });
        let n = u16::try_from(self.r.rvr.len() - 1).unwrap_or(u16::MAX);
        self.group(GroupKind::Rvr(n), i, 1);
        Parsed::Ok(1)
    }

    fn weather(&mut self, i: usize) -> Parsed {
        match groups::weather(self.toks.tok(i)) {
            GroupParse::No => Parsed::No,
            GroupParse::Bad(p) => Parsed::Bad(p),
            GroupParse::Ok(w, _) => {
                self.r.weather.push(w);
                let n = u16::try_from(self.r.weather.len() - 1).unwrap_or(u16::MAX);
                self.group(GroupKind::Weather(n), i, 1);
                Parsed::Ok(1)
            }
        }
    }

    fn cloud(&mut self, i: usize) -> Parsed {
        match groups::cloud(self.toks.tok(i)) {
            GroupParse::No => Parsed::No,
            GroupParse::Bad(p) => Parsed::Bad(p),
            GroupParse::Ok(SkyGroup::Clear(c), _) => {
                self.r.sky_clear = Some(c);
                self.group(GroupKind::SkyClear, i, 1);
                Parsed::Ok(1)
            }
            GroupParse::Ok(SkyGroup::Layer(layer), _) => {
                self.r.clouds.push(layer);
                let n = u16::try_from(self.r.clouds.len() - 1).unwrap_or(u16::MAX);
                self.group(GroupKind::Cloud(n), i, 1);
                Parsed::Ok(1)
            }
        }
    }

    fn temperature(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        if !tok.contains('/') || tok.len() > 9 || tok == "//" {
            return Parsed::No;
        }
        let bad = "expected TT/DD in whole °C with M for minus, e.g. 15/08 or M02/M05";
        if !tok
            .bytes()
            .all(|c| c.is_ascii_digit() || c == b'M' || c == b'/')
        {
            // A mistyped temperature group (`3O/12`, a letter O for a zero): short sides
            // of letters and digits around one slash, with a digit. Named as the
            // temperature group, quoted with its column, not reported as missing.
            let garbled = tok.split_once('/').is_some_and(|(t, d)| {
                !d.contains('/')
                    && (1..=3).contains(&t.len())
                    && d.len() <= 3
                    && tok.bytes().any(|c| c.is_ascii_digit())
                    && tok
                        .bytes()
                        .all(|c| c.is_ascii_uppercase() || c.is_ascii_digit() || c == b'/')
            });
            return if garbled {
                Parsed::Bad(bad.into())
            } else {
                Parsed::No
            };
        }
        let Some((t, d)) = tok.split_once('/') else {
            return Parsed::No;
        };
        if t == "//" && (d == "//" || d.is_empty()) || tok.bytes().all(|c| c == b'/') {
            self.temp_done = true;
            return Parsed::Bad("temperature not reported".into());
        }
        let (Ok(t), Ok(dv)) = (
            temp_value(t),
            if d.is_empty() {
                Ok(None)
            } else {
                temp_value(d)
            },
        ) else {
            return Parsed::Bad(bad.into());
        };
        if let Some(v) = t
            && !(-80.0..=60.0).contains(&v)
        {
            return Parsed::Bad(format!("temperature {v} °C is outside -80 to 60 °C"));
        }
        self.temp_done = true;
        self.group(GroupKind::Temperature, i, 1);
        if !self.r.temperature_from_remarks {
            self.r.temperature_c = t;
            self.r.dewpoint_c = dv;
        }
        if t.is_none() {
            return Parsed::Bad("temperature not reported".into());
        }
        if dv.is_none() {
            return Parsed::Bad("dew point not reported".into());
        }
        // Air holds no more water than saturation: the dew point is at most the
        // temperature (equal in fog). Above it, one of the two is wrong, and the
        // density computed from them would be too.
        if let (Some(t), Some(d)) = (t, dv)
            && d > t
        {
            return Parsed::Bad(format!(
                "dew point {d} °C above the temperature {t} °C (a dew point is at most the \
                 temperature): one of them is wrong"
            ));
        }
        Parsed::Ok(1)
    }

    fn altimeter(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        let (unit, body) = if let Some(b) = tok.strip_prefix('Q') {
            ('Q', b)
        } else if let Some(b) = tok.strip_prefix('A') {
            ('A', b)
        } else {
            return Parsed::No;
        };
        let first = body.as_bytes().first().copied();
        if !first.is_some_and(|c| c.is_ascii_digit() || c == b'/' || c == b'.') {
            return Parsed::No;
        }
        if body.bytes().all(|c| c == b'/') {
            return Parsed::Bad("altimeter setting not reported".into());
        }
        let Some(v) = num(body).filter(|_| body.len() == 4) else {
            return Parsed::Bad(if unit == 'Q' {
                "expected Q and 4 digits of whole hPa, e.g. Q1013".into()
            } else {
                "expected A and 4 digits of hundredths of inHg without a point, e.g. A2992".into()
            });
        };
        let v = f64::from(v);
        if unit == 'Q' {
            if !(850.0..=1100.0).contains(&v) {
                return Parsed::Bad(format!("{v} hPa is outside 850 to 1100 hPa"));
            }
            self.r.altimeter_hpa = Some(v);
            if self.r.altimeter_inhg.is_none() {
                self.r.altimeter_inhg = Some(v / HPA_PER_INHG);
            }
            self.group(GroupKind::AltimeterHpa, i, 1);
        } else {
            let inhg = v / 100.0;
            if !(25.0..=32.5).contains(&inhg) {
                return Parsed::Bad(format!("{inhg:.2} inHg is outside 25.00 to 32.50 inHg"));
            }
            // A reported Q value is exact; the A value is kept as reported beside it.
            if !self
                .r
                .groups
                .iter()
                .any(|g| g.kind == GroupKind::AltimeterHpa)
            {
                self.r.altimeter_hpa = Some(inhg * HPA_PER_INHG);
            }
            self.r.altimeter_inhg = Some(inhg);
            self.group(GroupKind::AltimeterInhg, i, 1);
        }
        self.altimeters += 1;
        Parsed::Ok(1)
    }

    fn recent(&mut self, i: usize) -> Parsed {
        let tok = self.toks.tok(i);
        let Some(body) = tok.strip_prefix("RE") else {
            return Parsed::No;
        };
        if body.is_empty() {
            return Parsed::No;
        }
        match weather_body(body, Intensity::Moderate) {
            Some(w) => {
                self.r.recent_weather.push(w);
                let n = u16::try_from(self.r.recent_weather.len() - 1).unwrap_or(u16::MAX);
                self.group(GroupKind::Recent(n), i, 1);
                Parsed::Ok(1)
            }
            None => Parsed::Bad("unknown recent weather; expected e.g. RERA, RETS, REFZDZ".into()),
        }
    }

    fn wind_shear(&mut self, i: usize) -> Parsed {
        if self.toks.tok(i) != "WS" {
            return Parsed::No;
        }
        let next = self.toks.tok(i + 1);
        if next == "ALL" && self.toks.tok(i + 2) == "RWY" {
            self.r.wind_shear.push(WindShear::AllRunways);
            let n = u16::try_from(self.r.wind_shear.len() - 1).unwrap_or(u16::MAX);
            self.group(GroupKind::WindShear(n), i, 3);
            return Parsed::Ok(3);
        }
        let rwy = next
            .strip_prefix("RWY")
            .or_else(|| next.strip_prefix('R'))
            .filter(|r| {
                let b = r.as_bytes();
                (b.len() == 2 || b.len() == 3)
                    && b.iter().take(2).all(u8::is_ascii_digit)
                    && b.get(2).is_none_or(|c| matches!(c, b'L' | b'C' | b'R'))
            });
        match rwy {
            Some(r) => {
                self.r.wind_shear.push(WindShear::Runway(r.to_string()));
                let n = u16::try_from(self.r.wind_shear.len() - 1).unwrap_or(u16::MAX);
                self.group(GroupKind::WindShear(n), i, 2);
                Parsed::Ok(2)
            }
            None => {
                Parsed::Bad("expected a runway after WS (WS R27, WS RWY27) or WS ALL RWY".into())
            }
        }
    }

    fn remarks(&mut self, i: usize) {
        let n = self.toks.len();
        let text = if i + 1 < n {
            self.toks
                .text
                .get(self.toks.start(i + 1)..self.toks.end(n - 1))
                .unwrap_or("")
        } else {
            ""
        };
        self.r.remarks = Some(text.to_string());
        self.group(GroupKind::Remarks, i, n - i);
        for j in i + 1..n {
            if let Some((t, d)) = remark_temperature(self.toks.tok(j)) {
                self.r.temperature_c = Some(t);
                if d.is_some() {
                    self.r.dewpoint_c = d;
                }
                self.r.temperature_from_remarks = true;
                self.group(GroupKind::RemarkTemperature, j, 1);
                break;
            }
        }
    }
}

/// What a decoded group says, in plain words and units, for the readable decode.
pub fn describe(r: &Report, g: &Group) -> String {
    match g.kind {
        GroupKind::ReportType => match r.kind {
            Some(Kind::Speci) => "special report (SPECI)".into(),
            _ => "routine report (METAR)".into(),
        },
        GroupKind::Correction => "correction of an earlier report".into(),
        GroupKind::Auto => "fully automatic observation".into(),
        GroupKind::Nil => "no observation (NIL)".into(),
        GroupKind::Station => format!("station {}", r.station),
        GroupKind::Time => match r.observed_at {
            Some(t) => format!("observed {}", t.format("%Y-%m-%d %H:%M UTC")),
            None => "observation time not readable".into(),
        },
        GroupKind::Wind => match &r.wind {
            None => "wind not readable".into(),
            Some(w) => describe_wind(w),
        },
        GroupKind::WindSector => match &r.wind {
            Some(Wind {
                variable_from_deg: Some(a),
                variable_to_deg: Some(b),
                ..
            }) => format!("wind direction varying between {a:03.0}° and {b:03.0}° true"),
            _ => "variable wind sector".into(),
        },
        GroupKind::Cavok => {
            "CAVOK: visibility 10 km or more, no cloud below 5,000 ft or below the highest \
             minimum sector altitude, no cumulonimbus or towering cumulus, no significant weather"
                .into()
        }
        GroupKind::Visibility => match &r.visibility {
            None => "visibility not readable".into(),
            Some(v) => describe_visibility(v),
        },
        GroupKind::MinimumVisibility => match &r.visibility {
            Some(Visibility {
                minimum_m: Some(m),
                minimum_direction,
                ..
            }) => {
                let dir = minimum_direction
                    .and_then(|d| DIRECTIONS.get(usize::from(d)))
                    .unwrap_or(&"?");
                format!("lowest visibility {m:.0} m, towards {dir}")
            }
            _ => "directional visibility".into(),
        },
        GroupKind::Rvr(n) => match r.rvr.get(usize::from(n)) {
            None => "runway visual range".into(),
            Some(v) => {
                let unit = |m: f64| {
                    if v.in_feet {
                        format!("{:.0} ft", m / M_PER_FT)
                    } else {
                        format!("{m:.0} m")
                    }
                };
                let mut s = format!(
                    "runway {} visual range {}{}",
                    v.runway,
                    bound_word(v.bound),
                    unit(v.range_m)
                );
                if let Some(h) = v.variable_to_m {
                    s.push_str(&format!(
                        " varying to {}{}",
                        bound_word(v.variable_bound),
                        unit(h)
                    ));
                }
                match v.tendency {
                    Some('U') => s.push_str(", increasing"),
                    Some('D') => s.push_str(", decreasing"),
                    Some('N') => s.push_str(", no change"),
                    _ => {}
                }
                s
            }
        },
        GroupKind::Weather(n) => r
            .weather
            .get(usize::from(n))
            .map_or_else(String::new, describe_weather),
        GroupKind::Recent(n) => r
            .recent_weather
            .get(usize::from(n))
            .map_or_else(String::new, |w| format!("recent {}", describe_weather(w))),
        GroupKind::Cloud(n) => r
            .clouds
            .get(usize::from(n))
            .map_or_else(String::new, describe_cloud),
        GroupKind::SkyClear => r
            .sky_clear
            .map_or_else(String::new, |c| describe_sky_clear(c).to_string()),
        GroupKind::Temperature => {
            let f = |v: Option<f64>| v.map_or("not reported".to_string(), |v| format!("{v:.0} °C"));
            if r.temperature_from_remarks {
                // The fields hold the remark's tenths; show the group's own whole degrees.
                let text = r.group_text(g);
                let (t, d) = text.split_once('/').unwrap_or((text, ""));
                let whole = |s: &str| temp_value(s).ok().flatten();
                format!(
                    "temperature {}, dew point {} (the remark T group's tenths are used)",
                    f(whole(t)),
                    f(whole(d))
                )
            } else {
                format!(
                    "temperature {}, dew point {}",
                    f(r.temperature_c),
                    f(r.dewpoint_c)
                )
            }
        }
        GroupKind::AltimeterHpa => match r.altimeter_hpa {
            Some(h) => format!("altimeter setting (QNH) {h:.0} hPa"),
            None => String::new(),
        },
        GroupKind::AltimeterInhg => match r.altimeter_inhg {
            Some(a) => format!(
                "altimeter setting {a:.2} inHg ({:.1} hPa)",
                a * HPA_PER_INHG
            ),
            None => String::new(),
        },
        GroupKind::WindShear(n) => match r.wind_shear.get(usize::from(n)) {
            Some(WindShear::AllRunways) => "wind shear on all runways".into(),
            Some(WindShear::Runway(rw)) => format!("wind shear on runway {rw}"),
            None => String::new(),
        },
        GroupKind::Trend => "trend for the next two hours (kept as text)".into(),
        GroupKind::Remarks => "remarks (kept as text)".into(),
        GroupKind::RemarkTemperature => {
            let f = |v: Option<f64>| v.map_or("not reported".to_string(), |v| format!("{v:.1} °C"));
            format!(
                "remark: temperature {}, dew point {} (tenths, used)",
                f(r.temperature_c),
                f(r.dewpoint_c)
            )
        }
    }
}
