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
fn a_failing_folder_is_an_error_whether_explicit_or_the_default() {
    let d = temp("fallback");
    let missing = d.join("nowhere");
    let err = config::load_for_use(&Choice::Explicit(missing.clone())).unwrap_err();
    assert!(
        format!("{err:#}").contains("reading operator folder"),
        "{err:#}"
    );
    // A remembered default that fails is an error too, never the demo in its place.
    let err = config::load_for_use(&Choice::Configured(missing)).unwrap_err();
    let err = format!("{err:#}");
    assert!(
        err.contains("default operator folder") && err.contains("rhoboard validate"),
        "{err}"
    );
    let demo = config::load_for_use(&Choice::Demo).unwrap();
    assert_eq!(demo.airfields.len(), 9, "the demo");
    // A folder that loads is used as is.
    rhoboard::ops::demo::files()
        .write_dir(&d.join("ok"))
        .unwrap();
    let ok = config::load_for_use(&Choice::Configured(d.join("ok"))).unwrap();
    assert_eq!(ok.airfields.len(), 9, "the folder written from the demo");
    std::fs::remove_dir_all(&d).unwrap();
}
