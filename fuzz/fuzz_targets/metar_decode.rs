//! Coverage-guided fuzzing of the METAR decoder and the observation-file splitter:
//! any bytes, no panic, and the decode is stable on its own normalised text.
#![no_main]

use chrono::{TimeZone, Utc};
use libfuzzer_sys::fuzz_target;
use rhoboard::observation::{Store, decode, split_reports};

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let mut store = Store::default();
    for (_, report_text) in split_reports(&text) {
        let r = decode(&report_text, reference);
        let _ = r.error_lines();
        for g in &r.groups {
            let _ = rhoboard::observation::describe(&r, g);
        }
        if !r.text.ends_with('…') {
            assert_eq!(decode(&r.text, reference), r, "decode not stable");
        }
        let _ = store.insert(r);
    }
});
