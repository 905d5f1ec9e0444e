//! `rhoboard check` on the built-in demo day, through the binary: the states a chief
//! instructor would expect over the day, exit codes, and snapshots of `--json` at three
//! times (numbers rounded to 4 decimals so the snapshots do not hang on the last float
//! digit).

use std::process::Command;

use serde_json::Value;

/// Runs the binary with an empty config dir, so the built-in demo is used.
fn rhoboard(args: &[&str]) -> (i32, String, String) {
    let config = std::env::temp_dir().join(format!("rhoboard-test-config-{}", std::process::id()));
    let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", &config)
        .env("HOME", &config)
        .output()
        .expect("runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn round(v: &mut Value) {
    match v {
        Value::Number(n) => {
            if let Some(f) = n.as_f64()
                && !n.is_i64()
                && !n.is_u64()
            {
                let r = (f * 1e4).round() / 1e4;
                *v = serde_json::json!(r);
            }
        }
        Value::Array(a) => a.iter_mut().for_each(round),
        Value::Object(o) => o.values_mut().for_each(round),
        _ => {}
    }
}

fn check_json(at: &str) -> Value {
    let (code, stdout, stderr) = rhoboard(&["check", "--json", "--at", at]);
    assert!(code == 0 || code == 1, "{stderr}");
    let v: Value = serde_json::from_str(&stdout).expect("JSON");
    // Exit status 1 exactly when some leg is below or no-data.
    let bad = v["legs"]
        .as_array()
        .unwrap()
        .iter()
        .any(|l| l["state"] == "below" || l["state"] == "no-data");
    assert_eq!(code == 1, bad);
    v
}

fn states(v: &Value) -> Vec<(String, String)> {
    v["legs"]
        .as_array()
        .unwrap()
        .iter()
        .map(|l| {
            (
                l["id"].as_str().unwrap().to_string(),
                l["state"].as_str().unwrap().to_string(),
            )
        })
        .collect()
}

#[test]
fn demo_day_morning_midday_afternoon() {
    let morning = check_json("2026-06-14T08:00:00Z");
    let midday = check_json("2026-06-14T11:00:00Z");
    let afternoon = check_json("2026-06-14T14:00:00Z");
    for (name, v) in [
        ("morning", &morning),
        ("midday", &midday),
        ("afternoon", &afternoon),
    ] {
        let mut v = v.clone();
        round(&mut v);
        insta::assert_snapshot!(
            format!("check_demo_{name}"),
            serde_json::to_string_pretty(&v).unwrap()
        );
    }
    // Every state appears over the day, and legs turn below as it warms.
    let all: Vec<(String, String)> = [&morning, &midday, &afternoon]
        .iter()
        .flat_map(|v| states(v))
        .collect();
    for s in ["within", "thin", "below", "no-data"] {
        assert!(
            all.iter().any(|(_, st)| st == s),
            "no leg is {s} at any of the three times"
        );
    }
    let m = states(&morning);
    let a = states(&afternoon);
    let turned: Vec<&String> = m
        .iter()
        .zip(&a)
        .filter(|((_, s0), (_, s1))| (s0 == "within" || s0 == "thin") && s1 == "below")
        .map(|((id, _), _)| id)
        .collect();
    assert!(!turned.is_empty(), "no leg turns below in the afternoon");
    // The density-altitude charter to the plateau: within in the morning, below by 14Z.
    let l11 = |v: &Value| {
        v["legs"]
            .as_array()
            .unwrap()
            .iter()
            .find(|l| l["id"] == "L11")
            .cloned()
            .unwrap()
    };
    assert_eq!(l11(&morning)["state"], "within");
    assert_eq!(l11(&afternoon)["state"], "below");
    assert!(
        l11(&afternoon)["limiting_check"]
            .as_str()
            .unwrap()
            .contains("density altitude")
    );
}

#[test]
fn json_has_the_documented_keys() {
    let v = check_json("2026-06-14T08:00:00Z");
    assert!(v["caution"].as_str().unwrap().contains("Planning aid"));
    for leg in v["legs"].as_array().unwrap() {
        for key in [
            "id",
            "state",
            "limiting_check",
            "headroom_c",
            "departure",
            "arrival",
            "reasons",
        ] {
            assert!(leg.get(key).is_some(), "{key}");
        }
        let dep = &leg["departure"];
        for key in [
            "airfield",
            "runway",
            "observation",
            "pressure_altitude_ft",
            "density_altitude_ft",
            "headwind_kt",
            "crosswind_kt",
            "crosswind_from",
            "takeoff",
            "climb",
        ] {
            assert!(dep.get(key).is_some(), "departure.{key}");
        }
        if leg["state"] != "no-data" {
            let t = &dep["takeoff"];
            assert!(t["ground_roll_m"].is_number() && t["distance_50ft_m"].is_number());
            for c in t["checks"].as_array().unwrap() {
                for key in ["rule", "required_m", "available_m", "margin_percent"] {
                    assert!(c.get(key).is_some(), "check.{key}");
                }
            }
            for key in [
                "rate_fpm",
                "gradient_ft_per_nm",
                "required_gradient_ft_per_nm",
                "margin_percent",
            ] {
                assert!(dep["climb"].get(key).is_some(), "climb.{key}");
            }
            assert!(leg["arrival"]["landing"]["checks"].is_array());
        }
    }
}

#[test]
fn the_chain_rebuilds_required_distance_from_its_own_values() {
    let v = check_json("2026-06-14T08:00:00Z");
    for leg in v["legs"].as_array().unwrap() {
        let t = &leg["departure"]["takeoff"];
        if !t.is_object() {
            continue;
        }
        let d50 = t["table_distance_50ft_m"].as_f64().unwrap()
            * t["wind_factor"].as_f64().unwrap()
            * t["slope_factor"].as_f64().unwrap();
        let surface = match t["surface_rule"]["rule"].get("multiply_by") {
            Some(f) => f.as_f64().unwrap(),
            None => 1.0,
        };
        if t["surface_rule"]["rule"]
            .get("add_percent_of_ground_roll")
            .is_some()
        {
            continue;
        }
        let rebuilt = d50 * surface;
        let got = t["distance_50ft_m"].as_f64().unwrap();
        assert!(
            (rebuilt - got).abs() < 1e-6,
            "{}: {rebuilt} vs {got}",
            leg["id"]
        );
        for c in t["checks"].as_array().unwrap() {
            if c["rule"].as_str().unwrap().starts_with("distance_50ft") {
                let req = got * c["factor"].as_f64().unwrap();
                assert!((req - c["required_m"].as_f64().unwrap()).abs() < 1e-6);
                let m = (c["available_m"].as_f64().unwrap() / c["required_m"].as_f64().unwrap()
                    - 1.0)
                    * 100.0;
                assert!((m - c["margin_percent"].as_f64().unwrap()).abs() < 1e-6);
            }
        }
    }
}

#[test]
fn bad_input_exits_2() {
    let (code, _, stderr) = rhoboard(&["check", "--at", "yesterday"]);
    assert_eq!(code, 2);
    assert!(stderr.contains("--at 'yesterday'"), "{stderr}");
    let (code, _, stderr) = rhoboard(&["check", "--leg", "L99", "--at", "2026-06-14T08:00:00Z"]);
    assert_eq!(code, 2);
    assert!(stderr.contains("L99"), "{stderr}");
    let (code, _, stderr) = rhoboard(&["check", "--ops", "/nonexistent/rhoboard-ops"]);
    assert_eq!(code, 2);
    assert!(stderr.contains("/nonexistent/rhoboard-ops"), "{stderr}");
}

#[test]
fn pairings_cover_every_available_aircraft_at_every_airfield() {
    let (_, stdout, _) = rhoboard(&[
        "check",
        "--json",
        "--pairings",
        "--at",
        "2026-06-14T14:00:00Z",
    ]);
    let v: Value = serde_json::from_str(&stdout).unwrap();
    let p = v["pairings"].as_array().unwrap();
    // Eight aircraft, one in maintenance; nine airfields.
    assert_eq!(p.len(), 7 * 9);
    assert!(p.iter().all(|c| c["state"].is_string()));
    assert!(p.iter().any(|c| c["state"] == "below"));
    assert!(p.iter().any(|c| c["state"] == "within"));
}

fn strings<'a>(v: &'a Value, out: &mut Vec<&'a str>) {
    match v {
        Value::String(s) => out.push(s),
        Value::Array(a) => a.iter().for_each(|x| strings(x, out)),
        Value::Object(o) => o.values().for_each(|x| strings(x, out)),
        _ => {}
    }
}

/// No text of the chain wraps parentheses in parentheses ("((…))"), whatever the
/// operator's own sources hold: a source is quoted after "from" or a colon.
#[test]
fn no_doubled_parentheses_in_the_chain() {
    for at in ["2026-06-14T08:00:00Z", "2026-06-14T14:00:00Z"] {
        let v = check_json(at);
        let mut all = Vec::new();
        strings(&v, &mut all);
        assert!(all.len() > 500);
        for s in all {
            assert!(!s.contains("((") && !s.contains("))"), "{s}");
        }
        let (_, text, _) = rhoboard(&["report", "--at", at]);
        assert!(!text.contains("((") && !text.contains("))"), "{text}");
    }
}

/// The CG envelope row carries the envelope's limit at the mass and the margin, in
/// `limits` and in `mass_balance.cg_limits` (README's JSON description).
#[test]
fn the_envelope_row_has_its_limit_and_margin() {
    let (_, out, _) = rhoboard(&[
        "check",
        "--json",
        "--leg",
        "L16",
        "--at",
        "2026-06-14T14:00:00Z",
    ]);
    let v: Value = serde_json::from_str(&out).unwrap();
    let leg = &v["legs"][0];
    let cg = &leg["mass_balance"]["cg_limits"];
    let env = leg["departure"]["limits"]
        .as_array()
        .unwrap()
        .iter()
        .find(|l| l["kind"] == "envelope")
        .unwrap();
    assert_eq!(env["limit"], cg["aft_limit_mm"]);
    assert_eq!(env["margin"], cg["margin_mm"]);
    assert_eq!(cg["nearer"], "aft");
    // Margin = aft limit − CG at the tightest point (the landing for L16).
    let (aft, at_cg) = (
        cg["aft_limit_mm"].as_f64().unwrap(),
        cg["cg_mm"].as_f64().unwrap(),
    );
    assert!((cg["margin_mm"].as_f64().unwrap() - (aft - at_cg)).abs() < 1e-9);
    assert_eq!(cg["mass_kg"], leg["mass_balance"]["landing_mass_kg"]);
}

/// Finding 27: a day with no legs says so and prints no empty table header (nor an
/// empty forecast section).
#[test]
fn a_day_without_legs_prints_no_empty_table() {
    let (code, out, _) = rhoboard(&["check", "--at", "2026-06-15T10:00:00Z", "--forecast"]);
    assert_eq!(code, 0);
    assert!(out.contains("No legs depart on 2026-06-15."), "{out}");
    assert!(!out.contains("limiting check"), "{out}");
    assert!(!out.contains("Forecast look-ahead"), "{out}");
}

/// Finding 27: a folder written by `init` does not carry the built-in demo's operator
/// name, so its listings cannot be taken for the demo's.
#[test]
fn an_init_folder_is_headed_as_a_copy_to_replace() {
    let dir = std::env::temp_dir().join(format!("rhoboard-check-init-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let ops = dir.join("ops");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&["init", d]).0, 0);
    let at = "2026-06-14T08:00:00Z";
    let (_, demo, _) = rhoboard(&["check", "--at", at]);
    let (_, copy, _) = rhoboard(&["check", "--ops", d, "--at", at]);
    let head = |s: &str| s.lines().next().unwrap_or("").to_string();
    assert!(head(&demo).contains("(demo — invented operator)"), "{demo}");
    assert!(
        head(&copy).starts_with(rhoboard::ops::demo::TEMPLATE_NAME),
        "{copy}"
    );
    assert_ne!(head(&demo), head(&copy));
    let _ = std::fs::remove_dir_all(&dir);
}

/// Findings 15 and 16: README's `check` example is what the `--at` it names prints, and
/// its list of pairings keys is the JSON's.
#[test]
fn the_readme_check_example_and_pairings_keys_match_the_output() {
    let readme = include_str!("../README.md");
    let section = readme
        .split("## `rhoboard check`")
        .nth(1)
        .and_then(|s| s.split("\n## ").next())
        .expect("the check section");
    assert!(section.contains("`rhoboard check --at 2026-06-14T14:00:00Z`"));
    let example: Vec<&str> = section
        .split("\n```\ndep ")
        .nth(1)
        .and_then(|s| s.split("\n```").next())
        .expect("the example table")
        .lines()
        .skip(1)
        .collect();
    assert!(!example.is_empty());
    let (_, out, _) = rhoboard(&["check", "--at", "2026-06-14T14:00:00Z"]);
    for line in &example {
        assert!(
            out.lines().any(|l| l == *line),
            "README line not printed: {line}\n{out}"
        );
    }
    let keys_text = section
        .split("`pairings` lists {")
        .nth(1)
        .and_then(|s| s.split('}').next())
        .expect("the pairings keys");
    let mut documented: Vec<String> = keys_text
        .split(',')
        .map(|k| k.trim().trim_matches('`').to_string())
        .collect();
    documented.sort();
    let v = check_json_pairings("2026-06-14T14:00:00Z");
    let mut actual: Vec<String> = v["pairings"][0]
        .as_object()
        .expect("a pairing")
        .keys()
        .cloned()
        .collect();
    actual.sort();
    assert_eq!(documented, actual);
}

fn check_json_pairings(at: &str) -> Value {
    let (_, out, err) = rhoboard(&["check", "--pairings", "--json", "--at", at]);
    serde_json::from_str(&out).unwrap_or_else(|e| panic!("{e}: {err}"))
}

/// A pairing below for a reason temperature cannot change (the wind limits, the field's
/// weather) has no headroom, as legs have none; a pairing the weather decides names the
/// minimum, and every margin shown carries its unit.
#[test]
fn pairings_name_the_weather_minimum_and_keep_headroom_for_temperature() {
    for at in [
        "2026-06-14T08:00:00Z",
        "2026-06-14T14:00:00Z",
        "2026-06-14T17:00:00Z",
    ] {
        let (_, stdout, _) = rhoboard(&["check", "--json", "--pairings", "--at", at]);
        let v: Value = serde_json::from_str(&stdout).unwrap();
        let p = v["pairings"].as_array().unwrap();
        let mut named = 0;
        for c in p {
            if c["limiting"] == "weather" {
                assert!(c["limiting_minimum"].is_string(), "{c}");
                named += 1;
            } else {
                assert!(c["limiting_minimum"].is_null(), "{c}");
            }
            if c["margin"].is_number() {
                assert_ne!(c["margin_unit"], "", "{c}");
            }
            let temperature_proof = matches!(
                c["limiting"].as_str(),
                Some("crosswind" | "tailwind" | "weather")
            );
            if c["state"] == "below" && temperature_proof {
                assert!(c["headroom_c"].is_null(), "{c}");
                assert!(c["headroom_table_ends"].is_null(), "{c}");
            }
            if c["headroom_c"].is_number() {
                assert!(c["headroom_table_ends"].is_boolean(), "{c}");
            }
        }
        if at.ends_with("14:00:00Z") {
            assert!(named > 0, "the 14Z demo has gusty fields");
        }
    }
}

/// The text pairings table says what the JSON says: each pairing the weather decides
/// names its minimum (never a bare "weather"), its margin is the JSON's in the same unit
/// and never rounded up, and a pairing with no headroom in the JSON shows none.
#[test]
fn text_pairings_name_the_minimum_with_its_margin_and_unit() {
    let at = "2026-06-14T14:00:00Z";
    let v = check_json_pairings(at);
    let (_, out, _) = rhoboard(&["check", "--pairings", "--at", at]);
    let table: Vec<&str> = out
        .split("\nPairings (")
        .nth(1)
        .expect("the pairings table")
        .lines()
        .skip(2)
        // The note under the table on what "—" means.
        .filter(|l| !l.starts_with("(headroom —"))
        .collect();
    let pairings = v["pairings"].as_array().unwrap();
    assert_eq!(table.len(), pairings.len(), "{out}");
    let mut weather = 0;
    for (c, line) in pairings.iter().zip(&table) {
        let cols: Vec<&str> = line.split_whitespace().collect();
        assert_eq!(cols[0], c["aircraft"], "{line}");
        assert_eq!(cols[1], c["airfield"], "{line}");
        assert!(!line.contains("weather (no margin)"), "{line}");
        if c["limiting"] == "weather" {
            weather += 1;
            let minimum = c["limiting_minimum"].as_str().unwrap();
            assert!(line.ends_with(&format!("  {minimum}")), "{line}");
        }
        match c["margin"].as_f64() {
            Some(m) => {
                let unit = c["margin_unit"].as_str().unwrap();
                let (shown, rest) = (cols[5], cols[6]);
                assert_eq!(rest, unit, "{line}");
                let shown: f64 = shown.parse().unwrap();
                assert!(shown <= m + 1e-9 && m - shown < 1.0, "{line} against {m}");
            }
            None => assert_eq!(cols[5], "—", "{line}"),
        }
        if c["headroom_c"].is_null() {
            assert!(line.contains(" —  "), "{line}");
        }
    }
    assert!(weather > 0, "the 14Z demo has gusty fields");
}

/// `check --json`'s phase and forecast objects carry the flags the report words come
/// from (README's JSON description).
#[test]
fn json_phase_and_forecast_carry_the_wind_factoring_and_observation_flags() {
    let (_, out, err) = rhoboard(&[
        "check",
        "--json",
        "--forecast",
        "--at",
        "2026-06-14T14:00:00Z",
    ]);
    let v: Value = serde_json::from_str(&out).unwrap_or_else(|e| panic!("{e}: {err}"));
    let legs = v["legs"].as_array().unwrap();
    let mut missing = 0;
    for leg in legs {
        for (side, phase) in [("departure", "takeoff"), ("arrival", "landing")] {
            let p = &leg[side][phase];
            if !p.is_null() {
                assert!(p["wind_factoring_in_manual"].is_boolean(), "{}", leg["id"]);
            }
        }
        let f = &leg["forecast"];
        if !f["state"].is_null() {
            assert!(f["observation_missing"].is_boolean(), "{}", leg["id"]);
            // Only a leg observed no-data is forecast alone.
            assert_eq!(
                f["observation_missing"].as_bool().unwrap(),
                leg["state"] == "no-data",
                "{}",
                leg["id"]
            );
            missing += usize::from(f["observation_missing"] == true);
        }
    }
    // docs/forecast.md: demo L10 at 14Z is observed no-data and forecast alone.
    assert!(missing > 0, "no leg at 14Z is forecast alone");
    // In the text, L10 (landed 1345Z) says it is gone rather than show a forecast; a
    // leg still ahead and observed no-data reads "forecast only" (tests/forecast_lookahead.rs).
    let (_, text, _) = rhoboard(&["check", "--forecast", "--at", "2026-06-14T14:00:00Z"]);
    assert!(
        text.contains("  L10   landed 1345Z: flown, no forecast ahead"),
        "{text}"
    );
}

/// The text table's headroom is `Headroom::figure` (as the briefing sheet and the board
/// print it): a bound reached at the table's top reads `≥`, at its coldest column `≤`,
/// a crossing is plain, none is `—`. Checked against each leg's JSON at four times.
#[test]
fn text_headroom_marks_a_bound_as_the_report_does() {
    for at in [
        "2026-06-14T08:00:00Z",
        "2026-06-14T11:00:00Z",
        "2026-06-14T14:00:00Z",
        "2026-06-14T17:00:00Z",
    ] {
        let v = check_json(at);
        let (_, out, _) = rhoboard(&["check", "--at", at]);
        let mut bounds = 0;
        for leg in v["legs"].as_array().unwrap() {
            let id = leg["id"].as_str().unwrap();
            let line = out
                .lines()
                .find(|l| l.split_whitespace().nth(1) == Some(id))
                .unwrap_or_else(|| panic!("{id} not in\n{out}"));
            let expected = match leg["headroom_c"].as_f64() {
                None => "—".to_string(),
                Some(h) => {
                    let mark = match (leg["headroom_table_ends"] == true, h >= 0.0) {
                        (false, _) => "",
                        (true, true) => "≥",
                        (true, false) => "≤",
                    };
                    bounds += usize::from(!mark.is_empty());
                    format!("{mark}{h:+.1}°C")
                }
            };
            assert!(
                line.split_whitespace().any(|w| w == expected),
                "{id}: {expected} not in {line}"
            );
        }
        assert!(bounds > 0, "{at}: no leg reaches a table's end");
    }
}

/// A limit row's margin in the text table is the shown value minus the shown limit (a
/// maximum: limit minus value), each rounded toward the other at whole units (value
/// down and limit up for a minimum, the reverse for a maximum), so never more than the
/// true margin and less by under two units (`LimitCheck::shown`); JSON's
/// `limiting_margin` is the same text. Checked against each leg's JSON limits at four
/// times.
#[test]
fn text_limit_margins_are_the_shown_difference_and_never_rounded_up() {
    let mut checked = 0;
    for at in [
        "2026-06-14T08:00:00Z",
        "2026-06-14T11:00:00Z",
        "2026-06-14T14:00:00Z",
        "2026-06-14T17:00:00Z",
    ] {
        let v = check_json(at);
        let (_, out, _) = rhoboard(&["check", "--at", at]);
        for leg in v["legs"].as_array().unwrap() {
            let id = leg["id"].as_str().unwrap();
            let line = out
                .lines()
                .find(|l| l.split_whitespace().nth(1) == Some(id))
                .unwrap();
            let cols: Vec<&str> = line.split_whitespace().collect();
            // dep leg aircraft route category… glyph state margin unit headroom check
            let Some(k) = cols
                .iter()
                .position(|c| matches!(*c, "kt" | "ft" | "m" | "kg" | "L" | "mm"))
            else {
                continue;
            };
            let (text, unit) = (cols[k - 1], cols[k]);
            assert_eq!(
                leg["limiting_margin"].as_str(),
                Some(format!("{text} {unit}").as_str()),
                "{at} {id}: JSON and text differ"
            );
            assert!(!text.contains('.'), "{at} {id}: {text} has decimals");
            let shown: f64 = text.parse().unwrap();
            let limits: Vec<&Value> = ["departure", "arrival"]
                .iter()
                .flat_map(|s| leg[*s]["limits"].as_array().unwrap())
                .filter(|l| l["unit"] == unit && l["margin"].is_number())
                .collect();
            let matched = limits.iter().any(|l| {
                let m = l["margin"].as_f64().unwrap();
                let (Some(val), Some(lim)) = (l["value"].as_f64(), l["limit"].as_f64()) else {
                    return false;
                };
                let minimum = (val - lim - m).abs() < 1e-6;
                let (vs, ls) = if minimum {
                    (val.floor(), lim.ceil())
                } else {
                    (val.ceil(), lim.floor())
                };
                let diff = if minimum { vs - ls } else { ls - vs };
                // Passing by less than a unit shows +0, at the limit.
                let diff = if m >= 0.0 { diff.max(0.0) } else { diff };
                (diff - shown).abs() < 1e-9 && shown <= m + 1e-9 && m - shown < 2.0
            });
            assert!(
                matched,
                "{at} {id}: {text} {unit} is no shown difference\n{line}"
            );
            checked += 1;
        }
    }
    assert!(checked > 10, "only {checked} limit margins checked");
}

/// A hard limit (L08's lapsed solo endorsement, 14 CFR 61.87(n)'s 90 days, from memory)
/// has no margin in numbers: the text's margin column reads `—`, not the state word
/// again, and JSON's `limiting_margin` is null, at every time of the demo day.
#[test]
fn a_hard_limit_has_no_margin_word_and_a_null_json_margin() {
    for at in ["2026-06-14T08:00:00Z", "2026-06-14T14:00:00Z"] {
        let (_, out, _) = rhoboard(&["check", "--at", at]);
        let line = out
            .lines()
            .find(|l| l.split_whitespace().nth(1) == Some("L08"))
            .expect("L08 in the table");
        let cols: Vec<&str> = line.split_whitespace().collect();
        // 1100Z L08 X-TRNC XSHT-XSEA student solo ✗ below — — XSHT endorsement
        let state = cols.iter().position(|c| *c == "below").expect("below");
        assert_eq!(cols[state + 1], "—", "margin column: {line}");
        assert_eq!(
            line.matches("below").count(),
            1,
            "the state alone says below: {line}"
        );
        assert!(line.ends_with("XSHT endorsement"), "{line}");
        let v = check_json(at);
        let l08 = v["legs"]
            .as_array()
            .unwrap()
            .iter()
            .find(|l| l["id"] == "L08")
            .unwrap();
        assert_eq!(l08["limiting_check"], "XSHT endorsement");
        assert!(
            l08["limiting_margin"].is_null(),
            "{}",
            l08["limiting_margin"]
        );
    }
}

/// A density altitude in a leg's advice is the figure its side shows (rounded up, as
/// the limit row and the air line have it): trial finding, "8337 ft" on the air line
/// beside "at 8336 ft density altitude" in the advice.
#[test]
fn the_advice_gives_the_density_altitude_the_side_shows() {
    let mut checked = 0;
    for at in ["2026-06-14T08:00:00Z", "2026-06-14T13:00:00Z"] {
        let v = check_json(at);
        for leg in v["legs"].as_array().unwrap() {
            for advice in leg["advice"].as_array().unwrap() {
                let a = advice.as_str().unwrap();
                let words: Vec<&str> = a.split(' ').collect();
                let figure = words
                    .windows(3)
                    .find_map(|w| (w[1] == "ft" && w[2] == "density").then_some(w[0]))
                    .or_else(|| {
                        words.windows(4).find_map(|w| {
                            (w[0] == "density" && w[1] == "altitude" && w[3] == "ft")
                                .then_some(w[2])
                        })
                    });
                let Some(figure) = figure else { continue };
                let field = a.split(':').next().unwrap();
                let side = ["departure", "arrival"]
                    .iter()
                    .map(|s| &leg[*s])
                    .find(|s| s["airfield"] == field)
                    .unwrap_or_else(|| panic!("{a}"));
                let da = side["density_altitude_ft"].as_f64().unwrap();
                assert_eq!(figure, format!("{:.0}", da.ceil()), "{}: {a}", leg["id"]);
                checked += 1;
            }
        }
    }
    assert!(checked > 3, "{checked}");
}
