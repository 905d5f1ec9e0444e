//! The sign-off log reader under proptest (the CI-sized version of the `signoff_log`
//! fuzz target): any bytes as monthly files never panic the reader, and every edit to a
//! real log — a changed byte, a deleted or repeated inner line, swapped lines, an
//! inserted line of garbage — is found (the chain is not sound).

#[path = "common/signoff.rs"]
mod signoff_common;

use std::sync::OnceLock;

use proptest::prelude::*;
use rhoboard::signoff::log::Log;
use signoff_common::{demo_folder, sign_at};

/// A real log of five sign-offs on the demo morning, one monthly file: its lines.
fn real_lines() -> &'static [Vec<u8>] {
    static LINES: OnceLock<Vec<Vec<u8>>> = OnceLock::new();
    LINES.get_or_init(|| {
        let dir = demo_folder();
        for (leg, t) in [
            ("L01", "2026-06-14T06:40:00Z"),
            ("L03", "2026-06-14T07:45:00Z"),
            ("L04", "2026-06-14T08:10:00Z"),
            ("L01", "2026-06-14T08:20:00Z"),
            ("L03", "2026-06-14T08:30:00Z"),
        ] {
            sign_at(dir.path(), leg, t);
        }
        let text = std::fs::read(dir.path().join("signoffs/2026-06.jsonl")).expect("log");
        text.split_inclusive(|b| *b == b'\n')
            .map(<[u8]>::to_vec)
            .collect()
    })
}

/// Reads `files` (name, bytes) as a log folder; never panics.
fn read_back(files: &[(&str, &[u8])]) -> Option<rhoboard::signoff::log::Chain> {
    let dir = tempfile::tempdir().expect("temp dir");
    for (name, bytes) in files {
        std::fs::write(dir.path().join(name), bytes).expect("write");
    }
    Log::new(dir.path()).read().ok()
}

#[test]
fn the_untouched_real_log_is_sound() {
    let all: Vec<u8> = real_lines().concat();
    let chain = read_back(&[("2026-06.jsonl", &all)]).expect("read");
    assert!(chain.is_sound(), "{:?}", chain.problems);
    assert_eq!(chain.entries.len(), 5);
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, .. ProptestConfig::default() })]

    /// Any bytes, split over two monthly files: the reader returns, whatever it finds.
    #[test]
    fn any_bytes_never_panic(data in proptest::collection::vec(any::<u8>(), 0..2048), cut in 0usize..2048) {
        let cut = cut.min(data.len());
        if let Some(chain) = read_back(&[("2026-05.jsonl", &data[..cut]), ("2026-06.jsonl", &data[cut..])]) {
            let _ = chain.is_sound();
            let _ = chain.head();
        }
    }

    /// Real lines with garbage lines mixed in never panic the reader, and a garbage line
    /// inside the log is never sound.
    #[test]
    fn garbage_between_real_lines_is_found(at in 0usize..5, garbage in "[ -~]{0,200}") {
        let lines = real_lines();
        let mut bytes: Vec<u8> = Vec::new();
        for (i, l) in lines.iter().enumerate() {
            if i == at {
                bytes.extend_from_slice(garbage.as_bytes());
                bytes.push(b'\n');
            }
            bytes.extend_from_slice(l);
        }
        let chain = read_back(&[("2026-06.jsonl", &bytes)]);
        if let Some(chain) = chain {
            prop_assert!(!chain.is_sound(), "garbage line {at} {garbage:?} went unnoticed");
        }
    }

    /// One byte changed anywhere in a real log is found.
    #[test]
    fn a_changed_byte_is_found(at in any::<prop::sample::Index>(), flip in 1u8..=255) {
        let mut bytes: Vec<u8> = real_lines().concat();
        let i = at.index(bytes.len());
        bytes[i] ^= flip;
        if let Some(chain) = read_back(&[("2026-06.jsonl", &bytes)]) {
            prop_assert!(!chain.is_sound(), "byte {i} changed by {flip:#04x} went unnoticed");
        }
    }

    /// Deleting, repeating or swapping inner lines (not the last, which no chain without
    /// a printed head can miss) is found.
    #[test]
    fn reordered_lines_are_found(kind in 0u8..3, a in 0usize..4, b in 0usize..4) {
        let mut lines: Vec<Vec<u8>> = real_lines().to_vec();
        match kind {
            0 => { lines.remove(a); }
            1 => { let l = lines[a].clone(); lines.insert(a, l); }
            _ => {
                prop_assume!(a != b);
                lines.swap(a, b);
            }
        }
        let bytes = lines.concat();
        if let Some(chain) = read_back(&[("2026-06.jsonl", &bytes)]) {
            prop_assert!(!chain.is_sound(), "edit {kind} at {a}/{b} went unnoticed");
        }
    }
}
