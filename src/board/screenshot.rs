//! Screenshots: a rendered buffer as an SVG image (monospace text runs with the
//! board's colours on a dark background), so `screenshots/` shows the real views.

use std::fmt::Write as _;

use chrono::{TimeZone, Utc};
use ratatui::Terminal;
use ratatui::backend::TestBackend;
use ratatui::buffer::Buffer;
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
use ratatui::style::{Color, Modifier};

use super::{App, Msg, Settings};

const CELL_W: f64 = 8.4;
const CELL_H: f64 = 18.0;
const BG: &str = "#1c1f24";
const FG: &str = "#d8dee9";

fn colour(c: Color, default: &'static str) -> &'static str {
    match c {
        Color::Reset => default,
        Color::Black => "#2e3440",
        Color::Red | Color::LightRed => "#f26d6d",
        Color::Green | Color::LightGreen => "#8fce6a",
        Color::Yellow | Color::LightYellow => "#e8c15a",
        Color::Blue | Color::LightBlue => "#7aa2e3",
        Color::Magenta | Color::LightMagenta => "#c792ea",
        Color::Cyan | Color::LightCyan => "#6cc4d1",
        Color::Gray | Color::White => "#eceff4",
        Color::DarkGray => "#7b8394",
        _ => default,
    }
}

fn escape(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
}

/// The buffer as an SVG document.
pub fn svg(buf: &Buffer) -> String {
    let w = f64::from(buf.area.width) * CELL_W;
    let h = f64::from(buf.area.height) * CELL_H;
    let mut out = String::new();
    let _ = writeln!(
        out,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.0}" height="{h:.0}" viewBox="0 0 {w:.1} {h:.1}" font-family="DejaVu Sans Mono, Menlo, Consolas, monospace" font-size="14">"#
    );
    let _ = writeln!(out, r#"<rect width="100%" height="100%" fill="{BG}"/>"#);
    for y in 0..buf.area.height {
        let mut x = 0;
        while x < buf.area.width {
            let cell = &buf[(buf.area.x + x, buf.area.y + y)];
            let style = (cell.fg, cell.bg, cell.modifier);
            // A run of cells with the same style.
            let mut text = String::new();
            let start = x;
            while x < buf.area.width {
                let c = &buf[(buf.area.x + x, buf.area.y + y)];
                if (c.fg, c.bg, c.modifier) != style {
                    break;
                }
                text.push_str(if c.symbol().is_empty() {
                    " "
                } else {
                    c.symbol()
                });
                x += 1;
            }
            let reversed = style.2.contains(Modifier::REVERSED);
            let (mut fg, mut bg) = (colour(style.0, FG), colour(style.1, BG));
            if reversed {
                std::mem::swap(&mut fg, &mut bg);
            }
            let px = f64::from(start) * CELL_W;
            let py = f64::from(y) * CELL_H;
            let len = f64::from(x - start) * CELL_W;
            if bg != BG {
                let _ = writeln!(
                    out,
                    r#"<rect x="{px:.1}" y="{py:.1}" width="{len:.1}" height="{CELL_H}" fill="{bg}"/>"#
                );
            }
            if text.trim().is_empty() {
                continue;
            }
            let mut attrs = format!(r#"fill="{fg}""#);
            if style.2.contains(Modifier::BOLD) {
                attrs.push_str(r#" font-weight="bold""#);
            }
            if style.2.contains(Modifier::DIM) {
                attrs.push_str(r#" fill-opacity="0.65""#);
            }
            if style.2.contains(Modifier::UNDERLINED) {
                attrs.push_str(r#" text-decoration="underline""#);
            }
            let _ = writeln!(
                out,
                r#"<text x="{px:.1}" y="{:.1}" textLength="{len:.1}" lengthAdjust="spacingAndGlyphs" xml:space="preserve" {attrs}>{}</text>"#,
                py + CELL_H * 0.75,
                escape(&text)
            );
        }
    }
    out.push_str("</svg>\n");
    out
}

// ---- The demo day's screenshots (written by `cargo run --example screenshots`,
// compared with the committed files by `tests/screenshots_current.rs`).

fn key(app: &mut App, code: KeyCode) {
    app.update(Msg::Key(KeyEvent::new(code, KeyModifiers::NONE)));
}

fn demo_at(hour: u32) -> anyhow::Result<App> {
    let start = Utc.with_ymd_and_hms(2026, 6, 14, 6, 30, 0).unwrap();
    let mut app = App::demo(start, Settings::default())?;
    key(&mut app, KeyCode::Char(' '));
    for _ in 7..=hour {
        key(&mut app, KeyCode::Char('n'));
    }
    Ok(app)
}

fn shoot(app: &mut App, w: u16, h: u16) -> anyhow::Result<String> {
    app.update(Msg::Resize(w, h));
    let mut t = Terminal::new(TestBackend::new(w, h))?;
    t.draw(|f| f.render_widget(&*app, f.area()))?;
    Ok(svg(t.backend().buffer()))
}

/// Every screenshot of the demo day, as `(file stem, SVG)`: what `screenshots/` holds.
pub fn demo_shots() -> anyhow::Result<Vec<(&'static str, String)>> {
    let mut shots = Vec::new();
    let mut morning = demo_at(8)?;
    shots.push(("morning-legs", shoot(&mut morning, 120, 32)?));
    let mut afternoon = demo_at(15)?;
    shots.push(("afternoon-legs", shoot(&mut afternoon, 120, 32)?));
    // The detail of a below leg beside the legs.
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Home);
    while afternoon.selected_leg().is_some_and(|r| r.id != "L14") {
        key(&mut afternoon, KeyCode::Down);
    }
    shots.push(("afternoon-detail-wide", shoot(&mut afternoon, 200, 50)?));
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Char('s'));
    key(&mut afternoon, KeyCode::Tab);
    shots.push(("afternoon-pairings", shoot(&mut afternoon, 120, 32)?));
    // L16's mass and balance: the loading table beside the CG envelope.
    let mut mb = demo_at(15)?;
    while mb.selected_leg().is_some_and(|r| r.id != "L16") {
        key(&mut mb, KeyCode::Down);
    }
    key(&mut mb, KeyCode::Enter);
    mb.update(Msg::Resize(120, 40));
    for _ in 0..400 {
        let Some(r) = mb.selected_leg() else {
            anyhow::bail!("the demo has no leg L16");
        };
        let lines =
            super::detail::lines(&mb.ops, r, None, super::theme::Theme { color: true }, 119);
        let at = lines
            .iter()
            .position(|l| l.to_string().contains("── Mass and balance"))
            .unwrap_or(0);
        if usize::from(mb.ui.detail_scroll) >= at {
            break;
        }
        key(&mut mb, KeyCode::Down);
    }
    shots.push(("afternoon-mass-and-balance", shoot(&mut mb, 120, 40)?));
    // The Airfields pane with sunset, after closing XBRK 36 until 18:00Z from the board.
    let mut fields = demo_at(15)?;
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
    shots.push(("afternoon-airfields", shoot(&mut fields, 120, 36)?));
    let mut help = demo_at(8)?;
    key(&mut help, KeyCode::Char('?'));
    shots.push(("help", shoot(&mut help, 120, 40)?));
    Ok(shots)
}

#[cfg(test)]
mod tests {
    use super::*;
    use ratatui::layout::Rect;
    use ratatui::style::Style;

    #[test]
    fn runs_colours_and_escaping() {
        let mut buf = Buffer::empty(Rect::new(0, 0, 12, 1));
        buf.set_string(0, 0, "a<b", Style::new());
        buf.set_string(
            4,
            0,
            "✗ below",
            Style::new().fg(Color::Red).add_modifier(Modifier::BOLD),
        );
        let s = svg(&buf);
        assert!(s.starts_with("<svg"), "{s}");
        assert!(s.contains(">a&lt;b </text>"), "{s}");
        assert!(
            s.contains(r##"fill="#f26d6d" font-weight="bold">✗ below</text>"##),
            "{s}"
        );
        assert!(s.trim_end().ends_with("</svg>"));
    }
}
