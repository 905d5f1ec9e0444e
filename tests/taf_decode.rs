//! TAF examples printed in government handbooks, decoded as the handbook explains
//! them (all "from memory": the texts and readings were recalled, not copied), plus
//! the decoder's error and tolerance rules. Handbook examples keep their real station
//! ids here only.

use chrono::{DateTime, TimeZone, Utc};
use rhoboard::observation::taf::{self, ChangeKind, Extreme, TafError, TafGroupName};
use rhoboard::observation::{Bound, Ceiling, Convective, Cover};

fn utc(y: i32, mo: u32, d: u32, h: u32, mi: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(y, mo, d, h, mi, 0).unwrap()
}

#[test]
fn faa_aim_chapter_7_taf_key_example() {
    // FAA Aeronautical Information Manual, chapter 7 (TAF key figure), from memory.
    let text = "TAF
KPIT 091730Z 0918/1024 15005KT 5SM HZ FEW020 WS010/31022KT
FM091930 30015G25KT 3SM SHRA OVC015
TEMPO 0920/0922 1/2SM +TSRA OVC008CB
FM100100 27008KT 5SM SHRA BKN020 OVC040
PROB30 1004/1007 1SM -RA BR
FM101015 18005KT 6SM -SHRA OVC020
BECMG 1013/1015 P6SM NSW SKC";
    let t = taf::decode(text, utc(2026, 6, 9, 17, 0));
    assert!(t.usable(), "{:?} {:?}", t.errors, t.not_understood);
    assert!(t.not_understood.is_empty(), "{:?}", t.not_understood);
    assert_eq!(t.station, "KPIT");
    // "issued on the 9th at 1730Z", "valid from the 9th at 18Z to the 10th at 24Z".
    assert_eq!(t.issued_at, Some(utc(2026, 6, 9, 17, 30)));
    assert_eq!(t.valid_from, Some(utc(2026, 6, 9, 18, 0)));
    assert_eq!(t.valid_to, Some(utc(2026, 6, 11, 0, 0)));
    // "wind 150° at 5 knots, visibility 5 statute miles in haze, few clouds at 2,000 ft,
    // wind shear at 1,000 ft, wind 310° at 22 knots".
    let w = t.base.wind.unwrap();
    assert_eq!((w.direction_deg, w.speed_kt), (Some(150.0), 5.0));
    assert_eq!(t.base.visibility.unwrap().reported_sm, Some(5.0));
    assert_eq!(t.base.weather[0].code(), "HZ");
    assert_eq!(t.base.clouds[0].cover, Cover::Few);
    assert_eq!(t.base.clouds[0].base_ft, Some(2000.0));
    let ws = t.base.wind_shear.unwrap();
    assert_eq!(
        (ws.height_ft, ws.direction_deg, ws.speed_kt),
        (1000.0, 310.0, 22.0)
    );
    assert_eq!(t.changes.len(), 6);
    let kinds: Vec<ChangeKind> = t.changes.iter().map(|c| c.kind).collect();
    assert_eq!(
        kinds,
        [
            ChangeKind::From,
            ChangeKind::Tempo,
            ChangeKind::From,
            ChangeKind::Probability { percent: 30 },
            ChangeKind::From,
            ChangeKind::Becoming
        ]
    );
    // "from 1930Z: wind 300° at 15 gusting 25, 3 SM in rain showers, overcast 1,500 ft".
    let fm = &t.changes[0];
    assert_eq!(fm.from, utc(2026, 6, 9, 19, 30));
    assert_eq!(
        fm.to,
        utc(2026, 6, 10, 1, 0),
        "an FM lasts until the next FM"
    );
    assert_eq!(fm.conditions.wind.unwrap().gust_kt, Some(25.0));
    assert_eq!(
        fm.conditions.ceiling_and_hazards().0,
        Ceiling::Known(1500.0)
    );
    // "temporarily between 20Z and 22Z: 1/2 SM, heavy thunderstorm with rain, overcast
    // 800 ft cumulonimbus".
    let tempo = &t.changes[1];
    assert_eq!(
        (tempo.from, tempo.to),
        (utc(2026, 6, 9, 20, 0), utc(2026, 6, 9, 22, 0))
    );
    assert_eq!(tempo.conditions.visibility.unwrap().reported_sm, Some(0.5));
    assert_eq!(tempo.conditions.weather[0].code(), "+TSRA");
    assert_eq!(tempo.conditions.clouds[0].convective, Some(Convective::Cb));
    let (_, h) = tempo.conditions.ceiling_and_hazards();
    assert!(h.thunderstorm && h.cumulonimbus);
    // "30 % probability between 04Z and 07Z of 1 SM light rain and mist".
    let prob = &t.changes[3];
    assert_eq!(
        (prob.from, prob.to),
        (utc(2026, 6, 10, 4, 0), utc(2026, 6, 10, 7, 0))
    );
    // "from 1015Z on the 10th".
    assert_eq!(t.changes[4].from, utc(2026, 6, 10, 10, 15));
    // "becoming between 13Z and 15Z: more than 6 SM, no significant weather, sky clear".
    let b = &t.changes[5].conditions;
    assert_eq!(b.visibility.unwrap().bound, Bound::AtLeast);
    assert!(b.no_significant_weather);
    assert_eq!(b.ceiling_and_hazards().0, Ceiling::None);
}

#[test]
fn faa_ac_00_45_taf_example() {
    // FAA Advisory Circular 00-45, Aviation Weather Services, TAF section, from memory.
    let text = "TAF KOKC 051130Z 0512/0618 14008KT 5SM BR BKN030 TEMPO 0513/0516 1 1/2SM BR \
                FM051600 16010KT P6SM SKC BECMG 0522/0524 20013G20KT 4SM SHRA OVC020 \
                PROB40 0600/0606 2SM TSRA OVC008CB";
    let t = taf::decode(text, utc(2026, 6, 5, 11, 0));
    assert!(t.usable(), "{:?}", t.errors);
    assert!(t.not_understood.is_empty(), "{:?}", t.not_understood);
    assert_eq!(t.valid_to, Some(utc(2026, 6, 6, 18, 0)));
    assert_eq!(t.base.ceiling_and_hazards().0, Ceiling::Known(3000.0));
    assert_eq!(
        t.changes[0].conditions.visibility.unwrap().reported_sm,
        Some(1.5)
    );
    assert_eq!(t.changes[1].from, utc(2026, 6, 5, 16, 0));
    assert_eq!(
        t.changes[1].conditions.sky_clear,
        Some(rhoboard::observation::SkyClear::Skc)
    );
    assert_eq!(t.changes[2].kind, ChangeKind::Becoming);
    assert_eq!(t.changes[3].kind, ChangeKind::Probability { percent: 40 });
    assert_eq!(t.changes[3].to, utc(2026, 6, 6, 6, 0));
}

#[test]
fn icao_annex_3_and_wmo_306_examples() {
    // ICAO Annex 3, Appendix 5 example TAF (the fictional YUDO), from memory.
    let text = "TAF YUDO 160000Z 1606/1624 13018KT 9000 BKN020 BECMG 1608/1610 SCT015CB BKN020 \
                TEMPO 1611/1612 17025G40KT 1000 TSRA SCT010CB BKN020 FM161230 15015KT 9999 BKN020";
    let t = taf::decode(text, utc(2026, 6, 16, 0, 0));
    assert!(t.usable(), "{:?}", t.errors);
    assert!(t.not_understood.is_empty());
    // "valid 06 to 24 UTC on the 16th".
    assert_eq!(t.valid_to, Some(utc(2026, 6, 17, 0, 0)));
    assert_eq!(t.base.visibility.unwrap().prevailing_m, 9000.0);
    assert_eq!(t.changes[1].conditions.wind.unwrap().gust_kt, Some(40.0));
    assert_eq!(t.changes[2].from, utc(2026, 6, 16, 12, 30));
    // Annex 3 cancellation example: "TAF AMD YUDO 161500Z 1606/1624 CNL".
    let c = taf::decode(
        "TAF AMD YUDO 161500Z 1606/1624 CNL",
        utc(2026, 6, 16, 15, 0),
    );
    assert!(c.amended && c.cancelled && !c.usable());
    assert_eq!(c.errors, [TafError::Cancelled]);
    // WMO No. 306 FM 51 temperature groups: TX and TN with day and hour, M for minus.
    let t = taf::decode(
        "TAF YUDO 100500Z 1006/1106 24010KT CAVOK TX25/1013Z TNM02/1105Z",
        utc(2026, 1, 10, 5, 0),
    );
    assert!(t.usable(), "{:?}", t.errors);
    assert!(t.base.cavok);
    let tx = t.max_temperature().unwrap();
    let tn = t.min_temperature().unwrap();
    assert_eq!(
        (tx.extreme, tx.temperature_c, tx.at),
        (Extreme::Max, 25.0, utc(2026, 1, 10, 13, 0))
    );
    assert_eq!((tn.temperature_c, tn.at), (-2.0, utc(2026, 1, 11, 5, 0)));
    // NIL.
    let n = taf::decode("TAF YUDO 160000Z NIL", utc(2026, 6, 16, 0, 0));
    assert!(n.nil && n.errors == [TafError::Nil]);
}

#[test]
fn month_and_year_rollover() {
    let t = taf::decode(
        "TAF XQAB 311730Z 3118/0124 27010KT 9999 SCT030 FM010300 30012KT 9999 BKN040 TEMPO 0106/0109 4000 SHRA",
        utc(2026, 12, 31, 17, 0),
    );
    assert!(t.usable(), "{:?}", t.errors);
    assert_eq!(t.valid_from, Some(utc(2026, 12, 31, 18, 0)));
    assert_eq!(t.valid_to, Some(utc(2027, 1, 2, 0, 0)));
    assert_eq!(t.changes[0].from, utc(2027, 1, 1, 3, 0));
    assert_eq!(t.changes[1].to, utc(2027, 1, 1, 9, 0));
    // A 24 end hour on the last day of a 30-day month.
    let t = taf::decode(
        "TAF XQAB 300500Z 3006/3024 VRB03KT P6SM SKC",
        utc(2026, 6, 30, 5, 0),
    );
    assert_eq!(t.valid_to, Some(utc(2026, 7, 1, 0, 0)));
}

#[test]
fn malformed_needed_groups_name_the_group_text_and_column() {
    let r = utc(2026, 6, 14, 5, 0);
    let t = taf::decode("TAF XQAB 140500Z 1406/1506 2701KT 9999 SCT030", r);
    assert!(!t.usable());
    insta::assert_snapshot!(t.error_lines().join("\n"), @"forecast XQAB 140500Z: wind group '2701KT' at column 28: expected 2 or 3 digits of speed after the direction, found '1'");
    let t = taf::decode("TAF XQAB 140500Z 1406/1406 27010KT 9999 SCT030", r);
    insta::assert_snapshot!(t.error_lines().join("\n"), @"forecast XQAB 140500Z: validity group '1406/1406' at column 18: the period ends before it starts");
    let t = taf::decode(
        "TAF XQAB 140500Z 1406/1506 27010KT 9999 SCT030 TEMPO 1414 4000",
        r,
    );
    assert_eq!(t.errors.len(), 1);
    assert!(matches!(
        &t.errors[0],
        TafError::Malformed {
            group: TafGroupName::ChangeTime,
            column: 48,
            ..
        }
    ));
    let t = taf::decode("TAF XQAB 140500Z 1406/1506 27010KT 9999 BKN03", r);
    insta::assert_snapshot!(t.error_lines().join("\n"), @"forecast XQAB 140500Z: cloud group 'BKN03' at column 41: expected 3 digits of height in hundreds of feet (or ///), e.g. BKN012");
    let t = taf::decode("TAF XQAB 140500Z 1406/1506 27010KT SCT030", r);
    insta::assert_snapshot!(t.error_lines().join("\n"), @"forecast XQAB 140500Z: visibility group missing in the base forecast (expected e.g. 9999, 6000 or P6SM)");
    let t = taf::decode(
        "TAF XQAB 140500Z 1406/1506 27010KT 9999 SCT030 FM141800 30010KT 9999 SCT040 TEMPO 1520/1522 4000",
        r,
    );
    assert!(
        t.error_lines()[0].contains("not within the validity"),
        "{:?}",
        t.errors
    );
    let t = taf::decode(
        "TAF XQAB 140500Z 1406/1506 27010KT 9999 SCT030 TX3X/1415Z",
        r,
    );
    assert!(matches!(
        &t.errors[0],
        TafError::Malformed {
            group: TafGroupName::Temperature,
            ..
        }
    ));
}

#[test]
fn unknown_groups_are_kept_with_their_column() {
    let t = taf::decode(
        "TAF XQAB 140500Z 1406/1506 27010KT 9999 SCT030 QNH2992INS INTER 1410/1412 4000",
        utc(2026, 6, 14, 5, 0),
    );
    assert!(t.usable(), "{:?}", t.errors);
    let cols: Vec<(String, usize)> = t
        .not_understood
        .iter()
        .map(|n| (n.group.clone(), n.column))
        .collect();
    assert_eq!(cols[0], ("QNH2992INS".to_string(), 48));
    assert_eq!(cols[1].0, "INTER");
    assert!(
        taf::decode("hello world", utc(2026, 6, 14, 5, 0)).errors[0]
            .to_string()
            .starts_with("not a TAF")
    );
}

#[test]
fn split_reads_multi_line_tafs() {
    let text = "# forecasts\nTAF XQAB 140500Z 1406/1506 27010KT 9999 SCT030\n  FM141200 30012KT 9999 SCT040=\nTAF XHA1 140500Z 1406/1506 VRB02KT CAVOK\nBECMG 1410/1412 24010KT\n\nXBOV 140500Z 1406/1506 00000KT CAVOK=\n";
    let v = taf::split_tafs(text);
    assert_eq!(v.len(), 3);
    assert_eq!(v[0].0, 2);
    assert!(v[1].1.ends_with("24010KT"));
    assert!(v[2].1.starts_with("XBOV"));
}

/// Finding 8: the issue day of a TAF read on the 1st of a month that is later than the
/// 1st is the previous month (November has 30 days), while its validity, which may run
/// into the reading day, is resolved from the issue.
#[test]
fn a_taf_issued_on_the_last_day_of_last_month_resolves_there() {
    let t = taf::decode(
        "TAF XQAB 301700Z 3018/0118 27010KT 9999 SCT030",
        utc(2026, 12, 1, 9, 0),
    );
    assert!(t.usable(), "{:?}", t.errors);
    assert_eq!(t.issued_at, Some(utc(2026, 11, 30, 17, 0)));
    assert_eq!(t.valid_from, Some(utc(2026, 11, 30, 18, 0)));
    assert_eq!(t.valid_to, Some(utc(2026, 12, 1, 18, 0)));
    // Across the year end: issued 31 December, read on 1 January.
    let t = taf::decode(
        "TAF XQAB 312300Z 0100/0124 27010KT 9999 SCT030",
        utc(2027, 1, 1, 6, 0),
    );
    assert_eq!(t.issued_at, Some(utc(2026, 12, 31, 23, 0)));
    assert_eq!(t.valid_from, Some(utc(2027, 1, 1, 0, 0)));
    assert_eq!(t.valid_to, Some(utc(2027, 1, 2, 0, 0)));
}
