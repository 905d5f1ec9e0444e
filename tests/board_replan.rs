//! What-if re-planning on the board: each kind of edit re-assessed at once (old → new),
//! undo, quitting with changes pending, writing (the demo in memory; an operator folder
//! through the event loop's safe save) and the conflict when the file changed on disk.

#[path = "common/board.rs"]
mod board_common;

use board_common::{demo_stepped_to, demo_time, key, render, screen, type_text};
use ratatui::crossterm::event::KeyCode;
use rhoboard::assess::State;
use rhoboard::board::App;
use rhoboard::board::app::Mode;
use rhoboard::board::effects::perform;
use rhoboard::board::replan::{Ask, Step};
use rhoboard::board::signoff::Mark;
use rhoboard::replan::Edit;

fn select_leg(app: &mut App, id: &str) -> usize {
    app.update(key(KeyCode::Home));
    for _ in 0..app.rows().len() {
        if app.selected_leg().is_some_and(|r| r.id == id) {
            return app.selected_leg().unwrap().index;
        }
        app.update(key(KeyCode::Down));
    }
    panic!("leg {id} not found");
}

fn new_state(app: &App, slot: usize) -> Option<State> {
    app.compared(slot)?.new.as_ref().map(|f| f.state)
}

fn old_state(app: &App, slot: usize) -> Option<State> {
    app.compared(slot)?.old.as_ref().map(|f| f.state)
}

/// Picks the option whose label starts with `prefix` in the open pick list.
fn pick(app: &mut App, prefix: &str) {
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!("no what-if panel")
    };
    let Ask::Pick { options, .. } = &ui.ask else {
        panic!("no pick list: {:?}", ui.ask)
    };
    let i = options
        .iter()
        .position(|(l, _)| l.starts_with(prefix))
        .unwrap_or_else(|| panic!("no option {prefix}: {options:?}"));
    for _ in 0..i {
        app.update(key(KeyCode::Down));
    }
    app.update(key(KeyCode::Enter));
}

#[test]
fn l16_becomes_within_by_moving_it_to_0630() {
    let mut app = demo_stepped_to(13);
    let slot = select_leg(&mut app, "L16");
    assert_eq!(app.selected_leg().unwrap().state, State::Below);
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(&mut app, "0630");
    app.update(key(KeyCode::Enter));
    // 0630Z is before the board's clock (1300Z): the first Enter warns in the panel's
    // prompt and plans nothing; a second Enter plans it (as the hand-report form does
    // for a time after the clock).
    assert!(app.plan.steps.is_empty(), "warned first, not planned");
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!("no what-if panel")
    };
    assert!(
        matches!(&ui.ask, Ask::Type { error: Some(e), .. }
            if e == "0630Z is 6 h 30 min before the board's clock (1300Z): the leg would have \
                     left already. Enter again to plan it anyway (to compare), or correct the time"),
        "{:?}",
        ui.ask
    );
    let warned = screen(&mut app, 120, 40);
    assert!(
        warned.contains("✗ 0630Z is 6 h 30 min before the board's clock (1300Z)"),
        "{warned}"
    );
    app.update(key(KeyCode::Enter));
    assert_eq!(app.plan.steps.len(), 1);
    assert_eq!(old_state(&app, slot), Some(State::Below));
    assert_eq!(new_state(&app, slot), Some(State::Within));
    assert_eq!(
        app.plan.slots[slot].leg.departs_utc(),
        demo_time(6, 30),
        "the planned duration is kept from the new time"
    );
    // The panel's "as planned" line is the leg before the change (finding 4: it showed
    // the new time at once, beside "departure 1230Z → 0630Z").
    let text = screen(&mut app, 120, 40);
    let planned = text
        .lines()
        .find(|l| l.contains("as planned:"))
        .unwrap_or_else(|| panic!("no as-planned line:\n{text}"));
    assert!(planned.contains("1230Z"), "{planned}");
    assert!(!planned.contains("0630Z"), "{planned}");
    assert!(text.contains("1230Z → 0630Z"), "{text}");
    // The warning stands in the panel once planned, not only as a passing notice.
    assert!(
        text.contains("⚠ 0630Z is 6 h 30 min before the board's clock (1300Z): the leg"),
        "{text}"
    );
    // The board's own leg is untouched until written.
    assert_eq!(app.ops.legs[slot].departs_utc(), demo_time(12, 30));
    assert_eq!(app.selected_leg().unwrap().state, State::Below);
}

#[test]
fn l16_becomes_within_by_unloading_the_rear_seats() {
    let mut app = demo_stepped_to(13);
    let slot = select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('l')));
    pick(&mut app, "rear_seats: remove a passenger");
    assert_eq!(
        app.plan.steps[0].step,
        Step::Edit(Edit::Unload("rear_seats".into()))
    );
    assert_eq!(new_state(&app, slot), Some(State::Within));
}

#[test]
fn aircraft_offered_are_not_below_at_the_departure_best_first() {
    // The morning review (at 13Z every pairing at XPIN is below: the list is empty).
    let mut app = demo_stepped_to(8);
    // L16's loads use a middle row of seats: an aircraft whose type lacks it is not
    // offered (validate would refuse the leg), and the heading says why.
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('a')));
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!()
    };
    let Ask::Pick { options, title, .. } = &ui.ask else {
        panic!()
    };
    assert!(options.is_empty(), "{options:?}");
    assert!(
        title.contains("not offered, validate would refuse: X-TOUA")
            && title.contains("no loading station 'middle_seats'"),
        "{title}"
    );
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Esc));
    let slot = select_leg(&mut app, "L15");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('a')));
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!()
    };
    let Ask::Pick { options, title, .. } = &ui.ask else {
        panic!()
    };
    let options = options.clone();
    assert!(!options.is_empty(), "{title}");
    assert!(
        options.iter().all(|(l, _)| !l.contains("below")),
        "{options:?}"
    );
    assert!(
        options.iter().all(|(l, _)| !l.starts_with("X-TOUA")),
        "not the current one"
    );
    // Finding 19: each margin has its unit and says what it is a margin of.
    let units = [" % ", " kt ", " ft "];
    assert!(
        options.iter().all(|(l, _)| {
            let after_word = l.split_once(" within ").or_else(|| l.split_once(" thin "));
            after_word.is_some_and(|(_, rest)| {
                rest.trim_start().starts_with(['+', '-'])
                    && (units.iter().any(|u| rest.contains(u.trim_start())) || rest.contains("% "))
            })
        }),
        "{options:?}"
    );
    let text = screen(&mut app, 120, 40);
    insta::assert_snapshot!(
        text.lines()
            .filter(|l| l.contains(" at XPIN"))
            .map(str::trim_end)
            .collect::<Vec<_>>()
            .join("\n")
    );
    let first = options[0].clone();
    app.update(key(KeyCode::Enter));
    assert_eq!(app.plan.steps[0].step, first.1);
    assert!(app.compared(slot).unwrap().what[0].starts_with("aircraft X-TOUA →"));
}

#[test]
fn destination_fuel_bags_cancel_copy_and_undo() {
    let mut app = demo_stepped_to(13);
    let slot = select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('d')));
    pick(&mut app, "XSHT");
    assert!(
        app.compared(slot)
            .unwrap()
            .what
            .contains(&"to XSEA → XSHT".to_string())
    );
    app.update(key(KeyCode::Char('f')));
    type_text(&mut app, "lots");
    app.update(key(KeyCode::Enter));
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!()
    };
    assert!(
        matches!(&ui.ask, Ask::Type { error: Some(e), .. } if e.contains("expected litres")),
        "{:?}",
        ui.ask
    );
    for _ in 0..4 {
        app.update(key(KeyCode::Backspace));
    }
    type_text(&mut app, "80");
    app.update(key(KeyCode::Enter));
    assert_eq!(app.plan.steps[1].step, Step::Edit(Edit::FuelL(80.0)));
    app.update(key(KeyCode::Char('l')));
    pick(&mut app, "baggage: 10 kg less");
    assert_eq!(app.plan.steps.len(), 3);
    app.update(key(KeyCode::Char('c')));
    let copy = app.plan.slots.len() - 1;
    assert_eq!(app.plan.slots[copy].leg.id, "L16-2");
    assert!(
        app.compared(copy).unwrap().old.is_none(),
        "a new leg has no before"
    );
    assert!(app.compared(copy).unwrap().new.is_some());
    // The copy goes straight to its own time prompt; Esc keeps it and shows its menu.
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!("no what-if panel")
    };
    assert_eq!(ui.slot, copy, "the panel is on the copy");
    assert!(
        matches!(&ui.ask, Ask::Type { note: Some(n), .. } if n.contains("L16-2")),
        "{:?}",
        ui.ask
    );
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('x')));
    assert!(
        app.compared(copy).unwrap().new.is_none(),
        "the copy cancelled"
    );
    assert!(app.compared(slot).unwrap().new.is_some(), "not its source");
    assert_eq!(app.plan.steps.len(), 5);
    // Undo, one at a time, back to nothing.
    app.update(key(KeyCode::Char('u')));
    assert!(app.compared(copy).unwrap().new.is_some());
    app.update(key(KeyCode::Char('u')));
    assert_eq!(app.plan.slots.len(), app.ops.legs.len(), "the copy is gone");
    let Mode::Replan(ui) = &app.ui.mode else {
        panic!("no what-if panel")
    };
    assert_eq!(ui.slot, slot, "back on the leg the copy was made of");
    for _ in 0..3 {
        app.update(key(KeyCode::Char('u')));
    }
    assert!(!app.plan.pending());
    assert!(app.compared(slot).is_none());
    // Undo also works from the board (u outside the panel).
    app.update(key(KeyCode::Char('x')));
    app.update(key(KeyCode::Esc));
    assert!(app.plan.pending());
    app.update(key(KeyCode::Char('u')));
    assert!(!app.plan.pending());
}

#[test]
fn quitting_with_pending_changes_asks_first() {
    let mut app = demo_stepped_to(13);
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('x')));
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('q')));
    assert!(!app.quit);
    assert!(matches!(app.ui.mode, Mode::ConfirmQuit));
    assert!(screen(&mut app, 80, 24).contains("pending and not written"));
    app.update(key(KeyCode::Char('n')));
    assert!(!app.quit, "any other key stays");
    app.update(key(KeyCode::Char('q')));
    app.update(key(KeyCode::Char('y')));
    assert!(app.quit);
}

#[test]
fn the_demo_writes_in_memory_and_the_signoff_of_a_replanned_leg_needs_a_recheck() {
    let tmp = tempfile::tempdir().unwrap();
    let mut app = demo_stepped_to(8);
    app.attach_signoffs(
        Ok(rhoboard::signoff::log::Log::new(
            tmp.path().join("signoffs"),
        )),
        rhoboard::commands::signoff::data_hashes(None),
    );
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('S')));
    type_text(&mut app, "M. Ortiz");
    app.update(key(KeyCode::Enter));
    for e in app.take_effects() {
        let done = perform(&app, e, demo_time(19, 0));
        app.update(done);
    }
    let k = app.rows()[app.ui.leg_row];
    assert!(matches!(app.mark(k), Mark::Signed { .. }));
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(&mut app, "1100");
    app.update(key(KeyCode::Enter));
    app.update(key(KeyCode::Char('w')));
    assert!(
        app.take_effects().is_empty(),
        "the demo has no file to write"
    );
    assert!(
        !app.plan.pending(),
        "{:?}",
        app.notes.iter().map(|n| &n.text).collect::<Vec<_>>()
    );
    assert!(
        app.notes.iter().any(|n| n.text.contains("in memory only")),
        "says so"
    );
    let i = app.ops.legs.iter().position(|l| l.id == "L09").unwrap();
    assert_eq!(app.ops.legs[i].departs_utc(), demo_time(11, 0));
    let k = select_leg(&mut app, "L09");
    let k = app
        .assessment
        .legs
        .iter()
        .position(|r| r.index == k)
        .unwrap();
    assert!(
        matches!(app.mark(k), Mark::Recheck { .. } | Mark::Signed { .. }),
        "{:?}",
        app.mark(k)
    );
    // Another aircraft: the sign-off no longer fits the leg.
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('a')));
    app.update(key(KeyCode::Enter));
    app.update(key(KeyCode::Char('w')));
    let k = app
        .assessment
        .legs
        .iter()
        .position(|r| r.id == "L09")
        .unwrap();
    let Mark::Recheck { why, .. } = app.mark(k) else {
        panic!("{:?}", app.mark(k))
    };
    assert!(
        why.iter().any(|w| w.starts_with("aircraft is now")),
        "{why:?}"
    );
}

#[test]
fn side_by_side_120x40() {
    let mut app = demo_stepped_to(13);
    move_l16_to_0630(&mut app);
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

// --- An operator folder: the safe save and the conflict ---

fn operator_folder() -> tempfile::TempDir {
    let tmp = tempfile::tempdir().unwrap();
    for (path, text) in rhoboard::ops::demo::FILES {
        let p = tmp.path().join(path);
        std::fs::create_dir_all(p.parent().unwrap()).unwrap();
        std::fs::write(p, text).unwrap();
    }
    tmp
}

fn board_on(dir: &std::path::Path) -> App {
    let args = rhoboard::commands::board::Args {
        ops: Some(dir.to_path_buf()),
        at: Some("2026-06-14T13:00:00Z".into()),
        feed_every: "10m".into(),
        ..Default::default()
    };
    let (app, _feeds) = rhoboard::commands::board::prepare(&args, demo_time(13, 0)).unwrap();
    app
}

fn legs_path(dir: &std::path::Path) -> std::path::PathBuf {
    dir.join("legs/2026-06-14.json")
}

/// The backups of the day's legs file (one per replaced version).
fn backups(dir: &std::path::Path) -> Vec<String> {
    let mut out: Vec<String> = std::fs::read_dir(dir.join("legs"))
        .unwrap()
        .filter_map(Result::ok)
        .filter(|e| {
            let n = e.file_name().to_string_lossy().into_owned();
            n.starts_with(".2026-06-14.json.") && n.ends_with(".bak")
        })
        .map(|e| std::fs::read_to_string(e.path()).unwrap())
        .collect();
    out.sort();
    out
}

fn run_io(app: &mut App) -> usize {
    let io = app.take_effects();
    let n = io.len();
    for e in io {
        let done = perform(app, e, demo_time(19, 0));
        app.update(done);
    }
    n
}

#[test]
fn writing_to_an_operator_folder_saves_safely_and_adopts_the_plan() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    let before = std::fs::read_to_string(legs_path(tmp.path())).unwrap();
    move_l16_to_0630(&mut app);
    app.update(key(KeyCode::Esc));
    assert_eq!(
        std::fs::read_to_string(legs_path(tmp.path())).unwrap(),
        before,
        "nothing written before w"
    );
    app.update(key(KeyCode::Char('w')));
    assert_eq!(run_io(&mut app), 1);
    assert!(!app.plan.pending());
    let now = std::fs::read_to_string(legs_path(tmp.path())).unwrap();
    let file: rhoboard::ops::legs::LegsFile = serde_json::from_str(&now).unwrap();
    let l16 = file.legs.iter().find(|l| l.id == "L16").unwrap();
    assert_eq!(l16.departs_utc(), demo_time(6, 30));
    assert!(
        backups(tmp.path()).contains(&before),
        "the previous version is kept"
    );
    // Finding 21: the note names the backup whole, relative to the folder, at 100
    // and at 80 columns (where it wraps onto a second line).
    let bak = std::fs::read_dir(tmp.path().join("legs"))
        .unwrap()
        .filter_map(Result::ok)
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .find(|n| n.ends_with(".bak"))
        .unwrap();
    let note = format!("saved legs/2026-06-14.json (backup: legs/{bak})");
    assert_eq!(app.notes[0].text, note);
    for (w, h) in [(100, 30), (80, 24)] {
        let text = screen(&mut app, w, h);
        assert!(text.contains(&bak), "{w}×{h}: {bak} not whole:\n{text}");
    }
    let k = app
        .assessment
        .legs
        .iter()
        .position(|r| r.id == "L16")
        .unwrap();
    assert_eq!(
        app.assessment.legs[k].state,
        State::Within,
        "the board shows the new plan"
    );
    // A second change writes against the new hash: no false conflict.
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('x')));
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    assert!(!matches!(app.ui.mode, Mode::Conflict));
    let file: rhoboard::ops::legs::LegsFile =
        serde_json::from_str(&std::fs::read_to_string(legs_path(tmp.path())).unwrap()).unwrap();
    assert!(file.legs.iter().all(|l| l.id != "L16"), "cancelled");
}

#[test]
fn a_legs_file_changed_on_disk_is_not_overwritten_and_both_versions_are_shown() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    move_l16_to_0630(&mut app);
    // Another dispatcher moves L16 to another aircraft meanwhile.
    let path = legs_path(tmp.path());
    let theirs = they_edit(
        &path,
        "\"aircraft\": \"X-UTLB\"",
        "\"aircraft\": \"X-UTLA\"",
    );
    app.update(key(KeyCode::Char('w')));
    assert_eq!(run_io(&mut app), 1);
    assert!(matches!(app.ui.mode, Mode::Conflict));
    assert_eq!(
        std::fs::read_to_string(&path).unwrap(),
        theirs,
        "nothing lost"
    );
    assert!(app.plan.pending(), "ours stay pending");
    let c = app.plan.conflict.as_ref().unwrap();
    let (_, loaded, their, ours) = c.legs.iter().find(|(id, ..)| id == "L16").unwrap();
    assert!(loaded.contains("1230Z X-UTLB"), "{loaded}");
    assert!(their.contains("1230Z X-UTLA"), "{their}");
    // What `o` would write: our time onto their aircraft.
    assert!(ours.contains("0630Z X-UTLA"), "{ours}");
    let text = screen(&mut app, 140, 40);
    assert!(text.contains("theirs now: 1230Z X-UTLA"), "{text}");
    assert!(text.contains("with o:     0630Z X-UTLA"), "{text}");

    // Overwrite with ours: theirs is kept as the backup.
    app.update(key(KeyCode::Char('o')));
    assert_eq!(run_io(&mut app), 1);
    assert!(!app.plan.pending());
    let now = std::fs::read_to_string(&path).unwrap();
    assert!(now.contains("\"2026-06-14T06:30:00Z\""), "ours written");
    assert!(backups(tmp.path()).contains(&theirs), "theirs kept");
    // Our change went onto their version: their aircraft stays (finding 12).
    let file: rhoboard::ops::legs::LegsFile = serde_json::from_str(&now).unwrap();
    let l16 = file.legs.iter().find(|l| l.id == "L16").unwrap();
    assert_eq!(l16.aircraft, "X-UTLA", "their change kept");
    assert_eq!(l16.departs_utc(), demo_time(6, 30), "ours applied");
    let on_board = app.ops.legs.iter().find(|l| l.id == "L16").unwrap();
    assert_eq!(
        on_board.aircraft, "X-UTLA",
        "the board shows the merged leg"
    );
}

/// Finding 12: another dispatcher's unrelated change (L16's fuel 125 → 130 L) is not
/// reverted by `o`; our change (L12 cancelled, L16 one passenger fewer) goes onto it.
#[test]
fn our_changes_go_onto_theirs_and_keep_their_unrelated_change() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    move_l16_to_0630(&mut app);
    let path = legs_path(tmp.path());
    they_edit(
        &path,
        "\"fuel_at_start_l\": 125,",
        "\"fuel_at_start_l\": 130,",
    );
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    assert!(matches!(app.ui.mode, Mode::Conflict));
    app.update(key(KeyCode::Char('o')));
    assert_eq!(run_io(&mut app), 1);
    assert!(!app.plan.pending());
    let file: rhoboard::ops::legs::LegsFile =
        serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    let l16 = file.legs.iter().find(|l| l.id == "L16").unwrap();
    assert_eq!(l16.departs_utc(), demo_time(6, 30), "ours applied");
    assert_eq!(l16.arrives_utc(), demo_time(7, 25), "with its duration");
    let loads = l16.loads.as_ref().unwrap();
    assert_eq!(loads.fuel_at_start_l, Some(130.0), "their fuel kept");
    assert_eq!(file.legs.len(), 16, "no leg lost or doubled");
}

/// Both moved L16's departure, to different times: a real conflict, nothing written,
/// both values named; `t` still keeps theirs.
#[test]
fn a_field_both_changed_is_a_real_conflict_and_nothing_is_written() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    move_l16_to_0630(&mut app);
    let path = legs_path(tmp.path());
    let theirs = they_edit(
        &path,
        "\"departs_at\": \"2026-06-14T12:30:00Z\"",
        "\"departs_at\": \"2026-06-14T12:45:00Z\"",
    );
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    app.update(key(KeyCode::Char('o')));
    assert_eq!(run_io(&mut app), 0, "nothing queued");
    assert!(matches!(app.ui.mode, Mode::Conflict), "still deciding");
    assert_eq!(std::fs::read_to_string(&path).unwrap(), theirs);
    let text = screen(&mut app, 200, 40);
    assert!(
        text.contains(
            "both changed L16 departs_at: theirs 2026-06-14T12:45:00Z, ours 2026-06-14T06:30:00Z"
        ),
        "{text}"
    );
    assert!(app.plan.pending());
    app.update(key(KeyCode::Char('t')));
    assert!(!app.plan.pending());
}

#[test]
fn keeping_theirs_reloads_their_legs() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('x')));
    let path = legs_path(tmp.path());
    let theirs = they_edit(
        &path,
        "\"aircraft\": \"X-UTLB\"",
        "\"aircraft\": \"X-UTLA\"",
    );
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    assert!(matches!(app.ui.mode, Mode::Conflict));
    app.update(key(KeyCode::Char('t')));
    assert!(matches!(app.ui.mode, Mode::Normal));
    assert!(!app.plan.pending());
    assert_eq!(std::fs::read_to_string(&path).unwrap(), theirs);
    let l16 = app.ops.legs.iter().find(|l| l.id == "L16").unwrap();
    assert_eq!(l16.aircraft, "X-UTLA", "the board now shows their version");
    // And the next save goes against their hash.
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('x')));
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    assert!(!matches!(app.ui.mode, Mode::Conflict));
}

/// With masses shown in lb, the loads menu's bag steps read in lb (10 kg = 22 lb, by
/// the exact 0.45359237 kg/lb of the international pound) and still step the file's kg.
#[test]
fn the_loads_menu_follows_the_display_mass_unit() {
    let mut app = demo_stepped_to(13);
    app.ops.operator.display_units.mass = rhoboard::ops::operator::MassUnit::Lb;
    let slot = select_leg(&mut app, "L16");
    let bag_kg = app.ops.legs[slot]
        .loads
        .as_ref()
        .and_then(|l| l.stations.iter().find(|s| s.station == "baggage"))
        .and_then(|s| s.mass_kg)
        .expect("L16 carries baggage");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('l')));
    let lb = |kg: f64| format!("{:.0} lb", kg / 0.453_592_37);
    let label = format!(
        "baggage: 22 lb less ({} → {})",
        lb(bag_kg),
        lb(bag_kg - 10.0)
    );
    pick(&mut app, &label);
    let Step::Edit(Edit::Load { mass_kg, .. }) = &app.plan.steps[0].step else {
        panic!("{:?}", app.plan.steps)
    };
    assert_eq!(*mass_kg, Some(bag_kg - 10.0));
}

/// They removed L16, we moved it: `o` cannot apply ours onto a leg that is gone — a
/// real conflict, nothing written.
#[test]
fn a_leg_they_removed_and_we_changed_is_a_real_conflict() {
    let tmp = operator_folder();
    let mut app = board_on(tmp.path());
    move_l16_to_0630(&mut app);
    let path = legs_path(tmp.path());
    let mut file: rhoboard::ops::legs::LegsFile =
        serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    file.legs.retain(|l| l.id != "L16");
    let theirs = serde_json::to_string_pretty(&file).unwrap() + "\n";
    std::fs::write(&path, &theirs).unwrap();
    app.update(key(KeyCode::Char('w')));
    run_io(&mut app);
    assert!(matches!(app.ui.mode, Mode::Conflict));
    app.update(key(KeyCode::Char('o')));
    assert_eq!(run_io(&mut app), 0, "nothing queued");
    assert!(matches!(app.ui.mode, Mode::Conflict));
    assert_eq!(std::fs::read_to_string(&path).unwrap(), theirs);
    assert!(
        app.notes[0]
            .text
            .contains("both changed L16 (they removed it, we changed it)"),
        "{}",
        app.notes[0].text
    );
}

/// H: a step validate would refuse is shown but does not block further steps; the
/// save vets the whole plan, so moving L09 onto L04's time (X-TOUA on both) is refused
/// until L04 moves too, and then the plan saves.
#[test]
fn the_save_vets_the_whole_plan_and_a_single_step_does_not_block() {
    let mut app = demo_stepped_to(8);
    let notes = |app: &App| app.notes.iter().map(|n| n.text.clone()).collect::<Vec<_>>();
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(&mut app, "0900");
    app.update(key(KeyCode::Enter));
    assert!(app.plan.pending());
    assert!(
        notes(&app)
            .iter()
            .any(|n| n.starts_with("L09: validate would refuse") && n.contains("overlaps leg L09")),
        "{:?}",
        notes(&app)
    );
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('w')));
    assert!(app.plan.pending(), "refused: {:?}", notes(&app));
    assert!(
        notes(&app)
            .iter()
            .any(|n| n.starts_with("nothing written: validate would refuse")
                && n.contains("aircraft X-TOUA is on leg L04")),
        "{:?}",
        notes(&app)
    );
    // Moving L04 out of the way settles it: the plan as a whole is sound.
    app.update(key(KeyCode::Esc));
    select_leg(&mut app, "L04");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(&mut app, "1300");
    app.update(key(KeyCode::Enter));
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('w')));
    assert!(!app.plan.pending(), "{:?}", notes(&app));
    assert!(notes(&app).iter().any(|n| n.contains("in memory only")));
    let departs = |id: &str| {
        app.ops
            .legs
            .iter()
            .find(|l| l.id == id)
            .map(|l| l.departs_utc().format("%H%M").to_string())
    };
    assert_eq!(departs("L09").as_deref(), Some("0900"));
    assert_eq!(departs("L04").as_deref(), Some("1300"));
}

/// Opens the what-if on L16 and moves it to 0630Z (the edit most tests start from).
fn move_l16_to_0630(app: &mut App) {
    select_leg(app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(app, "0630");
    app.update(key(KeyCode::Enter));
    // At 13Z 0630Z is past: the warning first, then the second Enter plans it.
    app.update(key(KeyCode::Enter));
}

/// Another dispatcher's edit of the legs file on disk: the first `from` becomes `to`
/// (which must change the file); returns the file as they left it.
fn they_edit(path: &std::path::Path, from: &str, to: &str) -> String {
    let before = std::fs::read_to_string(path).unwrap();
    let theirs = before.replacen(from, to, 1);
    assert_ne!(theirs, before, "their edit changes the file");
    std::fs::write(path, &theirs).unwrap();
    theirs
}

/// The whole-plan vetting counts a cancelled leg as gone and vets a copy like any leg;
/// what it says stands inside the what-if panel, not only in the passing notices.
#[test]
fn copies_are_vetted_cancelled_legs_are_gone_and_the_panel_says_so() {
    let mut app = demo_stepped_to(8);
    // A copy of L04 flies X-TOUA at L04's own time: validate refuses the copy.
    let l04 = select_leg(&mut app, "L04");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('c')));
    app.update(key(KeyCode::Esc));
    let copy = app.plan.slots.len() - 1;
    let v = app.compared(copy).unwrap().vetting.clone();
    assert!(
        v.refusals
            .iter()
            .any(|r| r.contains("X-TOUA") && r.contains("L04")),
        "{v:?}"
    );
    assert!(
        app.plan_refusals().iter().any(|r| r.starts_with("L04-2: ")),
        "{:?}",
        app.plan_refusals()
    );
    // The panel is on the copy (c opened its time prompt): its own refusal shows.
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("new leg, a copy of L04"), "{text}");
    assert!(
        text.contains("✗ validate would refuse (w writes nothing)"),
        "{text}"
    );
    assert!(text.contains("⚠ warning:"), "{text}");
    app.update(key(KeyCode::Char('u')));
    // Moving L09 onto L04's time is refused while L04 flies ...
    app.update(key(KeyCode::Esc));
    select_leg(&mut app, "L09");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('t')));
    type_text(&mut app, "0900");
    app.update(key(KeyCode::Enter));
    let l09 = app.ops.legs.iter().position(|l| l.id == "L09").unwrap();
    let v = app.compared(l09).unwrap().vetting.clone();
    assert!(v.refusals.iter().any(|r| r.contains("L04")), "{v:?}");
    let text = screen(&mut app, 120, 40);
    assert!(
        text.contains("✗ validate would refuse (w writes nothing)"),
        "{text}"
    );
    // ... and not once L04 is cancelled: a cancelled leg holds no aircraft.
    app.update(key(KeyCode::Esc));
    select_leg(&mut app, "L04");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('x')));
    assert!(app.plan.slots[l04].cancelled);
    assert!(app.plan_refusals().is_empty(), "{:?}", app.plan_refusals());
    assert!(app.compared(l09).unwrap().vetting.refusals.is_empty());
}

/// Finding: at 80×24 the loads list showed 4 of its choices, no position, and the
/// highlight moved off-screen. The list now scrolls with the highlight and says where.
#[test]
fn a_long_pick_list_keeps_the_highlight_on_screen_at_80x24() {
    let mut app = demo_stepped_to(13);
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('l')));
    let labels: Vec<String> = match &app.ui.mode {
        Mode::Replan(ui) => match &ui.ask {
            Ask::Pick { options, .. } => options.iter().map(|(l, _)| l.clone()).collect(),
            other => panic!("{other:?}"),
        },
        _ => panic!("no what-if panel"),
    };
    let n = labels.len();
    assert!(n > 4, "{labels:?}");
    for (i, label) in labels.iter().enumerate() {
        let text = screen(&mut app, 80, 24);
        // The highlighted label's start is on screen, and the position with it.
        let head: String = label.chars().take(30).collect();
        assert!(
            text.contains(head.trim_end()),
            "row {i} off screen:\n{text}"
        );
        assert!(
            text.contains(&format!("({} of {n}; ↑↓ scroll", i + 1)),
            "no position at row {i}:\n{text}"
        );
        app.update(key(KeyCode::Down));
    }
}

/// Finding: typing an airfield in the destination list was ignored and Enter took the
/// first entry. Typing jumps to the match; a key that matches nothing is refused in
/// words; Enter takes the highlighted choice only.
#[test]
fn typing_in_the_destination_list_jumps_and_a_mismatch_is_refused() {
    let mut app = demo_stepped_to(13);
    let slot = select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('d')));
    type_text(&mut app, "xmr");
    let cursor_label = |app: &App| match &app.ui.mode {
        Mode::Replan(ui) => match &ui.ask {
            Ask::Pick {
                options, cursor, ..
            } => options[*cursor].0.clone(),
            other => panic!("{other:?}"),
        },
        _ => panic!("no what-if panel"),
    };
    assert!(
        cursor_label(&app).starts_with("XMRS"),
        "{}",
        cursor_label(&app)
    );
    // Text that matches nothing is said so, and Enter then chooses nothing.
    app.update(key(KeyCode::Char('Q')));
    assert!(cursor_label(&app).starts_with("XMRS"));
    let text = screen(&mut app, 120, 40);
    assert!(text.contains("no choice matches 'xmrQ'"), "{text}");
    app.update(key(KeyCode::Enter));
    assert!(!app.plan.pending(), "nothing chosen");
    assert!(screen(&mut app, 120, 40).contains("Enter chose nothing"));
    // Backspace back to a match; Enter takes the highlighted choice and says which.
    app.update(key(KeyCode::Backspace));
    app.update(key(KeyCode::Enter));
    assert!(
        app.compared(slot)
            .unwrap()
            .what
            .iter()
            .any(|w| w.contains("XMRS")),
        "{:?}",
        app.compared(slot).unwrap().what
    );
    assert!(
        app.notes
            .iter()
            .any(|n| n.text.contains("what-if: chose XMRS"))
    );
    // An airfield not in the list (XSEA is L16's destination now) is refused too.
    app.update(key(KeyCode::Char('d')));
    type_text(&mut app, "XSEB");
    assert!(screen(&mut app, 120, 40).contains("no choice matches 'XSEB'"));
}

/// The loads list says what a change does to a station stated by mass (trial finding:
/// "front_seats: add a passenger (0 → 1)" where the pilot's 84 kg sits, and "empty it"
/// that would empty the pilot's seat without saying so); an empty aircraft list says
/// why rather than "nothing to choose".
#[test]
fn the_pick_lists_say_what_they_change_and_why_they_are_empty() {
    let mut app = demo_stepped_to(13);
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    app.update(key(KeyCode::Char('l')));
    let labels: Vec<String> = match &app.ui.mode {
        Mode::Replan(ui) => match &ui.ask {
            Ask::Pick { options, .. } => options.iter().map(|(l, _)| l.clone()).collect(),
            other => panic!("{other:?}"),
        },
        _ => panic!("no what-if panel"),
    };
    assert!(
        labels
            .iter()
            .any(|l| l == "front_seats: add a standard adult (84 kg stated, one more)"),
        "{labels:?}"
    );
    // The pilot's seat is never offered empty (validate refuses a leg with nobody
    // there); another station is.
    assert!(
        !labels
            .iter()
            .any(|l| l.starts_with("front_seats: empty it")),
        "{labels:?}"
    );
    assert!(
        labels
            .iter()
            .any(|l| l == "rear_seats: empty it (Rear row: all of it, 1 adult(s))"),
        "{labels:?}"
    );
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('a')));
    match &app.ui.mode {
        Mode::Replan(ui) => match &ui.ask {
            // At 13Z no other aircraft is not-below at XPIN (docs/board.md).
            Ask::Pick { options, title, .. } => {
                assert!(options.is_empty(), "{options:?}");
                assert!(
                    title.starts_with(
                        "No other aircraft for L16: every other available one is below at XPIN now"
                    ),
                    "{title}"
                );
            }
            other => panic!("{other:?}"),
        },
        _ => panic!("no what-if panel"),
    }
}
