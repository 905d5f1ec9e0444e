//! Whole-board snapshots (TestBackend text) of the demo day on a fixed replay clock.

#[path = "common/board.rs"]
mod board_common;

use board_common::{demo, demo_stepped_to, key, render, screen, type_text};
use ratatui::crossterm::event::KeyCode;
use rhoboard::board::App;

/// A leg's detail at `width` columns, line by line, without colour.
fn detail_text(app: &App, r: &rhoboard::assess::LegResult, width: u16) -> Vec<String> {
    rhoboard::board::detail::lines(
        &app.ops,
        r,
        None,
        rhoboard::board::theme::Theme { color: false },
        width,
    )
    .iter()
    .map(|l| l.to_string())
    .collect()
}

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
    insta::assert_snapshot!(render(&mut app, 59, 19).backend());
}

#[test]
fn tiny_terminals_do_not_panic() {
    let mut app = demo(8, 0);
    for (w, h) in [
        (1, 1),
        (0, 0),
        (1, 30),
        (200, 1),
        (59, 20),
        (60, 19),
        (60, 20),
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

/// Opens L16's detail in the afternoon and scrolls to its mass-and-balance section.
fn l16_at_its_mass_and_balance(w: u16, h: u16) -> App {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L16");
    assert_eq!(app.selected_leg().unwrap().state.word(), "below");
    app.update(key(KeyCode::Enter));
    // Scroll until the section's heading is the detail's first line.
    for _ in 0..400 {
        let s = screen(&mut app, w, h);
        if s.lines()
            .skip(3)
            .take(1)
            .any(|l| l.contains("── Mass and balance"))
        {
            return app;
        }
        app.update(key(KeyCode::Down));
    }
    panic!("no mass and balance section in L16's detail");
}

#[test]
fn l16_mass_and_balance_with_the_envelope_120x40() {
    let mut app = l16_at_its_mass_and_balance(120, 40);
    let t = render(&mut app, 120, 40);
    let s = format!("{}", t.backend());
    assert!(
        s.contains("CG envelope") && s.contains('T') && s.contains('L'),
        "{s}"
    );
    insta::assert_snapshot!(t.backend());
}

#[test]
fn l16_mass_and_balance_with_the_envelope_200x60() {
    let mut app = l16_at_its_mass_and_balance(200, 60);
    insta::assert_snapshot!(render(&mut app, 200, 60).backend());
}

#[test]
fn airfields_with_sunset_and_runway_state_120x40() {
    let mut app = demo_stepped_to(15);
    // Close the first airfield's end in use until 18:00Z from the Airfields pane.
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Char('r')));
    let rhoboard::board::app::Mode::Runway(f) = &app.ui.mode else {
        panic!("the runway form is open");
    };
    assert_eq!(f.airfield(), app.ops.airfields[0].id);
    type_text(&mut app, "y");
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "18:00Z");
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "works");
    app.update(key(KeyCode::Enter));
    let s = screen(&mut app, 120, 40);
    // From the board's clock (15:00Z): the legs already flown keep the end.
    assert!(s.contains("closed 1500Z–1800Z (works)"), "{s}");
    assert!(s.contains("sunset"), "{s}");
    insta::assert_snapshot!(s);
}

#[test]
fn runway_form_with_errors_120x40() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Char('r')));
    // Prefilled with the selected leg's departure and its runway; a TORA without unit.
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "900");
    app.update(key(KeyCode::Enter));
    let s = screen(&mut app, 120, 40);
    assert!(s.contains("✗ TORA '900'"), "{s}");
    insta::assert_snapshot!(s);
}

#[test]
fn runway_form_with_an_unknown_end_80x24() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Char('r')));
    app.update(key(KeyCode::Up)); // to "end"
    for _ in 0..4 {
        app.update(key(KeyCode::Backspace));
    }
    type_text(&mut app, "99");
    app.update(key(KeyCode::Tab));
    type_text(&mut app, "y");
    app.update(key(KeyCode::Enter));
    let s = screen(&mut app, 80, 24);
    assert!(s.contains("has no runway end '99'"), "{s}");
    insta::assert_snapshot!(s);
}

#[test]
fn new_widgets_in_tiny_terminals_do_not_panic() {
    let mut app = l16_at_its_mass_and_balance(120, 40);
    for (w, h) in [
        (1, 1),
        (0, 0),
        (2, 2),
        (80, 24),
        (81, 25),
        (140, 24),
        (200, 60),
    ] {
        render(&mut app, w, h);
    }
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Char('r')));
    for (w, h) in [(1, 1), (0, 0), (80, 24)] {
        render(&mut app, w, h);
    }
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    for (w, h) in [(1, 1), (0, 0), (80, 24), (200, 1), (1, 60)] {
        render(&mut app, w, h);
    }
}

#[test]
fn mass_and_balance_follows_the_display_unit() {
    let mut app = demo_stepped_to(15);
    app.ops.operator.display_units.mass = rhoboard::ops::operator::MassUnit::Lb;
    select_leg(&mut app, "L16");
    let r = app.selected_leg().unwrap();
    let text = detail_text(&app, r, 120);
    let text = text.join("\n");
    // 1466 kg × 2.20462 ≈ 3233 lb; 1355 mm ÷ 25.4 ≈ 53.3 in.
    let section = &text[text.find("── Mass and balance").expect("the section")..];
    assert!(
        section.contains("takeoff  mass  3233 lb  CG   53.3 in"),
        "{section}"
    );
    assert!(
        section.contains("lb·in") && section.contains("US gal"),
        "{section}"
    );
    assert!(section.contains("72 lb must come off"), "{section}");
    let table = &section[..section.find("Checks").unwrap()];
    assert!(!table.contains(" kg "), "{table}");
}

/// Every signed number in the legs table (margins, headroom) carries its unit, so
/// none was cut off its unit: `+5 kt`, `-6 %`, `+1095 ft`, `≥+23.0°C`.
fn legs_rows_are_whole(s: &str) {
    const UNITS: [&str; 6] = ["%", "kt", "ft", "m", "°C", "°F"];
    for line in s.lines().filter(|l| l.contains(" L0") || l.contains(" L1")) {
        let cells: Vec<&str> = line.split_whitespace().collect();
        for (i, c) in cells.iter().enumerate() {
            let Some(n) = c.trim_start_matches('≥').strip_prefix(['+', '-']) else {
                continue;
            };
            if !n.starts_with(|ch: char| ch.is_ascii_digit()) {
                continue;
            }
            let next = cells
                .get(i + 1)
                .map_or("", |n| n.trim_end_matches([',', ';', ')']));
            let glued = UNITS.iter().any(|u| n.ends_with(u));
            assert!(
                glued || (n.parse::<f64>().is_ok() && UNITS.contains(&next)),
                "{c:?} without its unit in {line:?}"
            );
        }
    }
}

/// The afternoon at w×h, its legs rows checked whole.
fn afternoon_whole(w: u16, h: u16) -> ratatui::Terminal<ratatui::backend::TestBackend> {
    let mut app = demo_stepped_to(15);
    legs_rows_are_whole(&screen(&mut app, w, h));
    render(&mut app, w, h)
}

#[test]
fn afternoon_60x20() {
    insta::assert_snapshot!(afternoon_whole(60, 20).backend());
}

#[test]
fn afternoon_100x30() {
    insta::assert_snapshot!(afternoon_whole(100, 30).backend());
}

#[test]
fn afternoon_160x50() {
    insta::assert_snapshot!(afternoon_whole(160, 50).backend());
}

/// The screens of `make(w, h)` at each size, each under a `── w×h` line.
fn screens_at(sizes: &[(u16, u16)], make: impl Fn(u16, u16) -> App) -> String {
    let mut shots = String::new();
    for &(w, h) in sizes {
        let mut app = make(w, h);
        shots.push_str(&format!("── {w}×{h}\n"));
        shots.push_str(&screen(&mut app, w, h));
    }
    shots
}

#[test]
fn detail_of_a_below_leg_at_60x20_100x30_and_160x50() {
    let shots = screens_at(&[(60, 20), (100, 30), (160, 50)], |w, _| {
        let mut app = demo_stepped_to(15);
        select_leg(&mut app, "L15");
        app.update(key(KeyCode::Enter));
        // Narrow: scrolled to the air and the takeoff chain.
        for _ in 0..if w < 140 { 12 } else { 0 } {
            app.update(key(KeyCode::Down));
        }
        app
    });
    insta::assert_snapshot!(shots);
}

#[test]
fn help_overlay_60x20_and_100x30() {
    let shots = screens_at(&[(60, 20), (100, 30)], |_, _| {
        let mut app = demo_stepped_to(8);
        app.update(key(KeyCode::Char('?')));
        app
    });
    insta::assert_snapshot!(shots);
}

#[test]
fn airfields_fleet_reports_80x24_and_60x20() {
    // Airfields, Fleet, Reports in turn, each at both sizes.
    let shots: String = (2..5)
        .map(|tabs| {
            screens_at(&[(80, 24), (60, 20)], |_, _| {
                let mut app = demo_stepped_to(15);
                for _ in 0..tabs {
                    app.update(key(KeyCode::Tab));
                }
                app
            })
        })
        .collect();
    insta::assert_snapshot!(shots);
}

fn imperial(app: &mut App) {
    use rhoboard::ops::operator::{DistanceUnit, MassUnit, PressureUnit, TemperatureUnit};
    let u = &mut app.ops.operator.display_units;
    u.distance = DistanceUnit::Ft;
    u.mass = MassUnit::Lb;
    u.pressure = PressureUnit::InHg;
    u.temperature = TemperatureUnit::F;
}

#[test]
fn display_units_ft_lb_inhg_f_everywhere_on_the_board() {
    let mut shots = String::new();
    let mut app = demo_stepped_to(15);
    imperial(&mut app);
    shots.push_str(&screen(&mut app, 120, 40));
    select_leg(&mut app, "L15");
    let r = app.selected_leg().unwrap().clone();
    app.update(key(KeyCode::Enter));
    shots.push_str(&screen(&mut app, 120, 40));
    for _ in 0..22 {
        app.update(key(KeyCode::Down));
    }
    shots.push_str(&screen(&mut app, 120, 40));
    app.update(key(KeyCode::Esc));
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Tab));
    shots.push_str(&screen(&mut app, 120, 40));
    // No metric unit left in the detail of L15 (altitudes stay in ft, wind in kt).
    let text: String = rhoboard::board::detail::lines(
        &app.ops,
        &r,
        None,
        rhoboard::board::theme::Theme { color: false },
        120,
    )
    .iter()
    .map(|l| format!("{l}\n"))
    .collect();
    for metric in [" m ", " m,", " kg", " hPa", " °C"] {
        let hits: Vec<&str> = text.lines().filter(|l| l.contains(metric)).collect();
        assert!(
            hits.is_empty(),
            "{metric:?} in the imperial detail: {hits:#?}"
        );
    }
    // The what-if panel: the leg as planned, its loads in lb.
    app.update(key(KeyCode::BackTab));
    app.update(key(KeyCode::BackTab));
    select_leg(&mut app, "L16");
    app.update(key(KeyCode::Char('e')));
    let panel = screen(&mut app, 120, 40);
    assert!(panel.contains("front_seats 185 lb"), "{panel}");
    assert!(!panel.contains(" kg"), "{panel}");
    shots.push_str(&panel);
    insta::assert_snapshot!(shots);
}

#[test]
fn display_units_m_kg_hpa_c_in_the_detail() {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L15");
    app.update(key(KeyCode::Enter));
    let mut shots = screen(&mut app, 120, 40);
    for _ in 0..22 {
        app.update(key(KeyCode::Down));
    }
    shots.push_str(&screen(&mut app, 120, 40));
    insta::assert_snapshot!(shots);
}

/// Finding 5: hidden rows are told on the tab line — "14 of 16 ↓" at the top, "↑ 3–16
/// of 16" at the bottom — and finding 6: a kept filter shows at 80 and at 60 columns.
#[test]
fn legs_scrolled_to_the_end_80x24() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::End));
    insta::assert_snapshot!(render(&mut app, 80, 24).backend());
}

#[test]
fn kept_filter_80x24_and_60x20() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Char('/')));
    type_text(&mut app, "XSEA");
    app.update(key(KeyCode::Enter));
    let wide = screen(&mut app, 80, 24);
    let narrow = screen(&mut app, 60, 20);
    insta::assert_snapshot!(format!("{wide}\n{narrow}"));
    let tab_line = |s: &str| s.lines().nth(1).unwrap_or_default().to_string();
    assert!(tab_line(&wide).contains("filter: XSEA"), "{wide}");
    assert!(tab_line(&narrow).contains("XSEA"), "{narrow}");
}

/// A filter too long for a 60-column tab line is cut with "…", never left out.
#[test]
fn a_long_kept_filter_is_cut_not_dropped_at_60_columns() {
    let mut app = demo_stepped_to(15);
    app.update(key(KeyCode::Char('/')));
    type_text(&mut app, "density altitude over the ridge");
    app.update(key(KeyCode::Enter));
    let text = screen(&mut app, 60, 20);
    let tabs = text.lines().nth(1).unwrap_or_default();
    assert!(tabs.contains("/density") && tabs.contains('…'), "{text}");
}

#[test]
fn rows_shown_names_what_is_hidden() {
    use rhoboard::board::view::rows_shown;
    assert_eq!(rows_shown(0, 16, 16), None, "all shown");
    assert_eq!(rows_shown(0, 14, 16).as_deref(), Some("14 of 16 ↓"));
    assert_eq!(rows_shown(15, 14, 16).as_deref(), Some("↑ 3–16 of 16"));
    assert_eq!(rows_shown(12, 10, 20).as_deref(), Some("↑ 4–13 of 20 ↓"));
}

/// Finding 11: on an operator folder whose reports are of 2026-06-14, a board running
/// on 2026-12-01 dates the newest report; on the report's own day it shows the time only.
#[test]
fn the_newest_report_of_another_day_shows_its_date() {
    let tmp = tempfile::tempdir().unwrap();
    for (path, text) in rhoboard::ops::demo::FILES {
        let p = tmp.path().join(path);
        std::fs::create_dir_all(p.parent().unwrap()).unwrap();
        std::fs::write(p, text).unwrap();
    }
    let now = chrono::DateTime::parse_from_rfc3339("2026-12-01T22:05:00Z")
        .unwrap()
        .to_utc();
    let args = rhoboard::commands::board::Args {
        ops: Some(tmp.path().to_path_buf()),
        feed_every: "10m".into(),
        ..Default::default()
    };
    let (mut app, _) = rhoboard::commands::board::prepare(&args, now).unwrap();
    let header = |app: &mut App, w: u16| {
        screen(app, w, 30)
            .lines()
            .next()
            .unwrap_or_default()
            .to_string()
    };
    let wide = header(&mut app, 120);
    let narrow = header(&mut app, 80);
    insta::assert_snapshot!(format!("{wide}\n{narrow}"));
    assert!(wide.contains("newest XSEA 2026-06-14 "), "{wide}");
    // The demo replay on its own day: the time alone.
    let mut demo = demo_stepped_to(15);
    let today = header(&mut demo, 120);
    assert!(today.contains("newest XSEA 1500Z"), "{today}");
}

/// Finding 27: at 80 columns "Headroom:" is never left at a line's end without its
/// value; it takes its own line when it does not fit beside the limiting check.
#[test]
fn headroom_keeps_its_value_on_its_line_at_80_columns() {
    for id in ["L15", "L01", "L12"] {
        let mut app = demo_stepped_to(15);
        select_leg(&mut app, id);
        app.update(key(KeyCode::Enter));
        let text = screen(&mut app, 80, 24);
        let line = text
            .lines()
            .find(|l| l.contains("Headroom:"))
            .unwrap_or_else(|| panic!("{id}: no headroom line:\n{text}"));
        let after = line.split_once("Headroom:").unwrap().1.trim_end();
        assert!(
            !after.trim_start_matches('│').trim().is_empty(),
            "{id}: {line}"
        );
    }
}

/// Finding 20: at 80 columns a load's name too long for its column ends in whole words
/// and "…" ("X-UTLB empty (weighing…"), never mid-word.
#[test]
fn a_long_load_name_wraps_whole_at_words_at_80_columns() {
    let mut app = demo_stepped_to(15);
    select_leg(&mut app, "L16");
    let r = app.selected_leg().unwrap();
    let text = detail_text(&app, r, 80);
    let at = text
        .iter()
        .position(|l| l.trim_start().starts_with("X-UTLB empty"))
        .unwrap_or_else(|| panic!("no empty-aircraft row:\n{}", text.join("\n")));
    // The name is never cut: the rest of it goes on the next line, indented.
    insta::assert_snapshot!(
        format!("{}\n{}", text[at].trim_end(), text[at + 1].trim_end()),
        @r"
      X-UTLB empty (weighing        1016 kg   1158 mm 1176.5 kg·m       —
        record)
    "
    );
}

/// Finding 22: a wider terminal never shows fewer legs columns: from 120 columns up,
/// with the detail beside the legs or not, the category and forecast stay.
#[test]
fn wider_never_shows_fewer_legs_columns() {
    for w in [120u16, 140, 150, 159, 160, 170, 200] {
        let mut app = demo_stepped_to(15);
        let text = screen(&mut app, w, 40);
        let head = text
            .lines()
            .find(|l| l.contains(" dep ") && l.contains(" leg "))
            .unwrap_or_else(|| panic!("{w}: no legs header:\n{text}"));
        assert!(head.contains("category"), "{w}: {head}");
        assert!(head.contains("forecast"), "{w}: {head}");
    }
}

#[test]
fn afternoon_150x40() {
    let mut app = demo_stepped_to(15);
    insta::assert_snapshot!(render(&mut app, 150, 40).backend());
}

/// The board's headroom (legs table and detail) says what the report says: a bound
/// at the table's coldest column reads `≤` and "at least … cooler", never "below
/// from" a temperature the search merely stopped at.
#[test]
fn headroom_reads_as_the_report_words_it() {
    use rhoboard::assess::State;
    use rhoboard::board::display::Show;
    let mut below_without_figure = 0;
    for hour in [8, 13, 15] {
        let app = demo_stepped_to(hour);
        let show = Show::of(&app.ops);
        below_without_figure += app
            .assessment
            .legs
            .iter()
            .filter(|r| r.headroom.is_none() && r.state == State::Below)
            .count();
        for r in &app.assessment.legs {
            let cell = rhoboard::board::view::headroom_cell(show, r);
            let words = rhoboard::board::detail::headroom_words(r, show);
            match r.headroom {
                None => {
                    assert_eq!(cell, "—", "{}", r.id);
                    // A below leg says why it has no figure, never "no data".
                    if r.state == State::Below {
                        assert!(
                            words.starts_with("— (below on ")
                                && words.ends_with("warming or cooling does not change it)"),
                            "{}: {words}",
                            r.id
                        );
                    } else {
                        assert_eq!(r.state, State::NoData, "{}", r.id);
                        assert_eq!(words, "— (no data)", "{}", r.id);
                    }
                }
                Some(h) => {
                    // The demo operator shows °C: the report's own figure and words.
                    assert_eq!(cell, h.figure(), "{}", r.id);
                    assert_eq!(words, h.words(), "{}", r.id);
                    if h.table_ends && h.warming_c < 0.0 {
                        assert!(cell.starts_with('≤'), "{}: {cell}", r.id);
                        assert!(words.contains("at least"), "{}: {words}", r.id);
                    }
                }
            }
        }
    }
    assert!(
        below_without_figure > 0,
        "the demo has below legs with no headroom figure to word"
    );
}

/// Every limit row of every leg's detail shows a margin that is the difference of the
/// value and limit it shows (`60 L limit 49 L margin +11 L`, never `+12 L`), and a row
/// with no value says why ("no ceiling reported").
#[test]
fn limit_rows_show_a_margin_equal_to_the_shown_difference() {
    let parse = |s: &str| -> Option<f64> {
        s.split_whitespace()
            .next()?
            .replace('−', "-")
            .trim_start_matches('+')
            .parse()
            .ok()
    };
    let (mut rows, mut no_ceiling) = (0, 0);
    for hour in [8, 15] {
        let app = demo_stepped_to(hour);
        for r in &app.assessment.legs {
            let text = detail_text(&app, r, 160);
            for (i, line) in text.iter().enumerate() {
                let Some((head, rest)) = line.split_once(" limit ") else {
                    continue;
                };
                let Some((limit, margin)) = rest.split_once(" margin ") else {
                    continue;
                };
                let value = head.trim().rsplit("  ").next().unwrap_or("");
                let value = value.split_whitespace().rev().nth(1).unwrap_or("");
                match (
                    value.parse::<f64>().ok(),
                    parse(limit),
                    parse(margin.trim()),
                ) {
                    (Some(v), Some(l), Some(m)) => {
                        rows += 1;
                        let d = [(v - l), (l - v)];
                        assert!(d.iter().any(|d| (d - m).abs() < 1e-6), "{}: {line}", r.id);
                    }
                    (None, Some(_), _)
                        if head.trim_end().ends_with('—')
                            && line.trim_start().starts_with("ceiling") =>
                    {
                        no_ceiling += 1;
                        assert!(
                            text.get(i + 1)
                                .is_some_and(|n| n.trim().contains("ceiling")),
                            "{}: {line} has no note",
                            r.id
                        );
                    }
                    _ => {}
                }
            }
        }
    }
    assert!(rows > 50, "only {rows} rows checked");
    assert!(no_ceiling > 0, "the demo has CAVOK/no-ceiling reports");
}

/// The demo operator copied into a temporary folder, the board live on it at `now`.
fn board_on_a_copy(now: &str) -> (tempfile::TempDir, App) {
    let tmp = tempfile::tempdir().unwrap();
    for (path, text) in rhoboard::ops::demo::FILES {
        let p = tmp.path().join(path);
        std::fs::create_dir_all(p.parent().unwrap()).unwrap();
        std::fs::write(p, text).unwrap();
    }
    let now = chrono::DateTime::parse_from_rfc3339(now).unwrap().to_utc();
    let args = rhoboard::commands::board::Args {
        ops: Some(tmp.path().to_path_buf()),
        feed_every: "10m".into(),
        ..Default::default()
    };
    let (app, _) = rhoboard::commands::board::prepare(&args, now).unwrap();
    (tmp, app)
}

/// On a day with no legs the empty table names the day that has them, in the words of
/// `rhoboard check` ("No legs depart on …. The operator has legs on …: pass --at, e.g.
/// --at …T08:00:00Z."), and says how to start the board there; wrapped, never cut.
#[test]
fn a_day_with_no_legs_names_the_day_that_has_them_60x20_80x24_120x40() {
    let (_tmp, mut app) = board_on_a_copy("2026-12-02T09:00:00Z");
    assert!(app.assessment.legs.is_empty());
    let want = "No legs depart on 2026-12-02. The operator has legs on 2026-06-14: pass --at, \
                e.g. rhoboard board --at 2026-06-14T08:00:00Z.";
    assert_eq!(rhoboard::board::view::no_legs_text(&app), want);
    let all = screens_at(&[(60, 20), (80, 24), (120, 40)], |w, h| {
        let (_tmp, mut app) = board_on_a_copy("2026-12-02T09:00:00Z");
        render(&mut app, w, h);
        app
    });
    insta::assert_snapshot!(all);
    for (w, h) in [(60, 20), (80, 24), (120, 40)] {
        let text = screen(&mut app, w, h);
        let joined: String = text.split_whitespace().collect::<Vec<_>>().join(" ");
        assert!(joined.contains("2026-06-14T08:00:00Z."), "{w}×{h}:\n{text}");
        assert!(
            joined.contains("The operator has legs on 2026-06-14"),
            "{w}×{h}:\n{text}"
        );
    }
}

/// Narrow terminals keep the newest report in the header (60 columns: the counts take
/// their glyph-and-number form first, `✓6 ~1 ✗8 ?1`) and the sort on the tab line with
/// a kept filter (80 columns: the pane titles shorten first); at 60×20, 80×24, 120×40.
#[test]
fn narrow_terminals_keep_the_newest_report_and_the_sort_60x20_80x24_120x40() {
    let make = |w: u16, h: u16| {
        let mut app = demo_stepped_to(15);
        app.update(key(KeyCode::Char('/')));
        type_text(&mut app, "XSEA");
        app.update(key(KeyCode::Enter));
        render(&mut app, w, h);
        app
    };
    insta::assert_snapshot!(screens_at(&[(60, 20), (80, 24), (120, 40)], make));
    for (w, h) in [(60, 20), (80, 24), (120, 40)] {
        let mut filtered = make(w, h);
        let text = screen(&mut filtered, w, h);
        let mut lines = text.lines();
        let head = lines.next().unwrap_or_default();
        let tabs = lines.next().unwrap_or_default();
        assert!(head.contains("XSEA 1500Z"), "{w}: {head}");
        assert!(
            tabs.contains("sort: time") && tabs.contains("XSEA"),
            "{w}: {tabs}"
        );
        let mut plain = demo_stepped_to(15);
        let text = screen(&mut plain, w, h);
        let mut lines = text.lines();
        assert!(
            lines.next().unwrap_or_default().contains("XSEA 1500Z"),
            "{w}:\n{text}"
        );
        assert!(
            lines.next().unwrap_or_default().contains("sort: time"),
            "{w}:\n{text}"
        );
    }
}

/// The fuel line's reserve and the fuel-reserve limit row show the same figure for
/// every leg with loads (both rounded up: the reserve is a minimum to keep), and the
/// fuel at landing is never shown above the row's value (both rounded down).
#[test]
fn the_fuel_line_and_the_reserve_row_agree() {
    let number_before = |line: &str, word: &str| -> Option<u32> {
        let at = line.find(word)?;
        line[..at].split_whitespace().last()?.parse().ok()
    };
    let mut compared = 0;
    for hour in [8, 15] {
        let app = demo_stepped_to(hour);
        for r in &app.assessment.legs {
            let text = detail_text(&app, r, 200);
            let Some(reserve) = text.iter().find_map(|l| {
                let l = l.trim();
                l.strip_prefix("reserve ")
                    .and_then(|rest| rest.split_whitespace().next()?.parse::<u32>().ok())
            }) else {
                continue;
            };
            let landing = text
                .iter()
                .find_map(|l| number_before(l, "L at landing"))
                .expect("a fuel line");
            let row = text
                .iter()
                .find(|l| l.trim_start().starts_with("fuel reserve "))
                .unwrap_or_else(|| panic!("{}: no fuel reserve row", r.id));
            let limit = number_before(row, "L  margin").expect("the row's limit");
            let value = number_before(row, "L limit").expect("the row's value");
            assert_eq!(reserve, limit, "{}: {row}", r.id);
            assert!(landing <= value, "{}: {landing} L vs {row}", r.id);
            compared += 1;
        }
    }
    assert!(compared >= 10, "{compared} legs compared");
}

/// One margin everywhere (trial finding: the detail's takeoff check said -6 % where
/// the legs table and `check` said -7 %; a pairing cell -8 kt where its chain and
/// `check --pairings` said -9 kt): a distance check's line in the detail ends in the
/// limiting margin, and every pairing cell's margin is `check`'s, rounded down.
#[test]
fn the_detail_the_pairings_and_check_give_one_margin() {
    use rhoboard::assess::leg::LimitingAt;
    use rhoboard::board::display::Show;
    let mut compared = (0, 0);
    for hour in [8, 13, 14, 15] {
        let app = demo_stepped_to(hour);
        for r in &app.assessment.legs {
            let Some(l) = &r.limiting else { continue };
            if !matches!(l.at, LimitingAt::Takeoff(_) | LimitingAt::Landing(_)) {
                continue;
            }
            let text = detail_text(&app, r, 200);
            // "… 1171 m needed of 1100 m → -7 %  ✗ below"
            let arrow = format!("→ {}  ", l.margin);
            assert!(
                text.iter()
                    .any(|t| t.contains("needed of") && t.contains(&arrow)),
                "{hour}Z {}: no line ends in {arrow:?}:\n{}",
                r.id,
                text.join("\n")
            );
            compared.0 += 1;
        }
        let show = Show::of(&app.ops);
        for c in app.assessment.matrix.cells() {
            let board = rhoboard::board::view::pair_margin(c, show)
                .map(|(m, unit, _)| {
                    let sep = if unit.is_empty() { "" } else { " " };
                    format!("{m:+.0}{sep}{unit}")
                })
                .unwrap_or_else(|| "—".to_string());
            assert_eq!(board, rhoboard::commands::check::pair_margin_text(c, show));
            compared.1 += 1;
        }
    }
    assert!(compared.0 >= 8 && compared.1 >= 100, "{compared:?}");
}

/// One quantity reads the same on every line (trial finding: a detail's air said
/// density altitude 8336 ft and its limit row 8337 ft; "Mass: takeoff 1466 kg" beside
/// "takeoff mass 1467 kg"): each is rounded up on every line, as the limits' rows round
/// a value against a maximum.
#[test]
fn density_altitude_and_mass_read_the_same_on_every_line() {
    let number_before = |line: &str, word: &str| -> Option<i64> {
        let at = line.find(word)?;
        line[..at].split_whitespace().last()?.parse().ok()
    };
    let mut compared = 0;
    for hour in [8, 13, 15] {
        let app = demo_stepped_to(hour);
        for r in &app.assessment.legs {
            let text = detail_text(&app, r, 200);
            let air: Vec<i64> = text
                .iter()
                .filter(|l| l.contains("(cross-check"))
                .filter_map(|l| number_before(l, "ft (cross-check"))
                .collect();
            for row in text.iter().filter(|l| {
                l.trim_start().starts_with("density altitude ") && l.contains(" limit ")
            }) {
                let v = number_before(row, "ft limit").expect("a value");
                assert!(
                    air.contains(&v),
                    "{hour}Z {}: {row} vs the air {air:?}",
                    r.id
                );
                compared += 1;
            }
            let head = text
                .iter()
                .find(|l| l.starts_with("Mass: takeoff"))
                .unwrap();
            let takeoff = number_before(head, "kg, landing").expect("takeoff mass");
            // The takeoff chain's heading and the loading table's row say the same.
            if let Some(phase) = text.iter().find(|l| l.starts_with("Takeoff at ")) {
                assert_eq!(
                    number_before(phase, "kg  "),
                    Some(takeoff),
                    "{phase} vs {head}"
                );
                compared += 1;
            }
            if let Some(row) = text
                .iter()
                .find(|l| l.trim_start().starts_with("takeoff  mass"))
            {
                assert_eq!(
                    number_before(row, "kg  CG"),
                    Some(takeoff),
                    "{row} vs {head}"
                );
                compared += 1;
            }
            if let Some(row) = text
                .iter()
                .find(|l| l.trim_start().starts_with("takeoff mass ") && l.contains(" limit "))
            {
                let v = number_before(row, "kg limit").expect("a value");
                assert_eq!(takeoff, v, "{hour}Z {}: {head} vs {row}", r.id);
                compared += 1;
            }
        }
    }
    assert!(compared >= 20, "{compared} compared");
}

/// The climb's arithmetic adds up from the figures shown (trial findings: "× 60 ÷
/// 100 kt = 487 ft/NM" where 807 × 60 ÷ 100 is 484; the ground speed is now shown to a
/// tenth, the gradient rounded down): within a ft/NM of the shown operands.
#[test]
fn the_climb_arithmetic_adds_up_from_the_figures_shown() {
    let mut checked = 0;
    for hour in [8, 13, 15] {
        let app = demo_stepped_to(hour);
        for r in &app.assessment.legs {
            let text = detail_text(&app, r, 200);
            for l in text
                .iter()
                .filter(|l| l.trim_start().starts_with("gradient "))
            {
                // "gradient 807 ft/min × 60 ÷ 99.5 kt = 486 ft/NM"
                let w: Vec<&str> = l.split_whitespace().collect();
                let rate: f64 = w[1].parse().unwrap();
                let gs: f64 = w[6].parse().unwrap();
                let shown: f64 = w[9].parse().unwrap();
                let sum = rate * 60.0 / gs;
                assert!(
                    (sum - shown).abs() < 1.5,
                    "{hour}Z {}: {l} ({sum:.1})",
                    r.id
                );
                checked += 1;
            }
        }
    }
    assert!(checked >= 10, "{checked} climbs");
}
