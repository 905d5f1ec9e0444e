//! Choosing the operator: `--ops` over the remembered default over the demo; an
//! explicit folder that fails is an error, a remembered one falls back with a warning.

use rhoboard::ops::config::{self, Choice};

fn temp(name: &str) -> std::path::PathBuf {
    let d = std::env::temp_dir().join(format!("rhoboard-cfg-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

#[test]
fn explicit_over_configured_over_demo() {
    let d = temp("choose");
    let cfg = d.join("config/ops-folder");
    assert_eq!(config::choose(None, Some(&cfg)), Choice::Demo);
    config::write_default(&cfg, &d.join("school")).unwrap();
    assert_eq!(
        config::choose(None, Some(&cfg)),
        Choice::Configured(d.join("school"))
    );
    assert_eq!(
        config::choose(Some(&d.join("other")), Some(&cfg)),
        Choice::Explicit(d.join("other"))
    );
    assert_eq!(config::choose(None, None), Choice::Demo);
    std::fs::remove_dir_all(&d).unwrap();
}

#[test]
fn a_failing_explicit_folder_is_an_error_and_a_failing_default_falls_back() {
    let d = temp("fallback");
    let missing = d.join("nowhere");
    let err = config::load_for_use(&Choice::Explicit(missing.clone())).unwrap_err();
    assert!(
        format!("{err:#}").contains("reading operator folder"),
        "{err:#}"
    );
    let (ops, warning) = config::load_for_use(&Choice::Configured(missing)).unwrap();
    assert_eq!(ops.airfields.len(), 9, "the demo");
    let warning = warning.unwrap();
    assert!(
        warning.contains("did not load") && warning.contains("built-in demo"),
        "{warning}"
    );
    let (_, warning) = config::load_for_use(&Choice::Demo).unwrap();
    assert!(warning.is_none());
    // A folder that loads is used as is.
    rhoboard::ops::demo::files()
        .write_dir(&d.join("ok"))
        .unwrap();
    let (_, warning) = config::load_for_use(&Choice::Configured(d.join("ok"))).unwrap();
    assert!(warning.is_none());
    std::fs::remove_dir_all(&d).unwrap();
}
