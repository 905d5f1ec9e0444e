//! Forecast conditions at a time: FM replaces, BECMG transitions (worse of before and
//! after during the period), TEMPO/PROB as a flagged worst case, nothing outside the
//! validity; the temperature curve; and the demo day's TAFs against its METARs.

use chrono::{DateTime, TimeZone, Utc};
use rhoboard::observation::forecast::{self, ExpectedHigh};
use rhoboard::observation::taf::{self, Taf};
use rhoboard::observation::{Ceiling, Kind, decode_all};
use rhoboard::ops::demo;

fn utc(d: u32, h: u32, mi: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, d, h, mi, 0).unwrap()
}

fn sample() -> Taf {
    taf::decode(
        "TAF XQAB 140500Z 1406/1506 23008KT 9999 FEW030 TX30/1415Z TN12/1406Z \
         BECMG 1409/1411 25015KT 6000 BKN020 \
         FM141200 31012KT 9999 SCT040 \
         TEMPO 1414/1416 31018G30KT 3000 TSRA BKN015CB \
         PROB30 1418/1420 0800 FG VV002",
        utc(14, 5, 0),
    )
}

#[test]
fn outside_validity_there_is_no_forecast() {
    let t = sample();
    assert!(t.usable(), "{:?}", t.errors);
    assert!(forecast::at(&t, utc(14, 5, 59), None).is_none());
    assert!(forecast::at(&t, utc(15, 6, 0), None).is_none());
    assert!(forecast::at(&t, utc(14, 6, 0), None).is_some());
}

#[test]
fn becmg_takes_the_worse_of_before_and_after_during_its_period() {
    let t = sample();
    let before = forecast::at(&t, utc(14, 8, 0), None).unwrap().prevailing;
    assert_eq!(before.wind.speed_kt, 8.0);
    assert_eq!(before.ceiling, Ceiling::None);
    let during = forecast::at(&t, utc(14, 10, 0), None).unwrap();
    assert!(during.worst.is_none());
    let p = during.prevailing;
    assert!(!p.worst_case);
    assert_eq!(p.wind.speed_kt, 15.0);
    assert_eq!(p.visibility.prevailing_m, 6000.0);
    assert_eq!(p.ceiling, Ceiling::Known(2000.0));
    // Direction changes from 230° to 250°: the sector covers both.
    assert_eq!(
        (p.wind.variable_from_deg, p.wind.variable_to_deg),
        (Some(230.0), Some(250.0))
    );
    assert!(
        p.basis.contains("BECMG 1409/1411 (in transition)"),
        "{}",
        p.basis
    );
    let after = forecast::at(&t, utc(14, 11, 0), None).unwrap().prevailing;
    assert_eq!(after.wind.direction_deg, Some(250.0));
    assert_eq!(after.wind.variable_from_deg, None);
}

#[test]
fn fm_replaces_and_tempo_is_a_flagged_worst_case() {
    let t = sample();
    let o = forecast::at(&t, utc(14, 12, 0), None).unwrap();
    assert_eq!(o.prevailing.wind.direction_deg, Some(310.0));
    assert_eq!(o.prevailing.ceiling, Ceiling::None, "FM drops the BKN020");
    assert!(o.worst.is_none());
    let o = forecast::at(&t, utc(14, 15, 0), None).unwrap();
    assert_eq!(o.prevailing.visibility.prevailing_m, 10_000.0);
    let w = o.worst.as_ref().unwrap();
    assert!(w.worst_case);
    assert_eq!(w.wind.gust_kt, Some(30.0));
    assert_eq!(w.visibility.prevailing_m, 3000.0);
    assert_eq!(w.ceiling, Ceiling::Known(1500.0));
    assert!(w.hazards.thunderstorm && w.hazards.cumulonimbus);
    assert!(
        w.basis.ends_with("TEMPO 1414/1416 (worst case)"),
        "{}",
        w.basis
    );
    // PROB30 alone is a worst case too.
    let o = forecast::at(&t, utc(14, 19, 0), None).unwrap();
    let w = o.worst.unwrap();
    assert_eq!(w.ceiling, Ceiling::Known(200.0));
    assert!(w.hazards.fog);
    assert!(!o.prevailing.hazards.fog);
}

#[test]
fn temperature_curve_from_tx_tn() {
    let t = sample();
    let at = |h| forecast::temperature_at(Some(&t), None, utc(14, h, 0));
    assert_eq!(at(6).temperature_c, Some(12.0));
    assert_eq!(at(15).temperature_c, Some(30.0));
    // Quarter-sine rise: at 2/3 of the way, sin(π/3) = 0.866 of the warming.
    let v = at(12).temperature_c.unwrap();
    assert!((v - (12.0 + 18.0 * 0.866_025)).abs() < 1e-3, "{v}");
    // Falling after the maximum, never below TN.
    assert!(at(18).temperature_c.unwrap() < 30.0);
    for (_, e) in forecast::hourly_temperatures(Some(&t), None, utc(14, 6, 0), utc(15, 6, 0)) {
        let v = e.temperature_c.unwrap();
        assert!((12.0..=30.0).contains(&v));
    }
    let o = forecast::at(&t, utc(14, 15, 0), None).unwrap();
    assert_eq!(o.prevailing.temperature_c, Some(30.0));
    assert_eq!(o.worst.unwrap().temperature_c, Some(30.0));
}

#[test]
fn without_tx_tn_the_expected_high_or_no_temperature_forecast() {
    let us = taf::decode(
        "TAF XHA1 141130Z 1412/1512 18010KT P6SM SCT050",
        utc(14, 11, 0),
    );
    assert!(us.usable());
    let none = forecast::temperature_at(Some(&us), None, utc(14, 15, 0));
    assert_eq!(none.temperature_c, None);
    assert!(
        none.basis.starts_with("no temperature forecast"),
        "{}",
        none.basis
    );
    assert_eq!(
        forecast::at(&us, utc(14, 15, 0), None)
            .unwrap()
            .prevailing
            .temperature_c,
        None
    );
    let e = ExpectedHigh {
        high_c: 34.0,
        high_at: utc(14, 16, 0),
        observed_c: 22.0,
        observed_at: utc(14, 12, 0),
    };
    let at = |h| {
        forecast::temperature_at(Some(&us), Some(&e), utc(14, h, 0))
            .temperature_c
            .unwrap()
    };
    assert_eq!(at(11), 22.0);
    assert_eq!(at(12), 22.0);
    assert_eq!(at(16), 34.0);
    assert!(at(14) > 22.0 && at(14) < 34.0);
    // Mirror after the high: 18Z is as warm as 14Z.
    assert!((at(18) - at(14)).abs() < 1e-9);
    assert_eq!(at(23), 22.0);
}

#[test]
fn the_synthetic_report_carries_the_forecast_values() {
    let t = sample();
    let o = forecast::at(&t, utc(14, 15, 0), None).unwrap();
    let w = o.worst.unwrap();
    let r = w.to_report("XQAB");
    assert_eq!(r.station, "XQAB");
    assert_eq!(r.kind, None::<Kind>);
    assert_eq!(r.observed_at, Some(utc(14, 15, 0)));
    assert_eq!(r.wind.unwrap().gust_kt, Some(30.0));
    assert_eq!(r.ceiling, Ceiling::Known(1500.0));
    assert!(r.hazards.thunderstorm);
    assert_eq!(r.temperature_c, Some(30.0));
    assert!(r.altimeter_hpa.is_none() && r.dewpoint_c.is_none());
}

#[test]
fn select_prefers_the_latest_issue_and_respects_cancellation() {
    let r = utc(14, 5, 0);
    let first = taf::decode("TAF XQAB 140500Z 1406/1506 23008KT 9999 FEW030", r);
    let amd = taf::decode("TAF AMD XQAB 140900Z 1409/1506 27015KT 9999 SCT030", r);
    let tafs = vec![first, amd];
    let at = utc(14, 12, 0);
    assert_eq!(
        taf::select(&tafs, "XQAB", at, utc(14, 8, 0))
            .unwrap()
            .issued_at,
        Some(utc(14, 5, 0))
    );
    assert!(
        taf::select(&tafs, "XQAB", at, utc(14, 10, 0))
            .unwrap()
            .amended
    );
    assert!(taf::select(&tafs, "XHA1", at, utc(14, 10, 0)).is_none());
    let mut with_cnl = tafs.clone();
    with_cnl.push(taf::decode("TAF AMD XQAB 141000Z 1409/1506 CNL", r));
    assert!(taf::select(&with_cnl, "XQAB", at, utc(14, 11, 0)).is_none());
}

#[test]
fn demo_tafs_cover_every_airfield_and_agree_with_the_observed_day() {
    let ops = demo::load().ops.unwrap();
    let reference = utc(14, 5, 0);
    let tafs = taf::from_files(&ops.observations, reference);
    assert_eq!(tafs.len(), ops.airfields.len());
    let metars: Vec<_> = ops
        .observations
        .iter()
        .filter(|(p, _)| p.starts_with("observations/"))
        .flat_map(|(_, text)| decode_all(text, reference))
        .map(|f| f.report)
        .collect();
    assert!(!metars.is_empty());
    for t in &tafs {
        assert!(t.usable(), "{}: {:?}", t.station, t.errors);
        assert!(t.not_understood.is_empty(), "{:?}", t.not_understood);
        assert_eq!(t.valid_from, Some(utc(14, 6, 0)));
        assert_eq!(t.valid_to, Some(utc(15, 6, 0)));
        for m in metars.iter().filter(|m| m.station == t.station) {
            let at = m.observed_at.unwrap();
            let o = forecast::at(t, at, None).unwrap();
            let f = o.worst_or_prevailing();
            // The TX/TN curve is never more than 1 °C colder than observed (warmer errs
            // towards caution; the evening fall is slower than the demo day's).
            let (tf, to) = (f.temperature_c.unwrap(), m.temperature_c.unwrap());
            assert!(
                (-1.0..=3.0).contains(&(tf - to)),
                "{} {at}: forecast {tf:.1}, observed {to:.1}",
                t.station
            );
            // Wind: the forecast (worst case where flagged) covers the observed speed and gust.
            let w = m.wind.unwrap();
            let fw = f
                .wind
                .gust_kt
                .unwrap_or(f.wind.speed_kt)
                .max(f.wind.speed_kt);
            assert!(
                fw + 4.0 >= w.gust_kt.unwrap_or(w.speed_kt),
                "{} {at}: {fw} vs {w:?}",
                t.station
            );
            // Thunderstorm/CB hazards observed are forecast.
            if m.hazards.cumulonimbus {
                assert!(f.hazards.cumulonimbus, "{} {at}", t.station);
            }
        }
    }
    // The TX is the observed maximum (where the 15Z report exists).
    for t in &tafs {
        let reports: Vec<_> = metars.iter().filter(|m| m.station == t.station).collect();
        if !reports
            .iter()
            .any(|m| m.observed_at == Some(utc(14, 15, 0)))
        {
            continue;
        }
        let max_obs = reports
            .iter()
            .filter_map(|m| m.temperature_c)
            .fold(f64::MIN, f64::max);
        assert!((t.max_temperature().unwrap().temperature_c - max_obs).abs() <= 1.0);
    }
}
