//! Writes `screenshots/*.svg` from the board's real views on the demo day:
//! `cargo run --example screenshots` (`tests/screenshots_current.rs` fails when the
//! committed files differ).

fn main() -> anyhow::Result<()> {
    std::fs::create_dir_all("screenshots")?;
    for (name, svg) in rhoboard::board::screenshot::demo_shots()? {
        let path = format!("screenshots/{name}.svg");
        std::fs::write(&path, svg)?;
        println!("wrote {path}");
    }
    Ok(())
}
