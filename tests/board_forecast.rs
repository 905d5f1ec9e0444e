//! The forecast look-ahead on the board: a column per leg and a section in the detail,
//! computed as `rhoboard check --forecast` does, labelled as a forecast and kept apart
//! from the observed state; recomputed as reports arrive.

#[path = "common/board.rs"]
mod board_common;

use board_common::{demo_stepped_to, key, screen};

use ratatui::crossterm::event::KeyCode;
use rhoboard::assess::State;

#[test]
fn at_0800_the_look_ahead_names_the_legs_the_afternoon_breaks() {
    let morning = demo_stepped_to(8);
    let afternoon = demo_stepped_to(15);
    assert_eq!(morning.forecast.len(), morning.assessment.legs.len());
    let mut named = 0;
    for (k, r) in morning.assessment.legs.iter().enumerate() {
        let later = afternoon
            .assessment
            .legs
            .iter()
            .find(|a| a.id == r.id)
            .unwrap();
        if r.state != State::Below && later.state == State::Below {
            let look = morning
                .look(k)
                .unwrap_or_else(|| panic!("{}: no forecast", r.id));
            assert!(
                look.fails_from.is_some() || look.state == State::Below,
                "{}: below at 15Z but the 08Z forecast holds: {look:?}",
                r.id
            );
            named += 1;
        }
    }
    assert!(named > 0, "the demo day breaks some legs in the afternoon");
}

#[test]
fn the_column_and_the_detail_say_forecast() {
    let mut app = demo_stepped_to(8);
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("forecast"), "{text}");
    assert!(text.contains("fails ~"), "{text}");
    // The first leg still to depart (one gone shows when it left instead: below).
    let k = app
        .rows()
        .iter()
        .copied()
        .find(|&k| {
            let r = &app.assessment.legs[k];
            app.ops.legs[r.index].departs_utc() >= app.clock
        })
        .unwrap();
    let lines = rhoboard::board::overlays::detail_extra(
        &app,
        k,
        rhoboard::board::theme::Theme { color: false },
    );
    let text: Vec<String> = lines.iter().map(|l| l.to_string()).collect();
    let text = text.join("\n");
    assert!(
        text.contains("Forecast look-ahead (from the TAFs — a forecast, not an observation)"),
        "{text}"
    );
    assert!(
        text.contains("observed now: ✓ within"),
        "kept apart: {text}"
    );
    assert!(text.contains("Sign-off"), "{text}");
}

#[test]
fn recomputed_when_a_report_arrives() {
    let mut app = demo_stepped_to(8);
    let before = app.forecast.clone();
    app.update(key(KeyCode::Char('n')));
    assert_eq!(app.forecast.len(), app.assessment.legs.len());
    assert_ne!(before, app.forecast, "the 09Z reports move the look-ahead");
    // An observed below is never made better by the forecast.
    for (k, r) in app.assessment.legs.iter().enumerate() {
        if r.state == State::Below
            && let Some(l) = app.look(k)
        {
            assert_eq!(l.state, State::Below, "{}", r.id);
        }
    }
}

/// A leg observed no-data (L10 at 15Z: a stale report) with a forecast reads
/// "forecast only" in the column, the summary and the detail: the forecast alone never
/// reads better than the observation.
#[test]
fn with_the_observation_missing_the_forecast_reads_forecast_only() {
    use rhoboard::board::forecast::{Progress, cell, summary};
    let app = demo_stepped_to(15);
    let mut seen = 0;
    for (k, r) in app.assessment.legs.iter().enumerate() {
        let Some(l) = app.look(k) else { continue };
        // As if still ahead: the words for a leg gone are tested on their own below.
        let ahead = Progress::Ahead;
        if !l.observation_missing {
            assert!(
                !cell(Some(l), r.state, ahead).contains("forecast only"),
                "{}",
                r.id
            );
            continue;
        }
        assert_eq!(r.state, State::NoData, "{}", r.id);
        seen += 1;
        assert_eq!(cell(Some(l), r.state, ahead), "forecast only", "{}", r.id);
        let s = summary(Some(l), r.state, ahead);
        assert!(
            s.contains("forecast only") && s.contains("no usable observation"),
            "{s}"
        );
        let detail: Vec<String> = rhoboard::board::forecast::detail_lines(
            &app,
            k,
            rhoboard::board::theme::Theme { color: false },
        )
        .iter()
        .map(|l| l.to_string())
        .collect();
        // In the detail only while the leg is still to depart (L10 has landed by 15Z:
        // its detail says so instead).
        let gone = app.ops.legs[r.index].departs_utc() < app.clock;
        let words = if gone {
            "nothing ahead to forecast"
        } else {
            "forecast only"
        };
        assert!(
            detail.iter().any(|d| d.contains(words)),
            "{}",
            detail.join("\n")
        );
    }
    assert!(
        seen > 0,
        "the demo's stale XSHT leaves a leg observed no-data"
    );
}

/// A leg already gone on the board's clock shows when it left (`left 0900Z`, still in
/// the air) or landed (`landed 1030Z`), never a departure-end forecast as if still ahead
/// (finding: "fails ~1311Z" on legs that had departed); legs still to go keep theirs.
#[test]
fn a_leg_already_gone_shows_when_it_left_not_a_forecast() {
    use rhoboard::board::forecast::{Progress, cell, summary};
    let mut app = demo_stepped_to(13);
    let mut gone = 0;
    let mut airborne = 0;
    let mut ahead = 0;
    for (k, r) in app.assessment.legs.iter().enumerate() {
        let leg = &app.ops.legs[r.index];
        let p = Progress::of(leg, app.clock);
        let c = cell(app.look(k), r.state, p);
        let s = summary(app.look(k), r.state, p);
        let (dep, arr) = (leg.departs_utc(), leg.arrives_utc());
        if dep < app.clock && arr >= app.clock {
            airborne += 1;
            assert_eq!(c, format!("left {}", dep.format("%H%MZ")), "{}", r.id);
            assert!(s.contains("departed, no forecast ahead"), "{}: {s}", r.id);
        } else if arr < app.clock {
            gone += 1;
            assert_eq!(c, format!("landed {}", arr.format("%H%MZ")), "{}", r.id);
            assert!(s.contains("no forecast ahead"), "{}: {s}", r.id);
        } else {
            ahead += 1;
            assert!(
                !c.starts_with("left") && !c.starts_with("landed"),
                "{}: {c}",
                r.id
            );
        }
    }
    assert!(
        gone > 0 && airborne > 0 && ahead > 0,
        "{gone} {airborne} {ahead}"
    );
    // On screen: no "fails ~" beside a departure already past.
    let text = screen(&mut app, 120, 40);
    for line in text.lines().filter(|l| l.contains("fails ~")) {
        let dep = line
            .split_whitespace()
            .find(|w| w.len() == 5 && w.ends_with('Z'));
        assert!(
            dep.is_some_and(|d| d >= "1300Z"),
            "a past departure with a forecast: {line}"
        );
    }
    assert!(text.contains("landed "), "{text}");
    // The detail says so in words.
    let k = app
        .assessment
        .legs
        .iter()
        .position(|r| app.ops.legs[r.index].arrives_utc() < app.clock)
        .unwrap();
    let detail: Vec<String> = rhoboard::board::forecast::detail_lines(
        &app,
        k,
        rhoboard::board::theme::Theme { color: false },
    )
    .iter()
    .map(|l| l.to_string())
    .collect();
    let detail = detail.join("\n");
    assert!(
        detail.contains("flown: departed") && detail.contains("nothing ahead to forecast"),
        "{detail}"
    );
    assert!(!detail.contains("flown from ~"), "{detail}");
}

/// A forecast that makes a leg `below` already at the board's clock (the observation
/// says thin) reads "fails now", not "fails ~1100Z" at 11:00Z as if a time still ahead
/// (trial nit); the one-line summary says "now" too.
#[test]
fn a_forecast_below_at_the_clock_reads_fails_now() {
    let found = (7..=17).map(demo_stepped_to).find(|app| {
        (0..app.assessment.legs.len()).any(|k| app.look(k).is_some_and(|l| l.fails_now))
    });
    let mut app = found.expect("some hour of the demo has a leg the forecast breaks now");
    let now: Vec<usize> = (0..app.assessment.legs.len())
        .filter(|&k| app.look(k).is_some_and(|l| l.fails_now))
        .collect();
    for &k in &now {
        let l = app.look(k).unwrap();
        assert_eq!(l.fails_from, Some(app.clock), "{l:?}");
        let r = &app.assessment.legs[k];
        let cell = rhoboard::board::forecast::cell(
            Some(l),
            r.state,
            rhoboard::assess::lookahead::Progress::Ahead,
        );
        assert_eq!(cell, "fails now");
        let summary = rhoboard::board::forecast::summary(
            Some(l),
            r.state,
            rhoboard::assess::lookahead::Progress::Ahead,
        );
        assert!(
            summary.ends_with("would be below if flown now"),
            "{summary}"
        );
    }
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("fails now"), "{text}");
    let at_clock = format!("fails ~{}", app.clock.format("%H%MZ"));
    assert!(!text.contains(&at_clock), "{text}");
}
