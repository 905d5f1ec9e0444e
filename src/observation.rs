//! Weather observations: METAR/SPECI decoding, observations entered by hand, the
//! per-station store and reading observation files.
//!
//! What this module does not do: it reads no clock (the reference instant is always a
//! parameter), makes no verdicts (those belong to `assess`), and touches the file system
//! only in [`file`]. The decoded [`Report`] carries everything the assessment needs as
//! plain `f64`s with the unit in the name, so nothing is re-parsed downstream.

pub mod file;
pub mod forecast;
mod groups;
pub mod manual;
pub mod metar;
pub mod store;
pub mod taf;

use chrono::{DateTime, Utc};

pub use file::{FileReport, ObservationFile, day_of_file, decode_all, read_reports, split_reports};
pub use manual::{ManualError, ManualInput, WindReference, manual_observation};
pub use metar::{DecodeError, GroupName, decode, describe, resolve_time};
pub use store::{DEFAULT_STALE_AFTER, Insert, Store, Valid};

/// Where a report came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Kind {
    /// A routine METAR.
    Metar,
    /// A special report (SPECI).
    Speci,
    /// Typed in by hand (instructor, tower, windsock); shown tagged as manual.
    Manual,
}

impl Kind {
    /// The word shown for this kind.
    pub const fn word(self) -> &'static str {
        match self {
            Kind::Metar => "METAR",
            Kind::Speci => "SPECI",
            Kind::Manual => "manual",
        }
    }
}

/// How a reported value relates to the true one (`P6SM`, `M1/4SM`, `9999`, `P99KT`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Bound {
    /// The value as reported.
    #[default]
    Exact,
    /// The true value is above the reported one (`P`, or `9999` = 10 km or more).
    AtLeast,
    /// The true value is below the reported one (`M`, or `0000` = less than 50 m).
    LessThan,
}

/// The unit a wind speed was reported in (kept for the readable decode).
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum SpeedUnit {
    /// Knots.
    #[serde(rename = "kt")]
    Kt,
    /// Metres per second.
    #[serde(rename = "m/s")]
    Mps,
    /// Kilometres per hour.
    #[serde(rename = "km/h")]
    Kmh,
}

/// The surface wind. METAR winds are true; a manual wind has already been converted to
/// true with the airfield's variation.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Wind {
    /// Direction the wind blows from, degrees true; `None` when variable (`VRB`).
    pub direction_deg: Option<f64>,
    /// `VRB`: no single direction (assume any direction for limits).
    pub variable: bool,
    /// Mean speed in knots (converted from MPS/KMH where reported so).
    pub speed_kt: f64,
    /// `P` before the speed: above what the code can report.
    pub speed_bound: Bound,
    /// Gust speed in knots.
    pub gust_kt: Option<f64>,
    /// Start of the variable sector (`dddVddd`), degrees true, clockwise to `variable_to_deg`.
    pub variable_from_deg: Option<f64>,
    /// End of the variable sector, degrees true.
    pub variable_to_deg: Option<f64>,
    /// The unit used in the report.
    pub unit: Option<SpeedUnit>,
}

impl Wind {
    /// True for `00000KT`.
    pub fn is_calm(&self) -> bool {
        self.speed_kt == 0.0 && self.gust_kt.is_none()
    }
}

/// Prevailing visibility and the directional minimum.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Visibility {
    /// Prevailing visibility in metres.
    pub prevailing_m: f64,
    /// The value as reported in statute miles, when it was reported so.
    pub reported_sm: Option<f64>,
    /// `P6SM`, `9999`, `M1/4SM`, `0000`.
    pub bound: Bound,
    /// Lowest visibility in one direction (`4000NE`), metres.
    pub minimum_m: Option<f64>,
    /// Direction of that minimum (`N`, `NE`, …; index into [`DIRECTIONS`]).
    pub minimum_direction: Option<u8>,
    /// `NDV`: the automatic station cannot report directional variation.
    pub no_directional_variation: bool,
}

impl Visibility {
    /// Prevailing visibility in statute miles (as reported, else converted; 1 SM = 1,609.344 m).
    pub fn prevailing_sm(&self) -> f64 {
        self.reported_sm
            .unwrap_or(self.prevailing_m / crate::units::M_PER_SM)
    }
}

/// The eight compass points used by directional visibility groups.
pub const DIRECTIONS: [&str; 8] = ["N", "NE", "E", "SE", "S", "SW", "W", "NW"];

/// Runway visual range (`R28L/P1500N`, `R06/0600V1000FT/U`).
#[derive(Debug, Clone, PartialEq)]
pub struct Rvr {
    /// Runway designator as reported (`28L`).
    pub runway: String,
    /// Range in metres (converted from feet where reported so).
    pub range_m: f64,
    /// `P` / `M` before the range.
    pub bound: Bound,
    /// Upper end when variable (`V`), metres.
    pub variable_to_m: Option<f64>,
    /// `P` / `M` before the upper end.
    pub variable_bound: Bound,
    /// Reported in feet (US practice) rather than metres.
    pub in_feet: bool,
    /// Tendency: `U` up, `D` down, `N` no change.
    pub tendency: Option<char>,
}

/// Intensity or proximity of a weather group.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Intensity {
    /// `-`
    Light,
    /// No sign.
    #[default]
    Moderate,
    /// `+`
    Heavy,
    /// `VC`: within 8 km of the aerodrome but not at it.
    Vicinity,
}

/// A present or recent weather group, kept in code form (`+TSRA`, `FZDZ`, `VCSH`).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Weather {
    /// Intensity or `VC`.
    pub intensity: Intensity,
    /// Descriptor code (`MI BC PR DR BL SH TS FZ`), if any.
    pub descriptor: Option<&'static str>,
    /// Phenomenon codes in order (`RA`, `SN`, `BR`, …). `//` (not observed) gives none.
    pub phenomena: Vec<&'static str>,
    /// `//`: present weather not observable by the automatic station.
    pub not_observed: bool,
}

impl Weather {
    /// The group in code form, e.g. `+TSRA`.
    pub fn code(&self) -> String {
        if self.not_observed {
            return "//".to_string();
        }
        let mut s = String::new();
        match self.intensity {
            Intensity::Light => s.push('-'),
            Intensity::Heavy => s.push('+'),
            Intensity::Vicinity => s.push_str("VC"),
            Intensity::Moderate => {}
        }
        if let Some(d) = self.descriptor {
            s.push_str(d);
        }
        for p in &self.phenomena {
            s.push_str(p);
        }
        s
    }

    /// True when any phenomenon is `code`.
    pub fn has(&self, code: &str) -> bool {
        self.phenomena.contains(&code)
    }
}

/// Amount of a cloud layer.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum Cover {
    /// 1–2 oktas.
    #[serde(rename = "FEW")]
    Few,
    /// 3–4 oktas.
    #[serde(rename = "SCT")]
    Scattered,
    /// 5–7 oktas.
    #[serde(rename = "BKN")]
    Broken,
    /// 8 oktas.
    #[serde(rename = "OVC")]
    Overcast,
    /// Sky obscured; the height is the vertical visibility.
    #[serde(rename = "VV")]
    VerticalVisibility,
    /// `///`: amount not observable (automatic station).
    #[serde(rename = "///")]
    Unknown,
}

impl Cover {
    /// The code as reported.
    pub const fn code(self) -> &'static str {
        match self {
            Cover::Few => "FEW",
            Cover::Scattered => "SCT",
            Cover::Broken => "BKN",
            Cover::Overcast => "OVC",
            Cover::VerticalVisibility => "VV",
            Cover::Unknown => "///",
        }
    }

    /// Whether a layer of this amount forms a ceiling (BKN, OVC, VV).
    pub const fn forms_ceiling(self) -> bool {
        matches!(
            self,
            Cover::Broken | Cover::Overcast | Cover::VerticalVisibility
        )
    }
}

/// Convective cloud type on a layer.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum Convective {
    /// Cumulonimbus.
    #[serde(rename = "CB")]
    Cb,
    /// Towering cumulus.
    #[serde(rename = "TCU")]
    Tcu,
    /// `///` after the height: type not observable.
    #[serde(rename = "///")]
    Unknown,
}

/// One cloud layer (`BKN012CB`, `VV002`, `OVC///`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CloudLayer {
    /// Amount.
    pub cover: Cover,
    /// Height of the base above the aerodrome in feet; `None` when `///`.
    pub base_ft: Option<f64>,
    /// CB / TCU.
    pub convective: Option<Convective>,
}

/// A report's sky statement other than layers.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum SkyClear {
    /// `NSC`: no significant cloud.
    #[serde(rename = "NSC")]
    Nsc,
    /// `NCD`: no cloud detected (automatic).
    #[serde(rename = "NCD")]
    Ncd,
    /// `SKC`: sky clear (manual).
    #[serde(rename = "SKC")]
    Skc,
    /// `CLR`: no cloud below 12,000 ft (US automatic).
    #[serde(rename = "CLR")]
    Clr,
}

/// The ceiling: lowest BKN, OVC or VV layer.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub enum Ceiling {
    /// No layer forms a ceiling (CAVOK, sky clear, only FEW/SCT).
    None,
    /// Height of the lowest ceiling layer in feet above the aerodrome.
    Known(f64),
    /// A ceiling layer of unknown height (`BKN///`, `VV///`), an unknown amount, or no
    /// sky information at all. The assessment treats it as `no-data`, never as "no ceiling".
    #[default]
    Unknown,
}

impl Ceiling {
    /// The height in feet when known.
    pub fn known_ft(self) -> Option<f64> {
        match self {
            Ceiling::Known(ft) => Some(ft),
            _ => None,
        }
    }
}

/// Weather hazards the assessment tests against the pilot category's limits.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize)]
pub struct Hazards {
    /// Thunderstorm at or near the field (`TS`, `VCTS`).
    pub thunderstorm: bool,
    /// Cumulonimbus or towering cumulus reported on a layer.
    pub cumulonimbus: bool,
    /// Freezing precipitation (`FZRA`, `FZDZ`, `FZUP`).
    pub freezing_precipitation: bool,
    /// Fog at or near the field (`FG` in any form, `VCFG`).
    pub fog: bool,
    /// Wind shear reported (`WS` group).
    pub wind_shear: bool,
    /// Hail, squall, funnel cloud, sand- or duststorm, volcanic ash.
    pub severe: bool,
}

impl Hazards {
    /// True when any hazard is set.
    pub fn any(&self) -> bool {
        self.thunderstorm
            || self.cumulonimbus
            || self.freezing_precipitation
            || self.fog
            || self.wind_shear
            || self.severe
    }
}

/// Wind shear statement (`WS R27`, `WS ALL RWY`).
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum WindShear {
    /// On one runway (designator as reported).
    Runway(String),
    /// On all runways.
    AllRunways,
}

/// A group the decoder saw but did not understand; kept, not fatal.
#[derive(Debug, Clone, PartialEq, Eq, serde::Serialize)]
pub struct NotUnderstood {
    /// The text of the group.
    pub group: String,
    /// 1-based column of the group in the report.
    pub column: usize,
    /// Why it was not understood.
    pub reason: String,
}

/// The kind of a decoded group, for the group-by-group readable decode.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum GroupKind {
    /// `METAR` / `SPECI`.
    ReportType,
    /// `COR`.
    Correction,
    /// `AUTO`.
    Auto,
    /// `NIL`.
    Nil,
    /// Station identifier.
    Station,
    /// Day-hour-minute.
    Time,
    /// Wind.
    Wind,
    /// Variable wind sector.
    WindSector,
    /// `CAVOK`.
    Cavok,
    /// Prevailing visibility.
    Visibility,
    /// Directional minimum visibility.
    MinimumVisibility,
    /// RVR group number `n`.
    Rvr(u16),
    /// Present weather group number `n`.
    Weather(u16),
    /// Cloud layer number `n`.
    Cloud(u16),
    /// NSC/NCD/SKC/CLR.
    SkyClear,
    /// Temperature and dew point.
    Temperature,
    /// `Q` altimeter.
    AltimeterHpa,
    /// `A` altimeter.
    AltimeterInhg,
    /// Recent weather number `n`.
    Recent(u16),
    /// Wind shear number `n`.
    WindShear(u16),
    /// Trend text.
    Trend,
    /// Remarks.
    Remarks,
    /// The US remark `T` group inside the remarks.
    RemarkTemperature,
}

/// A decoded group's place in the report text.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Group {
    /// What the group is.
    pub kind: GroupKind,
    /// Byte offset of the group in [`Report::text`].
    pub start: usize,
    /// Byte length (several tokens for `1 1/2SM`, `WS ALL RWY`, trend and remarks).
    pub len: usize,
}

/// One observation, decoded from a METAR/SPECI or entered by hand.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Report {
    /// The text as decoded (one line; `=` and surrounding space removed).
    pub text: String,
    /// METAR, SPECI or manual.
    pub kind: Option<Kind>,
    /// Station identifier (empty when missing).
    pub station: String,
    /// The day-hour-minute group as reported (`141250Z`), for messages.
    pub time_text: String,
    /// Observation time, resolved against the reference instant.
    pub observed_at: Option<DateTime<Utc>>,
    /// `AUTO`: fully automatic.
    pub auto: bool,
    /// `COR`: corrects an earlier report of the same station and time.
    pub corrected: bool,
    /// `NIL`: the report is missing.
    pub nil: bool,
    /// Surface wind.
    pub wind: Option<Wind>,
    /// `CAVOK`.
    pub cavok: bool,
    /// Visibility (CAVOK gives 10 km or more).
    pub visibility: Option<Visibility>,
    /// RVR groups.
    pub rvr: Vec<Rvr>,
    /// Present weather.
    pub weather: Vec<Weather>,
    /// Cloud layers, in report order.
    pub clouds: Vec<CloudLayer>,
    /// NSC / NCD / SKC / CLR.
    pub sky_clear: Option<SkyClear>,
    /// Derived ceiling.
    pub ceiling: Ceiling,
    /// Air temperature, °C (tenths from the remark `T` group when present).
    pub temperature_c: Option<f64>,
    /// Dew point, °C (tenths from the remark `T` group when present).
    pub dewpoint_c: Option<f64>,
    /// The temperature came from the remark `T` group (tenths).
    pub temperature_from_remarks: bool,
    /// Manual only: no dew point was typed, so it is taken equal to the temperature
    /// (saturated air, the highest density altitude).
    pub dewpoint_assumed: bool,
    /// Altimeter setting (QNH), hPa (from `Q`, else converted from `A`).
    pub altimeter_hpa: Option<f64>,
    /// Altimeter setting, inHg (from `A`, else converted from `Q`).
    pub altimeter_inhg: Option<f64>,
    /// Recent weather (`RE..`).
    pub recent_weather: Vec<Weather>,
    /// Wind shear statements.
    pub wind_shear: Vec<WindShear>,
    /// Trend (`NOSIG`, `BECMG …`, `TEMPO …`) as text.
    pub trend: Option<String>,
    /// Remarks after `RMK`, as text.
    pub remarks: Option<String>,
    /// Hazards derived from weather, clouds and wind shear.
    pub hazards: Hazards,
    /// Decoded groups in order, for the readable decode.
    pub groups: Vec<Group>,
    /// Optional groups not understood (kept, not fatal).
    pub not_understood: Vec<NotUnderstood>,
    /// Problems that make the report unusable for performance.
    pub errors: Vec<DecodeError>,
}

impl Report {
    /// Whether the assessment may use this report: station, time, wind, temperature,
    /// dew point and altimeter all present and well formed, and not `NIL`.
    pub fn usable_for_performance(&self) -> bool {
        self.errors.is_empty()
            && !self.nil
            && !self.station.is_empty()
            && self.observed_at.is_some()
            && self.wind.is_some()
            && self.temperature_c.is_some()
            && self.dewpoint_c.is_some()
            && self.altimeter_hpa.is_some()
    }

    /// "observation XQAB 141250Z" — the prefix of every message about this report.
    pub fn label(&self) -> String {
        let station = if self.station.is_empty() {
            "(no station)"
        } else {
            self.station.as_str()
        };
        let mut s = format!("observation {station}");
        if !self.time_text.is_empty() {
            s.push(' ');
            s.push_str(&self.time_text);
        }
        if self.kind == Some(Kind::Manual) {
            s.push_str(" (manual)");
        }
        s
    }

    /// Each error as one line a dispatcher understands, prefixed with [`Report::label`].
    pub fn error_lines(&self) -> Vec<String> {
        self.errors
            .iter()
            .map(|e| format!("{}: {e}", self.label()))
            .collect()
    }

    /// The first error as one line, when the report is unusable.
    pub fn rejection(&self) -> Option<String> {
        self.error_lines().into_iter().next()
    }

    /// The text of a decoded group.
    pub fn group_text(&self, group: &Group) -> &str {
        self.text
            .get(group.start..group.start.saturating_add(group.len))
            .unwrap_or("")
    }

    /// Recomputes ceiling and hazards from the decoded fields.
    pub(crate) fn derive(&mut self) {
        self.ceiling = derive_ceiling(self);
        let mut h = Hazards {
            wind_shear: !self.wind_shear.is_empty(),
            cumulonimbus: self
                .clouds
                .iter()
                .any(|c| matches!(c.convective, Some(Convective::Cb | Convective::Tcu))),
            ..Hazards::default()
        };
        for w in &self.weather {
            if w.descriptor == Some("TS") {
                h.thunderstorm = true;
            }
            if w.descriptor == Some("FZ") && (w.has("RA") || w.has("DZ") || w.has("UP")) {
                h.freezing_precipitation = true;
            }
            if w.has("FG") {
                h.fog = true;
            }
            if ["GR", "SQ", "FC", "SS", "DS", "VA"]
                .iter()
                .any(|c| w.has(c))
            {
                h.severe = true;
            }
        }
        self.hazards = h;
    }
}

fn derive_ceiling(r: &Report) -> Ceiling {
    if r.cavok {
        return Ceiling::None;
    }
    let mut lowest: Option<f64> = None;
    for layer in &r.clouds {
        if layer.cover == Cover::Unknown || (layer.cover.forms_ceiling() && layer.base_ft.is_none())
        {
            // An unknown amount or an unknown height could hide a ceiling at any height.
            return Ceiling::Unknown;
        }
        if layer.cover.forms_ceiling()
            && let Some(ft) = layer.base_ft
        {
            lowest = Some(lowest.map_or(ft, |l: f64| l.min(ft)));
        }
    }
    match lowest {
        Some(ft) => Ceiling::Known(ft),
        None if r.clouds.is_empty() && r.sky_clear.is_none() => Ceiling::Unknown,
        None => Ceiling::None,
    }
}
