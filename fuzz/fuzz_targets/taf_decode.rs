//! Coverage-guided fuzzing of the TAF decoder, the forecasts-file splitter and the
//! forecast at every hour of the validity: any bytes, no panic.
#![no_main]

use chrono::{Duration, TimeZone, Utc};
use libfuzzer_sys::fuzz_target;
use rhoboard::observation::{forecast, taf};

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 5, 0, 0).unwrap();
    for (_, t) in taf::split_tafs(&text) {
        let t = taf::decode(&t, reference);
        let _ = t.error_lines();
        for g in &t.groups {
            let _ = taf::describe(&t, g);
        }
        if let (Some(a), Some(b)) = (t.valid_from, t.valid_to) {
            let mut h = a;
            while h < b {
                let _ = forecast::at(&t, h, None);
                h += Duration::hours(1);
            }
        }
    }
});
