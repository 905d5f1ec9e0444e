//! Screenshots: a rendered buffer as an SVG image (monospace text runs with the
//! board's colours on a dark background), so `screenshots/` shows the real views.

use std::fmt::Write as _;

use ratatui::buffer::Buffer;
use ratatui::style::{Color, Modifier};

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
