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
    // L16's mass and balance: the loading table beside the CG envelope.
    let mut mb = demo_at(15);
    while mb.selected_leg().is_some_and(|r| r.id != "L16") {
        key(&mut mb, KeyCode::Down);
    }
    key(&mut mb, KeyCode::Enter);
    mb.update(Msg::Resize(120, 40));
    for _ in 0..400 {
        let r = mb.selected_leg().expect("L16");
        let lines = rhoboard::board::detail::lines(
            &mb.ops,
            r,
            None,
            rhoboard::board::theme::Theme { color: true },
            119,
        );
        let at = lines
            .iter()
            .position(|l| l.to_string().contains("── Mass and balance"))
            .unwrap_or(0);
        if usize::from(mb.ui.detail_scroll) >= at {
            break;
        }
        key(&mut mb, KeyCode::Down);
    }
    shoot(&mut mb, 120, 40, "afternoon-mass-and-balance")?;
    // The Airfields pane with sunset, after closing XBRK 36 until 18:00Z from the board.
    let mut fields = demo_at(15);
    key(&mut fields, KeyCode::Tab);
    key(&mut fields, KeyCode::Tab);
    key(&mut fields, KeyCode::Char('r'));
    for c in "y".chars() {
        key(&mut fields, KeyCode::Char(c));
    }
    key(&mut fields, KeyCode::Tab);
    for c in "18:00Z".chars() {
        key(&mut fields, KeyCode::Char(c));
    }
    key(&mut fields, KeyCode::Enter);
    shoot(&mut fields, 120, 36, "afternoon-airfields")?;
    let mut help = demo_at(8);
    key(&mut help, KeyCode::Char('?'));
    shoot(&mut help, 120, 40, "help")?;
    Ok(())
}
