//! Property tests: the decoder never panics, on arbitrary text and on mutations of valid
//! reports, and its verdict is stable (decoding its own normalised text gives the same
//! report). 4,000 + 8,000 cases by default; `PROPTEST_CASES` overrides both.

use chrono::{TimeZone, Utc};
use proptest::prelude::*;
use rhoboard::observation::{Report, decode};

const CORPUS: &str = include_str!("../fixtures/metar/corpus.txt");

fn corpus() -> Vec<&'static str> {
    CORPUS
        .lines()
        .map(str::trim)
        .filter(|l| !l.is_empty() && !l.starts_with('#'))
        .collect()
}

fn cases(default: u32) -> u32 {
    std::env::var("PROPTEST_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(default)
}

fn check_invariants(input: &str, r: &Report) -> Result<(), TestCaseError> {
    let chars = r.text.chars().count();
    for g in &r.groups {
        prop_assert!(
            g.start + g.len <= r.text.len(),
            "group span outside text: {input:?}"
        );
        prop_assert!(
            r.text.is_char_boundary(g.start),
            "group start not on a char: {input:?}"
        );
    }
    for n in &r.not_understood {
        prop_assert!(
            n.column >= 1 && n.column <= chars.max(1),
            "column {} of {input:?}",
            n.column
        );
    }
    if r.usable_for_performance() {
        prop_assert!(r.errors.is_empty());
        prop_assert!(r.wind.is_some() && r.temperature_c.is_some() && r.altimeter_hpa.is_some());
        prop_assert!(r.observed_at.is_some() && !r.station.is_empty());
    } else {
        prop_assert!(!r.errors.is_empty(), "unusable without a reason: {input:?}");
    }
    for e in r.error_lines() {
        prop_assert!(!e.contains('\n'), "multi-line error for {input:?}");
        prop_assert!(e.chars().count() < 400, "overlong error for {input:?}");
    }
    // Stable: the normalised text decodes to the same report.
    if !r.text.ends_with('…') {
        let again = decode(&r.text, reference());
        prop_assert_eq!(&again, r, "not stable for {:?}", input);
    }
    Ok(())
}

fn reference() -> chrono::DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap()
}

#[derive(Debug, Clone)]
enum Mutation {
    DeleteChar(usize),
    InsertChar(usize, char),
    ReplaceToken(usize, String),
    DeleteToken(usize),
    SwapTokens(usize, usize),
    DuplicateToken(usize),
    Truncate(usize),
}

fn mutation() -> impl Strategy<Value = Mutation> {
    let token = prop_oneof![
        "[A-Z0-9/+-]{1,9}",
        "(M|P)?[0-9]{1,4}(/[0-9]{1,2})?(SM|KT|MPS|FT)?",
        "(FEW|SCT|BKN|OVC|VV|///)[0-9/]{0,4}(CB|TCU|///)?",
        "[QA][0-9./]{0,6}",
        "R[0-9]{0,3}[LCR]?/[PM]?[0-9]{0,5}(V[0-9]{4})?(FT)?[/UDN]{0,2}",
        "\\PC{0,6}",
    ];
    prop_oneof![
        any::<usize>().prop_map(Mutation::DeleteChar),
        (any::<usize>(), any::<char>()).prop_map(|(i, c)| Mutation::InsertChar(i, c)),
        (any::<usize>(), token).prop_map(|(i, t)| Mutation::ReplaceToken(i, t)),
        any::<usize>().prop_map(Mutation::DeleteToken),
        (any::<usize>(), any::<usize>()).prop_map(|(a, b)| Mutation::SwapTokens(a, b)),
        any::<usize>().prop_map(Mutation::DuplicateToken),
        any::<usize>().prop_map(Mutation::Truncate),
    ]
}

fn apply(text: &str, m: &Mutation) -> String {
    let mut chars: Vec<char> = text.chars().collect();
    let mut toks: Vec<String> = text.split(' ').map(String::from).collect();
    let n = toks.len().max(1);
    match m {
        Mutation::DeleteChar(i) => {
            if !chars.is_empty() {
                chars.remove(i % chars.len());
            }
            chars.into_iter().collect()
        }
        Mutation::InsertChar(i, c) => {
            chars.insert(i % (chars.len() + 1), *c);
            chars.into_iter().collect()
        }
        Mutation::Truncate(i) => chars.into_iter().take(i % (text.len() + 1)).collect(),
        Mutation::ReplaceToken(i, t) => {
            if let Some(x) = toks.get_mut(i % n) {
                x.clone_from(t);
            }
            toks.join(" ")
        }
        Mutation::DeleteToken(i) => {
            if !toks.is_empty() {
                toks.remove(i % n);
            }
            toks.join(" ")
        }
        Mutation::SwapTokens(a, b) => {
            if !toks.is_empty() {
                toks.swap(a % n, b % n);
            }
            toks.join(" ")
        }
        Mutation::DuplicateToken(i) => {
            if let Some(x) = toks.get(i % n).cloned() {
                toks.insert(i % n, x);
            }
            toks.join(" ")
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: cases(4_000), failure_persistence: None, ..ProptestConfig::default() })]

    #[test]
    fn arbitrary_text_never_panics(s in prop_oneof!["\\PC{0,120}", ".{0,80}", "[A-Z0-9/ +-]{0,100}"]) {
        let r = decode(&s, reference());
        check_invariants(&s, &r)?;
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: cases(8_000), failure_persistence: None, ..ProptestConfig::default() })]

    #[test]
    fn mutated_reports_never_panic(idx in any::<usize>(), muts in proptest::collection::vec(mutation(), 1..4)) {
        let lines = corpus();
        let base = lines[idx % lines.len()];
        let mut text = base.to_string();
        for m in &muts {
            text = apply(&text, m);
        }
        let r = decode(&text, reference());
        check_invariants(&text, &r)?;
    }
}
