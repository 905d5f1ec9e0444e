//! `rhoboard taf` end to end: readable decode, JSON keys, stdin, exit codes.

#[path = "common/cli.rs"]
mod cli_common;

use cli_common::rhoboard;

const TAF: &str = "TAF XQAB 140500Z 1406/1506 23008KT 9999 FEW030 TX30/1415Z TN12/1406Z \
                   FM141200 31012KT 9999 SCT040 TEMPO 1414/1416 31018G30KT 3000 TSRA BKN015CB";

#[test]
fn readable_decode_lists_groups_periods_and_hours() {
    let (code, out) = rhoboard(&["taf", "--date", "2026-06-14", TAF], None);
    assert_eq!(code, 0, "{out}");
    assert!(
        out.contains(
            "  FM141200         from 14 12:00Z: these conditions replace all earlier ones"
        ),
        "{out}"
    );
    assert!(
        out.contains("wind from 310° true at 18 kt, gusting 30 kt (TEMPO 1414/1416)"),
        "{out}"
    );
    assert!(
        out.contains("  periods:\n    14 06:00Z – 14 12:00Z  base\n"),
        "{out}"
    );
    assert!(out.contains("    14 15:00Z  wind 310°/12 kt, visibility ≥10000 m, no ceiling, 30.0 °C\n             worst case: wind 310°/18 kt G30, visibility 3000 m, ceiling 1500 ft, TSRA, hazards: thunderstorm, CB/TCU, 30.0 °C"), "{out}");
    assert!(out.contains("usable: yes"));
}

#[test]
fn json_keys_and_exit_two_for_an_unusable_taf_from_stdin() {
    let input =
        format!("# two forecasts\n{TAF}=\nTAF XHA1 140500Z 1406/1506 2701KT 9999 SCT030=\n");
    let (code, out) = rhoboard(
        &["taf", "--json", "--date", "2026-06-14", "-"],
        Some(&input),
    );
    assert_eq!(code, 2);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let a = &v[0];
    assert_eq!(a["station"], "XQAB");
    assert_eq!(a["valid_from"], "2026-06-14T06:00:00Z");
    assert_eq!(a["changes"][1]["kind"], "tempo");
    assert_eq!(a["changes"][1]["conditions"]["ceiling_ft"], 1500.0);
    assert_eq!(a["temperatures"][0]["extreme"], "max");
    assert_eq!(a["hourly"].as_array().unwrap().len(), 24);
    assert_eq!(a["hourly"][9]["worst_case"]["worst_case"], true);
    assert_eq!(a["hourly"][9]["prevailing"]["temperature_c"], 30.0);
    assert_eq!(a["usable"], true);
    let b = &v[1];
    assert_eq!(b["usable"], false);
    assert_eq!(
        b["errors"][0],
        "forecast XHA1 140500Z: wind group '2701KT' at column 28: expected 2 or 3 digits of speed after the direction, found '1'"
    );
}
