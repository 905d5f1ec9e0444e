//! Regenerates the demo operator's generated files from the physics model in
//! `rhoboard::ops::demo_gen`: `fleet/types/<id>.json` and the demo day's METARs.
//!
//! Run from the repository root: `cargo run --example gen_demo`. Deterministic: a test
//! checks the committed files match its output byte for byte.

fn main() -> std::io::Result<()> {
    for (path, text) in rhoboard::ops::demo_gen::generated_files() {
        if let Some(parent) = std::path::Path::new(&path).parent() {
            std::fs::create_dir_all(parent)?;
        }
        std::fs::write(&path, text)?;
        println!("wrote {path}");
    }
    Ok(())
}
