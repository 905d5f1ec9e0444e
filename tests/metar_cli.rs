//! `rhoboard metar` end to end: readable and JSON output, stdin, exit codes.

#[path = "common/cli.rs"]
mod cli_common;

use cli_common::rhoboard;

#[test]
fn readable_decode_lists_each_group() {
    let (code, out) = rhoboard(
        &[
            "metar",
            "--date",
            "2026-06-14",
            "METAR XQAB 141250Z 27015G25KT 9999 -SHRA BKN012 21/12 Q1015 NOSIG",
        ],
        None,
    );
    assert_eq!(code, 0);
    insta::assert_snapshot!(out, @r"
    METAR XQAB 141250Z 27015G25KT 9999 -SHRA BKN012 21/12 Q1015 NOSIG
      METAR       routine report (METAR)
      XQAB        station XQAB
      141250Z     observed 2026-06-14 12:50 UTC
      27015G25KT  wind from 270° true at 15 kt, gusting 25 kt
      9999        visibility 10 km or more
      -SHRA       light showers of rain
      BKN012      broken clouds (5-7 oktas) at 1200 ft
      21/12       temperature 21 °C, dew point 12 °C
      Q1015       altimeter setting (QNH) 1015 hPa
      NOSIG       trend for the next two hours (kept as text)
      ceiling: 1200 ft
      usable for performance: yes
    ");
}

#[test]
fn unquoted_report_is_one_report() {
    let (code, out) = rhoboard(
        &[
            "metar",
            "--date",
            "2026-06-14",
            "XQAB",
            "141250Z",
            "27015KT",
            "9999",
            "FEW030",
            "21/12",
            "Q1015",
        ],
        None,
    );
    assert_eq!(code, 0, "{out}");
    assert_eq!(
        out.lines().next(),
        Some("XQAB 141250Z 27015KT 9999 FEW030 21/12 Q1015")
    );
}

#[test]
fn json_for_a_days_file_on_stdin_exits_2_for_the_rejected_report() {
    let day = include_str!("../fixtures/metar/day.txt");
    let (code, out) = rhoboard(&["metar", "--json", "--date", "2026-06-14", "-"], Some(day));
    assert_eq!(code, 2);
    let v: serde_json::Value = serde_json::from_str(&out).expect("JSON");
    let reports = v.as_array().expect("array");
    assert_eq!(reports.len(), 29);
    let first = &reports[0];
    for key in [
        "station",
        "kind",
        "observed_at",
        "auto",
        "corrected",
        "wind",
        "visibility_m",
        "visibility_sm",
        "cavok",
        "weather",
        "clouds",
        "ceiling_ft",
        "temperature_c",
        "dewpoint_c",
        "altimeter_hpa",
        "altimeter_inhg",
        "remarks",
        "not_understood",
        "usable_for_performance",
        "errors",
    ] {
        assert!(first.get(key).is_some(), "missing key {key}");
    }
    for key in [
        "direction_deg",
        "variable",
        "speed_kt",
        "gust_kt",
        "variable_from_deg",
        "variable_to_deg",
    ] {
        assert!(first["wind"].get(key).is_some(), "missing wind key {key}");
    }
    assert_eq!(first["observed_at"], "2026-06-14T06:50:00Z");
    assert_eq!(first["kind"], "metar");
    let rejected: Vec<_> = reports
        .iter()
        .filter(|r| r["usable_for_performance"] == false)
        .collect();
    assert_eq!(rejected.len(), 1);
    insta::assert_snapshot!(rejected[0]["errors"][0].as_str().unwrap(), @"observation XQAB 141920Z: wind group '26012KTS' at column 20: speed unit 'KTS' not understood; expected KT, MPS or KMH");
    // The wrapped report was joined.
    assert!(
        reports.iter().any(|r| r["text"]
            == "METAR XHA1 141250Z 20015G26KT 170V230 9999 FEW080 SCT200 23/M01 Q1016")
    );
}

#[test]
fn empty_input_and_a_bad_date_are_bad_input() {
    let (code, out) = rhoboard(&["metar", "-"], Some("\n# nothing\n"));
    assert_eq!(code, 2);
    assert!(out.contains("no report given"));
    let (code, _) = rhoboard(
        &[
            "metar",
            "--date",
            "14/06/2026",
            "XQAB 141250Z 27015KT 9999 FEW030 21/12 Q1015",
        ],
        None,
    );
    assert_eq!(code, 2);
}

#[test]
fn the_demo_operators_observation_day_decodes() {
    let day = include_str!("../fixtures/demo/observations/2026-06-14.txt");
    let (code, out) = rhoboard(&["metar", "--json", "--date", "2026-06-14", "-"], Some(day));
    assert_eq!(code, 0, "every demo report is usable");
    let v: serde_json::Value = serde_json::from_str(&out).expect("JSON");
    let reports = v.as_array().expect("array");
    assert!(reports.len() >= 100);
    assert!(
        reports
            .iter()
            .all(|r| r["not_understood"].as_array().is_some_and(Vec::is_empty))
    );
}

/// Finding 8: without `--date`, a report whose day is later than today's is from the
/// previous month (or earlier, if that month lacks the day), never in the future.
#[test]
fn without_a_date_a_later_day_is_a_past_month() {
    use chrono::{Datelike, Utc};
    let today = Utc::now().date_naive();
    // The next day number (29, 30 or 31 too: a previous month without that day gives
    // way to an earlier one). Only on the 31st is there no later day number to pick;
    // `resolve_time`'s own tests cover every month end with fixed dates.
    if today.day() == 31 {
        return;
    }
    let day = today.day() + 1;
    let text = format!("XQAB {day:02}0600Z 27010KT 9999 NSC 20/10 Q1013");
    let (_, out) = rhoboard(&["metar", "--json", &text], None);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let at = v[0]["observed_at"].as_str().unwrap();
    let at = chrono::DateTime::parse_from_rfc3339(at).unwrap();
    assert!(at.date_naive() < today, "{at} is not before {today}");
    assert_eq!(at.day(), day);
    assert!((today - at.date_naive()).num_days() <= 92);
}

/// Finding 7: the readable decode gives the column of a group not understood, as the
/// JSON does.
#[test]
fn readable_output_gives_the_column_of_a_group_not_understood() {
    let (_, out) = rhoboard(
        &[
            "metar",
            "--date",
            "2026-06-14",
            "XQAB 141250Z 27015KT 9999 FOO BKN012 21/12 Q1015",
        ],
        None,
    );
    assert!(
        out.contains("FOO      not understood (column 27): not a group of a METAR"),
        "{out}"
    );
}
