//! A second, span-keeping pass over JSON text: maps field paths (`runway_ends[1].tora_m`)
//! to line and column, and a position back to the deepest path containing it.
//!
//! serde's own errors carry a line and column but no path; semantic checks carry a path
//! but no position. This index joins the two. It is only built for files that have
//! something to report, and it stops quietly at the first syntax error (serde reports
//! that one) or past a nesting depth of 128 (serde's own limit).

/// Line starts and value spans of one JSON text.
#[derive(Debug, Clone, Default)]
pub struct Spans {
    line_starts: Vec<usize>,
    /// The text, kept only when it is not all ASCII (columns are then counted in
    /// characters, which needs it).
    text: Option<String>,
    nodes: Vec<Node>,
    by_path: std::collections::HashMap<String, usize>,
}

#[derive(Debug, Clone)]
struct Node {
    path: String,
    start: usize,
    end: usize,
}

const MAX_DEPTH: usize = 128;

struct Scanner<'a> {
    b: &'a [u8],
    i: usize,
    nodes: Vec<Node>,
}

impl Scanner<'_> {
    fn ws(&mut self) {
        while self.i < self.b.len() && matches!(self.b[self.i], b' ' | b'\t' | b'\n' | b'\r') {
            self.i += 1;
        }
    }

    fn string(&mut self) -> Option<String> {
        // At the opening quote.
        let start = self.i + 1;
        self.i += 1;
        let mut escaped = false;
        while self.i < self.b.len() {
            let c = self.b[self.i];
            self.i += 1;
            if escaped {
                escaped = false;
            } else if c == b'\\' {
                escaped = true;
            } else if c == b'"' {
                let raw = std::str::from_utf8(&self.b[start..self.i - 1]).ok()?;
                return Some(raw.to_string());
            }
        }
        None
    }

    fn value(&mut self, path: &str, depth: usize) -> Option<()> {
        if depth > MAX_DEPTH {
            return None;
        }
        self.ws();
        let start = self.i;
        let slot = self.nodes.len();
        self.nodes.push(Node {
            path: path.to_string(),
            start,
            end: start,
        });
        match *self.b.get(self.i)? {
            b'{' => {
                self.i += 1;
                self.ws();
                if self.b.get(self.i) == Some(&b'}') {
                    self.i += 1;
                } else {
                    loop {
                        self.ws();
                        if self.b.get(self.i) != Some(&b'"') {
                            return None;
                        }
                        let key = self.string()?;
                        self.ws();
                        if self.b.get(self.i) != Some(&b':') {
                            return None;
                        }
                        self.i += 1;
                        let child = if path.is_empty() {
                            key
                        } else {
                            format!("{path}.{key}")
                        };
                        self.value(&child, depth + 1)?;
                        self.ws();
                        match self.b.get(self.i)? {
                            b',' => self.i += 1,
                            b'}' => {
                                self.i += 1;
                                break;
                            }
                            _ => return None,
                        }
                    }
                }
            }
            b'[' => {
                self.i += 1;
                self.ws();
                if self.b.get(self.i) == Some(&b']') {
                    self.i += 1;
                } else {
                    let mut k = 0usize;
                    loop {
                        let child = format!("{path}[{k}]");
                        self.value(&child, depth + 1)?;
                        k += 1;
                        self.ws();
                        match self.b.get(self.i)? {
                            b',' => self.i += 1,
                            b']' => {
                                self.i += 1;
                                break;
                            }
                            _ => return None,
                        }
                    }
                }
            }
            b'"' => {
                self.string()?;
            }
            _ => {
                while self.i < self.b.len()
                    && !matches!(
                        self.b[self.i],
                        b',' | b'}' | b']' | b' ' | b'\t' | b'\n' | b'\r'
                    )
                {
                    self.i += 1;
                }
                if self.i == start {
                    return None;
                }
            }
        }
        self.nodes[slot].end = self.i;
        Some(())
    }
}

impl Spans {
    /// Indexes a JSON text.
    pub fn new(text: &str) -> Spans {
        let mut line_starts = vec![0];
        line_starts.extend(
            text.bytes()
                .enumerate()
                .filter(|&(_, c)| c == b'\n')
                .map(|(i, _)| i + 1),
        );
        let mut s = Scanner {
            b: text.as_bytes(),
            i: 0,
            nodes: Vec::new(),
        };
        let _ = s.value("", 0);
        let mut by_path = std::collections::HashMap::with_capacity(s.nodes.len());
        for (i, n) in s.nodes.iter().enumerate() {
            by_path.entry(n.path.clone()).or_insert(i);
        }
        Spans {
            line_starts,
            text: (!text.is_ascii()).then(|| text.to_string()),
            nodes: s.nodes,
            by_path,
        }
    }

    /// 1-based line and column (in characters) of a byte offset.
    pub fn line_col(&self, offset: usize) -> (usize, usize) {
        let line = self.line_starts.partition_point(|&s| s <= offset).max(1);
        let start = self.line_starts[line - 1];
        let column = match &self.text {
            // Count characters, not bytes, up to the offset (or the nearest boundary before it).
            Some(t) => {
                let mut end = offset.min(t.len());
                while !t.is_char_boundary(end) {
                    end -= 1;
                }
                t.get(start..end)
                    .map_or(offset - start, |s| s.chars().count())
                    + 1
            }
            None => offset - start + 1,
        };
        (line, column)
    }

    /// Byte offset of a 1-based line and byte column (as serde_json reports them).
    pub fn offset(&self, line: usize, column: usize) -> usize {
        let start = self
            .line_starts
            .get(line.saturating_sub(1))
            .copied()
            .unwrap_or(0);
        start + column.saturating_sub(1)
    }

    /// Byte span of the value at a path, if the path exists.
    pub fn span(&self, path: &str) -> Option<(usize, usize)> {
        self.by_path
            .get(path)
            .map(|&i| (self.nodes[i].start, self.nodes[i].end))
    }

    /// Position of the value at a path, or of its nearest existing ancestor.
    pub fn position(&self, path: &str) -> (usize, usize) {
        let mut p = path;
        loop {
            if let Some((start, _)) = self.span(p) {
                return self.line_col(start);
            }
            match p.rfind(['.', '[']) {
                Some(i) => p = &p[..i],
                None => return (1, 1),
            }
        }
    }

    /// The deepest path whose value contains a byte offset (`""` for the top level).
    pub fn path_at(&self, offset: usize) -> &str {
        // Nodes are in document order (pre-order, starts increasing): the deepest node
        // containing the offset is the last-starting one that still reaches it.
        let last = self.nodes.partition_point(|n| n.start <= offset);
        self.nodes[..last]
            .iter()
            .rev()
            .find(|n| offset <= n.end)
            .map_or("", |n| n.path.as_str())
    }

    /// The direct children (array elements or object members) of the value at `path`:
    /// their paths and byte spans.
    pub fn elements(&self, path: &str) -> Vec<(String, usize, usize)> {
        let index = format!("{path}[");
        let member = if path.is_empty() {
            String::new()
        } else {
            format!("{path}.")
        };
        self.nodes
            .iter()
            .filter(|n| {
                let elem = n
                    .path
                    .strip_prefix(&index)
                    .is_some_and(|rest| rest.find(']').is_some_and(|j| j + 1 == rest.len()));
                let memb = n
                    .path
                    .strip_prefix(&member)
                    .is_some_and(|rest| !rest.is_empty() && !rest.contains(['.', '[']));
                elem || (memb && n.path != path)
            })
            .map(|n| (n.path.clone(), n.start, n.end))
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_and_positions() {
        let text =
            "{\n  \"a\": 1,\n  \"ends\": [\n    {\"tora_m\": 5},\n    {\"tora_m\": 6}\n  ]\n}\n";
        let s = Spans::new(text);
        assert_eq!(s.position("a"), (2, 8));
        assert_eq!(s.position("ends[1].tora_m"), (5, 16));
        assert_eq!(s.position("ends[1].missing"), (5, 5));
        let off = s.offset(4, 17);
        assert_eq!(s.path_at(off), "ends[0].tora_m");
        assert_eq!(s.elements("ends").len(), 2);
    }

    #[test]
    fn columns_count_characters() {
        let text = "{\"name\": \"Fictional — demo\", \"x\": 1}";
        let s = Spans::new(text);
        // `1` is the 35th character but the 37th byte (the dash is 3 bytes): column 35.
        assert_eq!(s.position("x"), (1, 35));
    }

    #[test]
    fn deep_nesting_stops_quietly() {
        let text = "[".repeat(10_000);
        let s = Spans::new(&text);
        assert_eq!(s.position("x"), (1, 1));
    }
}
