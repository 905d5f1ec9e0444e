//! Our TAF decoder against a general-purpose reference decoder from PyPI
//! (`metar-taf-parser-mivek`, pinned in scripts/requirements-taf.txt), which decoded the
//! fictional corpus fixtures/taf/corpus.txt into fixtures/taf/reference.json via
//! scripts/taf_reference.py. Compared field by field: station, issue time, validity,
//! base and change-group wind, visibility, cloud, weather, CAVOK, wind shear, TX/TN.
//! Where the two disagree, the standard decides; each accepted disagreement names the
//! rule (WMO No. 306 FM 51 / FM 15 regulation, or FAA practice) that makes ours right.

use chrono::{Datelike, TimeZone, Timelike, Utc};
use rhoboard::observation::taf::{self, ChangeKind, Conditions, Extreme, Taf};
use rhoboard::observation::{Bound, Convective, Cover};
use serde_json::Value;

const CORPUS: &str = include_str!("../fixtures/taf/corpus.txt");
const REFERENCE: &str = include_str!("../fixtures/taf/reference.json");

/// The rule that decides each kind of disagreement we accept.
fn rule(kind: &str) -> Option<&'static str> {
    Some(match kind {
        "nil" => {
            "WMO No. 306 FM 51, the NIL rule (from memory): NIL after the issue time means a \
             missing forecast; the reference fails to parse it, ours reports NIL"
        }
        "cnl" => {
            "ICAO Annex 3 Appendix 5 and WMO No. 306 FM 51, cancellation (from memory): CNL cancels the forecast; ours \
             marks it cancelled and unusable"
        }
        "vv_cover" => {
            "WMO No. 306 FM 15/51 cloud group rules (from memory): VVhhh is a vertical visibility (sky obscured), not a \
             layer amount; the reference keeps it apart from the layers, ours as a VV layer"
        }
        "sky_clear_layer" => {
            "WMO No. 306 FM 51 cloud group rules and FAA practice (from memory): NSC and SKC state that there is no cloud; \
             the reference lists them as a layer without height, ours as a sky statement"
        }
        "wind_above_99kt" => {
            "WMO No. 306 FM 15/51 wind group rules (from memory): a speed of 100 kt or more is coded \
             P99KT (P49MPS); the reference does not read the P form and drops the wind, \
             ours reads it as at least 99 kt"
        }
        "vicinity_weather" => {
            "WMO No. 306 FM 15/51 weather group rules and FAA practice (from memory): VC with SH, TS, FG, etc. \
             is that weather in the vicinity (within 8 km, not at the aerodrome) and is \
             forecast in TAFs (US practice: VCSH, VCTS); the reference drops VCSH"
        }
        "mps" => {
            "WMO No. 306 FM 15/51 wind group rules: MPS is metres per second; both convert to knots, the \
             rounding of the conversion may differ in the first decimal"
        }
        _ => return None,
    })
}

fn corpus() -> Vec<String> {
    taf::split_tafs(CORPUS)
        .into_iter()
        .map(|(_, t)| t)
        .collect()
}

fn decode(text: &str) -> Taf {
    // The corpus is dated July 2026; resolve near each TAF's own issue day.
    let day: u32 = text
        .split_whitespace()
        .find(|w| w.len() == 7 && w.ends_with('Z'))
        .and_then(|w| w.get(..2)?.parse().ok())
        .unwrap_or(14);
    taf::decode(
        text,
        Utc.with_ymd_and_hms(2026, 7, day.clamp(1, 31), 12, 0, 0)
            .unwrap(),
    )
}

fn cover_name(c: Cover) -> &'static str {
    match c {
        Cover::Few => "FEW",
        Cover::Scattered => "SCT",
        Cover::Broken => "BKN",
        Cover::Overcast => "OVC",
        Cover::VerticalVisibility => "VV",
        Cover::Unknown => "UNKNOWN",
    }
}

/// The reference's visibility text ("P6", ">10000", "1 1/2", "4000") as (value, bound).
fn ref_visibility(v: &Value) -> Option<(f64, Bound, bool)> {
    let d = v["distance"].as_str()?;
    let sm = v["unit"].as_str()? == "SM";
    let (bound, rest) = if let Some(r) = d.strip_prefix('P').or(d.strip_prefix('>')) {
        (Bound::AtLeast, r)
    } else if let Some(r) = d.strip_prefix('M').or(d.strip_prefix('<')) {
        (Bound::LessThan, r)
    } else {
        (Bound::Exact, d)
    };
    let rest = rest.trim_end_matches("km").trim_end_matches("SM");
    let mut value = 0.0;
    for part in rest.split_whitespace() {
        value += match part.split_once('/') {
            Some((n, d)) => n.parse::<f64>().ok()? / d.parse::<f64>().ok()?,
            None => part.parse::<f64>().ok()?,
        };
    }
    Some((value, bound, sm))
}

fn compare_part(ours: &Conditions, theirs: &Value, at: &str, out: &mut Vec<(String, String)>) {
    let mut diff = |kind: &str, what: String| out.push((kind.to_string(), format!("{at}: {what}")));
    // Wind.
    match (&ours.wind, theirs["wind"].is_null()) {
        (None, true) => {}
        (Some(w), false) => {
            let tw = &theirs["wind"];
            let dir = tw["direction_deg"].as_f64();
            if w.direction_deg != dir {
                diff(
                    "wind",
                    format!("direction ours {:?} theirs {dir:?}", w.direction_deg),
                );
            }
            let kind = if tw["unit"] == "MPS" { "mps" } else { "wind" };
            let ts = tw["speed_kt"].as_f64().unwrap_or(-1.0);
            let tol = if kind == "mps" { 0.15 } else { 1e-6 };
            if (w.speed_kt - ts).abs() > tol && (w.speed_kt.round() - ts).abs() > tol {
                diff(kind, format!("speed ours {} theirs {ts}", w.speed_kt));
            }
            let tg = tw["gust_kt"].as_f64();
            if w.gust_kt.map(|g| (g * 10.0).round()) != tg.map(|g| (g * 10.0).round())
                && (w.gust_kt.zip(tg)).is_none_or(|(a, b)| (a - b).abs() > tol)
            {
                diff(kind, format!("gust ours {:?} theirs {tg:?}", w.gust_kt));
            }
        }
        (Some(w), true) if w.speed_bound == Bound::AtLeast => {
            diff(
                "wind_above_99kt",
                format!("ours at least {} kt, theirs none", w.speed_kt),
            );
        }
        (w, _) => diff("wind", format!("ours {w:?} theirs {}", theirs["wind"])),
    }
    // CAVOK and visibility.
    if ours.cavok != theirs["cavok"].as_bool().unwrap_or(false) {
        diff(
            "cavok",
            format!("ours {} theirs {}", ours.cavok, theirs["cavok"]),
        );
    }
    if !ours.cavok {
        match (&ours.visibility, ref_visibility(&theirs["visibility"])) {
            (None, None) => {}
            (Some(v), Some((tv, tb, sm))) => {
                let ov = if sm {
                    v.reported_sm.unwrap_or(-1.0)
                } else {
                    v.prevailing_m
                };
                // Our 9999 is "10 km or more" (10,000 m, at least); theirs "> 10000".
                let same = (ov - tv).abs() < 1e-6 || (v.bound == Bound::AtLeast && tv == 10_000.0);
                // Our 0000 is "less than 50 m"; theirs 0.
                let zero = v.bound == Bound::LessThan && !sm && tv == 0.0;
                if !(same || zero)
                    || (v.bound != tb
                        && !zero
                        && !(tb == Bound::AtLeast && v.bound == Bound::AtLeast))
                {
                    diff(
                        "visibility",
                        format!("ours {ov} {:?} theirs {tv} {tb:?}", v.bound),
                    );
                }
            }
            (v, t) => diff("visibility", format!("ours {v:?} theirs {t:?}")),
        }
    }
    // Weather.
    let ow: Vec<String> = ours.weather.iter().map(|w| w.code()).collect();
    let tw: Vec<String> = theirs["weather"]
        .as_array()
        .map(|a| {
            a.iter()
                .filter_map(|x| x.as_str().map(String::from))
                .collect()
        })
        .unwrap_or_default();
    if ow != tw {
        let without_vc: Vec<String> = ow
            .iter()
            .filter(|c| !c.starts_with("VC"))
            .cloned()
            .collect();
        let kind = if without_vc == tw {
            "vicinity_weather"
        } else {
            "weather"
        };
        diff(kind, format!("ours {ow:?} theirs {tw:?}"));
    }
    // Clouds (VV layers kept apart by the reference).
    let ours_layers: Vec<(String, Option<f64>, Option<&str>)> = ours
        .clouds
        .iter()
        .map(|c| {
            (
                cover_name(c.cover).to_string(),
                c.base_ft,
                c.convective.map(|k| match k {
                    Convective::Cb => "CB",
                    Convective::Tcu => "TCU",
                    Convective::Unknown => "///",
                }),
            )
        })
        .collect();
    let mut theirs_layers: Vec<(String, Option<f64>, Option<&str>)> = Vec::new();
    let mut their_clear = false;
    for c in theirs["clouds"].as_array().into_iter().flatten() {
        let cover = c["cover"].as_str().unwrap_or("?").to_string();
        if matches!(cover.as_str(), "SKC" | "NSC") && c["base_ft"].is_null() {
            their_clear = true;
            continue;
        }
        theirs_layers.push((cover, c["base_ft"].as_f64(), c["convective"].as_str()));
    }
    if let Some(vv) = theirs["vertical_visibility_ft"].as_f64() {
        theirs_layers.insert(0, ("VV".to_string(), Some(vv), None));
        if ours_layers.first().is_some_and(|l| l.0 == "VV") {
            diff("vv_cover", "VV kept apart from the layers".into());
        }
    }
    if their_clear {
        diff("sky_clear_layer", "NSC/SKC listed as a layer".into());
        if ours.sky_clear.is_none() {
            diff("clouds", "theirs NSC/SKC, ours no sky statement".into());
        }
    }
    if ours_layers != theirs_layers {
        diff(
            "clouds",
            format!("ours {ours_layers:?} theirs {theirs_layers:?}"),
        );
    }
    // Wind shear.
    let ows = ours
        .wind_shear
        .map(|w| (w.height_ft, w.direction_deg, w.speed_kt));
    let tws = theirs["wind_shear"].as_object().map(|w| {
        (
            w["height_ft"].as_f64().unwrap_or(-1.0),
            w["direction_deg"].as_f64().unwrap_or(-1.0),
            w["speed_kt"].as_f64().unwrap_or(-1.0),
        )
    });
    if ows != tws {
        diff("wind_shear", format!("ours {ows:?} theirs {tws:?}"));
    }
}

fn compare(ours: &Taf, theirs: &Value) -> Vec<(String, String)> {
    let mut out = Vec::new();
    let label = ours.station.clone();
    if let Some(e) = theirs["error"].as_str() {
        if ours.nil {
            out.push(("nil".into(), format!("{label}: reference failed ({e})")));
        } else {
            out.push(("reference_error".into(), format!("{label}: {e}")));
        }
        return out;
    }
    if ours.cancelled {
        out.push(("cnl".into(), label));
        return out;
    }
    let mut diff = |k: &str, w: String| out.push((k.to_string(), format!("{label}: {w}")));
    if ours.station != theirs["station"].as_str().unwrap_or("") {
        diff("station", format!("theirs {}", theirs["station"]));
    }
    let issued = ours
        .issued_at
        .map(|t| (t.day(), format!("{:02}:{:02}", t.hour(), t.minute())));
    let t_issued = theirs["day"]
        .as_u64()
        .map(|d| (d as u32, theirs["time"].as_str().unwrap_or("").to_string()));
    if issued != t_issued {
        diff("issue", format!("ours {issued:?} theirs {t_issued:?}"));
    }
    let v = &theirs["validity"];
    let hours = |t: chrono::DateTime<Utc>, end: bool| {
        // Hour 24 of day D is 00 of D+1: compare as the standard writes it.
        if end && t.hour() == 0 {
            let prev = t - chrono::Duration::days(1);
            (prev.day(), 24)
        } else {
            (t.day(), t.hour())
        }
    };
    // Day and hour as written; hour 24 of day D is 00:00 of the day after D.
    let same = |t: chrono::DateTime<Utc>, d: u64, h: u64| {
        (u64::from(t.day()) == d && u64::from(t.hour()) == h)
            || (h == 24 && t.hour() == 0 && u64::from((t - chrono::Duration::days(1)).day()) == d)
    };
    let field = |k: &str| v[k].as_u64().unwrap_or(99);
    let validity_ok = match (ours.valid_from, ours.valid_to) {
        (Some(a), Some(b)) => {
            same(a, field("start_day"), field("start_hour"))
                && same(b, field("end_day"), field("end_hour"))
        }
        _ => false,
    };
    if !validity_ok {
        diff(
            "validity",
            format!("ours {:?}-{:?} theirs {v}", ours.valid_from, ours.valid_to),
        );
    }
    let mut parts = Vec::new();
    compare_part(
        &ours.base,
        &theirs["base"],
        &format!("{label} base"),
        &mut parts,
    );
    let empty = Vec::new();
    let changes = theirs["changes"].as_array().unwrap_or(&empty);
    if changes.len() != ours.changes.len() {
        parts.push((
            "changes".into(),
            format!(
                "{label}: {} changes, theirs {}",
                ours.changes.len(),
                changes.len()
            ),
        ));
    }
    for (c, tc) in ours.changes.iter().zip(changes) {
        let (kind, prob) = match c.kind {
            ChangeKind::From => ("FM", None),
            ChangeKind::Becoming => ("BECMG", None),
            ChangeKind::Tempo => ("TEMPO", None),
            ChangeKind::Probability { percent } => ("PROB", Some(u64::from(percent))),
            ChangeKind::ProbabilityTempo { percent } => ("TEMPO", Some(u64::from(percent))),
        };
        let tk = tc["kind"].as_str().unwrap_or("");
        let tp = tc["probability"].as_u64();
        if kind != tk || prob != tp {
            parts.push((
                "change_kind".into(),
                format!("{label} {}: theirs {tk} {tp:?}", c.label),
            ));
        }
        let tv = &tc["validity"];
        if c.from.day() as u64 != tv["start_day"].as_u64().unwrap_or(99)
            || c.from.hour() as u64 != tv["start_hour"].as_u64().unwrap_or(99)
        {
            parts.push((
                "change_time".into(),
                format!("{label} {}: theirs {tv}", c.label),
            ));
        }
        compare_part(
            &c.conditions,
            tc,
            &format!("{label} {}", c.label),
            &mut parts,
        );
    }
    out.extend(parts);
    for (extreme, key) in [
        (Extreme::Max, "max_temperature"),
        (Extreme::Min, "min_temperature"),
    ] {
        let o = ours
            .temperatures
            .iter()
            .find(|p| p.extreme == extreme)
            .map(|p| {
                let (d, h) = hours(p.at, true);
                (p.temperature_c, d, h)
            });
        let t = theirs[key].as_object().map(|x| {
            (
                x["temperature_c"].as_f64().unwrap_or(-99.0),
                x["day"].as_u64().unwrap_or(0) as u32,
                x["hour"].as_u64().unwrap_or(0) as u32,
            )
        });
        if o != t {
            out.push((
                "temperature".into(),
                format!("{label} {key}: ours {o:?} theirs {t:?}"),
            ));
        }
    }
    out
}

#[test]
fn the_corpus_has_at_least_50_fictional_tafs() {
    let c = corpus();
    assert!(c.len() >= 50, "{}", c.len());
    for t in &c {
        let station = t
            .split_whitespace()
            .find(|w| w.len() == 4 && *w != "TAF" && w != &"AMD" && w != &"COR")
            .unwrap_or("");
        assert!(station.starts_with('X'), "{t}");
    }
}

#[test]
fn matches_the_reference_decoder_field_by_field() {
    let reference: Value = serde_json::from_str(REFERENCE).unwrap();
    let tafs = reference["tafs"].as_array().unwrap();
    let texts = corpus();
    assert_eq!(
        tafs.len(),
        texts.len(),
        "regenerate with scripts/taf_reference.py"
    );
    let mut unexplained = Vec::new();
    let mut explained = std::collections::BTreeMap::<String, usize>::new();
    let mut fields = 0usize;
    for (text, theirs) in texts.iter().zip(tafs) {
        assert_eq!(
            theirs["text"]
                .as_str()
                .unwrap()
                .split_whitespace()
                .collect::<Vec<_>>(),
            text.split_whitespace().collect::<Vec<_>>()
        );
        let ours = decode(text);
        assert!(
            ours.usable() || ours.nil || ours.cancelled,
            "{text}: {:?}",
            ours.errors
        );
        assert!(
            ours.not_understood.is_empty(),
            "{text}: {:?}",
            ours.not_understood
        );
        fields += 1 + ours.changes.len();
        for (kind, what) in compare(&ours, theirs) {
            match rule(&kind) {
                Some(_) => *explained.entry(kind).or_default() += 1,
                None => unexplained.push(format!("[{kind}] {what}")),
            }
        }
    }
    for (kind, n) in &explained {
        println!("{n} × {kind}: {}", rule(kind).unwrap_or(""));
    }
    assert!(fields > 150, "{fields}");
    assert!(
        unexplained.is_empty(),
        "{} disagreements:\n{}",
        unexplained.len(),
        unexplained.join("\n")
    );
}
