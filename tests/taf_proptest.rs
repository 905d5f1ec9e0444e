//! Property tests for the TAF decoder and the forecast: arbitrary strings and mutations
//! of the corpus never panic (and decode stably); a TEMPO/PROB worst case is never
//! better than the prevailing conditions; the temperature curve stays within [TN, TX].
//! 800 cases each by default (`PROPTEST_CASES` overrides).

use chrono::{DateTime, Duration, TimeZone, Utc};
use proptest::prelude::*;
use rhoboard::observation::Ceiling;
use rhoboard::observation::forecast::{self, ForecastConditions};
use rhoboard::observation::taf::{self, Taf};

const CORPUS: &str = include_str!("../fixtures/taf/corpus.txt");

fn corpus() -> Vec<String> {
    taf::split_tafs(CORPUS)
        .into_iter()
        .map(|(_, t)| t)
        .collect()
}

fn cases(default: u32) -> u32 {
    std::env::var("PROPTEST_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(default)
}

fn reference() -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 7, 20, 12, 0, 0).unwrap()
}

/// Runs everything a caller might run on a TAF, at every hour of its validity.
fn exercise(t: &Taf) {
    for g in &t.groups {
        let _ = taf::describe(t, g);
        let _ = t.group_text(g);
    }
    let _ = t.error_lines();
    let _ = forecast::periods(t);
    if let (Some(a), Some(b)) = (t.valid_from, t.valid_to) {
        let mut h = a;
        while h < b {
            let _ = forecast::at(t, h, None);
            h += Duration::hours(1);
        }
    }
}

fn ceiling_ft(c: Ceiling) -> f64 {
    match c {
        Ceiling::None => f64::INFINITY,
        Ceiling::Known(ft) => ft,
        Ceiling::Unknown => f64::NEG_INFINITY,
    }
}

fn not_better(worst: &ForecastConditions, base: &ForecastConditions) -> Result<(), TestCaseError> {
    prop_assert!(worst.wind.speed_kt >= base.wind.speed_kt);
    prop_assert!(
        worst.wind.gust_kt.unwrap_or(0.0) >= base.wind.gust_kt.unwrap_or(0.0),
        "gust {:?} < {:?}",
        worst.wind.gust_kt,
        base.wind.gust_kt
    );
    prop_assert!(worst.visibility.prevailing_m <= base.visibility.prevailing_m);
    prop_assert!(ceiling_ft(worst.ceiling) <= ceiling_ft(base.ceiling));
    let (w, b) = (worst.hazards, base.hazards);
    prop_assert!(w.thunderstorm >= b.thunderstorm && w.cumulonimbus >= b.cumulonimbus);
    prop_assert!(w.fog >= b.fog && w.severe >= b.severe && w.wind_shear >= b.wind_shear);
    prop_assert!(w.freezing_precipitation >= b.freezing_precipitation);
    for x in &base.weather {
        prop_assert!(worst.weather.iter().any(|y| y.code() == x.code()));
    }
    if base.wind.variable {
        prop_assert!(worst.wind.variable);
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(cases(800)))]

    #[test]
    fn arbitrary_text_never_panics(s in "\\PC{0,300}") {
        let t = taf::decode(&s, reference());
        exercise(&t);
    }

    #[test]
    fn taf_like_tokens_never_panic(words in prop::collection::vec(
        prop_oneof![
            Just("TAF".to_string()), Just("AMD".to_string()), Just("FM".to_string()),
            Just("BECMG".to_string()), Just("TEMPO".to_string()), Just("PROB30".to_string()),
            Just("NSW".to_string()), Just("CAVOK".to_string()), Just("CNL".to_string()),
            "[0-9]{2,6}", "[0-9]{4}/[0-9]{4}", "TX[M]?[0-9]{1,2}/[0-9]{4}Z",
            "[0-9]{5}(G[0-9]{2})?KT", "WS[0-9]{3}/[0-9]{5}KT", "(FEW|BKN|OVC|VV)[0-9/]{3}(CB)?",
            "[A-Z]{4}", "[0-9]{6}Z", "FM[0-9]{6}", "[-+]?[A-Z]{2,6}", "[0-9P/]{1,4}SM",
        ],
        0..30,
    )) {
        let t = taf::decode(&words.join(" "), reference());
        exercise(&t);
    }

    #[test]
    fn mutations_of_the_corpus_never_panic(
        k in 0usize..64,
        cut in 0usize..400,
        insert in "\\PC{0,8}",
        drop in 0usize..6,
    ) {
        let c = corpus();
        let base = &c[k % c.len()];
        let mut s: String = base.clone();
        let mut at = cut.min(s.len());
        while !s.is_char_boundary(at) { at -= 1; }
        s.insert_str(at, &insert);
        let mut end = (at + insert.len() + drop).min(s.len());
        while !s.is_char_boundary(end) { end -= 1; }
        let start = (at + insert.len()).min(end);
        s.replace_range(start..end, "");
        let t = taf::decode(&s, reference());
        exercise(&t);
        // Stable: decoding its own normalised text gives the same TAF.
        if !t.text.ends_with('…') {
            prop_assert_eq!(taf::decode(&t.text, reference()), t);
        }
    }

    #[test]
    fn a_worst_case_is_never_better_than_the_prevailing(
        k in 0usize..64,
        hour in 0i64..30,
    ) {
        let c = corpus();
        let text = &c[k % c.len()];
        // Resolve each TAF near its own issue day (the corpus spans the 14th and 30th/31st).
        let day: u32 = text.split_whitespace().find(|w| w.ends_with('Z') && w.len() == 7)
            .and_then(|w| w[..2].parse().ok()).unwrap_or(14);
        let r = Utc.with_ymd_and_hms(2026, 7, day.clamp(1, 31), 12, 0, 0).unwrap();
        let t = taf::decode(text, r);
        if let Some(a) = t.valid_from
            && let Some(o) = forecast::at(&t, a + Duration::hours(hour), None)
            && let Some(w) = &o.worst
        {
            prop_assert!(w.worst_case);
            not_better(w, &o.prevailing)?;
        }
    }

    #[test]
    fn the_temperature_curve_stays_within_tn_and_tx(
        tn in -30i32..30,
        swing in 0i32..25,
        tn_hour in 0u32..24,
        tx_hour in 0u32..24,
        minutes in 0i64..(36 * 60),
    ) {
        let tx = tn + swing;
        let fmt = |v: i32| if v < 0 { format!("M{:02}", -v) } else { format!("{v:02}") };
        let tn_day = if tn_hour >= 6 { 14 } else { 15 };
        let tx_day = if tx_hour >= 6 { 14 } else { 15 };
        let text = format!(
            "TAF XQAB 140500Z 1406/1512 27010KT 9999 SCT030 TX{}/{tx_day}{tx_hour:02}Z TN{}/{tn_day}{tn_hour:02}Z",
            fmt(tx), fmt(tn)
        );
        let t = taf::decode(&text, Utc.with_ymd_and_hms(2026, 6, 14, 5, 0, 0).unwrap());
        prop_assert!(t.usable(), "{text}: {:?}", t.errors);
        let at = Utc.with_ymd_and_hms(2026, 6, 14, 6, 0, 0).unwrap() + Duration::minutes(minutes);
        let e = forecast::temperature_at(Some(&t), None, at);
        let v = e.temperature_c.unwrap();
        prop_assert!(v >= f64::from(tn) - 1e-9 && v <= f64::from(tx) + 1e-9, "{text} at {at}: {v}");
    }
}
