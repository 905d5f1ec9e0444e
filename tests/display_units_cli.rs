//! `check`, `report` and `leg set` for an operator whose display units are ft, lb, inHg
//! and °F: a copy of the demo (`rhoboard init`) with operator.json's `display_units`
//! changed. The figures are checked against the SI values of the same run's `--json`
//! (or the metric copy's text), converted here with the published factors:
//! 1 lb = 0.453 592 37 kg and 1 ft = 0.3048 m exactly (NIST SP 811, appendix B);
//! 1 inHg = 33.8639 hPa (NIST SP 811); °F = °C × 9/5 + 32 (NIST SP 811, appendix B).

use std::path::{Path, PathBuf};
use std::process::Command;

use serde_json::Value;

/// kg in one lb (NIST SP 811, appendix B: exact).
const KG_PER_LB: f64 = 0.453_592_37;
/// m in one ft (NIST SP 811, appendix B: exact).
const M_PER_FT: f64 = 0.3048;
/// hPa in one inHg (NIST SP 811, appendix B).
const HPA_PER_INHG: f64 = 33.8639;

fn f_of_c(c: f64) -> f64 {
    c * 9.0 / 5.0 + 32.0
}

fn f_diff(dc: f64) -> f64 {
    dc * 9.0 / 5.0
}

fn rhoboard(home: &Path, args: &[&str]) -> (i32, String, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", home)
        .env("HOME", home)
        .output()
        .unwrap();
    (
        o.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&o.stdout).into_owned(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

/// Two copies of the demo: as written (metric) and in ft, lb, inHg and °F.
struct Folders {
    _dir: tempfile::TempDir,
    home: PathBuf,
    metric: String,
    imperial: String,
}

fn folders() -> Folders {
    let dir = tempfile::tempdir().unwrap();
    let home = dir.path().join("home");
    let metric = dir.path().join("metric");
    let imperial = dir.path().join("imperial");
    for d in [&metric, &imperial] {
        let (code, _, err) = rhoboard(&home, &["init", d.to_str().unwrap()]);
        assert_eq!(code, 0, "{err}");
    }
    let path = imperial.join("operator.json");
    let mut op: Value = serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    op["display_units"] = serde_json::json!({
        "distance": "ft", "mass": "lb", "pressure": "inHg", "temperature": "F"
    });
    std::fs::write(&path, serde_json::to_string_pretty(&op).unwrap()).unwrap();
    Folders {
        metric: metric.to_str().unwrap().to_string(),
        imperial: imperial.to_str().unwrap().to_string(),
        home,
        _dir: dir,
    }
}

/// No kg, hPa, °C, m or mm left (fuel stays in L, altitudes in ft, wind in kt).
fn assert_no_metric(text: &str) {
    for unit in ["hPa", "°C"] {
        assert!(!text.contains(unit), "'{unit}' in:\n{text}");
    }
    // kg as a word (not in the style sheet's "background").
    for (i, _) in text.match_indices("kg") {
        let before = text[..i].chars().next_back();
        let after = text[i + 2..].chars().next();
        assert!(
            before.is_some_and(char::is_alphabetic) || after.is_some_and(char::is_alphabetic),
            "'kg' in:\n{text}"
        );
    }
    let chars: Vec<char> = text.chars().collect();
    for (i, w) in chars.windows(3).enumerate() {
        if w[0].is_ascii_digit() && w[1] == ' ' && w[2] == 'm' {
            let after: String = chars[i + 3..].iter().take(1).collect();
            let word_ends = after.chars().next().is_none_or(|c| !c.is_alphabetic());
            let mm = after == "m" && chars.get(i + 4).is_none_or(|c: &char| !c.is_alphabetic());
            assert!(
                !(word_ends || mm),
                "a metric distance at '{}' in:\n{text}",
                chars[i.saturating_sub(20)..(i + 10).min(chars.len())]
                    .iter()
                    .collect::<String>()
            );
        }
    }
}

/// `+4.2°F`, `≥+41.4°F`, `≤-69.7°F` from a headroom in °C and its table-end flag.
fn headroom_f(h_c: f64, table_ends: bool) -> String {
    let mark = match (table_ends, h_c >= 0.0) {
        (false, _) => "",
        (true, true) => "≥",
        (true, false) => "≤",
    };
    // Rounded down to a tenth: less room, more cooling (the safe side of either).
    let f = (f_diff(h_c) * 10.0 + 1e-6).floor() / 10.0 + 0.0;
    format!("{mark}{f:+.1}°F")
}

/// Every distance check of `check --json` that is below, as `needs N ft, M ft
/// available`: its own metres (not the whole metres of the metric sentence) in ft, so
/// the reason and the chain give the same figure.
fn distances_in_ft(json: &Value) -> Vec<String> {
    let mut out = Vec::new();
    for leg in json["legs"].as_array().unwrap() {
        for side in ["departure", "arrival"] {
            for phase in ["takeoff", "landing"] {
                let Some(checks) = leg[side][phase]["checks"].as_array() else {
                    continue;
                };
                for c in checks.iter().filter(|c| c["state"] == "below") {
                    let ft = |k: &str| c[k].as_f64().unwrap() / M_PER_FT;
                    out.push(format!(
                        "needs {:.0} ft, {:.0} ft available",
                        ft("required_m"),
                        ft("available_m")
                    ));
                }
            }
        }
    }
    out
}

#[test]
fn the_factors_are_the_published_ones() {
    // The test's own constants against each other: 1 inHg = 25.4 mm of mercury; the
    // standard atmosphere's 1013.25 hPa is 29.92 inHg (ICAO Doc 7488).
    assert!((1013.25 / HPA_PER_INHG - 29.921).abs() < 0.001);
    assert!((1.0 / KG_PER_LB - 2.204_622_6).abs() < 1e-6);
    assert!((1.0 / M_PER_FT - 3.280_84).abs() < 1e-5);
    assert_eq!(f_of_c(100.0), 212.0);
}

#[test]
fn check_prints_the_operator_display_units() {
    let f = folders();
    let at = "2026-06-14T14:00:00Z";
    let args = |d: &str, json: bool| {
        let mut a = vec!["check", "--ops", d, "--at", at, "--pairings"];
        if json {
            a.push("--json");
        }
        a.iter().map(|s| s.to_string()).collect::<Vec<_>>()
    };
    let run = |a: Vec<String>| {
        let a: Vec<&str> = a.iter().map(String::as_str).collect();
        rhoboard(&f.home, &a)
    };
    let (code, text, err) = run(args(&f.imperial, false));
    assert_eq!(code, 1, "{err}");
    let (_, json, _) = run(args(&f.imperial, true));
    let (_, metric, _) = run(args(&f.metric, false));
    let json: Value = serde_json::from_str(&json).unwrap();
    assert_no_metric(&text);
    assert!(text.contains("headroom in °F of warming left"), "{text}");
    // Each leg's headroom, from the JSON's °C.
    let legs = json["legs"].as_array().unwrap();
    assert!(legs.len() > 10);
    for leg in legs {
        let id = leg["id"].as_str().unwrap();
        let row = text
            .lines()
            .find(|l| l.split_whitespace().nth(1) == Some(id))
            .unwrap_or_else(|| panic!("no row for {id}:\n{text}"));
        if let Some(h) = leg["headroom_c"].as_f64() {
            let want = headroom_f(h, leg["headroom_table_ends"].as_bool().unwrap());
            assert!(row.contains(&want), "{id}: want {want} in {row}");
        }
    }
    // The distances of the reasons: the checks' own metres in ft.
    let want = distances_in_ft(&json);
    assert!(!want.is_empty(), "{metric}");
    for w in &want {
        assert!(text.contains(w.as_str()), "want '{w}' in:\n{text}");
    }
    // The pairings' headroom, from the JSON's °C.
    let pairs = json["pairings"].as_array().unwrap();
    let mut checked = 0;
    for p in pairs {
        let (Some(h), Some(reg), Some(field)) = (
            p["headroom_c"].as_f64(),
            p["aircraft"].as_str(),
            p["airfield"].as_str(),
        ) else {
            continue;
        };
        let want = headroom_f(h, p["headroom_table_ends"].as_bool().unwrap());
        let row = text
            .lines()
            .find(|l| {
                let w: Vec<&str> = l.split_whitespace().collect();
                w.first() == Some(&reg) && w.get(1) == Some(&field)
            })
            .unwrap();
        assert!(row.contains(&want), "{reg} {field}: want {want} in {row}");
        checked += 1;
    }
    assert!(checked >= 5, "{checked}");
    // The metric demo keeps its units.
    assert!(metric.contains("headroom in °C of warming left"));
    assert!(metric.contains("°C") && !metric.contains("°F"));
}

/// The OAT of a METAR in °C: the RMK T group's tenths where there is one (FAA AIM
/// 7-1-30, FMH-1 12.7.2), else the body's whole degrees (WMO No. 306, FM 15).
fn metar_oat_c(metar: &str) -> f64 {
    let words: Vec<&str> = metar.split_whitespace().collect();
    if let Some(t) = words
        .iter()
        .find(|w| w.len() == 9 && w.starts_with('T') && w[1..].chars().all(|c| c.is_ascii_digit()))
    {
        let sign = if &t[1..2] == "1" { -1.0 } else { 1.0 };
        return sign * t[2..5].parse::<f64>().unwrap() / 10.0;
    }
    let group = words
        .iter()
        .find(|w| w.contains('/') && w.len() <= 7 && !w.contains("SM"))
        .unwrap();
    let t = group.split('/').next().unwrap();
    match t.strip_prefix('M') {
        Some(t) => -t.parse::<f64>().unwrap(),
        None => t.parse().unwrap(),
    }
}

#[test]
fn report_prints_the_operator_display_units() {
    let f = folders();
    let at = "2026-06-14T14:00:00Z";
    let d = f.imperial.as_str();
    let (code, md, err) = rhoboard(&f.home, &["report", "--ops", d, "--at", at]);
    // Some legs are below at 14Z.
    assert_eq!(code, 1, "{err}");
    let (_, html, _) = rhoboard(
        &f.home,
        &["report", "--ops", d, "--at", at, "--format", "html"],
    );
    let (_, json, _) = rhoboard(&f.home, &["check", "--ops", d, "--at", at, "--json"]);
    let (_, metric, _) = rhoboard(&f.home, &["report", "--ops", &f.metric, "--at", at]);
    let json: Value = serde_json::from_str(&json).unwrap();
    assert_no_metric(&md);
    assert_no_metric(&html);
    let legs = json["legs"].as_array().unwrap();
    let leg = |id: &str| legs.iter().find(|l| l["id"] == id).unwrap();
    // The legs table's headroom.
    for l in legs {
        if let Some(h) = l["headroom_c"].as_f64() {
            let want = headroom_f(h, l["headroom_table_ends"].as_bool().unwrap());
            assert!(md.contains(&format!(" | {want} | ")), "{}: {want}", l["id"]);
            assert!(html.contains(&format!("<td class=\"num\">{want}</td>")));
        }
    }
    // L16's chain: its departure's air, takeoff mass, table figures and checks.
    let l16 = leg("L16");
    let dep = &l16["departure"];
    let oat = dep["oat_c"].as_f64().unwrap();
    let isa = dep["isa_deviation_c"].as_f64().unwrap();
    let to = &dep["takeoff"];
    let ft = |m: &Value| m.as_f64().unwrap() / M_PER_FT;
    let mut want = vec![
        format!(
            "air: OAT {:.1} °F (ISA {:+.1} °F)",
            f_of_c(oat),
            f_diff(isa)
        ),
        format!(
            "takeoff at {:.0} lb: flight-manual table ground roll {:.0} ft, 50 ft distance {:.0} ft",
            to["mass_kg"].as_f64().unwrap() / KG_PER_LB,
            ft(&to["table_ground_roll_m"]),
            ft(&to["table_distance_50ft_m"])
        ),
        format!(
            "result: ground roll {:.0} ft, 50 ft distance {:.0} ft",
            ft(&to["ground_roll_m"]),
            ft(&to["distance_50ft_m"])
        ),
    ];
    for c in to["checks"].as_array().unwrap() {
        want.push(format!(
            "= {:.0} ft required, {:.0} ft available",
            ft(&c["required_m"]),
            ft(&c["available_m"])
        ));
    }
    // L16 is below by warming: the cooling it needs, in °F.
    let h = l16["headroom_c"].as_f64().unwrap();
    assert!(h < 0.0 && l16["headroom_table_ends"] == false);
    // Rounded to a tenth the safe way: more cooling.
    let cooling = -((f_diff(h) * 10.0 + 1e-6).floor() / 10.0);
    want.push(format!(
        "headroom: below now: needs {cooling:.1} °F of cooling"
    ));
    // The reasons' distances: the checks' own metres in ft.
    want.extend(distances_in_ft(&json));
    for w in &want {
        assert!(md.contains(w.as_str()), "want '{w}' in:\n{md}");
        assert!(html.contains(w.as_str()), "want '{w}' in the html");
    }
    // The airfields table's OAT, from each field's latest METAR in the basis.
    let basis: Vec<&str> = md
        .lines()
        .filter(|l| l.trim_start().starts_with("METAR "))
        .collect();
    assert!(basis.len() > 3, "{md}");
    for m in basis {
        let field = m.split_whitespace().nth(1).unwrap();
        let row = md
            .lines()
            .find(|l| l.starts_with(&format!("| {field} ")))
            .unwrap();
        let want = format!("| {:.1} °F |", f_of_c(metar_oat_c(m)));
        assert!(row.contains(&want), "{field}: want {want} in {row}");
    }
    // The metric sheet is as it was.
    assert!(metric.contains(" °C") && !metric.contains("°F") && metric.contains(" kg"));
}

#[test]
fn leg_set_prints_the_operator_display_units() {
    let f = folders();
    let set = |d: &str, leg: &str, at: &str, json: bool| {
        let mut a = vec![
            "leg",
            "set",
            leg,
            "--load",
            "baggage=60kg",
            "--dry-run",
            "--ops",
            d,
            "--at",
            at,
        ];
        if json {
            a.push("--json");
        }
        rhoboard(&f.home, &a)
    };
    // L03 at 08Z with 60 kg of baggage: over the maximum takeoff mass.
    let at = "2026-06-14T08:00:00Z";
    let (code, text, err) = set(&f.imperial, "L03", at, false);
    assert_eq!(code, 1, "{err}");
    let (_, json, _) = set(&f.imperial, "L03", at, true);
    let json: Value = serde_json::from_str(&json).unwrap();
    assert_no_metric(&text);
    let (before, after) = (&json["before"], &json["after"]);
    let h = before["headroom_c"].as_f64().unwrap();
    let want = format!(
        "before: ✓ within XHIG density altitude {}, headroom {}",
        before["limiting_margin"].as_str().unwrap(),
        headroom_f(h, before["headroom_table_ends"].as_bool().unwrap())
    );
    assert!(text.contains(&want), "want '{want}' in:\n{text}");
    // The mass limit in lb, value rounded up and limit down (a maximum), the margin
    // their difference.
    let row = after["departure"]["limits"]
        .as_array()
        .unwrap()
        .iter()
        .find(|l| l["kind"] == "takeoff_mass")
        .unwrap();
    let v_lb = (row["value"].as_f64().unwrap() / KG_PER_LB).ceil();
    let lim_lb = (row["limit"].as_f64().unwrap() / KG_PER_LB).floor();
    assert!(v_lb > lim_lb);
    let margin = lim_lb - v_lb;
    for w in [
        format!("after:  ✗ below XSEA takeoff mass {margin:+.0} lb, headroom —"),
        format!("takeoff mass below — {v_lb:.0} lb against {lim_lb:.0} lb, margin {margin:+.0} lb"),
    ] {
        assert!(text.contains(&w), "want '{w}' in:\n{text}");
    }
    // What must come off, rounded up in lb.
    let p = after["mass_balance"]["payload_headroom_kg"]
        .as_f64()
        .unwrap();
    assert!(p < 0.0);
    let want = format!("payload: remove {:.0} lb at", (-p / KG_PER_LB).ceil());
    assert!(text.contains(&want), "want '{want}' in:\n{text}");

    // L07 with the same baggage: room left, rounded down in lb.
    let (_, text, _) = set(&f.imperial, "L07", at, false);
    let (_, json, _) = set(&f.imperial, "L07", at, true);
    let json: Value = serde_json::from_str(&json).unwrap();
    assert_no_metric(&text);
    let p = json["after"]["mass_balance"]["payload_headroom_kg"]
        .as_f64()
        .unwrap();
    assert!(p > 0.0);
    let want = format!("payload: room for {:.0} lb at", (p / KG_PER_LB).floor());
    assert!(text.contains(&want), "want '{want}' in:\n{text}");

    // L16 at 14Z: below on its takeoff distance, in ft as the metric copy's metres.
    let at = "2026-06-14T14:00:00Z";
    let (_, text, _) = set(&f.imperial, "L16", at, false);
    let (_, metric, _) = set(&f.metric, "L16", at, false);
    let (_, json, _) = set(&f.imperial, "L16", at, true);
    let json: Value = serde_json::from_str(&json).unwrap();
    assert_no_metric(&text);
    let want = distances_in_ft(&serde_json::json!({ "legs": [json["after"]] }));
    assert!(!want.is_empty(), "{metric}");
    for w in &want {
        assert!(text.contains(w.as_str()), "want '{w}' in:\n{text}");
    }
    assert!(
        metric.contains(" kg at ") && metric.contains("°C"),
        "{metric}"
    );
}
