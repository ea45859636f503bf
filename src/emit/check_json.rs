//! The JSON document `segmask check --format json` prints.
//!
//! Takes the layout's name, its findings (each with the layout entries it concerns) or
//! the input problems that stopped it, gives one pretty-printed JSON document. A finding
//! is written as the report writes it (`report.rs`), plus `elements`: the element, key
//! path and layout line of each entry it concerns. docs/commands.md describes the keys.

use super::report::{FindingRow, finding_row};
use crate::error::{Error as SegmaskError, InputProblem};
use crate::finding::{ElementLine, Finding, Severity, count};
use crate::{Error, Result};
use serde::Serialize;
use std::path::Path;

#[derive(Serialize)]
struct CheckDoc<'a> {
    /// `checked`, `bad-input` (exit 2: the layout's problems are listed) or `failed`
    /// (exit 2: a file could not be read, or a bug).
    status: &'static str,
    file: String,
    layout: Option<&'a str>,
    errors: usize,
    warnings: usize,
    findings: Vec<Row<'a>>,
    input_problems: Vec<ProblemRow<'a>>,
    failure: Option<String>,
}

#[derive(Serialize)]
struct Row<'a> {
    #[serde(flatten)]
    finding: FindingRow<'a>,
    elements: &'a [ElementLine],
}

#[derive(Serialize)]
struct ProblemRow<'a> {
    file: String,
    line: Option<usize>,
    column: Option<usize>,
    key: &'a str,
    message: &'a str,
    allowed: Option<&'a str>,
}

fn to_bytes(doc: &CheckDoc) -> Result<Vec<u8>> {
    let mut bytes = serde_json::to_vec_pretty(doc).map_err(|e| Error::Bug(format!("check JSON: {e}")))?;
    bytes.push(b'\n');
    Ok(bytes)
}

/// The document of a layout that was built and checked: `findings[i]` concerns the
/// entries `elements[i]`.
pub fn render_check(file: &Path, layout: &str, findings: &[Finding], elements: &[Vec<ElementLine>]) -> Result<Vec<u8>> {
    let rows = findings.iter().zip(elements).map(|(f, e)| Row { finding: finding_row(f), elements: e }).collect();
    to_bytes(&CheckDoc {
        status: "checked",
        file: file.display().to_string(),
        layout: Some(layout),
        errors: count(findings, Severity::Error),
        warnings: count(findings, Severity::Warning),
        findings: rows,
        input_problems: Vec::new(),
        failure: None,
    })
}

/// The document of a layout that could not be checked: its input problems (file, line,
/// key, message, allowed), or the I/O failure or bug that stopped the run.
pub fn render_failure(file: &Path, e: &SegmaskError) -> Result<Vec<u8>> {
    let problems: &[InputProblem] = match e {
        SegmaskError::Input(p) => p,
        _ => &[],
    };
    let input_problems = problems
        .iter()
        .map(|p| ProblemRow {
            file: p.file.display().to_string(),
            line: p.line,
            column: p.column,
            key: &p.key,
            message: &p.message,
            allowed: p.allowed.as_deref(),
        })
        .collect();
    let input = matches!(e, SegmaskError::Input(_));
    to_bytes(&CheckDoc {
        status: if input { "bad-input" } else { "failed" },
        file: file.display().to_string(),
        layout: None,
        errors: 0,
        warnings: 0,
        findings: Vec::new(),
        input_problems,
        failure: if input { None } else { Some(e.to_string()) },
    })
}
