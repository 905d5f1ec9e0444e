//! The committed `screenshots/*.svg` (shown in README) are the board as it draws today:
//! regenerate with `cargo run --example screenshots` when a view changes.

#[test]
fn committed_screenshots_match_the_board() {
    let shots = rhoboard::board::screenshot::demo_shots().expect("demo screenshots");
    assert!(shots.len() >= 7, "every README screenshot is made");
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("screenshots");
    let stale: Vec<&str> = shots
        .iter()
        .filter(|(name, svg)| {
            std::fs::read_to_string(dir.join(format!("{name}.svg")))
                .ok()
                .as_deref()
                != Some(svg)
        })
        .map(|(name, _)| *name)
        .collect();
    assert!(
        stale.is_empty(),
        "screenshots out of date: {stale:?}; run `cargo run --example screenshots`"
    );
}
