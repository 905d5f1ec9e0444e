//! Writing a changed legs file as a change to its text, not a rewrite.
//!
//! A re-plan changes one leg; the file is the operator's, typed by hand or by another
//! tool, with its own key order, spacing and number style (`72`, not `72.0`). So the
//! new text is the old text with only the changed values' spans replaced:
//!
//! 1. the old text is scanned once for the byte span of every value (and of every
//!    object member, key included);
//! 2. the old file as read and the new one are both put into serde_json's canonical
//!    form (`serde_json::to_value` of the typed file), so a value counts as changed only
//!    when its meaning changed — `"07:00:00Z"` and `"+00:00"`, `72` and `72.0`, or an
//!    explicit default that the writer would omit are no changes;
//! 3. every unchanged value keeps its bytes; a changed scalar is written in the file's
//!    style (an integral number without `.0`, a UTC time with `Z` where the old one had
//!    it); a changed object keeps its members' order and spacing, drops a member that
//!    went, and appends a new one after the last, spaced like its siblings;
//! 4. the result is parsed back and must equal the new file, else the caller falls back
//!    to a whole rewrite: never a file that means something else.

use serde::Serialize;
use serde::de::DeserializeOwned;
use serde_json::{Map, Value};

/// A value in the old text: its span, and for containers the spans of what it holds.
#[derive(Debug)]
enum Node {
    Scalar {
        start: usize,
        end: usize,
    },
    Array {
        start: usize,
        end: usize,
        items: Vec<Node>,
    },
    Object {
        start: usize,
        end: usize,
        members: Vec<Member>,
    },
}

/// One object member: its decoded key, where its key starts, and its value.
#[derive(Debug)]
struct Member {
    key: String,
    key_start: usize,
    value: Node,
}

impl Node {
    const fn span(&self) -> (usize, usize) {
        match self {
            Node::Scalar { start, end }
            | Node::Array { start, end, .. }
            | Node::Object { start, end, .. } => (*start, *end),
        }
    }
}

/// A scanner over JSON text that serde_json has already accepted: it only finds spans.
struct Scanner<'a> {
    text: &'a [u8],
    at: usize,
}

impl Scanner<'_> {
    fn ws(&mut self) {
        while self.text.get(self.at).is_some_and(u8::is_ascii_whitespace) {
            self.at += 1;
        }
    }

    fn peek(&self) -> Option<u8> {
        self.text.get(self.at).copied()
    }

    fn string_end(&mut self) -> Option<()> {
        // At the opening quote.
        self.at += 1;
        loop {
            match self.peek()? {
                b'\\' => self.at += 2,
                b'"' => {
                    self.at += 1;
                    return Some(());
                }
                _ => self.at += 1,
            }
        }
    }

    /// From an opening bracket to past its `close`: each item read by `item`, commas
    /// skipped; where it ended.
    fn list(&mut self, close: u8, mut item: impl FnMut(&mut Self) -> Option<()>) -> Option<usize> {
        self.at += 1;
        loop {
            self.ws();
            match self.peek()? {
                b if b == close => break,
                b',' => self.at += 1,
                _ => item(self)?,
            }
        }
        self.at += 1;
        Some(self.at)
    }

    fn value(&mut self) -> Option<Node> {
        self.ws();
        let start = self.at;
        match self.peek()? {
            b'{' => {
                let mut members = Vec::new();
                let end = self.list(b'}', |s| {
                    let key_start = s.at;
                    s.string_end()?;
                    let key: String = serde_json::from_slice(&s.text[key_start..s.at]).ok()?;
                    s.ws();
                    (s.peek()? == b':').then_some(())?;
                    s.at += 1;
                    let value = s.value()?;
                    members.push(Member {
                        key,
                        key_start,
                        value,
                    });
                    Some(())
                })?;
                Some(Node::Object {
                    start,
                    end,
                    members,
                })
            }
            b'[' => {
                let mut items = Vec::new();
                let end = self.list(b']', |s| {
                    items.push(s.value()?);
                    Some(())
                })?;
                Some(Node::Array { start, end, items })
            }
            b'"' => {
                self.string_end()?;
                Some(Node::Scalar {
                    start,
                    end: self.at,
                })
            }
            _ => {
                while self
                    .peek()
                    .is_some_and(|b| !b.is_ascii_whitespace() && !b",]}".contains(&b))
                {
                    self.at += 1;
                }
                (self.at > start).then_some(Node::Scalar {
                    start,
                    end: self.at,
                })
            }
        }
    }
}

/// serde_json's pretty (or compact) output with the file's indentation, writing a
/// whole number as an integer (`72`, not `72.0`): how the operator's files are typed.
struct FileFormatter<'a> {
    pretty: Option<serde_json::ser::PrettyFormatter<'a>>,
}

macro_rules! delegate {
    ($($name:ident($($arg:ident: $t:ty),*);)*) => {
        $(fn $name<W: ?Sized + std::io::Write>(&mut self, w: &mut W $(, $arg: $t)*) -> std::io::Result<()> {
            match &mut self.pretty {
                Some(p) => p.$name(w $(, $arg)*),
                None => serde_json::ser::CompactFormatter.$name(w $(, $arg)*),
            }
        })*
    };
}

impl serde_json::ser::Formatter for FileFormatter<'_> {
    delegate! {
        begin_array();
        end_array();
        begin_array_value(first: bool);
        end_array_value();
        begin_object();
        end_object();
        begin_object_key(first: bool);
        begin_object_value();
        end_object_value();
    }

    fn write_f64<W: ?Sized + std::io::Write>(
        &mut self,
        w: &mut W,
        value: f64,
    ) -> std::io::Result<()> {
        // Every whole f64 under 2^53 is exact as an integer.
        if value.fract() == 0.0 && value.abs() < 9.0e15 {
            write!(w, "{value:.0}")
        } else {
            serde_json::ser::CompactFormatter.write_f64(w, value)
        }
    }
}

/// The old file's text and the new file's, written in the old one's style.
struct Style<'a> {
    text: &'a str,
    new_text: &'a str,
}

/// The leading white space of the line of `text` holding byte `at`.
fn line_indent(text: &str, at: usize) -> &str {
    let line_start = text[..at].rfind('\n').map_or(0, |i| i + 1);
    let line = &text[line_start..];
    &line[..line.len() - line.trim_start_matches([' ', '\t']).len()]
}

impl Style<'_> {
    /// The new text from `from` to `to` as it would stand at `at` in the old text:
    /// its continuation lines re-indented from the new text's base to the old one's.
    fn fresh(&self, from: usize, to: usize, at: usize) -> String {
        let new_base = line_indent(self.new_text, from);
        let old_base = line_indent(self.text, at);
        self.new_text[from..to].replace(&format!("\n{new_base}"), &format!("\n{old_base}"))
    }
}

/// A changed string in the old one's style: a UTC time keeps its `Z`.
fn string_in_style(old_text: &str, new: &str) -> String {
    let old_z = old_text.trim_matches('"').ends_with('Z');
    let utc =
        chrono::DateTime::parse_from_rfc3339(new).is_ok_and(|t| t.offset().local_minus_utc() == 0);
    match new.strip_suffix("+00:00") {
        Some(head) if old_z && utc => Value::String(format!("{head}Z")).to_string(),
        _ => Value::String(new.to_string()).to_string(),
    }
}

/// The text of `node` (whose canonical value was `old`) holding `new` instead, where
/// `new_node` is `new`'s place in the new text.
fn patch(style: &Style<'_>, node: &Node, old: &Value, new_node: &Node, new: &Value) -> String {
    let (start, end) = node.span();
    let here = &style.text[start..end];
    if old == new {
        return here.to_string();
    }
    match (node, old, new_node, new) {
        (
            Node::Object { members, .. },
            Value::Object(o),
            Node::Object {
                members: new_members,
                ..
            },
            Value::Object(n),
        ) if !members.is_empty() => patch_object(style, node, members, o, new_members, n),
        (
            Node::Array { items, .. },
            Value::Array(o),
            Node::Array {
                items: new_items, ..
            },
            Value::Array(n),
        ) if !items.is_empty() => patch_array(style, node, items, o, new_items, n),
        (Node::Scalar { .. }, _, _, Value::String(s)) => string_in_style(here, s),
        _ => {
            let (from, to) = new_node.span();
            style.fresh(from, to, start)
        }
    }
}

/// The white space between `{`/`[` and the first item, between items (after the comma)
/// and before the closing bracket, as the old text has them.
fn gaps<'a>(
    text: &'a str,
    (start, end): (usize, usize),
    firsts: &[usize],
    lasts: &[usize],
) -> (&'a str, &'a str, &'a str) {
    let open = &text[start + 1..firsts[0]];
    let close = &text[lasts[lasts.len() - 1]..end - 1];
    let between = if firsts.len() >= 2 {
        text[lasts[0]..firsts[1]]
            .trim_start()
            .trim_start_matches(',')
    } else {
        open
    };
    (open, between, close)
}

fn patch_object(
    style: &Style<'_>,
    node: &Node,
    members: &[Member],
    o: &Map<String, Value>,
    new_members: &[Member],
    n: &Map<String, Value>,
) -> String {
    let firsts: Vec<usize> = members.iter().map(|m| m.key_start).collect();
    let lasts: Vec<usize> = members.iter().map(|m| m.value.span().1).collect();
    let (open, between, close) = gaps(style.text, node.span(), &firsts, &lasts);
    let mut parts = Vec::new();
    for m in members {
        let key_text = &style.text[m.key_start..m.value.span().0];
        let new_member = new_members.iter().find(|x| x.key == m.key);
        match (o.get(&m.key), n.get(&m.key), new_member) {
            // An explicit default the writer omits, still the default: kept as typed.
            (None, None, _) => parts.push(style.text[m.key_start..m.value.span().1].to_string()),
            (old, Some(new), Some(nm)) => {
                let old = old.cloned().unwrap_or(Value::Null);
                parts.push(format!(
                    "{key_text}{}",
                    patch(style, &m.value, &old, &nm.value, new)
                ));
            }
            // Gone from the new file.
            _ => {}
        }
    }
    // New members after the last, in the writer's order, spaced like their siblings.
    for nm in new_members {
        if !members.iter().any(|m| m.key == nm.key) {
            parts.push(style.fresh(nm.key_start, nm.value.span().1, members[0].key_start));
        }
    }
    if parts.is_empty() {
        return "{}".to_string();
    }
    format!("{{{open}{}{close}}}", parts.join(&format!(",{between}")))
}

fn patch_array(
    style: &Style<'_>,
    node: &Node,
    items: &[Node],
    o: &[Value],
    new_items: &[Node],
    n: &[Value],
) -> String {
    let firsts: Vec<usize> = items.iter().map(|i| i.span().0).collect();
    let lasts: Vec<usize> = items.iter().map(|i| i.span().1).collect();
    let (open, between, close) = gaps(style.text, node.span(), &firsts, &lasts);
    let parts: Vec<String> = n
        .iter()
        .zip(new_items)
        .enumerate()
        .map(|(i, (new, new_node))| match (items.get(i), o.get(i)) {
            (Some(node), Some(old)) => patch(style, node, old, new_node, new),
            _ => {
                let (from, to) = new_node.span();
                style.fresh(from, to, firsts[0])
            }
        })
        .collect();
    if parts.is_empty() {
        return "[]".to_string();
    }
    format!("[{open}{}{close}]", parts.join(&format!(",{between}")))
}

/// `old_text` (which parses as `old`) changed to hold `new`, every unchanged byte kept;
/// `None` where that cannot be done faithfully (the caller then rewrites the file).
pub fn edit_in_place<T>(old_text: &str, new: &T) -> Option<String>
where
    T: Serialize + DeserializeOwned + PartialEq,
{
    let old: T = serde_json::from_str(old_text).ok()?;
    let old_v = serde_json::to_value(&old).ok()?;
    let new_v = serde_json::to_value(new).ok()?;
    let root = Scanner {
        text: old_text.as_bytes(),
        at: 0,
    }
    .value()?;
    let (start, end) = root.span();
    // The new file written in the old one's style: its indentation unit (the first
    // indented line's leading white space), or compact where the old is on one line.
    let indent = old_text
        .lines()
        .find_map(|l| {
            let t = l.trim_start_matches([' ', '\t']);
            (t.len() < l.len() && !t.is_empty()).then(|| l[..l.len() - t.len()].to_string())
        })
        .unwrap_or_else(|| "  ".to_string());
    let pretty = old_text[start..end].contains('\n');
    let mut buf = Vec::new();
    let fmt = FileFormatter {
        pretty: pretty.then(|| serde_json::ser::PrettyFormatter::with_indent(indent.as_bytes())),
    };
    new.serialize(&mut serde_json::Serializer::with_formatter(&mut buf, fmt))
        .ok()?;
    let new_text = String::from_utf8(buf).ok()?;
    let new_root = Scanner {
        text: new_text.as_bytes(),
        at: 0,
    }
    .value()?;
    let style = Style {
        text: old_text,
        new_text: &new_text,
    };
    let text = format!(
        "{}{}{}",
        &old_text[..start],
        patch(&style, &root, &old_v, &new_root, &new_v),
        &old_text[end..]
    );
    // Faithful or nothing: the edited text must read back as exactly the new file.
    (serde_json::from_str::<T>(&text).ok()? == *new).then_some(text)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::ops::legs::LegsFile;

    fn demo_legs() -> &'static str {
        crate::ops::demo::FILES
            .iter()
            .find(|(p, _)| p.starts_with("legs/"))
            .expect("demo legs")
            .1
    }

    /// The lines of `a` and `b` that differ, as (line number, old, new).
    fn changed_lines(a: &str, b: &str) -> Vec<(usize, String, String)> {
        let (la, lb): (Vec<_>, Vec<_>) = (a.lines().collect(), b.lines().collect());
        assert_eq!(la.len(), lb.len(), "same number of lines:\n{b}");
        la.iter()
            .zip(&lb)
            .enumerate()
            .filter(|(_, (x, y))| x != y)
            .map(|(i, (x, y))| (i + 1, (*x).to_string(), (*y).to_string()))
            .collect()
    }

    #[test]
    fn one_changed_value_changes_one_line_in_the_files_style() {
        let text = demo_legs();
        let mut file: LegsFile = serde_json::from_str(text).expect("demo");
        let l = file.legs.iter_mut().find(|l| l.id == "L01").expect("L01");
        l.loads.as_mut().expect("loads").fuel_at_start_l = Some(60.0);
        let edited = edit_in_place(text, &file).expect("edited in place");
        let diff = changed_lines(text, &edited);
        assert_eq!(diff.len(), 1, "{diff:?}");
        assert_eq!(diff[0].1.trim(), "\"fuel_at_start_l\": 70,");
        assert_eq!(
            diff[0].2.trim(),
            "\"fuel_at_start_l\": 60,",
            "an integer stays an integer"
        );
    }

    #[test]
    fn a_new_time_keeps_the_z_and_a_new_member_is_spaced_like_its_siblings() {
        let text = demo_legs();
        let mut file: LegsFile = serde_json::from_str(text).expect("demo");
        let l = file.legs.iter_mut().find(|l| l.id == "L01").expect("L01");
        let t = chrono::DateTime::parse_from_rfc3339("2026-06-14T06:30:00Z").expect("time");
        let d = l.arrives_at - l.departs_at;
        l.departs_at = t;
        l.arrives_at = t + d;
        let edited = edit_in_place(text, &file).expect("edited in place");
        let diff = changed_lines(text, &edited);
        assert_eq!(diff.len(), 2, "{diff:?}");
        assert!(
            diff[0]
                .2
                .ends_with("\"departs_at\": \"2026-06-14T06:30:00Z\","),
            "{diff:?}"
        );
        assert!(
            diff[1]
                .2
                .ends_with("\"arrives_at\": \"2026-06-14T07:20:00Z\","),
            "{diff:?}"
        );

        // A station added: only lines are added, each indented as its neighbours.
        let mut file: LegsFile = serde_json::from_str(text).expect("demo");
        let l = file.legs.iter_mut().find(|l| l.id == "L01").expect("L01");
        l.loads
            .as_mut()
            .expect("loads")
            .stations
            .push(crate::ops::legs::StationLoad {
                station: "baggage".into(),
                mass_kg: Some(15.0),
                standard_adults: 0,
                standard_children: 0,
                note: String::new(),
            });
        let edited = edit_in_place(text, &file).expect("edited in place");
        assert!(
            edited.contains("            \"note\": \"student\"\n          },\n          {\n            \"station\": \"baggage\",\n            \"mass_kg\": 15\n          }\n        ],"),
            "{edited}"
        );
        let back: LegsFile = serde_json::from_str(&edited).expect("reads back");
        assert_eq!(back, file);
    }

    #[test]
    fn a_member_that_goes_is_removed_with_its_comma_and_compact_files_stay_compact() {
        let text = r#"{"schema_version":1,"date":"2026-06-14","legs":[{"id":"A1","departs_at":"2026-06-14T07:00:00Z","arrives_at":"2026-06-14T08:00:00Z","aircraft":"X-TRNA","pilot":"p","category":"dual","from":"XSEA","to":"XSEA","takeoff_mass_kg":1000,"landing_mass_kg":950}]}"#;
        let mut file: LegsFile = serde_json::from_str(text).expect("compact");
        file.legs[0].landing_mass_kg = None;
        file.legs[0].takeoff_mass_kg = Some(1012.5);
        let edited = edit_in_place(text, &file).expect("edited in place");
        assert_eq!(
            edited,
            text.replace(
                r#""takeoff_mass_kg":1000,"landing_mass_kg":950"#,
                r#""takeoff_mass_kg":1012.5"#
            )
        );
    }

    #[test]
    fn an_unchanged_file_is_returned_byte_for_byte() {
        let text = demo_legs();
        let file: LegsFile = serde_json::from_str(text).expect("demo");
        assert_eq!(edit_in_place(text, &file).as_deref(), Some(text));
    }
}
