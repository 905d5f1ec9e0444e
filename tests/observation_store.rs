//! The store's answers do not depend on the order reports arrive in.

use chrono::{TimeDelta, TimeZone, Utc};
use proptest::prelude::*;
use rhoboard::observation::{Report, Store, decode_all};

fn day() -> Vec<Report> {
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    decode_all(include_str!("../fixtures/metar/day.txt"), reference)
        .into_iter()
        .map(|f| f.report)
        .collect()
}

fn answers(store: &Store) -> Vec<Option<(String, bool)>> {
    let start = Utc.with_ymd_and_hms(2026, 6, 14, 5, 0, 0).unwrap();
    let mut out = Vec::new();
    for station in ["XQAB", "XHA1", "XZZZ"] {
        for step in 0..100 {
            let at = start + TimeDelta::minutes(10 * step);
            out.push(
                store
                    .valid_at(station, at)
                    .map(|v| (v.report.text.clone(), v.stale)),
            );
        }
    }
    out
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 200, failure_persistence: None, ..ProptestConfig::default() })]

    #[test]
    fn arrival_order_does_not_matter(order in Just((0..29usize).collect::<Vec<_>>()).prop_shuffle()) {
        let reports = day();
        prop_assert_eq!(reports.len(), 29);
        let mut in_order = Store::default();
        for r in reports.iter().cloned() {
            in_order.insert(r);
        }
        let mut shuffled = Store::default();
        for &k in &order {
            shuffled.insert(reports[k].clone());
        }
        prop_assert_eq!(answers(&in_order), answers(&shuffled));
        prop_assert_eq!(in_order.len(), shuffled.len());
        for station in ["XQAB", "XHA1"] {
            let times: Vec<_> = shuffled.reports(station).map(|r| r.observed_at).collect();
            prop_assert!(times.windows(2).all(|w| w[0] < w[1]), "reports() not in time order");
        }
    }
}
