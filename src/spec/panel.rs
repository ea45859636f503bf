//! `panel:` — several cells on one substrate.
//!
//! Takes the raw `panel:` mapping, the glass and the rules; gives the [`Panel`] with its
//! sizes in mm, or records every problem with its key: counts that are not whole numbers
//! of at least 1, a scribe lane that would reach deeper into a cell than its edge
//! clearance, and a substrate too small for the array and the border its alignment marks
//! need.

use super::problems::Problems;
use super::raw::RawPanel;
use super::read::{Sign, mm};
use crate::layout::{Glass, Panel, Rules};

/// Most cells along one side of a panel (a larger array is a different kind of job).
const MAX_CELLS: i64 = 50;

/// Resolves `panel:`; `None` when it has problems (all recorded).
pub fn panel(p: &mut Problems, r: &RawPanel, glass: &Glass, rules: &Rules) -> Option<Panel> {
    let mut count = |v, key: &str| {
        let n = p.int(v, key, None, 1);
        if p.clean(&[key]) && n > MAX_CELLS {
            p.bad(key, format!("{n} cells along one side are more than a panel is for"), &format!("1 to {MAX_CELLS}"));
        }
        n.clamp(1, MAX_CELLS) as u32
    };
    let rows = count(r.rows.as_ref(), "panel.rows");
    let columns = count(r.columns.as_ref(), "panel.columns");
    let spacing = p.length(r.spacing.as_ref(), "panel.spacing", Some(0.0), Sign::NonNegative);
    let scribe_lane = p.length(r.scribe_lane.as_ref(), "panel.scribe_lane", Some(0.2), Sign::Positive);
    let size = r.substrate.as_ref();
    if size.is_none() {
        p.add("panel.substrate", "missing", Some("{width, height}: the substrate's size in mm".into()));
    }
    let width = p.length(size.and_then(|s| s.width.as_ref()), "panel.substrate.width", size.map(|_| None).unwrap_or(Some(1.0)), Sign::Positive);
    let height = p.length(size.and_then(|s| s.height.as_ref()), "panel.substrate.height", size.map(|_| None).unwrap_or(Some(1.0)), Sign::Positive);
    if p.clean(&["panel.scribe_lane", "rules"]) && scribe_lane / 2.0 > rules.edge_clearance + 1e-9 {
        p.bad(
            "panel.scribe_lane",
            format!(
                "a {} lane reaches {} into each cell, deeper than rules.edge_clearance {}",
                mm(scribe_lane),
                mm(scribe_lane / 2.0),
                mm(rules.edge_clearance)
            ),
            &format!("at most twice rules.edge_clearance: {}", mm(2.0 * rules.edge_clearance)),
        );
    }
    if p.clean(&["panel.scribe_lane"]) && scribe_lane > Panel::widest_lane() + 1e-9 {
        p.bad(
            "panel.scribe_lane",
            format!("a {} lane reaches the panel's alignment marks in the substrate corners", mm(scribe_lane)),
            &format!("at most {}", mm(Panel::widest_lane())),
        );
    }
    let (x0, y0, x1, y1) = glass.footprint();
    for (key, n, cell, have, across) in
        [("panel.substrate.width", columns, x1 - x0, width, "columns"), ("panel.substrate.height", rows, y1 - y0, height, "rows")]
    {
        let need = n as f64 * cell + (n as f64 - 1.0) * spacing + 2.0 * Panel::BORDER;
        if p.clean(&[key, "panel.rows", "panel.columns", "panel.spacing"]) && have < need - 1e-9 {
            p.bad(
                key,
                format!(
                    "{} is too small: {n} {across} of {} cells with {} spacing take {}, plus {} on each side for the panel's alignment marks",
                    mm(have),
                    mm(cell),
                    mm(spacing),
                    mm(need - 2.0 * Panel::BORDER),
                    mm(Panel::BORDER)
                ),
                &format!("at least {}", mm(need)),
            );
        }
    }
    p.clean(&["panel"]).then_some(Panel { rows, columns, spacing, scribe_lane, width, height })
}
