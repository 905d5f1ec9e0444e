//! Coverage-guided fuzzing of the sign-off log reader: any bytes as a monthly file (and
//! a second one), read and verified. No input may panic; the reader never writes.
#![no_main]

use libfuzzer_sys::fuzz_target;
use rhoboard::signoff::log::Log;

fuzz_target!(|data: &[u8]| {
    let dir = std::env::temp_dir().join(format!("rhoboard-fuzz-log-{}", std::process::id()));
    let _ = std::fs::create_dir_all(&dir);
    let cut = data.len() / 2;
    let _ = std::fs::write(dir.join("2026-05.jsonl"), &data[..cut]);
    let _ = std::fs::write(dir.join("2026-06.jsonl"), &data[cut..]);
    let log = Log::new(dir.clone());
    if let Ok(chain) = log.read() {
        let _ = chain.is_sound();
        let _ = chain.head();
    }
});
