//! Key-path locator: layout text → the 1-based line of every key path
//! (`pads.pitch`, `digits[1].height`, `icons[0].ring.inner`, `buses[0].points[1]`).
//!
//! serde gives line numbers only for the errors it finds itself; problems found after
//! deserialisation need this map. It is a small indentation-aware scanner, not a YAML
//! parser: it understands block mappings, `- ` sequence items (also compact ones at the
//! parent key's indentation), flow `{}`/`[]` collections (also across lines), quoted
//! keys, comments and `|`/`>` block scalars. On input it does not understand it records
//! less, never panics; syntax errors are serde's to report.

use std::collections::BTreeMap;

/// Line of each key path in `text` (first occurrence wins).
pub fn key_lines(text: &str) -> BTreeMap<String, usize> {
    key_lines_and_repeats(text).0
}

/// Line of each key path in `text`, and of the second occurrence of each repeated one.
pub fn key_lines_and_repeats(text: &str) -> (BTreeMap<String, usize>, BTreeMap<String, usize>) {
    let mut s = Scanner::new(text);
    s.run();
    (s.lines, s.repeats)
}

/// Line of `key`, or of its nearest ancestor that is in `lines` (`pads.pitch` → `pads`
/// when `pitch` is missing), or `None`.
pub fn line_of(lines: &BTreeMap<String, usize>, key: &str) -> Option<usize> {
    crate::layout::key_line(lines, key)
}

/// Nesting deeper than this is not located (no real layout comes near; serde_yaml refuses
/// deeper documents anyway), which keeps time and memory linear on hostile input.
const MAX_DEPTH: usize = 64;

/// Joins a key onto a path.
fn join(path: &str, key: &str) -> String {
    if path.is_empty() { key.to_string() } else { format!("{path}.{key}") }
}

enum Kind {
    /// A block mapping; the path of its latest key.
    Map { last: Option<String> },
    /// A block sequence; the index of its current item.
    Seq { index: usize },
}

struct Frame {
    indent: usize,
    path: String,
    kind: Kind,
}

impl Frame {
    /// Path of the value a deeper line would belong to.
    fn child_path(&self) -> String {
        match &self.kind {
            Kind::Map { last } => last.clone().unwrap_or_else(|| self.path.clone()),
            Kind::Seq { index } => format!("{}[{index}]", self.path),
        }
    }
}

struct Scanner {
    chars: Vec<char>,
    /// Start offset (in chars) of each line.
    starts: Vec<usize>,
    stack: Vec<Frame>,
    lines: BTreeMap<String, usize>,
    repeats: BTreeMap<String, usize>,
}

impl Scanner {
    fn new(text: &str) -> Scanner {
        let chars: Vec<char> = text.chars().collect();
        let mut starts = vec![0];
        for (i, c) in chars.iter().enumerate() {
            if *c == '\n' {
                starts.push(i + 1);
            }
        }
        let root = Frame { indent: 0, path: String::new(), kind: Kind::Map { last: None } };
        Scanner { chars, starts, stack: vec![root], lines: BTreeMap::new(), repeats: BTreeMap::new() }
    }

    fn record(&mut self, path: &str, line: usize) {
        if self.lines.contains_key(path) {
            self.repeats.entry(path.to_string()).or_insert(line + 1);
        } else {
            self.lines.insert(path.to_string(), line + 1);
        }
    }

    /// End offset of line `l` (exclusive, without the newline).
    fn line_end(&self, l: usize) -> usize {
        match self.starts.get(l + 1) {
            Some(s) => s - 1,
            None => self.chars.len(),
        }
    }

    /// Line holding offset `pos`.
    fn line_at(&self, pos: usize) -> usize {
        match self.starts.binary_search(&pos) {
            Ok(l) => l,
            Err(l) => l - 1,
        }
    }

    fn run(&mut self) {
        let mut l = 0;
        // Lines deeper than this indentation belong to a block scalar.
        let mut block_scalar: Option<usize> = None;
        while l < self.starts.len() {
            let (start, end) = (self.starts[l], self.line_end(l));
            let indent = (start..end).take_while(|&i| self.chars[i] == ' ').count();
            let first = start + indent;
            let blank = first >= end || self.chars[first] == '#' || self.chars[first] == '\r';
            if let Some(d) = block_scalar {
                if blank || indent > d {
                    l += 1;
                    continue;
                }
                block_scalar = None;
            }
            if blank || self.is_marker(first, end) {
                l += 1;
                continue;
            }
            let next = self.content(l, first, end, &mut block_scalar);
            l = next.max(l + 1);
        }
    }

    /// True for document markers `---` and `...`.
    fn is_marker(&self, first: usize, end: usize) -> bool {
        let s: String = self.chars[first..end.min(first + 3)].iter().collect();
        first == self.starts[self.line_at(first)] && (s == "---" || s == "...")
    }

    /// Handles the content of line `l` from offset `pos`; gives the next line to read.
    fn content(&mut self, l: usize, mut pos: usize, end: usize, block_scalar: &mut Option<usize>) -> usize {
        // `- ` items, possibly several on one line (`- - x`), each one level deeper.
        while self.chars[pos] == '-' && matches!(self.chars.get(pos + 1), None | Some(' ' | '\r' | '\n')) {
            if self.stack.len() > MAX_DEPTH {
                return l + 1;
            }
            self.seq_item(l, pos - self.starts[l]);
            pos += 1;
            while pos < end && self.chars[pos] == ' ' {
                pos += 1;
            }
            if pos >= end || self.chars[pos] == '#' || self.chars[pos] == '\r' {
                return l + 1;
            }
        }
        let col = pos - self.starts[l];
        let c = self.chars[pos];
        if c == '{' || c == '[' {
            let path = self.top_child();
            return self.flow_value(pos, &path);
        }
        let Some((key, value_pos)) = self.block_key(pos, end) else {
            return l + 1;
        };
        if self.stack.len() > MAX_DEPTH {
            return l + 1;
        }
        let path = self.key(l, col, &key);
        let mut p = value_pos;
        while p < end && self.chars[p] == ' ' {
            p += 1;
        }
        // Anchors and tags before a value: skip the token.
        while p < end && (self.chars[p] == '&' || self.chars[p] == '!') {
            while p < end && self.chars[p] != ' ' {
                p += 1;
            }
            while p < end && self.chars[p] == ' ' {
                p += 1;
            }
        }
        if p >= end {
            return l + 1;
        }
        match self.chars[p] {
            '{' | '[' => self.flow_value(p, &path),
            '|' | '>' => {
                *block_scalar = Some(col);
                l + 1
            }
            _ => l + 1,
        }
    }

    fn top_child(&self) -> String {
        self.stack.last().map(Frame::child_path).unwrap_or_default()
    }

    /// A `- ` item at column `col` on line `l`.
    fn seq_item(&mut self, l: usize, col: usize) {
        while self.stack.len() > 1 && self.stack.last().is_some_and(|f| f.indent > col) {
            self.stack.pop();
        }
        let top = self.stack.last_mut().expect("root frame stays");
        let path = match (&mut top.kind, top.indent == col) {
            (Kind::Seq { index }, true) => {
                *index += 1;
                format!("{}[{index}]", top.path)
            }
            _ => {
                let parent = top.child_path();
                let item = format!("{parent}[0]");
                self.stack.push(Frame { indent: col, path: parent, kind: Kind::Seq { index: 0 } });
                item
            }
        };
        self.record(&path, l);
    }

    /// A block key `key` at column `col` on line `l`; gives its path.
    fn key(&mut self, l: usize, col: usize, key: &str) -> String {
        while self.stack.len() > 1
            && self
                .stack
                .last()
                .is_some_and(|f| f.indent > col || (matches!(f.kind, Kind::Seq { .. }) && f.indent >= col))
        {
            self.stack.pop();
        }
        let top = self.stack.last().expect("root frame stays");
        if !(matches!(top.kind, Kind::Map { .. }) && top.indent == col) {
            let path = top.child_path();
            self.stack.push(Frame { indent: col, path, kind: Kind::Map { last: None } });
        }
        let top = self.stack.last_mut().expect("frame pushed");
        let path = join(&top.path, key);
        top.kind = Kind::Map { last: Some(path.clone()) };
        self.record(&path, l);
        path
    }

    /// The key of a block mapping entry starting at `pos`, and where its value starts.
    fn block_key(&self, pos: usize, end: usize) -> Option<(String, usize)> {
        let c = self.chars[pos];
        if c == '"' || c == '\'' {
            let (key, after) = self.quoted(pos)?;
            let mut p = after;
            while p < end && self.chars[p] == ' ' {
                p += 1;
            }
            return (p < end && self.chars[p] == ':').then_some((key, p + 1));
        }
        let mut p = pos;
        while p < end {
            if self.chars[p] == ':' && (p + 1 >= end || matches!(self.chars[p + 1], ' ' | '\r')) {
                let key: String = self.chars[pos..p].iter().collect();
                return Some((key.trim_end().to_string(), p + 1));
            }
            if self.chars[p] == '#' && p > pos && self.chars[p - 1] == ' ' {
                return None;
            }
            p += 1;
        }
        None
    }

    /// A quoted scalar starting at `pos`: its text and the offset after the closing quote.
    fn quoted(&self, pos: usize) -> Option<(String, usize)> {
        let q = self.chars[pos];
        let mut out = String::new();
        let mut p = pos + 1;
        while p < self.chars.len() {
            let c = self.chars[p];
            if q == '"' && c == '\\' && p + 1 < self.chars.len() {
                out.push(self.chars[p + 1]);
                p += 2;
                continue;
            }
            if c == q {
                if q == '\'' && self.chars.get(p + 1) == Some(&'\'') {
                    out.push('\'');
                    p += 2;
                    continue;
                }
                return Some((out, p + 1));
            }
            out.push(c);
            p += 1;
        }
        None
    }

    /// A flow collection or scalar at `pos` belonging to `path`; gives the line after it.
    fn flow_value(&mut self, pos: usize, path: &str) -> usize {
        let end = self.flow(pos, path, 0);
        self.line_at(end.saturating_sub(1).min(self.chars.len().saturating_sub(1))) + 1
    }

    fn skip_space(&self, mut p: usize) -> usize {
        while p < self.chars.len() {
            match self.chars[p] {
                ' ' | '\t' | '\n' | '\r' => p += 1,
                '#' if p == 0 || matches!(self.chars[p - 1], ' ' | '\t' | '\n') => {
                    while p < self.chars.len() && self.chars[p] != '\n' {
                        p += 1;
                    }
                }
                _ => break,
            }
        }
        p
    }

    /// Parses one flow value at `p` (after spaces); records keys under `path`; gives the
    /// offset after it. Depth-limited so malformed input cannot recurse forever.
    fn flow(&mut self, p: usize, path: &str, depth: usize) -> usize {
        let p = self.skip_space(p);
        if p >= self.chars.len() || depth > MAX_DEPTH {
            return p;
        }
        match self.chars[p] {
            '{' => self.flow_map(p + 1, path, depth),
            '[' => self.flow_seq(p + 1, path, depth),
            _ => self.flow_scalar(p).1,
        }
    }

    fn flow_map(&mut self, mut p: usize, path: &str, depth: usize) -> usize {
        loop {
            p = self.skip_space(p);
            if p >= self.chars.len() {
                return p;
            }
            match self.chars[p] {
                '}' => return p + 1,
                ',' => {
                    p += 1;
                    continue;
                }
                ']' => return p + 1,
                _ => {}
            }
            let (key, after) = self.flow_scalar(p);
            let key_path = join(path, &key);
            let line = self.line_at(p);
            self.record(&key_path, line);
            p = self.skip_space(after);
            if p < self.chars.len() && self.chars[p] == ':' {
                p = self.flow(p + 1, &key_path, depth + 1);
            } else if p == after && p < self.chars.len() && !matches!(self.chars[p], ',' | '}') {
                // No progress possible: give up on this collection.
                return p + 1;
            }
        }
    }

    fn flow_seq(&mut self, mut p: usize, path: &str, depth: usize) -> usize {
        let mut index = 0;
        loop {
            p = self.skip_space(p);
            if p >= self.chars.len() {
                return p;
            }
            match self.chars[p] {
                ']' | '}' => return p + 1,
                ',' => {
                    index += 1;
                    p += 1;
                    continue;
                }
                _ => {}
            }
            let item = format!("{path}[{index}]");
            let line = self.line_at(p);
            self.record(&item, line);
            let after = self.flow(p, &item, depth + 1);
            p = if after > p { after } else { p + 1 };
        }
    }

    /// A scalar inside a flow collection: quoted, or plain up to `,` `}` `]` or `: `.
    fn flow_scalar(&self, p: usize) -> (String, usize) {
        if matches!(self.chars[p], '"' | '\'')
            && let Some(q) = self.quoted(p)
        {
            return q;
        }
        let mut e = p;
        while e < self.chars.len() {
            let c = self.chars[e];
            if matches!(c, ',' | '}' | ']' | '{' | '[' | '\n') {
                break;
            }
            if c == ':' && matches!(self.chars.get(e + 1), None | Some(' ' | ',' | '}' | ']' | '\n' | '\r' | '{' | '['))
            {
                break;
            }
            if c == '#' && e > p && self.chars[e - 1] == ' ' {
                break;
            }
            e += 1;
        }
        let s: String = self.chars[p..e].iter().collect();
        (s.trim().to_string(), e)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const SAMPLE: &str = "\
# a comment
name: pump-panel
glass:
  front: {width: 60, height: 40}
  back:  {width: 60, height: 34, x: 0, y: 6}
pads: {side: bottom, pitch: 1.8, fixed: {COM1: 1, \"D1.a\": 2}}
digits:
  - name: D
    height: 12
    origin: [8, 12]
  - name: E   # second group
    height: 9
    decimal_points: [1, 2]
legends:
- {name: UNIT, text: \"a: b, c\", at: [40, 5]}
- name: X
  text: |
    not: a key
  height: 3
icons:
  - {name: RING1, ring: {centre: [5, 5], outer: 2,
       inner: 1.5}}
  - name: TRI
    polygon:
      - [0, 0]
      - [1, 0]
buses:
  - {net: D1.a, points: [[1,1],[1,5]]}
seal:
  width: 1.0
";

    fn lines() -> BTreeMap<String, usize> {
        key_lines(SAMPLE)
    }

    #[test]
    fn block_keys_and_nesting() {
        let m = lines();
        assert_eq!(m["name"], 2);
        assert_eq!(m["glass"], 3);
        assert_eq!(m["glass.front"], 4);
        assert_eq!(m["glass.back.y"], 5);
        assert_eq!(m["seal.width"], 30);
    }

    #[test]
    fn flow_mappings_on_one_line() {
        let m = lines();
        assert_eq!(m["pads.pitch"], 6);
        assert_eq!(m["pads.fixed.COM1"], 6);
        assert_eq!(m["pads.fixed.D1.a"], 6);
    }

    #[test]
    fn sequence_items() {
        let m = lines();
        assert_eq!(m["digits[0]"], 8);
        assert_eq!(m["digits[0].height"], 9);
        assert_eq!(m["digits[0].origin[1]"], 10);
        assert_eq!(m["digits[1].name"], 11);
        assert_eq!(m["digits[1].height"], 12);
        assert_eq!(m["digits[1].decimal_points[1]"], 13);
    }

    #[test]
    fn compact_sequences_and_block_scalars() {
        let m = lines();
        assert_eq!(m["legends[0].at"], 15);
        assert_eq!(m["legends[1].name"], 16);
        assert_eq!(m["legends[1].height"], 19);
        assert!(!m.contains_key("legends[1].text.not"));
        assert!(!m.contains_key("legends[0].text.c"));
        assert!(!m.contains_key("legends[1].not"));
    }

    #[test]
    fn flow_across_lines_and_nested_block_sequences() {
        let m = lines();
        assert_eq!(m["icons[0].ring.outer"], 21);
        assert_eq!(m["icons[0].ring.inner"], 22);
        assert_eq!(m["icons[1].name"], 23);
        assert_eq!(m["icons[1].polygon[1]"], 26);
        assert_eq!(m["buses[0].points[1]"], 28);
        assert_eq!(m["buses"], 27);
    }

    #[test]
    fn missing_keys_fall_back_to_their_parent() {
        let m = lines();
        assert_eq!(line_of(&m, "digits[1].width"), Some(11));
        assert_eq!(line_of(&m, "pads.length"), Some(6));
        assert_eq!(line_of(&m, "window.x"), None);
    }

    #[test]
    fn repeated_keys_are_found_at_their_second_place() {
        let (first, again) = key_lines_and_repeats("pads:\n  side: top\n  pitch: 1\n  pitch: 2\nfixed: {A: 1, A: 2}\n");
        assert_eq!(first["pads.pitch"], 3);
        assert_eq!(again["pads.pitch"], 4);
        assert_eq!(again["fixed.A"], 5);
        assert!(!again.contains_key("pads.side"));
    }

    #[test]
    fn garbage_does_not_panic() {
        let deep = "- ".repeat(100_000);
        let _ = key_lines(&deep);
        let _ = key_lines(&"[".repeat(100_000));
        for t in
            ["", "{", "a: [1, {b: ", "- - -", ":\n:", "a: 'x", "  - x\nb:\n - [}", "\"k\": {\"", "a:\n  - b: [1,\n"]
        {
            let _ = key_lines(t);
        }
    }
}
