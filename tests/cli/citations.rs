//! No file in the repository cites a file that is not there (DEVELOPERS.md, *Testing*:
//! "Every file a comment, test or doc names must be in the repository").
//!
//! Reads README.md, DEVELOPERS.md, docs/*.md, demo-layouts/README.md,
//! fonts-strokes/README.md and the comments of every Rust file under src/, tests/ and
//! examples/; takes out every path that starts at a top folder or file of the repository
//! (`docs/outputs.md`, `src/emit/files.rs`, `tests/fixtures/...`), every relative markdown link
//! (resolved from the citing file's folder), every bare Rust file name (`files.rs`) and
//! every Rust file under a module folder (`check/causes.rs`, under src/),
//! and fails listing each one that is not in the repository. The extractor has tests of
//! its own below, so the check cannot pass by finding nothing.

use std::path::{Path, PathBuf};

/// Where a cited path starts: a top folder or a file at the top of the repository.
const ROOTS: &[&str] =
    &["src/", "docs/", "tests/", "demo-layouts/", "fonts-strokes/", "examples/", ".ci/", "README.md", "DEVELOPERS.md", "Cargo.toml"];

/// One citation: the path as written, and whether it is relative to the citing file's
/// folder (a markdown link) rather than to the repository.
#[derive(Debug, PartialEq)]
enum Cited {
    /// A path from the repository's top (`docs/outputs.md`).
    FromTop(String),
    /// A markdown link, relative to the citing file's folder (`../src/lib.rs`).
    Link(String),
    /// A bare Rust file name (`files.rs`): some file of that name must exist.
    RustFile(String),
    /// A Rust file under a module folder (`check/causes.rs`): under src/ or the top.
    InSrc(String),
}

fn path_char(c: char) -> bool {
    c.is_ascii_alphanumeric() || matches!(c, '_' | '-' | '.' | '/')
}

/// Every citation in `text`. A path with a placeholder (`*`, `NAME`, `X.yaml`, `...`) is no
/// citation of one file and is left out.
fn cited(text: &str) -> Vec<Cited> {
    let mut out = Vec::new();
    let chars: Vec<(usize, char)> = text.char_indices().collect();
    let mut i = 0;
    while i < chars.len() {
        let (at, c) = chars[i];
        let starts = i == 0 || !path_char(chars[i - 1].1);
        if !(starts && path_char(c)) {
            i += 1;
            continue;
        }
        let mut j = i;
        while j < chars.len() && path_char(chars[j].1) {
            j += 1;
        }
        let end = chars.get(j).map_or(text.len(), |c| c.0);
        let raw = &text[at..end];
        let token = raw.trim_end_matches(['.', ',', ':']);
        let next = chars.get(j).map(|c| c.1);
        let placeholder = matches!(next, Some('*' | '{' | '<'))
            || raw.contains("...")
            || token.split(['/', '.']).any(|part| part.len() > 0 && part.chars().all(|c| c.is_ascii_uppercase()) && !matches!(part, "README" | "DEVELOPERS"));
        if !placeholder {
            if ROOTS.iter().any(|r| token.starts_with(r)) {
                out.push(Cited::FromTop(token.to_string()));
            } else if !token.contains('/') && token.ends_with(".rs") && token.len() > 3 {
                out.push(Cited::RustFile(token.to_string()));
            } else if token.ends_with(".rs") && !token.starts_with(['/', '.']) {
                out.push(Cited::InSrc(token.to_string()));
            }
        }
        i = j;
    }
    let mut rest = text;
    while let Some(k) = rest.find("](") {
        rest = &rest[k + 2..];
        let target = &rest[..rest.find(')').unwrap_or(rest.len())];
        let target = target.split('#').next().unwrap_or("").trim();
        if !target.is_empty() && !target.contains("://") && !target.starts_with("mailto:") {
            out.push(Cited::Link(target.to_string()));
        }
    }
    out
}

/// The comments of a Rust file (`//`, `///`, `//!`), one line each.
fn rust_comments(text: &str) -> String {
    text.lines().filter_map(|l| l.find("//").map(|k| &l[k..])).collect::<Vec<_>>().join("\n")
}

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn files_under(dir: &Path, ext: &str, out: &mut Vec<PathBuf>) {
    for e in std::fs::read_dir(dir).unwrap().flatten() {
        let p = e.path();
        if p.is_dir() {
            files_under(&p, ext, out);
        } else if p.extension().is_some_and(|x| x == ext) {
            out.push(p);
        }
    }
}

/// Whether a file named `name` is anywhere under src/, tests/ or examples/.
fn rust_file_exists(name: &str, rust: &[PathBuf]) -> bool {
    rust.iter().any(|p| p.file_name().is_some_and(|n| n == name))
}

#[test]
fn every_cited_file_is_in_the_repository() {
    let top = root();
    let mut rust = Vec::new();
    for d in ["src", "tests", "examples"] {
        files_under(&top.join(d), "rs", &mut rust);
    }
    let mut docs: Vec<PathBuf> =
        ["README.md", "DEVELOPERS.md", "demo-layouts/README.md", "fonts-strokes/README.md"].iter().map(|f| top.join(f)).collect();
    files_under(&top.join("docs"), "md", &mut docs);
    let mut sources: Vec<(PathBuf, String)> = docs.into_iter().map(|p| (p.clone(), std::fs::read_to_string(&p).unwrap())).collect();
    sources.extend(rust.iter().map(|p| (p.clone(), rust_comments(&std::fs::read_to_string(p).unwrap()))));
    let mut missing = Vec::new();
    let mut seen = 0;
    for (file, text) in &sources {
        for c in cited(text) {
            seen += 1;
            let there = match &c {
                Cited::FromTop(p) => top.join(p).exists(),
                Cited::Link(p) => file.parent().unwrap().join(p).exists(),
                Cited::RustFile(n) => rust_file_exists(n, &rust),
                Cited::InSrc(p) => top.join("src").join(p).exists() || top.join(p).exists(),
            };
            if !there {
                missing.push(format!("{}: {c:?}", file.strip_prefix(&top).unwrap().display()));
            }
        }
    }
    println!("{seen} citations checked");
    assert!(seen > 100, "only {seen} citations found: the extractor is broken");
    assert!(missing.is_empty(), "cited but not in the repository:\n{}", missing.join("\n"));
}

#[test]
fn extractor_finds_paths_links_and_rust_files() {
    let text = "See docs/outputs.md, *One set*; and `src/emit/files.rs`. [format](layout-format.md#limits) \
                [web](https://example.org/x.md) (`report.rs`) tests/fixtures/bad/. (`check/causes.rs`)";
    assert_eq!(
        cited(text),
        vec![
            Cited::FromTop("docs/outputs.md".into()),
            Cited::FromTop("src/emit/files.rs".into()),
            Cited::RustFile("report.rs".into()),
            Cited::FromTop("tests/fixtures/bad/".into()),
            Cited::InSrc("check/causes.rs".into()),
            Cited::Link("layout-format.md".into()),
        ]
    );
}

#[test]
fn extractor_leaves_out_placeholders_and_mid_word_paths() {
    let text = "out/NAME.front.svg docs/*.md tests/fixtures/bad/X.yaml demo-layouts/X.yaml mysrc/a.md src/...";
    assert_eq!(cited(text), vec![]);
}

/// A path that is not there is reported: the check can fail.
#[test]
fn a_missing_file_is_caught() {
    let c = cited("as docs/no-such-file.md says");
    assert_eq!(c, vec![Cited::FromTop("docs/no-such-file.md".into())]);
    assert!(!root().join("docs/no-such-file.md").exists());
}
