//! No loader panics on any input: mutated JSON (proptest), huge files, many files,
//! deep nesting, odd bytes.

use proptest::prelude::*;
use rhoboard::ops::{OpsFiles, demo, load_files};

fn demo_with(path: &str, text: String) -> OpsFiles {
    let mut f = demo::files();
    f.files.insert(path.to_string(), text);
    f
}

/// Mutations that keep the text UTF-8: delete a span, duplicate a span, insert a
/// JSON-ish token, or replace a digit run.
fn mutate(text: &str, kind: u8, at: usize, len: usize, token: usize) -> String {
    const TOKENS: [&str; 12] = [
        "{", "}", "[", "]", ",", ":", "\"", "-1", "1e999", "null", "\"x\"", "\u{00e9}",
    ];
    let chars: Vec<char> = text.chars().collect();
    let n = chars.len().max(1);
    let a = at % n;
    let b = (a + len % 40).min(chars.len());
    let mut out: Vec<char> = chars[..a].to_vec();
    match kind % 4 {
        0 => out.extend(&chars[b..]),
        1 => {
            out.extend(&chars[a..b]);
            out.extend(&chars[a..]);
        }
        2 => {
            out.extend(TOKENS[token % TOKENS.len()].chars());
            out.extend(&chars[a..]);
        }
        _ => {
            out.extend("-0.000".chars());
            out.extend(&chars[b..]);
        }
    }
    out.into_iter().collect()
}

const TARGETS: [&str; 6] = [
    "operator.json",
    "pilots.json",
    "fleet/aircraft.json",
    "fleet/types/ft2.json",
    "airfields/XBRK.json",
    "legs/2026-06-14.json",
];

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, .. ProptestConfig::default() })]

    #[test]
    fn mutated_json_never_panics(target in 0usize..TARGETS.len(), kind in 0u8..4, at in 0usize..100_000, len in 0usize..40, token in 0usize..12) {
        let path = TARGETS[target];
        let original = demo::files().files[path].clone();
        let text = mutate(&original, kind, at, len, token);
        let loaded = load_files(&demo_with(path, text));
        // Errors, if any, point inside the file.
        for d in &loaded.report.errors {
            prop_assert!(d.line >= 1 && d.column >= 1);
        }
    }
}

#[test]
fn deeply_nested_and_odd_texts_fail_cleanly() {
    for text in [
        "[".repeat(100_000),
        "{\"a\":".repeat(50_000),
        String::new(),
        "\u{feff}{}".to_string(),
        "null".to_string(),
        "{\"schema_version\": 1e999}".to_string(),
        "{\"schema_version\": 1, \"id\": \"XBRK\", \"runway_ends\": [{\"designator\": \"é\"}]}"
            .to_string(),
    ] {
        let loaded = load_files(&demo_with("airfields/XBRK.json", text));
        assert!(!loaded.report.errors.is_empty());
    }
}

#[test]
fn a_50_mb_file_loads_or_fails_cleanly() {
    // A valid airfield with 50 MB of remarks loads; the same with a broken tail fails
    // with one positioned error.
    let base = demo::files().files["airfields/XBRK.json"].clone();
    let big = "x".repeat(50_000_000);
    let text = base.replacen("\"remarks\": \"", &format!("\"remarks\": \"{big} "), 1);
    let loaded = load_files(&demo_with("airfields/XBRK.json", text.clone()));
    assert!(
        loaded.report.errors.is_empty(),
        "{:?}",
        loaded.report.errors.first()
    );
    let broken = format!("{}!", &text[..text.len() - 3]);
    let loaded = load_files(&demo_with("airfields/XBRK.json", broken));
    assert_eq!(loaded.report.errors.len(), 1);
}

#[test]
fn ten_thousand_airfields_load() {
    let mut files = demo::files();
    let template = files.files["airfields/XMES.json"].clone();
    for i in 0..10_000 {
        let id = format!("XG{i:04}");
        files.files.insert(
            format!("airfields/{id}.json"),
            template.replace("\"XMES\"", &format!("\"{id}\"")),
        );
    }
    let started = std::time::Instant::now();
    let loaded = load_files(&files);
    assert!(
        loaded.report.errors.is_empty(),
        "{:?}",
        loaded.report.errors.first()
    );
    assert_eq!(loaded.ops.unwrap().airfields.len(), 10_009);
    assert!(started.elapsed().as_secs() < 20);
    // And with every one broken, every one is reported.
    for i in 0..10_000 {
        let id = format!("XG{i:04}");
        files.files.insert(
            format!("airfields/{id}.json"),
            template
                .replace("\"XMES\"", &format!("\"{id}\""))
                .replace("1250", "-1"),
        );
    }
    let loaded = load_files(&files);
    assert!(loaded.report.errors.len() >= 10_000);
}

#[test]
fn a_huge_table_of_zeros_is_reported_briefly() {
    // 10 × 100 × 100 = 100,000 values per table, all zero: 400,000 problems, listed up
    // to the per-file cap and then counted.
    let row = format!("[{}]", ["0"; 100].join(","));
    let block = format!("[{}]", [row.as_str(); 100].join(","));
    let table = format!("[{}]", [block.as_str(); 10].join(","));
    let axis = |n: usize, step: usize| {
        format!(
            "[{}]",
            (0..n)
                .map(|i| (i * step).to_string())
                .collect::<Vec<_>>()
                .join(",")
        )
    };
    let text = demo::files().files["fleet/types/ft2.json"].clone();
    let start = text.find("\"performance\"").unwrap();
    let end = text.find("\"corrections\"").unwrap();
    let perf = format!(
        "\"performance\": {{\"axes\": {{\"mass_kg\": {}, \"pressure_altitude_ft\": {}, \"oat_c\": {}}}, \
         \"takeoff\": {{\"ground_roll_m\": {t}, \"distance_50ft_m\": {t}}}, \
         \"landing\": {{\"distance_50ft_m\": {t}, \"ground_roll_m\": {t}}}, \
         \"climb\": {{\"climb_speed_kias\": 68, \"rate_fpm\": {t}}}}},\n  ",
        axis(10, 20),
        axis(100, 100),
        axis(100, 1),
        t = table
    );
    let huge = format!("{}{}{}", &text[..start], perf, &text[end..]);
    let started = std::time::Instant::now();
    let loaded = load_files(&demo_with("fleet/types/ft2.json", huge));
    let in_file: Vec<_> = loaded
        .report
        .errors
        .iter()
        .chain(&loaded.report.warnings)
        .filter(|d| d.file == "fleet/types/ft2.json")
        .collect();
    assert_eq!(
        in_file.len(),
        rhoboard::ops::load::MAX_PER_FILE + 1,
        "{:?} … {:?}",
        in_file.first(),
        in_file.last()
    );
    let more = loaded
        .report
        .errors
        .iter()
        .rfind(|d| d.file == "fleet/types/ft2.json")
        .unwrap();
    assert!(more.message.starts_with("… and "), "{more}");
    assert!(started.elapsed().as_secs() < 10);
}
