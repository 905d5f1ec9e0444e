//! The built-in demo operator (fictional), embedded in the binary with `include_str!`,
//! so `rhoboard` runs with no operator folder configured.

use super::load::{Loaded, OpsFiles, load_files};

/// The demo day (UTC date of its legs and observations).
pub const DATE: &str = "2026-06-14";

/// The demo's files in the operator-folder layout: (relative path, text).
pub const FILES: &[(&str, &str)] = &[
    (
        "operator.json",
        include_str!("../../fixtures/demo/operator.json"),
    ),
    (
        "pilots.json",
        include_str!("../../fixtures/demo/pilots.json"),
    ),
    (
        "fleet/aircraft.json",
        include_str!("../../fleet/aircraft.json"),
    ),
    (
        "fleet/types/ft2.json",
        include_str!("../../fleet/types/ft2.json"),
    ),
    (
        "fleet/types/ft4.json",
        include_str!("../../fleet/types/ft4.json"),
    ),
    (
        "fleet/types/ft6.json",
        include_str!("../../fleet/types/ft6.json"),
    ),
    (
        "airfields/XBRK.json",
        include_str!("../../fixtures/demo/airfields/XBRK.json"),
    ),
    (
        "airfields/XFEN.json",
        include_str!("../../fixtures/demo/airfields/XFEN.json"),
    ),
    (
        "airfields/XHIG.json",
        include_str!("../../fixtures/demo/airfields/XHIG.json"),
    ),
    (
        "airfields/XKNL.json",
        include_str!("../../fixtures/demo/airfields/XKNL.json"),
    ),
    (
        "airfields/XMES.json",
        include_str!("../../fixtures/demo/airfields/XMES.json"),
    ),
    (
        "airfields/XMRS.json",
        include_str!("../../fixtures/demo/airfields/XMRS.json"),
    ),
    (
        "airfields/XPIN.json",
        include_str!("../../fixtures/demo/airfields/XPIN.json"),
    ),
    (
        "airfields/XSEA.json",
        include_str!("../../fixtures/demo/airfields/XSEA.json"),
    ),
    (
        "airfields/XSHT.json",
        include_str!("../../fixtures/demo/airfields/XSHT.json"),
    ),
    (
        "legs/2026-06-14.json",
        include_str!("../../fixtures/demo/legs/2026-06-14.json"),
    ),
    (
        "observations/2026-06-14.txt",
        include_str!("../../fixtures/demo/observations/2026-06-14.txt"),
    ),
    (
        "forecasts/2026-06-14.txt",
        include_str!("../../fixtures/demo/forecasts/2026-06-14.txt"),
    ),
];

/// The demo's files.
pub fn files() -> OpsFiles {
    OpsFiles {
        files: FILES
            .iter()
            .map(|(k, v)| (k.to_string(), v.to_string()))
            .collect(),
    }
}

/// Loads the demo. It is checked by the test suite, so `ops` is always present.
pub fn load() -> Loaded {
    load_files(&files())
}

/// The notice `rhoboard init` writes into every JSON file it creates.
pub const REPLACE_NOTICE: &str = "Fictional demo data written by `rhoboard init`: every value in this file \
(names, ids, distances, tables, masses, minimums, sources) is invented. Replace each with your own \
from your flight manuals, airfield directories and approved procedures, then delete this line.";

/// The demo's files as an `init` template: each JSON file carries `replace_before_use`.
pub fn template() -> OpsFiles {
    let mut f = files();
    for (path, text) in f.files.iter_mut() {
        if path.ends_with(".json") {
            let marker = "\"schema_version\": 1,\n";
            if let Some(i) = text.find(marker) {
                let at = i + marker.len();
                let line = format!(
                    "  \"replace_before_use\": {},\n",
                    serde_json::Value::from(REPLACE_NOTICE)
                );
                text.insert_str(at, &line);
            }
        }
        // The operator's name, which heads every listing, says it is a copy to replace:
        // a folder from `init` cannot be taken for the built-in demo.
        if path == "operator.json"
            && let Some(i) = text.find("\"name\": \"")
        {
            let start = i + "\"name\": \"".len();
            if let Some(len) = text[start..].find('"') {
                text.replace_range(start..start + len, TEMPLATE_NAME);
            }
        }
    }
    f
}

/// The operator name in a folder written by `rhoboard init`.
pub const TEMPLATE_NAME: &str =
    "Copy of the demo from rhoboard init (fictional; replace with your operator's name)";
