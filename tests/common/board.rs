//! Shared helpers for the board tests: the demo day on a fixed replay clock.
#![allow(dead_code, reason = "each test file uses a different part")]

use chrono::{DateTime, TimeZone, Utc};
use ratatui::Terminal;
use ratatui::backend::TestBackend;
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
use rhoboard::board::{App, Msg, Settings};

/// 2026-06-14 at hh:mm UTC.
pub fn demo_time(h: u32, m: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
}

/// The demo replay starting at hh:mm, paused so nothing moves by itself; no colour.
pub fn demo(h: u32, m: u32) -> App {
    let mut app = App::demo(
        demo_time(h, m),
        Settings {
            color: false,
            ..Settings::default()
        },
    )
    .expect("demo loads");
    app.update(key(KeyCode::Char(' ')));
    app
}

/// The demo at 06:30, stepped with `n` to `hour`:00 (so the change list fills).
pub fn demo_stepped_to(hour: u32) -> App {
    let mut app = demo(6, 30);
    for _ in 7..=hour {
        app.update(key(KeyCode::Char('n')));
    }
    assert_eq!(app.clock, demo_time(hour, 0));
    app
}

/// A key press message.
pub fn key(code: KeyCode) -> Msg {
    Msg::Key(KeyEvent::new(code, KeyModifiers::NONE))
}

/// Types text, one key per character.
pub fn type_text(app: &mut App, text: &str) {
    for c in text.chars() {
        app.update(key(KeyCode::Char(c)));
    }
}

/// Renders the whole board at w×h.
pub fn render(app: &mut App, w: u16, h: u16) -> Terminal<TestBackend> {
    app.update(Msg::Resize(w, h));
    let mut terminal = Terminal::new(TestBackend::new(w, h)).expect("test terminal");
    terminal
        .draw(|f| f.render_widget(&*app, f.area()))
        .expect("draw");
    terminal
}

/// The screen as text lines.
pub fn screen(app: &mut App, w: u16, h: u16) -> String {
    let t = render(app, w, h);
    let buf = t.backend().buffer();
    let mut out = String::new();
    for y in 0..buf.area.height {
        for x in 0..buf.area.width {
            out.push_str(buf[(x, y)].symbol());
        }
        out.push('\n');
    }
    out
}
