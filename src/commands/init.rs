//! `rhoboard init DIR`: writes a new operator folder from the demo, in the layout of
//! DESIGN.md, with every JSON file marked `replace_before_use`.

use std::io::Write;
use std::path::PathBuf;

use anyhow::Context as _;

use crate::commands::Outcome;
use crate::ops::{config, demo};

/// Arguments of `rhoboard init`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The folder to create (must not exist, or be empty).
    pub dir: PathBuf,
    /// Also remember the new folder as the default operator (platform config dir).
    #[arg(long)]
    pub make_default: bool,
}

/// Writes the template folder.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let dir = &args.dir;
    if dir.exists() {
        let non_empty = std::fs::read_dir(dir)
            .with_context(|| format!("reading {}", dir.display()))?
            .next()
            .is_some();
        anyhow::ensure!(
            !non_empty,
            "{} exists and is not empty; choose a new folder (nothing was written)",
            dir.display()
        );
    }
    let files = demo::template();
    files
        .write_dir(dir)
        .with_context(|| format!("writing {}", dir.display()))?;
    for rel in files.files.keys() {
        writeln!(out, "wrote {}", dir.join(rel).display())?;
    }
    writeln!(
        out,
        "\nA template operator folder: every value in it is fictional demo data, marked \
         `replace_before_use`. Replace the values with your own, delete those lines, and check \
         with `rhoboard validate --ops {}`.",
        dir.display()
    )?;
    if args.make_default {
        let cfg = config::config_file().context("this platform has no config folder")?;
        let abs = std::fs::canonicalize(dir).unwrap_or_else(|_| dir.clone());
        config::write_default(&cfg, &abs).with_context(|| format!("writing {}", cfg.display()))?;
        writeln!(
            out,
            "Remembered {} as the default operator folder ({}).",
            abs.display(),
            cfg.display()
        )?;
    }
    Ok(Outcome::Success)
}
