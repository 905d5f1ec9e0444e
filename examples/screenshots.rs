//! Writes `screenshots/*.svg` from the board's real views on the demo day:
//! `cargo run --example screenshots`.

use chrono::{TimeZone, Utc};
use ratatui::Terminal;
use ratatui::backend::TestBackend;
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
use rhoboard::board::screenshot::svg;
use rhoboard::board::{App, Msg, Settings};

fn key(app: &mut App, code: KeyCode) {
    app.update(Msg::Key(KeyEvent::new(code, KeyModifiers::NONE)));
}

fn demo_at(hour: u32) -> App {
    let start = Utc.with_ymd_and_hms(2026, 6, 14, 6, 30, 0).unwrap();
    let mut app = App::demo(start, Settings::default()).expect("demo");
    key(&mut app, KeyCode::Char(' '));
    for _ in 7..=hour {
        key(&mut app, KeyCode::Char('n'));
    }
    app
}

fn shoot(app: &mut App, w: u16, h: u16, name: &str) -> anyhow::Result<()> {
    app.update(Msg::Resize(w, h));
    let mut t = Terminal::new(TestBackend::new(w, h))?;
    t.draw(|f| f.render_widget(&*app, f.area()))?;
    let path = format!("screenshots/{name}.svg");
    std::fs::write(&path, svg(t.backend().buffer()))?;
    println!("wrote {path}");
    Ok(())
}

fn main() -> anyhow::Result<()> {
    std::fs::create_dir_all("screenshots")?;
    let mut morning = demo_at(8);
    shoot(&mut morning, 120, 32, "morning-legs")?;
    let mut afternoon = demo_at(15);
    shoot(&mut afternoon, 120, 32, "afternoon-legs")?;
    // The detail of a below leg beside the legs.
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Home);
    while afternoon.selected_leg().is_some_and(|r| r.id != "L14") {
        key(&mut afternoon, KeyCode::Down);
    }
    shoot(&mut afternoon, 200, 50, "afternoon-detail-wide")?;
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Tab);
    shoot(&mut afternoon, 120, 32, "afternoon-pairings")?;
    let mut help = demo_at(8);
    key(&mut help, KeyCode::Char('?'));
    shoot(&mut help, 120, 40, "help")?;
    Ok(())
}
