//! Sign-off from the board: the confirmation, the effect the event loop performs (with
//! a fixed clock and a temp-dir log), the mark on the leg row and the re-check after
//! the afternoon report.

#[path = "common/board.rs"]
mod board_common;

use board_common::{demo, demo_stepped_to, demo_time, key, render, screen, type_text};
use ratatui::crossterm::event::KeyCode;
use rhoboard::board::App;
use rhoboard::board::app::Mode;
use rhoboard::board::effects::perform;
use rhoboard::board::signoff::Mark;
use rhoboard::signoff::log::Log;

fn select_leg(app: &mut App, id: &str) -> usize {
    app.update(key(KeyCode::Home));
    for _ in 0..app.rows().len() {
        if app.selected_leg().is_some_and(|r| r.id == id) {
            return app.rows()[app.ui.leg_row];
        }
        app.update(key(KeyCode::Down));
    }
    panic!("leg {id} not found");
}

fn with_log(app: &mut App, dir: &std::path::Path) {
    app.attach_signoffs(
        Ok(Log::new(dir.join("signoffs"))),
        rhoboard::commands::signoff::data_hashes(None),
    );
}

/// Runs what `update` queued, as the event loop does, with a fixed real clock.
fn run_effects(app: &mut App) -> usize {
    let effects = app.take_effects();
    let n = effects.len();
    for e in effects {
        let done = perform(app, e, demo_time(19, 5));
        app.update(done);
    }
    n
}

#[test]
fn a_solo_signed_at_0800_needs_a_recheck_after_the_1300_report() {
    let tmp = tempfile::tempdir().unwrap();
    let mut app = demo_stepped_to(8);
    with_log(&mut app, tmp.path());
    let k = select_leg(&mut app, "L09");
    assert_eq!(app.mark(k), &Mark::Unsigned);
    app.update(key(KeyCode::Char('S')));
    assert!(matches!(app.ui.mode, Mode::Sign(_)));
    type_text(&mut app, "M. Ortiz");
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "circuits only");
    app.update(key(KeyCode::Enter));
    assert_eq!(
        run_effects(&mut app),
        1,
        "Enter queues one sign-off for the event loop"
    );
    assert!(
        matches!(app.ui.mode, Mode::Normal),
        "the form closes once signed"
    );
    let k = select_leg(&mut app, "L09");
    assert!(
        matches!(app.mark(k), Mark::Signed { seq: 1, instructor } if instructor == "M. Ortiz"),
        "{:?}",
        app.mark(k)
    );
    assert!(
        app.notes
            .iter()
            .any(|n| n.text.contains("L09 signed #1 by M. Ortiz")),
        "{:?}",
        app.notes.front()
    );
    // The record: basis = the simulated clock, signed_at = the real (injected) one.
    let chain = Log::new(tmp.path().join("signoffs")).read().unwrap();
    let rec = &chain.entries[0].record;
    assert_eq!(rec.basis_at, demo_time(8, 0));
    assert_eq!(rec.signed_at, demo_time(19, 5));
    assert_eq!(rec.note, "circuits only");
    let status = rhoboard::board::overlays::status(&app);
    assert!(status.contains("log head 1:"), "{status}");
    assert!(
        screen(&mut app, 120, 40).contains("✎"),
        "the leg row shows the mark"
    );

    for _ in 9..=13 {
        app.update(key(KeyCode::Char('n')));
    }
    assert_eq!(app.clock, demo_time(13, 0));
    let k = select_leg(&mut app, "L09");
    let Mark::Recheck { seq: 1, why, .. } = app.mark(k) else {
        panic!("L09 should need a re-check: {:?}", app.mark(k));
    };
    assert!(!why.is_empty());
    assert!(
        app.notes
            .iter()
            .any(|n| n.text.starts_with("L09 sign-off #1 needs a re-check:")),
        "the change list says so"
    );
    let status = rhoboard::board::overlays::status(&app);
    assert!(status.contains("↻ re-check 1"), "{status}");
    let text = screen(&mut app, 140, 40);
    assert!(text.contains("↻ re-check"), "{text}");

    // A new sign-off supersedes the old one and clears the re-check (with an override
    // if the leg is below: a student solo is never overridden, so it stays refused).
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "M. Ortiz");
    app.update(key(KeyCode::Enter));
    if app.assessment.legs[k].state.meets_minimums() {
        run_effects(&mut app);
        assert!(matches!(app.mark(k), Mark::Signed { seq: 2, .. }));
    } else {
        assert_eq!(run_effects(&mut app), 0, "a refusal writes nothing");
        let Mode::Sign(f) = &app.ui.mode else {
            panic!("the form stays open with the reason")
        };
        assert!(
            f.error.as_deref().is_some_and(|e| e.contains("below")),
            "{:?}",
            f.error
        );
    }
}

#[test]
fn a_below_leg_is_refused_on_screen_and_nothing_is_written() {
    let tmp = tempfile::tempdir().unwrap();
    let mut app = demo_stepped_to(15);
    with_log(&mut app, tmp.path());
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "K. Lind");
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("would be refused"), "{text}");
    app.update(key(KeyCode::Enter));
    assert_eq!(run_effects(&mut app), 0);
    let Mode::Sign(f) = &app.ui.mode else {
        panic!()
    };
    assert!(f.error.is_some());
    app.update(key(KeyCode::Esc));
    assert!(matches!(app.ui.mode, Mode::Normal));
    assert!(
        !tmp.path().join("signoffs").exists() || {
            let c = Log::new(tmp.path().join("signoffs")).read().unwrap();
            c.entries.is_empty()
        }
    );
}

#[test]
fn no_log_is_an_error_on_screen_not_a_crash() {
    let mut app = demo_stepped_to(8);
    app.attach_signoffs(
        Err(anyhow::anyhow!("no platform data folder")),
        rhoboard::commands::signoff::data_hashes(None),
    );
    select_leg(&mut app, "L01");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "A. B");
    app.update(key(KeyCode::Enter));
    assert_eq!(run_effects(&mut app), 0);
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("no sign-off log"), "{text}");
    assert!(rhoboard::board::overlays::status(&app).contains("log: not available"));
}

#[test]
fn signoff_confirmation_120x40() {
    let mut app = demo_stepped_to(8);
    // A log folder that does not exist reads as an empty chain: no I/O, fixed text.
    app.attach_signoffs(
        Ok(Log::new("/nonexistent-rhoboard-test/signoffs")),
        rhoboard::commands::signoff::data_hashes(None),
    );
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "M. Ortiz");
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn overlays_do_not_panic_in_tiny_terminals() {
    let mut app = demo(8, 0);
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('S')));
    for (w, h) in [(1, 1), (0, 0), (80, 24), (20, 5), (81, 25)] {
        let _ = render(&mut app, w, h);
    }
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('e')));
    for (w, h) in [(1, 1), (0, 0), (80, 24), (20, 5)] {
        let _ = render(&mut app, w, h);
    }
}

#[test]
fn a_board_opened_later_lists_the_recheck_at_load() {
    let tmp = tempfile::tempdir().unwrap();
    let mut morning = demo_stepped_to(8);
    with_log(&mut morning, tmp.path());
    select_leg(&mut morning, "L09");
    morning.update(key(KeyCode::Char('S')));
    type_text(&mut morning, "M. Ortiz");
    morning.update(key(KeyCode::Enter));
    assert_eq!(run_effects(&mut morning), 1);
    // Another board (another dispatcher, later) reads the same log.
    let mut later = demo_stepped_to(13);
    with_log(&mut later, tmp.path());
    assert!(
        later
            .notes
            .iter()
            .any(|n| n.text.starts_with("L09 sign-off #1 needs a re-check:")),
        "{:?}",
        later.notes
    );
    assert_eq!(later.signoffs.rechecks(), 1);
}

/// The screen's lines joined, frames and padding trimmed (a wrapped message reads whole).
fn flatten(text: &str) -> String {
    text.lines()
        .map(|l| l.trim_matches(|c| c == '│' || c == ' '))
        .collect::<Vec<_>>()
        .join(" ")
}

fn sign_form(app: &App) -> &rhoboard::board::signoff::SignForm {
    match &app.ui.mode {
        Mode::Sign(f) => f,
        other => panic!("not in the sign-off form: {other:?}"),
    }
}

#[test]
fn a_refusal_at_80x24_is_wrapped_whole_and_no_override_is_offered_where_none_is_allowed() {
    let mut app = demo_stepped_to(13);
    app.attach_signoffs(
        Ok(Log::new("/nonexistent-rhoboard-test/signoffs")),
        rhoboard::commands::signoff::data_hashes(None),
    );
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('S')));
    assert!(
        !sign_form(&app).offers_override,
        "charter legs: no override"
    );
    type_text(&mut app, "K. Lind");
    let text = screen(&mut app, 80, 24);
    // The refusal's end, on whatever line the wrap puts it.
    let flat = flatten(&text);
    assert!(flat.contains("would be refused"), "{text}");
    assert!(flat.contains("charter legs"), "{text}");
    assert!(!text.contains("override reason"), "{text}");
    insta::assert_snapshot!("signoff_refused_80x24", render(&mut app, 80, 24).backend());
    insta::assert_snapshot!(
        "signoff_refused_120x40",
        render(&mut app, 120, 40).backend()
    );
    // Tab skips the hidden field: two fields, so Tab twice is back on the instructor.
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    assert_eq!(sign_form(&app).focus, 0);
    // Enter keeps the refusal on screen.
    app.update(key(KeyCode::Enter));
    let text = screen(&mut app, 80, 24);
    assert!(text.contains('✗'), "{text}");
}

#[test]
fn a_long_override_reason_never_pushes_the_message_off_screen() {
    let mut app = demo_stepped_to(15);
    app.attach_signoffs(
        Ok(Log::new("/nonexistent-rhoboard-test/signoffs")),
        rhoboard::commands::signoff::data_hashes(None),
    );
    // The first below leg whose category allows an override, if the demo has one.
    let policy = app.ops.operator.policy.sign_off.override_categories.clone();
    let Some(id) = app
        .assessment
        .legs
        .iter()
        .find(|r| !r.state.meets_minimums() && policy.contains(&r.category))
        .map(|r| r.id.clone())
    else {
        panic!("the demo at 15Z has no below leg with an override allowed");
    };
    select_leg(&mut app, &id);
    app.update(key(KeyCode::Char('S')));
    assert!(sign_form(&app).offers_override);
    type_text(&mut app, "K. Lind");
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    type_text(
        &mut app,
        "dual lesson with the instructor aboard, circuits only, turning back at the first sign of cloud below the minimums",
    );
    let text = screen(&mut app, 80, 24);
    assert!(text.contains("Enter signs"), "{text}");
}

#[test]
fn signing_a_leg_already_gone_warns_first_and_the_second_enter_signs() {
    let tmp = tempfile::tempdir().unwrap();
    let mut app = demo_stepped_to(13);
    with_log(&mut app, tmp.path());
    select_leg(&mut app, "L03");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "M. Ortiz");
    app.update(key(KeyCode::Enter));
    assert_eq!(run_effects(&mut app), 0, "the first Enter only warns");
    let text = screen(&mut app, 120, 40);
    let flat = flatten(&text);
    assert!(flat.contains("has left already"), "{text}");
    assert!(flat.contains("Enter again to sign it anyway"), "{text}");
    app.update(key(KeyCode::Enter));
    assert_eq!(run_effects(&mut app), 1, "the second Enter signs");
}

#[test]
fn ctrl_u_clears_the_focused_field_of_the_signoff_form() {
    let mut app = demo_stepped_to(8);
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "M. Ortiz");
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "circuits");
    app.update(rhoboard::board::Msg::Key(
        ratatui::crossterm::event::KeyEvent::new(
            KeyCode::Char('u'),
            ratatui::crossterm::event::KeyModifiers::CONTROL,
        ),
    ));
    let f = sign_form(&app);
    assert_eq!(f.values[1], "", "the note is cleared");
    assert_eq!(f.values[0], "M. Ortiz", "the other field stays");
    assert!(app.ui.filter.is_empty());
}

/// The sign-off's basis is the leg assessed at the board's clock when the form opens,
/// not at the board's last re-check (trial finding: a record made at 13:07 gave a
/// 13:05 report's age as 0.45 min, from a re-check at 13:05). Here the clock runs three
/// minutes past 08:00 with no re-check, and the basis ages the 08:00 reports by three.
#[test]
fn the_basis_is_assessed_at_the_clock_the_form_opens() {
    let mut app = demo_stepped_to(8);
    let k = select_leg(&mut app, "L09");
    let board_age = app.assessment.legs[k]
        .departure
        .observation
        .as_ref()
        .unwrap()
        .age_min;
    assert_eq!(board_age, 0.0, "re-checked at 08:00 on the 08:00 report");
    // Running: half a second of real time is three minutes at the default pace.
    app.update(key(KeyCode::Char(' ')));
    app.update(rhoboard::board::Msg::Tick {
        now: demo_time(8, 3),
        elapsed: std::time::Duration::from_millis(500),
    });
    app.update(key(KeyCode::Char(' ')));
    assert_eq!(app.clock, demo_time(8, 3));
    assert_eq!(
        app.assessment.legs[k]
            .departure
            .observation
            .as_ref()
            .unwrap()
            .age_min,
        0.0,
        "no re-check yet"
    );
    app.update(key(KeyCode::Char('S')));
    let Mode::Sign(f) = &app.ui.mode else {
        panic!("S opens the form");
    };
    assert_eq!(f.basis_at, demo_time(8, 3));
    for side in [&f.result.departure, &f.result.arrival] {
        let o = side.observation.as_ref().unwrap();
        let want = (demo_time(8, 3) - o.observed_at).num_seconds() as f64 / 60.0;
        assert!(
            (o.age_min - want).abs() < 1e-9,
            "{}: {} vs {want}",
            o.station,
            o.age_min
        );
        assert!(o.age_min >= 3.0, "{}", o.age_min);
    }
}
