//! Whole-board snapshots (TestBackend text) of the demo day on a fixed replay clock.

#[path = "common/board.rs"]
mod board_common;

use board_common::{demo, demo_stepped_to, key, render, screen, type_text};
use ratatui::crossterm::event::KeyCode;
use rhoboard::board::App;

fn select_leg(app: &mut App, id: &str) {
    app.update(key(KeyCode::Home));
    for _ in 0..app.rows().len() {
        if app.selected_leg().is_some_and(|r| r.id == id) {
            return;
        }
        app.update(key(KeyCode::Down));
    }
    panic!("leg {id} not found");
}

#[test]
fn morning_80x24() {
    let mut app = demo_stepped_to(8);
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn morning_120x40() {
    let mut app = demo_stepped_to(8);
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn morning_200x60() {
    let mut app = demo_stepped_to(8);
    insta::assert_snapshot!(render(&mut app, 200, 60).backend());
}

#[test]
fn afternoon_80x24() {
    let mut app = demo_stepped_to(15);
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn afternoon_120x40() {
    let mut app = demo_stepped_to(15);
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn afternoon_200x60() {
    let mut app = demo_stepped_to(15);
    insta::assert_snapshot!(render(&mut app, 200, 60).backend());
}

#[test]
fn detail_of_a_below_leg_120x40() {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L15");
    assert_eq!(app.selected_leg().unwrap().state.word(), "below");
    app.update(key(KeyCode::Enter));
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn detail_of_a_below_leg_beside_legs_200x60() {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L14");
    assert_eq!(app.selected_leg().unwrap().state.word(), "below");
    insta::assert_snapshot!(render(&mut app, 200, 60).backend());
}

#[test]
fn detail_of_a_below_leg_80x24_scrolled_to_the_takeoff() {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L15");
    app.update(key(KeyCode::Enter));
    for _ in 0..14 {
        app.update(key(KeyCode::Down));
    }
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn help_overlay_80x24() {
    let mut app = demo_stepped_to(8);
    app.update(key(KeyCode::Char('?')));
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn help_overlay_80x24_scrolled() {
    let mut app = demo_stepped_to(8);
    app.update(key(KeyCode::Char('?')));
    for _ in 0..20 {
        app.update(key(KeyCode::Down));
    }
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn help_overlay_120x40() {
    let mut app = demo_stepped_to(8);
    app.update(key(KeyCode::Char('?')));
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn manual_entry_form_with_errors_120x40() {
    let mut app = demo_stepped_to(8);
    app.update(key(KeyCode::Char('o')));
    // Station is prefilled from the selected leg; wind direction 400 and a temperature
    // without unit are wrong; the altimeter is left empty.
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "400");
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "12kt");
    for _ in 0..4 {
        app.update(key(KeyCode::Tab));
    }
    type_text(&mut app, "hot");
    app.update(key(KeyCode::Enter));
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn pairings_120x40() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Tab));
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn pairing_chain_120x40() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Right));
    app.update(key(KeyCode::Right));
    app.update(key(KeyCode::Enter));
    insta::assert_snapshot!(render(&mut app, 120, 40).backend());
}

#[test]
fn airfields_fleet_reports_120x40() {
    let mut app = demo_stepped_to(15);
    let mut shots = String::new();
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    for _ in 0..3 {
        shots.push_str(&screen(&mut app, 120, 40));
        app.update(key(KeyCode::Tab));
    }
    // Airfields, Fleet, Reports in turn.
    insta::assert_snapshot!(shots);
}

#[test]
fn too_small_message() {
    let mut app = demo(8, 0);
    insta::assert_snapshot!(render(&mut app, 60, 20).backend());
}

#[test]
fn tiny_terminals_do_not_panic() {
    let mut app = demo(8, 0);
    for (w, h) in [
        (1, 1),
        (0, 0),
        (1, 30),
        (200, 1),
        (79, 24),
        (80, 23),
        (80, 24),
    ] {
        render(&mut app, w, h);
    }
    app.update(key(KeyCode::Enter));
    app.update(key(KeyCode::Char('?')));
    render(&mut app, 1, 1);
    render(&mut app, 80, 24);
}

#[test]
fn the_first_frame_lists_the_days_legs_with_their_states() {
    let mut app = demo(6, 30);
    let s = screen(&mut app, 80, 24);
    for id in ["L01", "L02", "L08", "L10"] {
        assert!(s.contains(id), "{id} missing:\n{s}");
    }
    assert!(s.contains("✓ within") && s.contains("below"), "{s}");
    assert!(s.contains("Planning aid only"), "{s}");
}

#[test]
fn states_are_coloured_and_no_color_keeps_glyph_word_and_bold() {
    use ratatui::style::{Color, Modifier};
    for color in [true, false] {
        let mut app = App::demo(
            board_common::demo_time(15, 0),
            rhoboard::board::Settings {
                color,
                ..Default::default()
            },
        )
        .unwrap();
        let t = render(&mut app, 120, 40);
        let buf = t.backend().buffer();
        // Find "✗ below" in the legs' state column and check its style.
        let (x, y) = (0..40u16)
            .flat_map(|y| (0..120u16).map(move |x| (x, y)))
            .find(|&(x, y)| buf[(x, y)].symbol() == "✗" && x > 30 && y > 2)
            .expect("a below leg");
        let cell = &buf[(x, y)];
        assert_eq!(buf[(x + 2, y)].symbol(), "b", "glyph then word");
        assert!(cell.modifier.contains(Modifier::BOLD), "below is bold");
        if color {
            assert_eq!(cell.fg, Color::Red);
        } else {
            assert_eq!(cell.fg, Color::Reset, "NO_COLOR: no colour");
        }
    }
}
