//! Decoding checks against published METAR examples, the derived ceiling and visibility
//! conversions, time resolution, and the bad inputs the issue lists.

use chrono::{DateTime, TimeZone, Utc};
use rhoboard::observation::{
    Bound, Ceiling, Convective, Cover, Intensity, Kind, SkyClear, SpeedUnit, WindShear, decode,
    resolve_time,
};

fn utc(y: i32, mo: u32, d: u32, h: u32, mi: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(y, mo, d, h, mi, 0).unwrap()
}

fn all_errors(text: &str, reference: DateTime<Utc>) -> String {
    decode(text, reference).error_lines().join("\n")
}

/// FAA Aeronautical Information Manual, chapter 7 (7-1-30, "Key to Aerodrome Forecast
/// and Aviation Routine Weather Report"), METAR example — quoted and decoded from memory:
/// Pittsburgh, 9th day 1955 UTC, corrected; wind 220° at 15 kt gusting 25 kt; visibility
/// 3/4 SM; RVR runway 28L 2,600 ft; thunderstorm with moderate rain; overcast at 1,000 ft
/// with cumulonimbus; temperature 18 °C, dew point 16 °C; altimeter 29.92 inHg; remark
/// temperature 18.2 °C, dew point 15.9 °C.
#[test]
fn faa_aim_chapter_7_example() {
    let r = decode(
        "METAR KPIT 091955Z COR 22015G25KT 3/4SM R28L/2600FT TSRA OVC010CB 18/16 A2992 RMK SLP045 T01820159",
        utc(2026, 6, 9, 20, 0),
    );
    assert_eq!(r.station, "KPIT");
    assert_eq!(r.observed_at, Some(utc(2026, 6, 9, 19, 55)));
    assert!(r.corrected);
    let w = r.wind.unwrap();
    assert_eq!(
        (w.direction_deg, w.speed_kt, w.gust_kt),
        (Some(220.0), 15.0, Some(25.0))
    );
    let v = r.visibility.unwrap();
    assert_eq!(v.reported_sm, Some(0.75));
    assert!((v.prevailing_m - 0.75 * 1609.344).abs() < 1e-9);
    let rvr = &r.rvr[0];
    assert_eq!(rvr.runway, "28L");
    assert!(rvr.in_feet);
    assert!((rvr.range_m - 2600.0 * 0.3048).abs() < 1e-9);
    assert_eq!(r.weather[0].code(), "TSRA");
    assert_eq!(r.weather[0].intensity, Intensity::Moderate);
    assert_eq!(r.clouds[0].cover, Cover::Overcast);
    assert_eq!(r.clouds[0].base_ft, Some(1000.0));
    assert_eq!(r.clouds[0].convective, Some(Convective::Cb));
    assert_eq!(r.ceiling, Ceiling::Known(1000.0));
    assert_eq!(r.temperature_c, Some(18.2));
    assert_eq!(r.dewpoint_c, Some(15.9));
    assert!(r.temperature_from_remarks);
    assert_eq!(r.altimeter_inhg, Some(29.92));
    // 29.92 inHg = 1013.2 hPa (AIM 7-2-2, to 0.1 hPa).
    assert!((r.altimeter_hpa.unwrap() - 1013.2).abs() < 0.05);
    assert!(r.hazards.thunderstorm && r.hazards.cumulonimbus);
    assert!(r.usable_for_performance());
}

/// FAA Aviation Weather Services (AC 00-45H), METAR section, example report — quoted from
/// memory: Oklahoma City, 1st day 1955 UTC, automated; wind 220° at 15 gusting 25 kt,
/// varying 180° to 250°; visibility 3/4 SM; RVR 17L 2,600 ft; thunderstorm with heavy
/// rain and mist; overcast 1,000 ft CB; 18/16; 29.92 inHg.
#[test]
fn faa_ac_00_45_example() {
    let r = decode(
        "METAR KOKC 011955Z AUTO 22015G25KT 180V250 3/4SM R17L/2600FT +TSRA BR OVC010CB 18/16 A2992 RMK AO2 TSB25 TS OHD MOV E SLP132",
        utc(2026, 7, 1, 20, 0),
    );
    assert!(r.auto);
    let w = r.wind.unwrap();
    assert_eq!(
        (w.variable_from_deg, w.variable_to_deg),
        (Some(180.0), Some(250.0))
    );
    assert_eq!(r.weather.len(), 2);
    assert_eq!(r.weather[0].intensity, Intensity::Heavy);
    assert_eq!(r.weather[0].descriptor, Some("TS"));
    assert_eq!(r.weather[0].phenomena, vec!["RA"]);
    assert_eq!(r.weather[1].code(), "BR");
    assert_eq!(r.remarks.as_deref(), Some("AO2 TSB25 TS OHD MOV E SLP132"));
    assert_eq!(r.temperature_c, Some(18.0));
    assert!(r.usable_for_performance());
    assert!(r.not_understood.is_empty());
}

/// ICAO Annex 3 / WMO No. 306 example routine report for the fictional ICAO example
/// aerodrome YUDO (Donlon) — quoted from memory: 22nd 1630 UTC; 240° 15 kt; 600 m; RVR
/// runway 12 1,000 m increasing; drizzle and fog; scattered 1,000 ft, overcast 2,000 ft;
/// 17/16; QNH 1018 hPa; trend becoming 800 m fog until 1700 and 10 km or more, nil
/// significant weather at 1800.
#[test]
fn icao_annex_3_example() {
    let r = decode(
        "METAR YUDO 221630Z 24015KT 0600 R12/1000U DZ FG SCT010 OVC020 17/16 Q1018 BECMG TL1700 0800 FG BECMG AT1800 9999 NSW",
        utc(2026, 6, 22, 17, 0),
    );
    assert_eq!(r.observed_at, Some(utc(2026, 6, 22, 16, 30)));
    assert_eq!(r.visibility.unwrap().prevailing_m, 600.0);
    assert_eq!(r.rvr[0].range_m, 1000.0);
    assert_eq!(r.rvr[0].tendency, Some('U'));
    assert_eq!(
        r.weather.iter().map(|w| w.code()).collect::<Vec<_>>(),
        vec!["DZ", "FG"]
    );
    assert_eq!(r.ceiling, Ceiling::Known(2000.0));
    assert_eq!(r.altimeter_hpa, Some(1018.0));
    assert_eq!(
        r.trend.as_deref(),
        Some("BECMG TL1700 0800 FG BECMG AT1800 9999 NSW")
    );
    assert!(r.hazards.fog);
    assert!(r.usable_for_performance());
}

/// ICAO Annex 3 example special report for YUDO, from memory: 05025G37KT, 3,000 m with
/// 1,200 m to the north-east, thunderstorm with heavy rain, broken 500 ft CB.
#[test]
fn icao_annex_3_speci_example() {
    let r = decode(
        "SPECI YUDO 151115Z 05025G37KT 3000 1200NE +TSRA BKN005CB 25/22 Q1008 TEMPO TL1200 0600 BECMG AT1200 8000 NSW NSC",
        utc(2026, 6, 15, 12, 0),
    );
    assert_eq!(r.kind, Some(Kind::Speci));
    let v = r.visibility.unwrap();
    assert_eq!((v.prevailing_m, v.minimum_m), (3000.0, Some(1200.0)));
    assert_eq!(v.minimum_direction, Some(1)); // NE
    assert_eq!(r.ceiling, Ceiling::Known(500.0));
    assert!(r.hazards.thunderstorm && r.hazards.cumulonimbus);
}

#[test]
fn statute_miles_convert_at_1609_344_m() {
    // 1 SM = 1,609.344 m exactly (NIST SP 811, appendix B.8).
    let cases = [
        ("10SM", 10.0, Bound::Exact),
        ("P6SM", 6.0, Bound::AtLeast),
        ("1/2SM", 0.5, Bound::Exact),
        ("M1/4SM", 0.25, Bound::LessThan),
        ("1 1/2SM", 1.5, Bound::Exact),
        ("2 3/4SM", 2.75, Bound::Exact),
        ("1/16SM", 0.0625, Bound::Exact),
    ];
    for (group, sm, bound) in cases {
        let r = decode(
            &format!("XQAB 141250Z 27010KT {group} CLR 20/10 A3000"),
            utc(2026, 6, 14, 13, 0),
        );
        let v = r
            .visibility
            .unwrap_or_else(|| panic!("{group}: {:?}", r.not_understood));
        assert_eq!(v.reported_sm, Some(sm), "{group}");
        assert!((v.prevailing_m - sm * 1609.344).abs() < 1e-9, "{group}");
        assert!((v.prevailing_sm() - sm).abs() < 1e-12, "{group}");
        assert_eq!(v.bound, bound, "{group}");
    }
    // Metres convert back: 1609 m is 0.9998 SM.
    let r = decode(
        "XQAB 141250Z 27010KT 1609 NSC 20/10 Q1013",
        utc(2026, 6, 14, 13, 0),
    );
    assert!((r.visibility.unwrap().prevailing_sm() - 1609.0 / 1609.344).abs() < 1e-12);
}

#[test]
fn ceiling_is_the_lowest_broken_overcast_or_vertical_visibility() {
    let at = utc(2026, 6, 14, 13, 0);
    let ceiling =
        |sky: &str| decode(&format!("XQAB 141250Z 27010KT 9999 {sky} 20/10 Q1013"), at).ceiling;
    assert_eq!(
        ceiling("FEW010 SCT020 BKN030 OVC050"),
        Ceiling::Known(3000.0)
    );
    assert_eq!(ceiling("FEW005 SCT008"), Ceiling::None);
    assert_eq!(ceiling("OVC015 BKN008"), Ceiling::Known(800.0));
    assert_eq!(ceiling("VV002"), Ceiling::Known(200.0));
    assert_eq!(ceiling("NSC"), Ceiling::None);
    assert_eq!(ceiling("NCD"), Ceiling::None);
    assert_eq!(ceiling("SKC"), Ceiling::None);
    assert_eq!(ceiling("CLR"), Ceiling::None);
    // Unknown heights or amounts: unknown, never "no ceiling".
    assert_eq!(ceiling("BKN///"), Ceiling::Unknown);
    assert_eq!(ceiling("VV///"), Ceiling::Unknown);
    assert_eq!(ceiling("FEW010 OVC///"), Ceiling::Unknown);
    assert_eq!(ceiling("//////"), Ceiling::Unknown);
    assert_eq!(ceiling("///015"), Ceiling::Unknown);
    // Known height, unknown type: still a ceiling.
    assert_eq!(ceiling("BKN015///"), Ceiling::Known(1500.0));
    // No sky group at all: unknown.
    let r = decode("XQAB 141250Z 27010KT 9999 20/10 Q1013", at);
    assert_eq!(r.ceiling, Ceiling::Unknown);
    let r = decode("XQAB 141250Z 27010KT CAVOK 20/10 Q1013", at);
    assert_eq!(r.ceiling, Ceiling::None);
    assert!(r.cavok);
    assert_eq!(r.visibility.unwrap().prevailing_m, 10_000.0);
}

#[test]
fn winds_in_every_unit_and_form() {
    let at = utc(2026, 6, 14, 13, 0);
    let wind = |g: &str| {
        decode(&format!("XQAB 141250Z {g} 9999 NSC 20/10 Q1013"), at)
            .wind
            .unwrap()
    };
    let w = wind("00000KT");
    assert!(w.is_calm());
    let w = wind("VRB03KT");
    assert!(w.variable && w.direction_deg.is_none());
    // 10 m/s = 19.438 kt (1 kt = 1852/3600 m/s).
    let w = wind("09010G15MPS");
    assert!((w.speed_kt - 10.0 * 3600.0 / 1852.0).abs() < 1e-9);
    assert!((w.gust_kt.unwrap() - 15.0 * 3600.0 / 1852.0).abs() < 1e-9);
    assert_eq!(w.unit, Some(SpeedUnit::Mps));
    let w = wind("14037KMH");
    assert!((w.speed_kt - 37.0 / 1.852).abs() < 1e-9);
    let w = wind("270P99KT");
    assert_eq!((w.speed_kt, w.speed_bound), (99.0, Bound::AtLeast));
    let w = wind("270105G130KT");
    assert_eq!((w.speed_kt, w.gust_kt), (105.0, Some(130.0)));
}

#[test]
fn weather_hazards_are_flagged() {
    let at = utc(2026, 6, 14, 13, 0);
    let h = |wx: &str| {
        decode(
            &format!("XQAB 141250Z 27010KT 3000 {wx} BKN010 05/04 Q1013"),
            at,
        )
        .hazards
    };
    assert!(h("VCTS").thunderstorm);
    assert!(h("-FZRA").freezing_precipitation);
    assert!(h("FZDZ").freezing_precipitation);
    assert!(!h("FZFG").freezing_precipitation);
    assert!(h("FZFG").fog);
    assert!(h("BCFG").fog);
    assert!(h("+SHGR").severe);
    assert!(!h("-RA").any());
    let r = decode("XQAB 141250Z 27010KT 9999 FEW030 05/04 Q1013 WS R27", at);
    assert!(r.hazards.wind_shear);
    assert_eq!(r.wind_shear, vec![WindShear::Runway("27".into())]);
    let r = decode("XQAB 141250Z 27010KT 9999 SCT030TCU 05/04 Q1013", at);
    assert!(r.hazards.cumulonimbus);
}

#[test]
fn day_hour_minute_resolves_to_the_nearest_utc_time() {
    // A day-31 report read on the 1st belongs to the previous month (and year).
    assert_eq!(
        resolve_time(31, 23, 50, utc(2027, 1, 1, 0, 10)),
        Some(utc(2026, 12, 31, 23, 50))
    );
    // A 0005Z report read at 2350Z the day before belongs to the next day.
    assert_eq!(
        resolve_time(15, 0, 5, utc(2026, 6, 14, 23, 50)),
        Some(utc(2026, 6, 15, 0, 5))
    );
    // Next month across a year end.
    assert_eq!(
        resolve_time(1, 0, 20, utc(2026, 12, 31, 23, 55)),
        Some(utc(2027, 1, 1, 0, 20))
    );
    // 29 February exists in 2028 only.
    assert_eq!(
        resolve_time(29, 12, 0, utc(2028, 3, 1, 6, 0)),
        Some(utc(2028, 2, 29, 12, 0))
    );
    // A day 31 read on 1 March: February has no 31st, so back to 31 January (Gregorian
    // calendar: February has 28 days in 2026).
    assert_eq!(
        resolve_time(31, 12, 0, utc(2026, 3, 1, 6, 0)),
        Some(utc(2026, 1, 31, 12, 0))
    );
    let r = decode(
        "XQAB 311200Z 27010KT 9999 NSC 20/10 Q1013",
        utc(2026, 3, 1, 6, 0),
    );
    assert_eq!(r.observed_at, Some(utc(2026, 1, 31, 12, 0)));
}

/// Finding 8: a report's day later than today's is the previous month, never two weeks
/// ahead; month lengths from the Gregorian calendar (30 days hath November…).
#[test]
fn a_day_after_today_is_the_previous_month_around_month_and_year_ends() {
    // Day 14 read on 1 December: 14 November, not 14 December.
    assert_eq!(
        resolve_time(14, 13, 50, utc(2026, 12, 1, 22, 5)),
        Some(utc(2026, 11, 14, 13, 50))
    );
    // Day 31 read on 1 December: November has 30 days, so 31 October.
    assert_eq!(
        resolve_time(31, 9, 0, utc(2026, 12, 1, 8, 0)),
        Some(utc(2026, 10, 31, 9, 0))
    );
    // Across the year end: day 31 read on 5 January is 31 December of the year before.
    assert_eq!(
        resolve_time(31, 23, 50, utc(2027, 1, 5, 10, 0)),
        Some(utc(2026, 12, 31, 23, 50))
    );
    // Day 30 read on 15 March: February has no 30th, so 30 January.
    assert_eq!(
        resolve_time(30, 6, 0, utc(2026, 3, 15, 6, 0)),
        Some(utc(2026, 1, 30, 6, 0))
    );
    // Day 29 read on 1 March 2027 (not a leap year): 29 January.
    assert_eq!(
        resolve_time(29, 6, 0, utc(2027, 3, 1, 6, 0)),
        Some(utc(2027, 1, 29, 6, 0))
    );
    // Today's day, later in the day than now: still today (a report read with a
    // reference at noon, or a clock a little behind).
    assert_eq!(
        resolve_time(1, 18, 0, utc(2026, 12, 1, 12, 0)),
        Some(utc(2026, 12, 1, 18, 0))
    );
    // Tomorrow's day well ahead of a clock before midnight: a month back instead.
    assert_eq!(
        resolve_time(2, 6, 0, utc(2026, 12, 1, 12, 0)),
        Some(utc(2026, 11, 2, 6, 0))
    );
}

#[test]
fn unknown_optional_groups_are_kept_and_do_not_stop_the_decode() {
    let r = decode(
        "XQAB 141250Z 27010KT 9999 XYZZY FEW030 BLUE 20/10 Q1013",
        utc(2026, 6, 14, 13, 0),
    );
    assert!(r.usable_for_performance());
    let nu: Vec<(&str, usize)> = r
        .not_understood
        .iter()
        .map(|n| (n.group.as_str(), n.column))
        .collect();
    assert_eq!(nu, vec![("XYZZY", 27), ("BLUE", 40)]);
    assert_eq!(r.clouds.len(), 1);
    // A cloud group out of place is still decoded, so the ceiling is not lost.
    let r = decode(
        "XQAB 141250Z 27010KT 9999 20/10 BKN008 Q1013",
        utc(2026, 6, 14, 13, 0),
    );
    assert_eq!(r.ceiling, Ceiling::Known(800.0));
    // A trailing '=', lower case and extra blanks are fine.
    let r = decode(
        "  metar xqab  141250z 27010kt 9999 few030 20/10 q1013 =",
        utc(2026, 6, 14, 13, 0),
    );
    assert!(r.usable_for_performance(), "{:?}", r.errors);
    assert_eq!(r.text, "METAR XQAB 141250Z 27010KT 9999 FEW030 20/10 Q1013");
    assert_eq!(r.clouds[0].cover, Cover::Few);
    let r = decode(
        "XQAB 141250Z AUTO 27010KT 9999 NCD 20/10 Q1013",
        utc(2026, 6, 14, 13, 0),
    );
    assert_eq!(r.sky_clear, Some(SkyClear::Ncd));
}

#[test]
fn bad_inputs_give_a_clear_message() {
    let at = utc(2026, 6, 14, 13, 0);
    insta::assert_snapshot!(all_errors("", at), @"observation (no station): empty report");
    insta::assert_snapshot!(all_errors("   \n\t ", at), @"observation (no station): empty report");
    insta::assert_snapshot!(all_errors("\u{0}\u{7f}\u{fffd}ÿþ garbage", at), @r"observation (no station): not a METAR: no group recognised, starting with '\u{0}\u{7f}�ÿþ'");
    // A line of words: one reads as a station, nothing else as a METAR group (trial
    // nit: it was "time group missing").
    insta::assert_snapshot!(all_errors("this is not a metar", at), @"observation THIS: not a METAR: no group recognised, starting with 'THIS'");
    let huge = "XQAB 141250Z ".to_string() + &"9".repeat(1 << 20);
    insta::assert_snapshot!(all_errors(&huge, at), @"observation (no station): report is 1048589 characters long; a METAR is at most 2000");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 27010KT 99", at), @r"
    observation XQAB 141250Z: temperature/dew point group missing (expected e.g. 15/08)
    observation XQAB 141250Z: altimeter group missing (expected e.g. Q1013 or A2992)
    ");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 27010KT 9999 FEW030 20/10 A29.92", at), @"observation XQAB 141250Z: altimeter group 'A29.92' at column 40: expected A and 4 digits of hundredths of inHg without a point, e.g. A2992");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 27010KT 9999 FEW030 20/10 Q101", at), @"observation XQAB 141250Z: altimeter group 'Q101' at column 40: expected Q and 4 digits of whole hPa, e.g. Q1013");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 27015KTS 9999 FEW030 20/10 Q1013", at), @"observation XQAB 141250Z: wind group '27015KTS' at column 14: speed unit 'KTS' not understood; expected KT, MPS or KMH");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 2701KT 9999 FEW030 20/10 Q1013", at), @"observation XQAB 141250Z: wind group '2701KT' at column 14: expected 2 or 3 digits of speed after the direction, found '1'");
    insta::assert_snapshot!(all_errors("XQAB 141250Z 27015KT 9999 FEW030 M/M Q1013", at), @"observation XQAB 141250Z: temperature/dew point group 'M/M' at column 34: expected TT/DD in whole °C with M for minus, e.g. 15/08 or M02/M05");
    insta::assert_snapshot!(all_errors("XQAB 321260Z 27015KT 9999 FEW030 20/10 Q1013", at), @"observation XQAB 321260Z: time group '321260Z' at column 6: day 32 is not a day of the month");
    insta::assert_snapshot!(all_errors("XQAB 142460Z 27015KT 9999 FEW030 20/10 Q1013", at), @"observation XQAB 142460Z: time group '142460Z' at column 6: hour 24 is not an hour of the day (00-23)");
    insta::assert_snapshot!(all_errors("XQAB 27015KT 9999 FEW030 20/// Q1013", at), @r"
    observation XQAB: time group missing (expected e.g. 141250Z)
    observation XQAB: temperature/dew point group '20///' at column 26: dew point not reported
    ");
    insta::assert_snapshot!(all_errors("XQAB 141250Z /////KT 9999 FEW030 20/10 Q////", at), @r"
    observation XQAB 141250Z: wind group '/////KT' at column 14: wind not reported
    observation XQAB 141250Z: altimeter group 'Q////' at column 40: altimeter setting not reported
    ");
    insta::assert_snapshot!(all_errors("METAR XQAB 141250Z NIL=", at), @"observation XQAB 141250Z: NIL: the station sent no observation");
}

/// Finding 7: a mistyped temperature group is named with its text and column (the
/// README's promise), not reported as missing.
#[test]
fn a_mistyped_temperature_group_is_quoted_with_its_column() {
    let r = decode(
        "XQAB 141250Z 27015KT 9999 BKN012 3O/12 Q1015",
        utc(2026, 6, 14, 13, 0),
    );
    assert!(!r.usable_for_performance());
    assert_eq!(
        r.error_lines(),
        vec![
            "observation XQAB 141250Z: temperature/dew point group '3O/12' at column 34: expected TT/DD in whole °C with M for minus, e.g. 15/08 or M02/M05"
        ]
    );
    // Other slash groups are not taken for a temperature: RVR, US fractions.
    let r = decode(
        "XQAB 141250Z 27015KT 1/2SM R26/0600 FG VV002 12/12 A2992",
        utc(2026, 6, 14, 13, 0),
    );
    assert!(r.usable_for_performance(), "{:?}", r.errors);
}

/// A dew point above the temperature cannot be (saturation vapour pressure caps it:
/// WMO No. 8, Guide to Instruments and Methods of Observation, the dew point is the
/// temperature at which the air is saturated, so at most the air's temperature): the
/// report is unusable, with the group named; equal (fog) is fine.
#[test]
fn a_dew_point_above_the_temperature_is_refused() {
    let at = utc(2026, 6, 14, 13, 30);
    let r = decode("METAR XSEA 141300Z 25016KT 9999 30/35 Q1012", at);
    let why = r.rejection().expect("refused");
    assert!(why.contains("'30/35' at column 33"), "{why}");
    assert!(
        why.contains("dew point 35 °C above the temperature 30 °C"),
        "{why}"
    );
    let r = decode("METAR XSEA 140600Z 00000KT 0200 FG VV001 12/12 Q1012", at);
    assert!(r.rejection().is_none(), "{:?}", r.rejection());
    let r = decode("METAR XSEA 140600Z 00000KT 9999 NSC M05/M03 Q1012", at);
    assert!(r.rejection().is_some(), "-3 °C dew point above -5 °C");
}
