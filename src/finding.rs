//! Findings: what the checks (and the generator) report about a design.
//!
//! A finding is plain data — rule, severity, nets, place, measured and required values —
//! so that the terminal, the preview and the JSON report all show the same thing.

use crate::geom::Pt;
use crate::layout::PlateId;

/// How bad a finding is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Severity {
    /// Must be fixed before making masks.
    Error,
    /// Probably wrong, or visible only under the bezel.
    Warning,
    /// For information.
    Note,
}

impl Severity {
    /// Lower-case name.
    pub fn name(self) -> &'static str {
        match self {
            Severity::Error => "error",
            Severity::Warning => "warning",
            Severity::Note => "note",
        }
    }
}

/// The rule a finding is about. Codes are ours (see docs/checks.md).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Rule {
    /// Drawn line narrower than the minimum width.
    Width,
    /// Line narrower than the minimum width once etched (undercut on both edges).
    EtchedWidth,
    /// Two nets on a plate closer than the minimum gap.
    Gap,
    /// A line or space on the film below what the film holds.
    FilmFeature,
    /// Two intended nets joined by ITO.
    Short,
    /// Part of a net with no ITO path to its pad.
    Open,
    /// Front and back ITO overlap in the liquid crystal where no pixel is designed.
    Ghost,
    /// A pad not fully exposed on the ledge.
    PadCovered,
    /// ITO too close to the glass edge.
    EdgeClearance,
    /// A lead that could not be drawn.
    Unroutable,
    /// A designed pixel that does not light fully, or lights with the wrong common.
    DriveTruth,
    /// A pixel its common electrode does not cover fully (trimmed where two commons meet).
    Coverage,
    /// A line whose lead resistance times capacitance is a large share of the frame.
    LineRc,
    /// The drive amplitude does not switch the mixture fully on, or lights off pixels.
    DriveMargin,
    /// Plates misaligned by the registration the process holds to light stray area or
    /// uncover part of a pixel.
    Registration,
    /// No room for an alignment mark in a corner of the liquid crystal.
    MarkRoom,
    /// More pins than the fewest under multiplexing, and what keeps the spare places free.
    PinCount,
    /// An icon or legend put on another common than the assignment first chose, because
    /// on that one its common could not reach its transfer dot.
    Reassigned,
}

impl Rule {
    /// The rule code printed and written to JSON.
    pub fn code(self) -> &'static str {
        match self {
            Rule::Width => "width",
            Rule::EtchedWidth => "etched-width",
            Rule::Gap => "gap",
            Rule::FilmFeature => "film-feature",
            Rule::Short => "short",
            Rule::Open => "open",
            Rule::Ghost => "ghost",
            Rule::PadCovered => "pad-covered",
            Rule::EdgeClearance => "edge-clearance",
            Rule::Unroutable => "unroutable",
            Rule::DriveTruth => "drive-truth",
            Rule::Coverage => "coverage",
            Rule::LineRc => "line-rc",
            Rule::DriveMargin => "drive-margin",
            Rule::Registration => "registration",
            Rule::MarkRoom => "mark-room",
            Rule::PinCount => "pin-count",
            Rule::Reassigned => "reassigned",
        }
    }
}

/// One problem found in a design.
#[derive(Debug, Clone, PartialEq)]
pub struct Finding {
    /// Rule broken.
    pub rule: Rule,
    /// How bad.
    pub severity: Severity,
    /// Plate concerned, if one.
    pub plate: Option<PlateId>,
    /// Nets involved (intended names).
    pub nets: Vec<String>,
    /// Where, mm, front-plate frame.
    pub location: Pt,
    /// Measured value (mm, or mm² for areas), if the rule measures one.
    pub measured: Option<f64>,
    /// Required value, same unit.
    pub required: Option<f64>,
    /// One sentence saying what is wrong.
    pub message: String,
}

/// One layout entry a finding concerns.
#[derive(Debug, Clone, PartialEq, Eq, serde::Serialize)]
pub struct ElementLine {
    /// Element (`D1.a`, `HOLD`) or, for a bus trace, its net.
    pub element: String,
    /// Key path of the layout entry (`digits[0]`, `buses[1]`).
    pub key: String,
    /// 1-based line of that entry in the layout file, when the locator found it.
    pub line: Option<usize>,
}

/// Counts of errors and warnings in a list of findings.
pub fn count(findings: &[Finding], severity: Severity) -> usize {
    findings.iter().filter(|f| f.severity == severity).count()
}
