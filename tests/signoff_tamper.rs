//! Tampering with the sign-off log: an edited figure, a deleted line, two lines
//! swapped, a line cut mid-way, a missing monthly file, an inserted record, and a head
//! that disagrees — `rhoboard log verify` names the file and line of each and exits 1.

#[path = "common/signoff.rs"]
mod signoff_common;

use std::path::Path;
use std::process::{Command, Output};

use rhoboard::signoff::Log;
use signoff_common::{demo_folder, sign_at};

/// Seven records: three in June, two in July, two in August.
fn log_of_seven() -> (tempfile::TempDir, String) {
    let dir = demo_folder();
    let mut head = String::new();
    for (leg, t) in [
        ("L01", "2026-06-14T06:40:00Z"),
        ("L03", "2026-06-14T07:45:00Z"),
        ("L04", "2026-06-14T08:10:00Z"),
        ("L05", "2026-07-02T09:00:00Z"),
        ("L01", "2026-07-03T09:00:00Z"),
        ("L09", "2026-08-01T09:00:00Z"),
        ("L03", "2026-08-02T09:00:00Z"),
    ] {
        head = sign_at(dir.path(), leg, t);
    }
    (dir, head)
}

fn verify(dir: &Path, head: Option<&str>) -> (Option<i32>, String) {
    let mut args = vec!["log", "verify", "--ops", dir.to_str().expect("utf-8")];
    if let Some(h) = head {
        args.extend(["--head", h]);
    }
    let o: Output = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(&args)
        .output()
        .expect("run");
    (
        o.status.code(),
        format!(
            "{}{}",
            String::from_utf8_lossy(&o.stdout),
            String::from_utf8_lossy(&o.stderr)
        ),
    )
}

fn file(dir: &Path, name: &str) -> std::path::PathBuf {
    dir.join("signoffs").join(name)
}

fn lines(dir: &Path, name: &str) -> Vec<String> {
    std::fs::read_to_string(file(dir, name))
        .expect("read")
        .lines()
        .map(str::to_string)
        .collect()
}

fn write_lines(dir: &Path, name: &str, lines: &[String]) {
    let mut t = lines.join("\n");
    t.push('\n');
    std::fs::write(file(dir, name), t).expect("write");
}

#[test]
fn the_untouched_log_is_sound_across_monthly_files() {
    let (dir, head) = log_of_seven();
    let names: Vec<_> = ["2026-06.jsonl", "2026-07.jsonl", "2026-08.jsonl"]
        .iter()
        .map(|n| lines(dir.path(), n).len())
        .collect();
    assert_eq!(names, [3, 2, 2]);
    let (code, out) = verify(dir.path(), Some(&head));
    assert_eq!(code, Some(0), "{out}");
    assert!(out.contains("7 record(s) in 3 monthly file(s)"), "{out}");
    assert!(out.contains(&format!("head {head}")), "{out}");
    // A head printed on an earlier sheet is a prefix of the chain: still sound.
    let (code, out) = verify(dir.path(), Some(&head[..12]));
    assert_eq!(code, Some(0), "{out}");
}

#[test]
fn an_edited_figure_is_named() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-06.jsonl");
    let before = l[1].clone();
    l[1] = l[1].replacen("\"headroom_c\":", "\"headroom_c\":1", 1);
    assert_ne!(before, l[1]);
    write_lines(dir.path(), "2026-06.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(
            "2026-06.jsonl line 2: record 2 was edited: its content no longer matches its sha256"
        ),
        "{out}"
    );
}

#[test]
fn an_edit_with_a_recomputed_own_hash_breaks_the_next_link() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-06.jsonl");
    let edited = l[1].replacen("Mara Greyling", "Someone Else", 1);
    // A forger who also recomputes the record's own hash.
    let cut = edited.rfind(",\"sha256\":\"").expect("hash field");
    let body = format!("{}}}", &edited[..cut]);
    let sha = rhoboard::signoff::sha256_hex(body.as_bytes());
    l[1] = format!("{},\"sha256\":\"{sha}\"}}", &edited[..cut]);
    write_lines(dir.path(), "2026-06.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-06.jsonl line 3: record 3's prev_sha256 does not match record 2 at 2026-06.jsonl line 2"),
        "{out}"
    );
}

#[test]
fn a_deleted_line_is_named() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-06.jsonl");
    l.remove(1);
    write_lines(dir.path(), "2026-06.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-06.jsonl line 2: record 2 is missing before this line (deleted)"),
        "{out}"
    );
    // The first line of a month removed.
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-07.jsonl");
    l.remove(0);
    write_lines(dir.path(), "2026-07.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(
            "2026-07.jsonl line 1: record 4 is missing between 2026-06.jsonl line 3 and here"
        ),
        "{out}"
    );
}

#[test]
fn swapped_lines_are_named() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-06.jsonl");
    l.swap(0, 1);
    write_lines(dir.path(), "2026-06.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(
            "2026-06.jsonl line 1: records 2 and 1 are out of order (lines 1 and 2 swapped)"
        ),
        "{out}"
    );
}

#[test]
fn an_inserted_record_is_named() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-07.jsonl");
    let copy = l[0].clone();
    l.insert(1, copy);
    write_lines(dir.path(), "2026-07.jsonl", &l);
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-07.jsonl line 2: record 4 where record 5 was expected"),
        "{out}"
    );
}

#[test]
fn a_line_cut_mid_way_is_a_torn_last_line() {
    let (dir, _) = log_of_seven();
    let p = file(dir.path(), "2026-08.jsonl");
    let bytes = std::fs::read(&p).expect("read");
    let cut = bytes.len() - 300;
    std::fs::write(&p, &bytes[..cut]).expect("write");
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-08.jsonl line 2: torn last line"),
        "{out}"
    );
    assert!(out.contains("into 2026-08.jsonl.torn"), "{out}");
    // A cut in a monthly file that is not the last.
    let (dir, _) = log_of_seven();
    let p = file(dir.path(), "2026-06.jsonl");
    let bytes = std::fs::read(&p).expect("read");
    std::fs::write(&p, &bytes[..bytes.len() - 10]).expect("write");
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-06.jsonl line 3: line without an end of line"),
        "{out}"
    );
}

#[test]
fn the_next_sign_off_sets_a_torn_line_aside() {
    let (dir, _) = log_of_seven();
    let p = file(dir.path(), "2026-08.jsonl");
    let bytes = std::fs::read(&p).expect("read");
    let keep = bytes.len() - 300;
    let torn_start = bytes[..bytes.len() - 1]
        .iter()
        .rposition(|&b| b == b'\n')
        .expect("two lines")
        + 1;
    std::fs::write(&p, &bytes[..keep]).expect("write");
    let head = sign_at(dir.path(), "L05", "2026-08-03T09:00:00Z");
    assert!(
        head.starts_with("7:"),
        "the torn record 7 never counted: {head}"
    );
    let aside = std::fs::read(file(dir.path(), "2026-08.jsonl.torn")).expect("set aside");
    assert_eq!(&aside[..aside.len() - 1], &bytes[torn_start..keep]);
    let (code, out) = verify(dir.path(), Some(&head));
    assert_eq!(code, Some(0), "{out}");
    assert!(
        out.contains("note: 2026-08.jsonl.torn holds torn line(s) set aside"),
        "{out}"
    );
}

#[test]
fn a_missing_monthly_file_is_named() {
    let (dir, _) = log_of_seven();
    std::fs::remove_file(file(dir.path(), "2026-07.jsonl")).expect("remove");
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(
            "2026-08.jsonl line 1: records 4–5 are missing: monthly file 2026-07.jsonl missing"
        ),
        "{out}"
    );
    // The first month gone.
    let (dir, _) = log_of_seven();
    std::fs::remove_file(file(dir.path(), "2026-06.jsonl")).expect("remove");
    let (code, out) = verify(dir.path(), None);
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-07.jsonl line 1: the chain starts at record 4: records 1–3 are missing"),
        "{out}"
    );
}

#[test]
fn a_head_that_disagrees_is_named() {
    let (dir, head) = log_of_seven();
    // The last record removed cleanly: the chain alone still holds together…
    let mut l = lines(dir.path(), "2026-08.jsonl");
    l.pop();
    write_lines(dir.path(), "2026-08.jsonl", &l);
    assert_eq!(verify(dir.path(), None).0, Some(0));
    // …but not against the head printed on a sheet.
    let (code, out) = verify(dir.path(), Some(&head));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-08.jsonl line 1: the log ends at record 6, but the given head is record 7: record 7 is missing from the end"),
        "{out}"
    );
    // Rewritten: another record 7 in its place.
    sign_at(dir.path(), "L04", "2026-08-02T09:00:00Z");
    let (code, out) = verify(dir.path(), Some(&head));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-08.jsonl line 2: the given head 7:"),
        "{out}"
    );
    assert!(
        out.contains(
            "does not match any record (mistyped, or the log was rewritten since that head was printed): record 7 has sha256"
        ),
        "{out}"
    );
}

#[test]
fn a_mistyped_or_unknown_head_says_it_matches_no_record_and_names_the_file() {
    let (dir, head) = log_of_seven();
    let (seq, hash) = head.split_once(':').expect("SEQ:HASH");
    // A short prefix with its last digit mistyped: no record has that hash.
    let short = &hash[..10];
    let last = short.chars().last().expect("digit");
    let typo = format!(
        "{seq}:{}{}",
        &short[..9],
        if last == '0' { '1' } else { '0' }
    );
    let (code, out) = verify(dir.path(), Some(&typo));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(&format!(
            "✗ 2026-08.jsonl line 2: the given head {typo} does not match any record (mistyped, or the log was rewritten since that head was printed): record 7 has sha256 {hash}"
        )),
        "{out}"
    );
    assert!(out.contains("✗ broken: 1 problem(s)"), "{out}");
    // An unknown record number with an unknown hash.
    let (code, out) = verify(dir.path(), Some("3:0123456789abcdef"));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("2026-06.jsonl line 3: the given head 3:0123456789abcdef does not match any record (mistyped, or the log was rewritten since that head was printed)"),
        "{out}"
    );
    // The right hash with the wrong sequence number: the record it belongs to is named.
    let (code, out) = verify(dir.path(), Some(&format!("6:{short}")));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains(&format!(
            "2026-08.jsonl line 1: the given head 6:{short} does not match record 6: its hash is that of record 7 at 2026-08.jsonl line 2 (is the sequence number mistyped?)"
        )),
        "{out}"
    );
    let (code, out) = verify(dir.path(), Some(&format!("9:{short}")));
    assert_eq!(code, Some(1), "{out}");
    assert!(
        out.contains("names record 9, which the log does not hold; its hash is that of record 7 at 2026-08.jsonl line 2"),
        "{out}"
    );
}

#[test]
fn a_broken_log_takes_no_new_record() {
    let (dir, _) = log_of_seven();
    let mut l = lines(dir.path(), "2026-06.jsonl");
    l.remove(1);
    write_lines(dir.path(), "2026-06.jsonl", &l);
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args([
            "signoff",
            "L01",
            "--instructor",
            "Mara Greyling",
            "--ops",
            dir.path().to_str().expect("utf-8"),
            "--at",
            "2026-06-14T08:00:00Z",
        ])
        .output()
        .expect("run");
    let out = String::from_utf8_lossy(&o.stdout);
    assert_eq!(o.status.code(), Some(1), "{out}");
    assert!(
        out.contains("refused: the sign-off log does not verify (2026-06.jsonl line 2"),
        "{out}"
    );
    assert_eq!(lines(dir.path(), "2026-08.jsonl").len(), 2);
}

#[test]
fn any_changed_byte_is_caught() {
    let (dir, _) = log_of_seven();
    let log = Log::of_operator(dir.path());
    let names = ["2026-06.jsonl", "2026-07.jsonl", "2026-08.jsonl"];
    let originals: Vec<Vec<u8>> = names
        .iter()
        .map(|n| std::fs::read(file(dir.path(), n)).expect("read"))
        .collect();
    let mut x: u64 = 0x2545_f491_4f6c_dd1d;
    for _ in 0..300 {
        x ^= x << 13;
        x ^= x >> 7;
        x ^= x << 17;
        let f = (x % 3) as usize;
        let mut bytes = originals[f].clone();
        let at = ((x >> 8) as usize) % bytes.len();
        let new = bytes[at] ^ (1 + ((x >> 40) as u8 % 127));
        bytes[at] = new;
        let path = file(dir.path(), names[f]);
        std::fs::write(&path, &bytes).expect("write");
        let chain = log.read().expect("read");
        assert!(
            !chain.is_sound(),
            "byte {at} of {} changed to {new:#04x} went unnoticed",
            names[f]
        );
        std::fs::write(&path, &originals[f]).expect("restore");
    }
    assert!(log.read().expect("read").is_sound());
}
