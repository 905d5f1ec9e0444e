//! Coverage-guided fuzzing of the operator-data loaders and every validation check: the
//! demo's files with one of them replaced by the fuzzer's bytes. No input may panic.
#![no_main]

use libfuzzer_sys::fuzz_target;
use rhoboard::ops::{demo, load_files};

fuzz_target!(|data: &[u8]| {
    let Some((&which, rest)) = data.split_first() else {
        return;
    };
    let mut files = demo::files();
    let keys: Vec<String> = files.files.keys().cloned().collect();
    let key = &keys[usize::from(which) % keys.len()];
    files
        .files
        .insert(key.clone(), String::from_utf8_lossy(rest).into_owned());
    let loaded = load_files(&files);
    for d in loaded.report.errors.iter().chain(&loaded.report.warnings) {
        let _ = d.to_string();
    }
});
