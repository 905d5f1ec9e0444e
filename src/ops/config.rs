//! Where the configured operator folder is remembered: a one-line file in the
//! platform config dir (`directories`), overridden by `--ops DIR`.

use std::path::{Path, PathBuf};

/// The file holding the default operator folder, if the platform has a config dir.
pub fn config_file() -> Option<PathBuf> {
    directories::ProjectDirs::from("", "", "rhoboard").map(|d| d.config_dir().join("ops-folder"))
}

/// Reads the remembered operator folder from a config file; `None` when unset.
pub fn read_default(config: &Path) -> Option<PathBuf> {
    let text = std::fs::read_to_string(config).ok()?;
    let line = text.lines().next()?.trim();
    (!line.is_empty()).then(|| PathBuf::from(line))
}

/// Remembers an operator folder as the default.
pub fn write_default(config: &Path, folder: &Path) -> std::io::Result<()> {
    if let Some(parent) = config.parent() {
        std::fs::create_dir_all(parent)?;
    }
    std::fs::write(config, format!("{}\n", folder.display()))
}

/// Which operator to use.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Choice {
    /// A folder named with `--ops`: failing to load it is an error.
    Explicit(PathBuf),
    /// The remembered default: failing to load it warns and falls back to the demo.
    Configured(PathBuf),
    /// The built-in demo.
    Demo,
}

/// Picks the operator: `--ops` first, then the remembered default, else the demo.
pub fn choose(explicit: Option<&Path>, config: Option<&Path>) -> Choice {
    if let Some(p) = explicit {
        return Choice::Explicit(p.to_path_buf());
    }
    match config.and_then(read_default) {
        Some(p) => Choice::Configured(p),
        None => Choice::Demo,
    }
}

/// How many errors a folder that did not load names in place (`validate` lists all).
const PROBLEMS_SHOWN: usize = 3;

/// `1 problem:` and each of the first few errors on its own line, as `validate` prints
/// them (`airfields/XPIN.json:6:19: elevation_ft: JSON syntax: …`), then how many more.
fn first_problems(report: &super::load::Report) -> String {
    let n = report.errors.len();
    let mut s = format!("{n} problem{}:", if n == 1 { "" } else { "s" });
    for d in report.errors.iter().take(PROBLEMS_SHOWN) {
        s.push_str(&format!("\n  {d}"));
    }
    if n > PROBLEMS_SHOWN {
        s.push_str(&format!("\n  … and {} more", n - PROBLEMS_SHOWN));
    }
    s
}

/// Loads the chosen operator for use (board, check, report). A folder that fails —
/// given with `--ops` or remembered as the default — is an error naming it: the demo
/// is never shown in place of a real operator's folder (its invented legs could be
/// taken for the day's, and a script would read its verdict as the operator's).
pub fn load_for_use(choice: &Choice) -> anyhow::Result<super::Ops> {
    let demo = || {
        super::demo::load().ops.ok_or_else(|| {
            anyhow::anyhow!("the built-in demo failed its own checks (a bug; please report it)")
        })
    };
    match choice {
        Choice::Demo => demo(),
        Choice::Explicit(dir) => {
            let loaded = super::load_dir(dir)?;
            match loaded.ops {
                Some(ops) => Ok(ops),
                None => Err(anyhow::anyhow!(
                    "operator folder {} did not load: {}\nrun `rhoboard validate --ops {}` to see every problem and warning",
                    dir.display(),
                    first_problems(&loaded.report),
                    dir.display()
                )),
            }
        }
        Choice::Configured(dir) => {
            let why = match super::load_dir(dir) {
                Ok(loaded) => match loaded.ops {
                    Some(ops) => return Ok(ops),
                    None => first_problems(&loaded.report),
                },
                Err(e) => format!("{e:#}"),
            };
            Err(anyhow::anyhow!(
                "the default operator folder {} did not load: {why}\nrun `rhoboard validate` to see every problem, or pass --ops DIR for another folder",
                dir.display()
            ))
        }
    }
}
