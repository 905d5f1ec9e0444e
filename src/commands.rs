//! The subcommands behind the binary: each takes its parsed arguments and a writer,
//! and returns what the process should exit with.

pub mod board;
pub mod calc;
pub mod check;
pub mod metar;
pub mod output;
pub mod overview;
pub mod runway;
pub mod taf;

use std::process::ExitCode;

pub mod init;
pub mod leg;
pub mod log;
pub mod report;
pub mod signoff;
pub mod validate;

/// How a command ended, mapped to the process exit status (DESIGN.md "Command line").
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// Success; every leg meets the minimums.
    Success,
    /// The command ran, but at least one leg is `below` or `no-data`, or a check failed.
    Findings,
    /// Bad usage or bad input.
    BadInput,
}

impl Outcome {
    /// The exit status for this outcome: 0, 1 or 2.
    pub const fn code(self) -> u8 {
        match self {
            Outcome::Success => 0,
            Outcome::Findings => 1,
            Outcome::BadInput => 2,
        }
    }
}

impl From<Outcome> for ExitCode {
    fn from(o: Outcome) -> Self {
        ExitCode::from(o.code())
    }
}

/// Standard input as text, for `metar -` and `taf -`: garbled bytes become U+FFFD and
/// are reported as groups not understood.
pub(crate) fn read_stdin(what: &str) -> anyhow::Result<String> {
    use anyhow::Context as _;
    use std::io::Read as _;
    let mut bytes = Vec::new();
    std::io::stdin()
        .read_to_end(&mut bytes)
        .with_context(|| format!("reading {what} from standard input"))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}

/// Prints decoded reports or forecasts: one pretty JSON array, or each readable decode
/// with a blank line between.
pub(crate) fn print_decoded<T>(
    items: &[T],
    json: bool,
    to_json: fn(&T) -> serde_json::Value,
    readable: fn(&T, &mut dyn std::io::Write) -> std::io::Result<()>,
    out: &mut dyn std::io::Write,
) -> anyhow::Result<()> {
    if json {
        let v: Vec<serde_json::Value> = items.iter().map(to_json).collect();
        writeln!(out, "{}", serde_json::to_string_pretty(&v)?)?;
    } else {
        for (k, item) in items.iter().enumerate() {
            if k > 0 {
                writeln!(out)?;
            }
            readable(item, out)?;
        }
    }
    Ok(())
}

/// One decoded group line: its column (from 1), its text, its meaning.
pub(crate) type GroupLine = (usize, String, String);

/// The readable head of a decoded report or forecast, the same for METAR and TAF: the
/// text (control characters escaped), then every group — decoded (`groups`, given as
/// byte start, text and meaning), not understood, or a needed group that is malformed
/// (`malformed`, already as lines) — in report order.
pub(crate) fn write_decoded(
    text: &str,
    groups: impl IntoIterator<Item = (usize, String, String)>,
    not_understood: &[crate::observation::NotUnderstood],
    malformed: impl IntoIterator<Item = GroupLine>,
    out: &mut dyn std::io::Write,
) -> std::io::Result<()> {
    let shown: String = text
        .chars()
        .flat_map(|c| -> Vec<char> {
            if c.is_control() {
                c.escape_default().collect()
            } else {
                vec![c]
            }
        })
        .collect();
    writeln!(out, "{shown}")?;
    let mut lines: Vec<GroupLine> = groups
        .into_iter()
        .map(|(start, group, meaning)| {
            let column = text.get(..start).map_or(0, |p| p.chars().count()) + 1;
            (column, group, meaning)
        })
        .collect();
    lines.extend(not_understood.iter().map(|n| {
        (
            n.column,
            n.group.clone(),
            format!("not understood (column {}): {}", n.column, n.reason),
        )
    }));
    lines.extend(malformed);
    write_groups(lines, out)
}

/// Writes a decoded report's groups in column order, each with its meaning, aligned;
/// a group longer than 24 characters gets its meaning on the next line.
fn write_groups(mut lines: Vec<GroupLine>, out: &mut dyn std::io::Write) -> std::io::Result<()> {
    lines.sort_by_key(|(column, _, _)| *column);
    let width = lines
        .iter()
        .map(|(_, t, _)| t.chars().count())
        .filter(|n| *n <= 24)
        .max()
        .unwrap_or(8);
    for (_, text, meaning) in &lines {
        if text.chars().count() > 24 {
            writeln!(out, "  {text}")?;
            writeln!(out, "  {:width$}  {meaning}", "")?;
        } else {
            writeln!(out, "  {text:width$}  {meaning}")?;
        }
    }
    Ok(())
}
