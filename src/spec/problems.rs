//! Collecting input problems: every bad value is noted with its key path and line, and
//! the keys already found bad are remembered so that later cross-checks which depend on
//! them stay quiet instead of piling up consequential errors.

use super::locate::line_of;
use crate::error::InputProblem;
use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

/// Problems found so far in one layout file.
pub struct Problems {
    file: PathBuf,
    lines: BTreeMap<String, usize>,
    repeats: BTreeMap<String, usize>,
    found: Vec<InputProblem>,
}

impl Problems {
    /// An empty collection for `file`; `lines` locates keys, `repeats` the second
    /// occurrence of repeated keys.
    pub fn new(file: &Path, lines: BTreeMap<String, usize>, repeats: BTreeMap<String, usize>) -> Problems {
        Problems { file: file.to_path_buf(), lines, repeats, found: Vec::new() }
    }

    /// Notes a problem about a key given twice, at its second occurrence.
    pub fn repeated(&mut self, key: &str, message: impl Into<String>, allowed: &str) {
        self.bad(key, message, allowed);
        if let (Some(p), Some(l)) = (self.found.last_mut(), self.repeats.get(key)) {
            p.line = Some(*l);
        }
    }

    /// Notes a problem at `key`.
    pub fn add(&mut self, key: &str, message: impl Into<String>, allowed: Option<String>) {
        let line = line_of(&self.lines, key);
        self.found.push(InputProblem {
            file: self.file.clone(),
            line,
            column: None,
            key: key.to_string(),
            message: message.into(),
            allowed,
        });
    }

    /// Notes a problem with a short "allowed" text.
    pub fn bad(&mut self, key: &str, message: impl Into<String>, allowed: &str) {
        self.add(key, message, Some(allowed.to_string()));
    }

    /// True when no problem was noted at any of `keys` or below them.
    pub fn clean(&self, keys: &[&str]) -> bool {
        !self.found.iter().any(|p| keys.iter().any(|k| is_under(&p.key, k)))
    }

    /// How many problems were noted.
    pub fn len(&self) -> usize {
        self.found.len()
    }

    /// True when nothing at all was noted.
    pub fn is_empty(&self) -> bool {
        self.found.is_empty()
    }

    /// Line of `key` (or its nearest located ancestor).
    pub fn line(&self, key: &str) -> Option<usize> {
        line_of(&self.lines, key)
    }

    /// `key (line N)` for messages that name a second place.
    pub fn place(&self, key: &str) -> String {
        match self.line(key) {
            Some(l) => format!("`{key}` (line {l})"),
            None => format!("`{key}`"),
        }
    }

    /// The key lines, for the resolved layout.
    pub fn lines(&self) -> &BTreeMap<String, usize> {
        &self.lines
    }

    /// All problems, ordered by line (problems without a line last).
    pub fn into_sorted(mut self) -> Vec<InputProblem> {
        self.found.sort_by_key(|p| p.line.unwrap_or(usize::MAX));
        self.found
    }
}

/// True when `key` is `prefix` or lies below it (`pads.pitch` under `pads`, `digits[0]`
/// under `digits`).
pub fn is_under(key: &str, prefix: &str) -> bool {
    key == prefix || (key.starts_with(prefix) && matches!(key.as_bytes().get(prefix.len()), Some(b'.') | Some(b'[')))
}

/// Turns a serde_yaml error into an input problem: line and column from its location,
/// key path from its message, and plainer words for unknown and repeated keys.
pub fn from_yaml_error(
    file: &Path,
    source: &str,
    e: &serde_yaml::Error,
    repeats: &BTreeMap<String, usize>,
) -> InputProblem {
    let loc = e.location();
    let mut text = e.to_string();
    if text.contains("more than one document") {
        return InputProblem {
            file: file.to_path_buf(),
            line: second_document(source),
            column: Some(1),
            key: String::new(),
            message: "a second YAML document starts here".into(),
            allowed: Some("one layout per file: remove the second `---` and what follows, or split the file".into()),
        };
    }
    if let Some(l) = &loc {
        let suffix = format!(" at line {} column {}", l.line(), l.column());
        if let Some(cut) = text.find(&suffix) {
            text.replace_range(cut..cut + suffix.len(), "");
        }
    }
    let (mut key, mut message) = split_path(&text);
    let mut allowed = None;
    let mut line = loc.as_ref().map(|l| l.line());
    let mut column = loc.as_ref().map(|l| l.column());
    if message.starts_with("unknown field `<<`") {
        message = "YAML merge keys (`<<`) are not supported".into();
        allowed = Some("the keys written out in full (anchors and aliases `&name`, `*name` of whole values work)".into());
        key = join_key(&key, "<<");
    } else if let Some(rest) = message.strip_prefix("unknown field ") {
        let (field, expected) = rest.split_once(", expected ").unwrap_or((rest, ""));
        let field = field.trim_matches('`').to_string();
        let names = expected.trim_start_matches("one of ").replace('`', "").replace(" or ", ", ");
        let mut m = format!("unknown key `{field}`");
        if let Some(near) = nearest(&field, names.split(", ")) {
            m.push_str(&format!(" (did you mean `{near}`?)"));
        }
        message = m;
        allowed = (!names.is_empty() && names != "there are no fields").then_some(names);
        key = join_key(&key, &field);
    } else if let Some(rest) = message.strip_prefix("duplicate field ") {
        let field = rest.trim_matches('`').to_string();
        message = format!("key `{field}` appears twice");
        key = join_key(&key, &field);
        // serde_yaml points at the mapping; the second occurrence is what to fix.
        if let Some(l) = repeats.get(&key) {
            (line, column) = (Some(*l), None);
        }
    }
    InputProblem { file: file.to_path_buf(), line, column, key, message, allowed }
}

/// 1-based line of the marker that starts a second document in `text`: a `---` or
/// `...` line after some content (a `---` before any content only opens the first).
fn second_document(text: &str) -> Option<usize> {
    let mut content = false;
    for (i, line) in text.lines().enumerate() {
        let marker = ["---", "..."].iter().any(|m| line.strip_prefix(m).is_some_and(|r| r.is_empty() || r.starts_with([' ', '\t', '#', '\r'])));
        if marker && content {
            return Some(i + 1 + usize::from(line.starts_with("...")));
        }
        let t = line.trim();
        if !marker && !t.is_empty() && !t.starts_with('#') && !t.starts_with('%') {
            content = true;
        }
    }
    None
}

fn join_key(path: &str, field: &str) -> String {
    if path.is_empty() { field.to_string() } else { format!("{path}.{field}") }
}

/// Splits `path: message` as serde_yaml writes it (no path means the document root).
fn split_path(text: &str) -> (String, String) {
    if let Some((head, rest)) = text.split_once(": ") {
        let looks_like_path = !head.is_empty() && !head.contains([' ', '`', '"', '\'']);
        if looks_like_path {
            return (head.to_string(), rest.to_string());
        }
    }
    (String::new(), text.to_string())
}

/// The candidate closest to `word` by edit distance, if it is close (at most 2 edits).
pub fn nearest<'a>(word: &str, candidates: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    candidates
        .into_iter()
        .filter(|c| !c.is_empty())
        .map(|c| (edit_distance(word, c), c))
        .filter(|(d, _)| *d <= 2)
        .min_by_key(|(d, _)| *d)
        .map(|(_, c)| c)
}

/// Levenshtein distance (insertions, deletions, substitutions), by characters.
fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut row: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut prev = row[0];
        row[0] = i + 1;
        for j in 0..b.len() {
            let cur = row[j + 1];
            row[j + 1] = (prev + usize::from(ca != b[j])).min(row[j] + 1).min(cur + 1);
            prev = cur;
        }
    }
    row[b.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn edit_distance_counts_edits() {
        // Textbook example (Levenshtein 1966; e.g. Wagner & Fischer 1974): kitten → sitting = 3.
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        assert_eq!(edit_distance("heigth", "height"), 2);
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(nearest("heigth", ["name", "height", "width"]), Some("height"));
        assert_eq!(nearest("zzzzzz", ["name", "height"]), None);
    }

    #[test]
    fn keys_under_prefixes() {
        assert!(is_under("pads.pitch", "pads"));
        assert!(is_under("digits[0].height", "digits"));
        assert!(is_under("digits[0]", "digits[0]"));
        assert!(!is_under("padsx", "pads"));
        assert!(!is_under("digits[10]", "digits[1]"));
    }

    #[test]
    fn serde_paths_are_split_off() {
        assert_eq!(split_path("pads: unknown field `x`"), ("pads".into(), "unknown field `x`".into()));
        assert_eq!(split_path("invalid type: string"), (String::new(), "invalid type: string".into()));
    }
}
