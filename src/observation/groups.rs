//! Group parsers shared by the METAR and TAF decoders (WMO No. 306 FM 15 and FM 51 use
//! the same wind, visibility, weather and cloud groups), and their plain-word
//! descriptions. Each parser looks at one token (two for `1 1/2SM`) and says whether it
//! is that kind of group, and if so what it holds or what is wrong with it; the decoders
//! keep the bookkeeping (columns, errors, group lists).

use super::{
    Bound, CloudLayer, Convective, Cover, Intensity, SkyClear, SpeedUnit, Visibility, Weather, Wind,
};
use crate::units::{KMH_PER_KT, M_PER_SM, MPS_PER_KT, mps_to_kt};

/// What a group parser made of a token.
pub(super) enum GroupParse<T> {
    /// Not this kind of group.
    No,
    /// Decoded; this many tokens consumed.
    Ok(T, usize),
    /// Clearly this kind of group, but malformed: what is wrong.
    Bad(String),
}

/// Shortens a group for quoting in a message.
pub(super) fn quote(s: &str) -> String {
    let mut q = String::with_capacity(s.len().min(48));
    for (k, ch) in s.chars().enumerate() {
        if k == 40 {
            q.push('…');
            break;
        }
        if ch.is_control() {
            q.extend(ch.escape_default());
        } else {
            q.push(ch);
        }
    }
    q
}

pub(super) fn all_digits(s: &str) -> bool {
    !s.is_empty() && s.bytes().all(|b| b.is_ascii_digit())
}

/// The value of an all-digit string of at most 9 digits.
pub(super) fn num(s: &str) -> Option<u32> {
    if all_digits(s) && s.len() <= 9 {
        s.parse().ok()
    } else {
        None
    }
}

const DESCRIPTORS: [&str; 8] = ["MI", "BC", "PR", "DR", "BL", "SH", "TS", "FZ"];
const PHENOMENA: [&str; 21] = [
    "DZ", "RA", "SN", "SG", "IC", "PL", "GR", "GS", "UP", "BR", "FG", "FU", "VA", "DU", "SA", "HZ",
    "PY", "PO", "SQ", "FC", "SS",
];
const PHENOMENA_MORE: [&str; 1] = ["DS"];

pub(super) fn phenomenon(code: &str) -> Option<&'static str> {
    PHENOMENA
        .iter()
        .chain(PHENOMENA_MORE.iter())
        .find(|p| **p == code)
        .copied()
}

/// Parses the body of a weather group (after any intensity), e.g. `TSRA`, `FZDZ`, `BR`.
pub(super) fn weather_body(s: &str, intensity: Intensity) -> Option<Weather> {
    let mut rest = s;
    let mut descriptor = None;
    if let Some(head) = rest.get(..2)
        && let Some(d) = DESCRIPTORS.iter().find(|d| **d == head)
    {
        descriptor = Some(*d);
        rest = rest.get(2..).unwrap_or("");
    }
    let mut phenomena = Vec::new();
    while !rest.is_empty() {
        let head = rest.get(..2)?;
        phenomena.push(phenomenon(head)?);
        rest = rest.get(2..).unwrap_or("");
        if phenomena.len() > 4 {
            return None;
        }
    }
    let ok = !phenomena.is_empty()
        || descriptor == Some("TS")
        || (intensity == Intensity::Vicinity && descriptor.is_some());
    ok.then_some(Weather {
        intensity,
        descriptor,
        phenomena,
        not_observed: false,
    })
}

pub(super) fn parse_weather(tok: &str) -> Option<Weather> {
    if tok == "//" {
        return Some(Weather {
            not_observed: true,
            ..Weather::default()
        });
    }
    let (intensity, body) = if let Some(b) = tok.strip_prefix('-') {
        (Intensity::Light, b)
    } else if let Some(b) = tok.strip_prefix('+') {
        (Intensity::Heavy, b)
    } else if let Some(b) = tok.strip_prefix("VC") {
        (Intensity::Vicinity, b)
    } else {
        (Intensity::Moderate, tok)
    };
    weather_body(body, intensity)
}

/// `P`/`M` prefix of a value.
pub(super) fn bound_prefix(s: &str) -> (Bound, &str) {
    if let Some(r) = s.strip_prefix('P') {
        (Bound::AtLeast, r)
    } else if let Some(r) = s.strip_prefix('M') {
        (Bound::LessThan, r)
    } else {
        (Bound::Exact, s)
    }
}

/// `1/2`, `3/16` → the fraction.
pub(super) fn fraction(s: &str) -> Option<f64> {
    let (n, d) = s.split_once('/')?;
    let (n, d) = (num(n)?, num(d)?);
    if d == 0 || n > 99 || d > 16 {
        return None;
    }
    Some(f64::from(n) / f64::from(d))
}

/// Statute miles in `P6SM`, `1/2SM`, `M1/4SM`, `10SM` (without the `SM`).
pub(super) fn miles(s: &str) -> Option<(Bound, f64)> {
    let (bound, v) = bound_prefix(s);
    if v.contains('/') {
        fraction(v).map(|f| (bound, f))
    } else if v.len() <= 3 {
        num(v).map(|n| (bound, f64::from(n)))
    } else {
        None
    }
}

pub(super) fn bound_word(b: Bound) -> &'static str {
    match b {
        Bound::Exact => "",
        Bound::AtLeast => "more than ",
        Bound::LessThan => "less than ",
    }
}

pub(super) fn fmt_num(v: f64) -> String {
    if (v - v.round()).abs() < 1e-9 {
        format!("{v:.0}")
    } else {
        let s = format!("{v:.2}");
        s.trim_end_matches('0').to_string()
    }
}

pub(super) fn describe_weather(w: &Weather) -> String {
    if w.not_observed {
        return "present weather not observable (automatic station)".into();
    }
    let mut parts: Vec<&str> = Vec::new();
    let intensity = match w.intensity {
        Intensity::Light => Some("light"),
        Intensity::Heavy => Some("heavy"),
        _ => None,
    };
    // The intensity qualifies the precipitation: +TSRA is a thunderstorm with heavy rain.
    let ts_with_precip = w.descriptor == Some("TS") && !w.phenomena.is_empty();
    if !ts_with_precip && let Some(i) = intensity {
        parts.push(i);
    }
    if let Some(d) = w.descriptor {
        parts.push(match d {
            "MI" => "shallow",
            "BC" => "patches of",
            "PR" => "partial",
            "DR" => "low drifting",
            "BL" => "blowing",
            "SH" => "showers of",
            "TS" => "thunderstorm",
            "FZ" => "freezing",
            _ => d,
        });
    }
    if ts_with_precip {
        parts.push("with");
        if let Some(i) = intensity {
            parts.push(i);
        }
    }
    for (k, p) in w.phenomena.iter().enumerate() {
        if k > 0 {
            parts.push("and");
        }
        parts.push(match *p {
            "DZ" => "drizzle",
            "RA" => "rain",
            "SN" => "snow",
            "SG" => "snow grains",
            "IC" => "ice crystals",
            "PL" => "ice pellets",
            "GR" => "hail",
            "GS" => "small hail",
            "UP" => "unknown precipitation",
            "BR" => "mist",
            "FG" => "fog",
            "FU" => "smoke",
            "VA" => "volcanic ash",
            "DU" => "dust",
            "SA" => "sand",
            "HZ" => "haze",
            "PY" => "spray",
            "PO" => "dust/sand whirls",
            "SQ" => "squalls",
            "FC" => "funnel cloud",
            "SS" => "sandstorm",
            "DS" => "duststorm",
            other => other,
        });
    }
    if w.descriptor == Some("SH") && w.phenomena.is_empty() {
        parts.push("showers");
    }
    if w.intensity == Intensity::Vicinity {
        parts.push("in the vicinity");
    }
    parts.join(" ")
}

/// A wind group: `27015KT`, `VRB03KT`, `27015G25KT`, `270P99KT`, `05MPS`, `18KMH`.
pub(super) fn wind(tok: &str) -> GroupParse<Wind> {
    let (body, unit) = if let Some(b) = tok.strip_suffix("KT") {
        (b, SpeedUnit::Kt)
    } else if let Some(b) = tok.strip_suffix("MPS") {
        (b, SpeedUnit::Mps)
    } else if let Some(b) = tok.strip_suffix("KMH") {
        (b, SpeedUnit::Kmh)
    } else {
        // Not ending in a unit: is it a wind group with a bad or missing unit?
        let b = tok.as_bytes();
        let head_ok =
            tok.starts_with("VRB") || b.get(..3).is_some_and(|h| h.iter().all(u8::is_ascii_digit));
        if !head_ok || tok.len() < 5 {
            return GroupParse::No;
        }
        let digits_end = b
            .iter()
            .skip(3)
            .position(|c| !(c.is_ascii_digit() || *c == b'G' || *c == b'P'))
            .map_or(b.len(), |p| p + 3);
        if digits_end < 5 {
            return GroupParse::No;
        }
        let suffix = tok.get(digits_end..).unwrap_or("");
        if suffix.is_empty() {
            return GroupParse::Bad(
                "the speed unit is missing; expected KT, MPS or KMH after the speed".into(),
            );
        }
        if suffix.len() <= 5 && suffix.bytes().all(|c| c.is_ascii_uppercase()) {
            return GroupParse::Bad(format!(
                "speed unit '{suffix}' not understood; expected KT, MPS or KMH"
            ));
        }
        return GroupParse::No;
    };
    if body.is_empty() || body.len() > 12 {
        return GroupParse::No;
    }
    if body.bytes().all(|c| c == b'/') {
        return GroupParse::Bad("wind not reported".into());
    }
    let (dir_text, rest) = (body.get(..3).unwrap_or(""), body.get(3..).unwrap_or(""));
    let direction = if dir_text == "VRB" {
        None
    } else if let Some(d) = num(dir_text).filter(|_| dir_text.len() == 3) {
        if d > 360 {
            return GroupParse::Bad(format!("direction {d}° is more than 360°"));
        }
        Some(f64::from(d))
    } else {
        return GroupParse::Bad(
            "expected 3 digits of direction (or VRB), then 2 or 3 digits of speed".into(),
        );
    };
    let (speed_text, gust_text) = match rest.split_once('G') {
        Some((s, g)) => (s, Some(g)),
        None => (rest, None),
    };
    let speed_val = |s: &str| -> Option<(Bound, f64)> {
        let (b, v) = match s.strip_prefix('P') {
            Some(v) => (Bound::AtLeast, v),
            None => (Bound::Exact, s),
        };
        if v.len() == 2 || v.len() == 3 {
            num(v).map(|n| (b, f64::from(n)))
        } else {
            None
        }
    };
    let Some((speed_bound, speed)) = speed_val(speed_text) else {
        return GroupParse::Bad(format!(
            "expected 2 or 3 digits of speed after the direction, found '{speed_text}'"
        ));
    };
    let gust = match gust_text {
        None => None,
        Some(g) => match speed_val(g) {
            Some((_, v)) => Some(v),
            None => {
                return GroupParse::Bad(format!(
                    "expected 2 or 3 digits of gust after G, found '{g}'"
                ));
            }
        },
    };
    let to_kt = |v: f64| match unit {
        SpeedUnit::Kt => v,
        SpeedUnit::Mps => mps_to_kt(v),
        SpeedUnit::Kmh => v / KMH_PER_KT,
    };
    GroupParse::Ok(
        Wind {
            direction_deg: direction,
            variable: direction.is_none(),
            speed_kt: to_kt(speed),
            speed_bound,
            gust_kt: gust.map(to_kt),
            variable_from_deg: None,
            variable_to_deg: None,
            unit: Some(unit),
        },
        1,
    )
}

/// A prevailing-visibility statement.
pub(super) enum VisibilityGroup {
    /// `CAVOK`.
    Cavok,
    /// A visibility in metres or statute miles.
    Visibility(Visibility),
}

/// A prevailing visibility group: `CAVOK`, `9999`, `0800`, `4000NDV`, `P6SM`, `1/2SM`,
/// `M1/4SM`, or `1 1/2SM` (two tokens; `next` is the token after `tok`).
/// `////` and `////SM` are `Bad("visibility not reported")`.
pub(super) fn visibility(tok: &str, next: &str) -> GroupParse<VisibilityGroup> {
    if tok == "CAVOK" {
        return GroupParse::Ok(VisibilityGroup::Cavok, 1);
    }
    let (metres, ndv) = match tok.strip_suffix("NDV") {
        Some(m) => (m, true),
        None => (tok, false),
    };
    if metres.len() == 4 && all_digits(metres) {
        let m = f64::from(num(metres).unwrap_or(0));
        let (prevailing_m, bound) = match metres {
            "9999" => (10_000.0, Bound::AtLeast),
            "0000" => (50.0, Bound::LessThan),
            _ => (m, Bound::Exact),
        };
        return GroupParse::Ok(
            VisibilityGroup::Visibility(Visibility {
                prevailing_m,
                bound,
                no_directional_variation: ndv,
                ..Visibility::default()
            }),
            1,
        );
    }
    if tok == "////" || tok == "////SM" {
        return GroupParse::Bad("visibility not reported".into());
    }
    // `1 1/2SM`: a whole number, then the fraction.
    if tok.len() == 1 && all_digits(tok) {
        if let Some(frac) = next.strip_suffix("SM").and_then(fraction) {
            let sm = f64::from(num(tok).unwrap_or(0)) + frac;
            return GroupParse::Ok(
                VisibilityGroup::Visibility(Visibility {
                    prevailing_m: sm * M_PER_SM,
                    reported_sm: Some(sm),
                    ..Visibility::default()
                }),
                2,
            );
        }
        return GroupParse::No;
    }
    if let Some(m) = tok.strip_suffix("SM") {
        return match miles(m) {
            Some((bound, sm)) => GroupParse::Ok(
                VisibilityGroup::Visibility(Visibility {
                    prevailing_m: sm * M_PER_SM,
                    reported_sm: Some(sm),
                    bound,
                    ..Visibility::default()
                }),
                1,
            ),
            None => {
                GroupParse::Bad("expected statute miles such as 3SM, 1/2SM, P6SM or 1 1/2SM".into())
            }
        };
    }
    GroupParse::No
}

/// A present-weather group: `-RA`, `+TSRA`, `VCSH`, `BR`, `//`.
pub(super) fn weather(tok: &str) -> GroupParse<Weather> {
    if tok.len() > 14 {
        return GroupParse::No;
    }
    match parse_weather(tok) {
        Some(w) => GroupParse::Ok(w, 1),
        None if tok.len() > 1 && (tok.starts_with('-') || tok.starts_with('+')) => {
            GroupParse::Bad("unknown weather code; expected e.g. -RA, +TSRA, SHSN, BR".into())
        }
        None => GroupParse::No,
    }
}

/// A sky statement: a cloud layer or a "no cloud" code.
pub(super) enum SkyGroup {
    /// `NSC`, `NCD`, `SKC`, `CLR`.
    Clear(SkyClear),
    /// `FEW030`, `BKN012CB`, `VV002`, `///015`.
    Layer(CloudLayer),
}

/// A cloud group: a layer or a "no cloud" code.
pub(super) fn cloud(tok: &str) -> GroupParse<SkyGroup> {
    let clear = match tok {
        "NSC" => Some(SkyClear::Nsc),
        "NCD" => Some(SkyClear::Ncd),
        "SKC" => Some(SkyClear::Skc),
        "CLR" => Some(SkyClear::Clr),
        _ => None,
    };
    if let Some(c) = clear {
        return GroupParse::Ok(SkyGroup::Clear(c), 1);
    }
    let (cover, rest) = if let Some(r) = tok.strip_prefix("VV") {
        (Cover::VerticalVisibility, r)
    } else if let Some(r) = tok.strip_prefix("FEW") {
        (Cover::Few, r)
    } else if let Some(r) = tok.strip_prefix("SCT") {
        (Cover::Scattered, r)
    } else if let Some(r) = tok.strip_prefix("BKN") {
        (Cover::Broken, r)
    } else if let Some(r) = tok.strip_prefix("OVC") {
        (Cover::Overcast, r)
    } else if tok.len() >= 6 && tok.starts_with("///") {
        (Cover::Unknown, tok.get(3..).unwrap_or(""))
    } else {
        return GroupParse::No;
    };
    let (height, kind) = (rest.get(..3).unwrap_or(""), rest.get(3..).unwrap_or(""));
    let base_ft = if height == "///" {
        None
    } else if height.len() == 3 && all_digits(height) {
        Some(f64::from(num(height).unwrap_or(0)) * 100.0)
    } else {
        return GroupParse::Bad(
            "expected 3 digits of height in hundreds of feet (or ///), e.g. BKN012".into(),
        );
    };
    let convective = match kind {
        "" => None,
        "CB" => Some(Convective::Cb),
        "TCU" => Some(Convective::Tcu),
        "///" => Some(Convective::Unknown),
        _ => {
            return GroupParse::Bad(format!(
                "cloud type '{kind}' not understood; expected CB or TCU"
            ));
        }
    };
    if cover == Cover::VerticalVisibility && convective.is_some() {
        return GroupParse::Bad("a vertical visibility (VV) carries no cloud type".into());
    }
    GroupParse::Ok(
        SkyGroup::Layer(CloudLayer {
            cover,
            base_ft,
            convective,
        }),
        1,
    )
}

/// A wind in plain words (`wind from 270° true at 15 kt, gusting 25 kt`).
pub(super) fn describe_wind(w: &Wind) -> String {
    if w.is_calm() {
        return "wind calm".into();
    }
    let dir = match w.direction_deg {
        Some(d) => format!("from {d:03.0}° true"),
        None => "variable in direction".into(),
    };
    // As reported, with knots beside a metric unit.
    let speed = |kt: f64| match w.unit {
        Some(SpeedUnit::Mps) => {
            format!("{} m/s ({:.1} kt)", fmt_num((kt * MPS_PER_KT).round()), kt)
        }
        Some(SpeedUnit::Kmh) => {
            format!("{} km/h ({:.1} kt)", fmt_num((kt * KMH_PER_KT).round()), kt)
        }
        _ => format!("{} kt", fmt_num(kt)),
    };
    let mut s = format!(
        "wind {dir} at {}{}",
        bound_word(w.speed_bound),
        speed(w.speed_kt)
    );
    if let Some(gk) = w.gust_kt {
        s.push_str(&format!(", gusting {}", speed(gk)));
    }
    s
}

/// A prevailing visibility in plain words.
pub(super) fn describe_visibility(v: &Visibility) -> String {
    let b = bound_word(v.bound);
    let mut s = match v.reported_sm {
        Some(sm) => format!(
            "visibility {b}{} SM ({b}{:.0} m)",
            fmt_num(sm),
            v.prevailing_m
        ),
        None if v.bound == Bound::AtLeast => "visibility 10 km or more".into(),
        None if v.bound == Bound::LessThan => "visibility less than 50 m".into(),
        None => format!(
            "visibility {:.0} m ({} SM)",
            v.prevailing_m,
            fmt_num((v.prevailing_sm() * 100.0).round() / 100.0)
        ),
    };
    if v.no_directional_variation {
        s.push_str(", no directional variation available");
    }
    s
}

/// A cloud layer in plain words.
pub(super) fn describe_cloud(c: &CloudLayer) -> String {
    let cover = match c.cover {
        Cover::Few => "few clouds (1-2 oktas)",
        Cover::Scattered => "scattered clouds (3-4 oktas)",
        Cover::Broken => "broken clouds (5-7 oktas)",
        Cover::Overcast => "overcast (8 oktas)",
        Cover::VerticalVisibility => "sky obscured, vertical visibility",
        Cover::Unknown => "cloud of unknown amount",
    };
    let base = match c.base_ft {
        Some(ft) if c.cover == Cover::VerticalVisibility => format!(" {ft:.0} ft"),
        Some(ft) => format!(" at {ft:.0} ft"),
        None => " at unknown height".into(),
    };
    let kind = match c.convective {
        Some(Convective::Cb) => ", cumulonimbus",
        Some(Convective::Tcu) => ", towering cumulus",
        Some(Convective::Unknown) => ", cloud type not observable",
        None => "",
    };
    format!("{cover}{base}{kind}")
}

/// A "no cloud" code in plain words.
pub(super) fn describe_sky_clear(c: SkyClear) -> &'static str {
    match c {
        SkyClear::Nsc => "no significant cloud",
        SkyClear::Ncd => "no cloud detected (automatic)",
        SkyClear::Skc => "sky clear",
        SkyClear::Clr => "no cloud below 12,000 ft (automatic)",
    }
}

impl<T> GroupParse<T> {
    /// Whether the token was read cleanly.
    pub(super) fn is_ok(&self) -> bool {
        matches!(self, GroupParse::Ok(..))
    }
}

/// Reports and forecasts normalised for decoding: one space between groups, upper case,
/// and each group's byte span in the normalised text.
pub(super) fn normalise<'s>(
    groups: impl Iterator<Item = &'s str>,
) -> (String, Vec<(usize, usize)>) {
    let mut norm = String::new();
    let mut spans: Vec<(usize, usize)> = Vec::with_capacity(32);
    for tok in groups.filter(|t| !t.is_empty()) {
        if !norm.is_empty() {
            norm.push(' ');
        }
        let start = norm.len();
        for ch in tok.chars() {
            norm.push(ch.to_ascii_uppercase());
        }
        spans.push((start, norm.len()));
    }
    (norm, spans)
}

/// A normalised report's groups: the text and each group's byte span in it, as
/// [`normalise`] makes them. What the METAR and TAF decoders ask of their input.
#[derive(Debug, Clone, Copy)]
pub(super) struct Tokens<'a> {
    /// The normalised text.
    pub text: &'a str,
    /// Byte (start, end) of each group.
    pub spans: &'a [(usize, usize)],
}

impl<'a> Tokens<'a> {
    /// How many groups.
    pub fn len(self) -> usize {
        self.spans.len()
    }

    /// The text of group `i` ("" past the end).
    pub fn tok(self, i: usize) -> &'a str {
        self.spans
            .get(i)
            .and_then(|&(s, e)| self.text.get(s..e))
            .unwrap_or("")
    }

    /// Byte start of group `i` (the text's end past the last).
    pub fn start(self, i: usize) -> usize {
        self.spans.get(i).map_or(self.text.len(), |&(s, _)| s)
    }

    /// Byte end of group `i` (the text's end past the last).
    pub fn end(self, i: usize) -> usize {
        self.spans.get(i).map_or(self.text.len(), |&(_, e)| e)
    }

    /// 1-based character column of group `i`.
    pub fn column(self, i: usize) -> usize {
        let s = self.start(i);
        self.text.get(..s).map_or(s, |p| p.chars().count()) + 1
    }

    /// Byte start and length of the `ntok` groups from `i`, taken as one.
    pub fn span(self, i: usize, ntok: usize) -> (usize, usize) {
        let start = self.start(i);
        let end = self.end(i + ntok.saturating_sub(1));
        (start, end.saturating_sub(start))
    }

    /// Group `i` quoted for a message, and its column.
    pub fn quoted(self, i: usize) -> (String, usize) {
        (quote(self.tok(i)), self.column(i))
    }

    /// Group `i`, not understood for `reason`.
    pub fn not_understood(self, i: usize, reason: impl Into<String>) -> super::NotUnderstood {
        let (group, column) = self.quoted(i);
        super::NotUnderstood {
            group,
            column,
            reason: reason.into(),
        }
    }
}
