//! Shared helpers for the sign-off tests: the demo operator in a temporary folder, and a
//! sign-off made on the demo morning through the library.
#![allow(dead_code, reason = "each test file uses a different part")]

use std::path::Path;

use chrono::{DateTime, Utc};
use rhoboard::assess::{Context, DaySettings, Model, assess_leg};
use rhoboard::commands::check;
use rhoboard::commands::signoff::{data_hashes, leg_index, sign};
use rhoboard::ops::demo;
use rhoboard::signoff::log::AppendOptions;
use rhoboard::signoff::{Log, Request};

/// The demo operator's files in a fresh temporary folder.
pub fn demo_folder() -> tempfile::TempDir {
    let dir = tempfile::tempdir().expect("temp dir");
    for (rel, text) in demo::FILES {
        let p = dir.path().join(rel);
        std::fs::create_dir_all(p.parent().expect("parent")).expect("mkdir");
        std::fs::write(&p, text).expect("write");
    }
    dir
}

/// An RFC 3339 time.
pub fn utc(s: &str) -> DateTime<Utc> {
    DateTime::parse_from_rfc3339(s)
        .expect("time")
        .with_timezone(&Utc)
}

/// Signs `leg` on the demo morning (the 08:00Z basis), at the real time `signed_at`;
/// returns the new head as `seq:sha256`.
pub fn sign_at(dir: &Path, leg: &str, signed_at: &str) -> String {
    let loaded =
        check::load(Some(dir), &[], Some("2026-06-14T08:00:00Z"), utc(signed_at)).expect("load");
    let ops = &loaded.ops;
    let model = Model::new(ops, &DaySettings::default());
    let ctx = Context {
        ops,
        model: &model,
        store: &loaded.store,
        at: loaded.at,
    };
    let i = leg_index(ops, leg, loaded.at).expect("leg");
    let r = assess_leg(&ctx, i).expect("assessed");
    let data = data_hashes(Some(dir)).expect("hashes");
    let req = Request {
        instructor: "Mara Greyling",
        note: "",
        override_reason: None,
        signed_at: utc(signed_at),
        basis_at: loaded.at,
        data: &data,
    };
    let a = sign(
        &Log::of_operator(dir),
        ops,
        &r,
        &req,
        &AppendOptions::default(),
    )
    .expect("signed");
    format!("{}:{}", a.entry.record.seq, a.entry.sha256)
}
