//! All observations per station, in time order.
//!
//! A newer report becomes current; a correction (`COR`) replaces the report it corrects
//! (same station and time); exact duplicates are ignored; arrival order does not matter.
//! Unusable reports are not stored as observations: the last good report stays valid,
//! and the rejection is kept per station for display.

use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hash, Hasher};

use chrono::{DateTime, TimeDelta, Utc};

use super::Report;

/// Default age after which a report is stale (DESIGN.md, assessment step 8).
pub const DEFAULT_STALE_AFTER: TimeDelta = TimeDelta::minutes(75);

/// What [`Store::insert`] did with a report.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Insert {
    /// Stored; `current` when it is now the latest report of its station.
    Added {
        /// Whether it is the station's latest report.
        current: bool,
    },
    /// Replaced the report of the same station and time (a correction, or a resend).
    Replaced,
    /// The same report was already stored.
    Duplicate,
    /// An uncorrected report arrived for a time that already has a correction; kept the correction.
    KeptCorrection,
    /// Unusable for performance: not stored; the one-line reason.
    Rejected(String),
}

/// The report valid at an instant, with its age.
#[derive(Debug, Clone, Copy)]
pub struct Valid<'a> {
    /// The latest report at or before the instant.
    pub report: &'a Report,
    /// The instant minus the observation time.
    pub age: TimeDelta,
    /// Older than the store's stale age.
    pub stale: bool,
}

#[derive(Debug, Clone, Default)]
struct Station {
    /// Observation time and index into `reports`, sorted by time, one entry per time.
    /// Small entries keep an out-of-order insert and the lookup cheap.
    index: Vec<(DateTime<Utc>, u32)>,
    /// Reports in arrival order (a replacement overwrites in place).
    reports: Vec<Report>,
    /// Boxed: rarely present, and the stations' table stays small in the cache.
    last_rejected: Option<Box<Report>>,
}

impl Station {
    fn at(&self, k: usize) -> Option<&Report> {
        let &(_, i) = self.index.get(k)?;
        self.reports.get(i as usize)
    }
}

/// A station identifier as the store's key: up to 16 bytes kept inline, so a look-up
/// compares it in the table itself instead of following a pointer to the text (one
/// cache miss less per look-up); longer ones on the heap.
#[derive(Debug, Clone, PartialEq, Eq)]
enum Key {
    Short { len: u8, bytes: [u8; 16] },
    Long(Box<str>),
}

impl Key {
    /// The key of `station` (allocating only for an identifier over 16 bytes).
    fn of(station: &str) -> Key {
        let b = station.as_bytes();
        if b.len() <= 16 {
            let mut bytes = [0u8; 16];
            bytes[..b.len()].copy_from_slice(b);
            Key::Short {
                len: b.len() as u8,
                bytes,
            }
        } else {
            Key::Long(station.into())
        }
    }

    fn as_str(&self) -> &str {
        match self {
            // The bytes are a whole `str`'s, so this never fails.
            Key::Short { len, bytes } => std::str::from_utf8(&bytes[..*len as usize]).unwrap_or(""),
            Key::Long(s) => s,
        }
    }
}

impl Hash for Key {
    fn hash<H: Hasher>(&self, h: &mut H) {
        match self {
            Key::Short { len, bytes } => {
                let (lo, hi) = bytes.split_at(8);
                h.write_u64(u64::from_le_bytes(lo.try_into().unwrap_or_default()));
                h.write_u64(u64::from_le_bytes(hi.try_into().unwrap_or_default()));
                h.write_u8(*len);
            }
            Key::Long(s) => s.hash(h),
        }
    }
}

/// A multiply-rotate hash of a few words (the station keys are short, and the ids are
/// the operator's own, so the default hasher's flooding resistance buys nothing here).
#[derive(Default)]
struct WordHasher(u64);

impl Hasher for WordHasher {
    fn finish(&self) -> u64 {
        self.0
    }

    fn write(&mut self, bytes: &[u8]) {
        for chunk in bytes.chunks(8) {
            let mut word = [0u8; 8];
            word[..chunk.len()].copy_from_slice(chunk);
            self.write_u64(u64::from_le_bytes(word));
        }
    }

    fn write_u8(&mut self, i: u8) {
        self.write_u64(u64::from(i));
    }

    fn write_u64(&mut self, i: u64) {
        // The multiplier is the 64-bit golden-ratio constant (common practice).
        self.0 = (self.0.rotate_left(5) ^ i).wrapping_mul(0x9e37_79b9_7f4a_7c15);
    }
}

/// Observations per station.
#[derive(Debug, Clone)]
pub struct Store {
    stations: HashMap<Key, Station, BuildHasherDefault<WordHasher>>,
    stale_after: TimeDelta,
}

impl Default for Store {
    fn default() -> Self {
        Self::new(DEFAULT_STALE_AFTER)
    }
}

impl Store {
    /// An empty store; reports older than `stale_after` at the instant asked are stale.
    pub fn new(stale_after: TimeDelta) -> Self {
        Self {
            stations: HashMap::default(),
            stale_after,
        }
    }

    /// The stale age this store applies.
    pub fn stale_after(&self) -> TimeDelta {
        self.stale_after
    }

    /// Adds a report (see the module notes for the rules).
    pub fn insert(&mut self, report: Report) -> Insert {
        let Some(at) = report
            .observed_at
            .filter(|_| report.usable_for_performance())
        else {
            let reason = report
                .rejection()
                .unwrap_or_else(|| format!("{}: not usable", report.label()));
            if !report.station.is_empty() {
                let key = Key::of(&report.station);
                self.stations.entry(key).or_default().last_rejected = Some(Box::new(report));
            }
            return Insert::Rejected(reason);
        };
        let st = self.stations.entry(Key::of(&report.station)).or_default();
        let idx = st.index.partition_point(|(t, _)| *t < at);
        if let Some(&(t, slot)) = st.index.get(idx)
            && t == at
        {
            let Some(old) = st.reports.get_mut(slot as usize) else {
                return Insert::Duplicate;
            };
            if same_report(&old.text, &report.text) {
                return Insert::Duplicate;
            }
            if old.corrected && !report.corrected {
                return Insert::KeptCorrection;
            }
            *old = report;
            return Insert::Replaced;
        }
        let Ok(slot) = u32::try_from(st.reports.len()) else {
            return Insert::Rejected(format!(
                "{}: too many reports for one station",
                report.label()
            ));
        };
        let current = idx == st.index.len();
        st.index.insert(idx, (at, slot));
        st.reports.push(report);
        Insert::Added { current }
    }

    /// The report valid for `station` at `at`: the latest observed at or before it.
    pub fn valid_at(&self, station: &str, at: DateTime<Utc>) -> Option<Valid<'_>> {
        let st = self.stations.get(&Key::of(station))?;
        let k = st.index.partition_point(|(t, _)| *t <= at).checked_sub(1)?;
        let &(observed, _) = st.index.get(k)?;
        let report = st.at(k)?;
        let age = at - observed;
        Some(Valid {
            report,
            age,
            stale: age > self.stale_after,
        })
    }

    /// The latest report of `station`, whatever its time.
    pub fn current(&self, station: &str) -> Option<&Report> {
        let st = self.stations.get(&Key::of(station))?;
        st.at(st.index.len().checked_sub(1)?)
    }

    /// Every stored report of `station`, oldest first.
    pub fn reports<'a>(&'a self, station: &str) -> impl Iterator<Item = &'a Report> + 'a {
        let st = self.stations.get(&Key::of(station));
        let n = st.map_or(0, |s| s.index.len());
        (0..n).filter_map(move |k| st.and_then(|s| s.at(k)))
    }

    /// The last report of `station` that was rejected, if any.
    pub fn last_rejected(&self, station: &str) -> Option<&Report> {
        self.stations
            .get(&Key::of(station))?
            .last_rejected
            .as_deref()
    }

    /// Station identifiers with at least one stored or rejected report, sorted.
    pub fn stations(&self) -> Vec<&str> {
        let mut v: Vec<&str> = self.stations.keys().map(Key::as_str).collect();
        v.sort_unstable();
        v
    }

    /// Number of stored (usable) reports over all stations.
    pub fn len(&self) -> usize {
        self.stations.values().map(|s| s.reports.len()).sum()
    }

    /// True when no usable report is stored.
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
}

/// Two texts are the same report when they differ only by a leading `METAR`.
fn same_report(a: &str, b: &str) -> bool {
    fn body(t: &str) -> &str {
        t.strip_prefix("METAR ").unwrap_or(t)
    }
    body(a) == body(b)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::observation::decode;
    use chrono::TimeZone;

    fn reference() -> DateTime<Utc> {
        Utc.with_ymd_and_hms(2026, 6, 14, 13, 0, 0).unwrap()
    }

    fn at(h: u32, m: u32) -> DateTime<Utc> {
        Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
    }

    fn rep(s: &str) -> Report {
        decode(s, reference())
    }

    #[test]
    fn newer_replaces_older_and_lookup_is_as_of() {
        let mut s = Store::default();
        assert_eq!(
            s.insert(rep("XQAB 141150Z 27010KT 9999 FEW040 18/09 Q1016")),
            Insert::Added { current: true }
        );
        assert_eq!(
            s.insert(rep("XQAB 141250Z 27012KT 9999 FEW040 21/09 Q1015")),
            Insert::Added { current: true }
        );
        // Out of order: older arrives late, does not become current.
        assert_eq!(
            s.insert(rep("XQAB 141050Z 26008KT 9999 FEW040 15/09 Q1016")),
            Insert::Added { current: false }
        );
        assert_eq!(s.current("XQAB").unwrap().temperature_c, Some(21.0));
        assert_eq!(
            s.valid_at("XQAB", at(12, 49)).unwrap().report.temperature_c,
            Some(18.0)
        );
        assert_eq!(
            s.valid_at("XQAB", at(12, 50)).unwrap().report.temperature_c,
            Some(21.0)
        );
        assert!(s.valid_at("XQAB", at(10, 49)).is_none());
        assert!(s.valid_at("XQZZ", at(12, 0)).is_none());
        // Stale after 75 minutes, not at exactly 75.
        assert!(!s.valid_at("XQAB", at(14, 5)).unwrap().stale);
        assert!(s.valid_at("XQAB", at(14, 6)).unwrap().stale);
        assert_eq!(s.len(), 3);
    }

    #[test]
    fn correction_replaces_duplicate_is_ignored_rejected_keeps_last_good() {
        let mut s = Store::default();
        let first = "XQAB 141250Z 27012KT 9999 FEW040 21/09 Q1015";
        s.insert(rep(first));
        assert_eq!(s.insert(rep(first)), Insert::Duplicate);
        assert_eq!(s.insert(rep(&format!("METAR {first}="))), Insert::Duplicate);
        assert_eq!(
            s.insert(rep(
                "METAR COR XQAB 141250Z 27012KT 9999 FEW040 23/09 Q1015"
            )),
            Insert::Replaced
        );
        assert_eq!(s.insert(rep(first)), Insert::KeptCorrection);
        assert_eq!(s.current("XQAB").unwrap().temperature_c, Some(23.0));
        let bad = s.insert(rep("XQAB 141350Z 27015KTS 9999 FEW040 24/09 Q1015"));
        insta::assert_snapshot!(
            match bad { Insert::Rejected(r) => r, other => format!("{other:?}") },
            @"observation XQAB 141350Z: wind group '27015KTS' at column 14: speed unit 'KTS' not understood; expected KT, MPS or KMH"
        );
        assert_eq!(s.current("XQAB").unwrap().temperature_c, Some(23.0));
        assert!(s.last_rejected("XQAB").is_some());
        assert_eq!(s.len(), 1);
    }

    /// Station keys: short ones inline, long ones on the heap, each found by its own
    /// text only (a key padded with NUL bytes is another station); `stations()` gives
    /// the texts back, sorted.
    #[test]
    fn station_keys_short_long_and_padded_are_distinct() {
        let ids = [
            "XQAB",
            "AB",
            "AB\0",
            "ABCDEFGHIJKLMNOP",
            "ABCDEFGHIJKLMNOPQ",
        ];
        let mut s = Store::default();
        let mut r = rep("XQAB 141250Z 27012KT 9999 FEW040 21/09 Q1015");
        for (k, id) in ids.iter().enumerate() {
            r.station = id.to_string();
            r.temperature_c = Some(k as f64);
            assert_eq!(
                s.insert(r.clone()),
                Insert::Added { current: true },
                "{id:?}"
            );
        }
        for (k, id) in ids.iter().enumerate() {
            let v = s.valid_at(id, reference()).expect(id);
            assert_eq!(v.report.temperature_c, Some(k as f64), "{id:?}");
            assert_eq!(s.current(id).map(|r| r.station.as_str()), Some(*id));
        }
        assert!(s.valid_at("ABC", reference()).is_none());
        assert!(s.valid_at("ABCDEFGHIJKLMNOPR", reference()).is_none());
        let mut want = ids.to_vec();
        want.sort_unstable();
        assert_eq!(s.stations(), want);
    }
}
