//! The resolved layout: what the `spec` stage gives every later stage.
//!
//! Contract (docs/architecture.md, *Contracts*): every length is a plain `f64` in
//! millimetres, already
//! checked positive where it must be; every angle is in degrees; every reference (style,
//! icon, font) is resolved; all coordinates are in the *front-plate frame*: origin at the
//! lower-left corner of the front glass, x to the right, y up, as the viewer sees the
//! finished display. No later stage sees YAML.

use crate::geom::Pt;
use std::collections::BTreeMap;

#[path = "layout_bar.rs"]
mod bar;
pub use bar::{BarGraph, BarPath, MAX_STEPS, StepShape, StepSide, step_net};

/// A whole display, resolved.
#[derive(Debug, Clone)]
pub struct Layout {
    /// Name used for output files and titles.
    pub name: String,
    /// Path of the layout file, for messages.
    pub source: std::path::PathBuf,
    /// Both glass plates.
    pub glass: Glass,
    /// The viewing window (visible through the bezel), front-plate frame.
    pub window: Rect,
    /// Liquid-crystal layer thickness in mm (for capacitance).
    pub cell_gap: f64,
    /// Photoresist tone the films are made for (decides their polarity).
    pub resist: Resist,
    /// Process and design rules.
    pub rules: Rules,
    /// How the mask files are made.
    pub masks: MaskOptions,
    /// Seal ring and fill port.
    pub seal: Seal,
    /// Transfer dots joining back-plate leads to front-plate pads.
    pub transfer: Transfer,
    /// Pad row on the ledge.
    pub pads: Pads,
    /// Drive scheme.
    pub drive: Drive,
    /// COM and SEG choices fixed by hand (`drive.fixed`), by element name.
    pub fixed_lines: BTreeMap<String, FixedLine>,
    /// Alignment marks.
    pub marks: Marks,
    /// Digit groups.
    pub digits: Vec<DigitGroup>,
    /// Fixed legends set in the stroke font.
    pub legends: Vec<Legend>,
    /// Icons, built in or drawn.
    pub icons: Vec<Icon>,
    /// Bar graphs: rows of steps along a line or an arc, each step its own element.
    pub bars: Vec<BarGraph>,
    /// User-drawn bus traces.
    pub buses: Vec<Bus>,
    /// GDSII layer numbers.
    pub layers: LayerMap,
    /// Chord tolerance for curves, mm.
    pub tolerance: f64,
    /// Extra font and icon files the layout adds (already read), by file name.
    pub extra_fonts: Vec<FontSource>,
    /// The cell's mixture, electrical and optical data (its `gap` equals `cell_gap`).
    pub cell: Cell,
    /// Line of each key path in the layout file, so later stages can point at it.
    pub key_lines: BTreeMap<String, usize>,
}

impl Layout {
    /// An input problem located at `key` (its line looked up in the layout file).
    pub fn problem(&self, key: &str, message: impl Into<String>, allowed: Option<String>) -> crate::error::InputProblem {
        crate::error::InputProblem {
            file: self.source.clone(),
            line: key_line(&self.key_lines, key),
            column: None,
            key: key.to_string(),
            message: message.into(),
            allowed,
        }
    }
}

/// Font text supplied by the layout (same format as `fonts-strokes/`).
#[derive(Debug, Clone)]
pub struct FontSource {
    /// File path as given, for messages.
    pub path: std::path::PathBuf,
    /// File contents.
    pub text: String,
}

/// Axis-aligned rectangle in mm.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rect {
    /// Left edge.
    pub x: f64,
    /// Bottom edge.
    pub y: f64,
    /// Width (> 0).
    pub width: f64,
    /// Height (> 0).
    pub height: f64,
}

impl Rect {
    /// Right edge.
    pub fn x1(&self) -> f64 {
        self.x + self.width
    }
    /// Top edge.
    pub fn y1(&self) -> f64 {
        self.y + self.height
    }
    /// The same rectangle shrunk by `d` on every side (grown for negative `d`).
    pub fn inset(&self, d: f64) -> Rect {
        Rect { x: self.x + d, y: self.y + d, width: self.width - 2.0 * d, height: self.height - 2.0 * d }
    }
    /// True when `other` lies inside this rectangle (edges may touch).
    pub fn contains_rect(&self, other: &Rect) -> bool {
        other.x >= self.x - 1e-9
            && other.y >= self.y - 1e-9
            && other.x1() <= self.x1() + 1e-9
            && other.y1() <= self.y1() + 1e-9
    }
    /// As a polygon.
    pub fn polygon(&self) -> crate::geom::Polygon {
        crate::geom::rect(self.x, self.y, self.x1(), self.y1())
    }
}

/// The two glass plates, both in the front-plate frame.
#[derive(Debug, Clone)]
pub struct Glass {
    /// Front (segment) plate; its lower-left corner is the origin.
    pub front: Rect,
    /// Back (common) plate, placed relative to the front plate.
    pub back: Rect,
}

impl Glass {
    /// The footprint of one cell: both glass outlines together, (x0, y0, x1, y1) in the
    /// front-plate frame.
    pub fn footprint(&self) -> (f64, f64, f64, f64) {
        let (f, b) = (self.front, self.back);
        (f.x.min(b.x), f.y.min(b.y), f.x1().max(b.x1()), f.y1().max(b.y1()))
    }
}

/// One side of a rectangle.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Side {
    /// y minimum.
    Bottom,
    /// y maximum.
    Top,
    /// x minimum.
    Left,
    /// x maximum.
    Right,
}

impl Side {
    /// The side across the glass.
    pub fn opposite(self) -> Side {
        match self {
            Side::Bottom => Side::Top,
            Side::Top => Side::Bottom,
            Side::Left => Side::Right,
            Side::Right => Side::Left,
        }
    }

    /// Lower-case name as written in layouts.
    pub fn name(self) -> &'static str {
        match self {
            Side::Bottom => "bottom",
            Side::Top => "top",
            Side::Left => "left",
            Side::Right => "right",
        }
    }
}

/// Photoresist tone, which decides the film's polarity.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Resist {
    /// Exposed resist dissolves: the film is opaque where ITO stays (clear-field).
    Positive,
    /// Exposed resist stays: the film is clear where ITO stays (dark-field).
    Negative,
}

/// Process and design rules, all in mm.
#[derive(Debug, Clone, PartialEq)]
pub struct Rules {
    /// Smallest ITO line width after etch.
    pub min_width: f64,
    /// Smallest gap between different nets on one plate, as drawn.
    pub min_gap: f64,
    /// Etch undercut per edge.
    pub undercut: f64,
    /// Whether the films grow every feature by the undercut (etch pre-compensation).
    pub compensate: bool,
    /// Smallest line or space the film itself holds.
    pub film_min_feature: f64,
    /// How far a common electrode extends beyond the segments it faces.
    pub backplane_overlap: f64,
    /// Smallest distance from ITO inside the liquid-crystal region to the glass edge
    /// (outside it, ITO must only stay on its glass; docs/checks.md).
    pub edge_clearance: f64,
    /// Width of automatically drawn leads.
    pub lead_width: f64,
    /// Misalignment of the plates the assembly process holds to (each of x and y); 0
    /// leaves the registration check off.
    pub registration: f64,
}

impl Rules {
    /// Cell size of the routing grid: half the smaller of lead width and gap, so that a
    /// corridor one lead wide always holds a row of cell centres; never below 10 µm.
    pub fn grid_step(&self) -> f64 {
        (self.lead_width.min(self.min_gap) / 2.0).max(0.01)
    }

    /// The default gap between the segments of a digit: wide enough for a lead to pass
    /// between two segments (lead plus a gap each side) with two routing-grid cells of
    /// slack on each side, since a lead is placed on the grid. Under multiplexed drive
    /// leads of both plates thread through the junctions of every digit; with less slack
    /// the 1/2-, 1/3- and 1/4-duty demos came out with commons cut off from their dots.
    /// Under static drive the middle bar's lead leaves between two others: the smallest
    /// layout (`tests/fixtures/good/minimal.yaml`, one digit, everything default) left
    /// `g` unroutable at 0.21 and 0.26 mm and routes at 0.31 mm.
    pub fn passing_gap(&self) -> f64 {
        self.lead_width + 2.0 * self.min_gap + 4.0 * self.grid_step()
    }

    /// The default gap between the segments of a fourteen-segment digit under multiplexed
    /// drive: three leads cross the centre node side by side (`i`–`l`, `h`–`m`, `j`–`k`,
    /// `assign::template::fourteen_segment`), each with a gap on both sides and two
    /// routing-grid cells of slack, as [`Rules::passing_gap`] gives one lead. Measured on
    /// two digits 12 mm high with points under 0.1/0.05 mm rules (grid 25 µm, default
    /// 0.68 mm), strokes 1.0 and 1.2 mm: gaps of 0.5 mm and less left SEG lines unjoined
    /// at the centre, every gap from 0.55 to 0.8 mm routed clean.
    pub fn centre_gap(&self) -> f64 {
        3.0 * self.lead_width + 4.0 * self.min_gap + 6.0 * self.grid_step()
    }

    /// The default gap between the segments of a digit of `style` at `commons` commons:
    /// [`Rules::centre_gap`] for fourteen-segment digits under multiplexed drive, else
    /// [`Rules::passing_gap`].
    pub fn digit_gap(&self, style: DigitStyle, commons: u32) -> f64 {
        if style == DigitStyle::Fourteen && commons > 1 { self.centre_gap() } else { self.passing_gap() }
    }

    /// How much each edge moves on the film relative to the drawing (the undercut when
    /// compensating, else 0).
    pub fn film_bias(&self) -> f64 {
        if self.compensate { self.undercut } else { 0.0 }
    }
    /// Width after etch of a drawn line of width `w`.
    pub fn etched_width(&self, w: f64) -> f64 {
        w + 2.0 * self.film_bias() - 2.0 * self.undercut
    }
    /// Gap after etch of a drawn gap `g`.
    pub fn etched_gap(&self, g: f64) -> f64 {
        g - 2.0 * self.film_bias() + 2.0 * self.undercut
    }
    /// Width on the film of a drawn line `w`.
    pub fn film_width(&self, w: f64) -> f64 {
        w + 2.0 * self.film_bias()
    }
    /// Gap on the film of a drawn gap `g`.
    pub fn film_gap(&self, g: f64) -> f64 {
        g - 2.0 * self.film_bias()
    }
    /// The distance an alignment mark keeps from other ITO and from the window: the gap
    /// rule's limit (the drawn minimum gap, or more where the film could not hold that
    /// gap), plus 1 µm so that the check's rounding never reports it.
    pub fn mark_gap(&self) -> f64 {
        self.min_gap.max(self.film_min_feature - self.film_gap(0.0)) + 1e-3
    }
}

/// Seal ring and its fill port.
#[derive(Debug, Clone, PartialEq)]
pub struct Seal {
    /// Glue line width.
    pub width: f64,
    /// Distance from the back glass edge to the seal's outer edge.
    pub inset: f64,
    /// Side of the back plate the fill port opens to.
    pub port_side: Side,
    /// Centre of the port, measured along its side from the side's lower/left end of the
    /// back glass.
    pub port_at: f64,
    /// Port opening width.
    pub port_width: f64,
}

/// Transfer dots.
#[derive(Debug, Clone, PartialEq)]
pub struct Transfer {
    /// Dot diameter.
    pub diameter: f64,
    /// Size of the square ITO pad under a dot on each plate.
    pub pad: f64,
}

/// The pad row on the ledge of the front plate.
#[derive(Debug, Clone, PartialEq)]
pub struct Pads {
    /// Ledge side the pads sit on.
    pub side: Side,
    /// Centre-to-centre pitch.
    pub pitch: f64,
    /// Pad width (along the row).
    pub width: f64,
    /// Pad length (across the row, into the glass).
    pub length: f64,
    /// Distance from the glass edge to the pad's outer end.
    pub edge_margin: f64,
    /// Number of the first pin.
    pub first_pin: u32,
    /// A second row whose `first_pin` was not given: its pins follow on from the first
    /// row's last pad position (numbered in the route stage, which knows that).
    pub pins_follow: bool,
    /// Centre of the first pad along the side; `None` centres the row on the back plate.
    pub start: Option<f64>,
    /// Number of pad positions; `None` makes exactly as many as there are nets.
    pub count: Option<u32>,
    /// Fixed pins: net name → pin number (on either row).
    pub fixed: BTreeMap<String, u32>,
    /// A second pad row on the opposite side, for the SEG lines of the digits behind
    /// another row as seen from this one (`assign::tiers`), which would otherwise go
    /// round the seal; `None` for one row.
    pub second_row: Option<Box<Pads>>,
}

impl Pads {
    /// The rows: this one, then the second row if any.
    pub fn rows(&self) -> impl Iterator<Item = &Pads> {
        std::iter::once(self).chain(self.second_row.as_deref())
    }
}

/// Which side of the display the viewer looks from, as a clock face on the glass seen
/// from the front: `Bottom` is "6 o'clock", the usual one for a panel below eye level.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Viewing {
    /// From below (6 o'clock).
    Bottom,
    /// From above (12 o'clock).
    Top,
    /// From the left (9 o'clock).
    Left,
    /// From the right (3 o'clock).
    Right,
}

impl Viewing {
    /// Name as written in layouts.
    pub fn name(self) -> &'static str {
        match self {
            Viewing::Bottom => "bottom",
            Viewing::Top => "top",
            Viewing::Left => "left",
            Viewing::Right => "right",
        }
    }
}

/// The liquid-crystal cell and its drive, for the electrical and optical plan (keys
/// `cell_gap`, `mixture`, `electrical`, `optics`; docs/layout-format.md). SI units
/// except the gap (mm, like every length) and the wavelength (nm).
#[derive(Debug, Clone, PartialEq)]
pub struct Cell {
    /// Liquid-crystal thickness, mm.
    pub gap: f64,
    /// Birefringence Δn of the mixture at `wavelength_nm`.
    pub birefringence: f64,
    /// Relative permittivity along the director, ε∥ (pixel fully on).
    pub permittivity_parallel: f64,
    /// Relative permittivity across the director, ε⊥ (pixel off).
    pub permittivity_perpendicular: f64,
    /// rms voltage where the mixture starts to switch, V.
    pub threshold: f64,
    /// rms voltage where it is fully switched, V.
    pub saturation: f64,
    /// Sheet resistance of the ITO, ohms per square.
    pub sheet_resistance: f64,
    /// Frame rate of the drive, Hz.
    pub frame_rate: f64,
    /// Largest RC of a line, as a fraction of the frame period, before a warning.
    pub rc_limit: f64,
    /// Drive amplitude V of Alt & Pleshko's waveforms, volts; `None` when not given.
    pub voltage: Option<f64>,
    /// Wavelength the cell is tuned for, nm.
    pub wavelength_nm: f64,
    /// Side the viewer looks from.
    pub viewing: Viewing,
}

impl Cell {
    /// The defaults of docs/layout-format.md (*mixture*, *electrical*, *optics*) around
    /// a cell gap in mm.
    pub fn with_gap(gap: f64) -> Cell {
        Cell {
            gap,
            birefringence: 0.15,
            permittivity_parallel: 15.0,
            permittivity_perpendicular: 5.0,
            threshold: 1.5,
            saturation: 2.2,
            sheet_resistance: 50.0,
            frame_rate: 64.0,
            rc_limit: 0.02,
            voltage: None,
            wavelength_nm: 550.0,
            viewing: Viewing::Bottom,
        }
    }
}

/// Drive scheme.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Drive {
    /// Number of common electrodes (1 = static).
    pub commons: u32,
    /// Bias divisor `a` (bias 1/a); `None` for static.
    pub bias: Option<u32>,
}

/// A COM electrode and SEG line fixed by hand for one element (1-based, as written).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct FixedLine {
    /// COM electrode number, 1 … N.
    pub com: Option<u32>,
    /// SEG line number, from 1.
    pub seg: Option<u32>,
}

/// Alignment marks.
#[derive(Debug, Clone, PartialEq)]
pub struct Marks {
    /// Outer size of a mark.
    pub size: f64,
    /// Line width of the mark strokes.
    pub line: f64,
}

/// Segment style of a digit.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DigitStyle {
    /// a–g.
    Seven,
    /// Fourteen segments (alphanumeric, split middle bar).
    Fourteen,
    /// Sixteen segments (split top and bottom bars).
    Sixteen,
}

impl DigitStyle {
    /// Name as written in layouts and in `fonts-strokes/`.
    pub fn name(self) -> &'static str {
        match self {
            DigitStyle::Seven => "seven",
            DigitStyle::Fourteen => "fourteen",
            DigitStyle::Sixteen => "sixteen",
        }
    }
}

/// A row of equal digits.
#[derive(Debug, Clone, PartialEq)]
pub struct DigitGroup {
    /// Net name prefix; digit `i` (1-based) segment `s` is net `{name}{i}.{s}`.
    pub name: String,
    /// Segment style.
    pub style: DigitStyle,
    /// Number of digits.
    pub count: u32,
    /// Lower-left corner of the first digit's upright cell.
    pub origin: Pt,
    /// Character height.
    pub height: f64,
    /// Character width.
    pub width: f64,
    /// Distance between digit origins.
    pub pitch: f64,
    /// Slant (italic) angle in degrees, positive leans right.
    pub slant: f64,
    /// Segment stroke width.
    pub stroke: f64,
    /// Gap between neighbouring segments.
    pub gap: f64,
    /// Digits (1-based) followed by a decimal point.
    pub decimal_points: Vec<u32>,
    /// Digits (1-based) followed by a colon.
    pub colons: Vec<u32>,
    /// Which digit positions are half digits showing only `b` and `c` ("1"), 1-based.
    pub half_digits: Vec<u32>,
    /// Key path in the layout, for messages.
    pub key: String,
}

/// Horizontal alignment of a legend's text relative to its anchor.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// Anchor at the left end.
    Left,
    /// Anchor at the centre.
    Centre,
    /// Anchor at the right end.
    Right,
}

/// A fixed legend (text that switches as one element).
#[derive(Debug, Clone, PartialEq)]
pub struct Legend {
    /// Net name.
    pub name: String,
    /// Text to set.
    pub text: String,
    /// Anchor point on the baseline.
    pub at: Pt,
    /// Cap height.
    pub height: f64,
    /// Stroke width.
    pub stroke: f64,
    /// Alignment of the text to the anchor.
    pub align: Align,
    /// Key path, for messages.
    pub key: String,
}

/// An icon element.
#[derive(Debug, Clone, PartialEq)]
pub struct Icon {
    /// Net name.
    pub name: String,
    /// Where its shape comes from.
    pub shape: IconShape,
    /// Key path, for messages.
    pub key: String,
}

/// Shape of an icon.
#[derive(Debug, Clone, PartialEq)]
pub enum IconShape {
    /// A built-in (or layout-supplied) stroke icon, scaled into a square box.
    Named {
        /// Icon name in the font files.
        icon: String,
        /// Lower-left corner of its box.
        at: Pt,
        /// Box size.
        size: f64,
        /// Stroke width.
        stroke: f64,
    },
    /// Rectangle, optionally with rounded corners.
    Rectangle {
        /// Lower-left corner.
        at: Pt,
        /// Width.
        width: f64,
        /// Height.
        height: f64,
        /// Corner radius (0 = sharp).
        corner: f64,
    },
    /// Filled circle.
    Circle {
        /// Centre.
        centre: Pt,
        /// Radius.
        radius: f64,
    },
    /// Annulus.
    Ring {
        /// Centre.
        centre: Pt,
        /// Outer radius.
        outer: f64,
        /// Inner radius (< outer).
        inner: f64,
    },
    /// Closed polygon.
    Polygon {
        /// Vertices (at least 3).
        points: Vec<Pt>,
    },
    /// SVG path data (M L H V C S Q T A Z, absolute or relative), y up, in mm, placed at
    /// `at`; closed sub-paths are filled with the even-odd rule.
    Path {
        /// Path data.
        d: String,
        /// Offset added to every point.
        at: Pt,
    },
    /// A gauge: every part of a built-in (or layout-supplied) gauge icon placed in one
    /// box, each part its own element `{name}.{part}` (`BATT.shell`, `BATT.1`, …).
    Gauge {
        /// Gauge name in the font files (`battery`, `signal`).
        gauge: String,
        /// Its parts, in order: the element suffix and the icon drawn for it.
        parts: Vec<GaugePart>,
        /// Lower-left corner of the box every part is drawn in.
        at: Pt,
        /// Box size.
        size: f64,
        /// Stroke width.
        stroke: f64,
    },
}

/// One part of a gauge.
#[derive(Debug, Clone, PartialEq)]
pub struct GaugePart {
    /// What follows the gauge's name and a dot in the element name (`shell`, `1`, `2`).
    pub suffix: String,
    /// Name of the icon drawn for it (`battery-shell`, `battery-bar-1`).
    pub icon: String,
}

/// Net name of one part of a gauge: the icon entry's name, a dot, the part (`BATT.shell`).
pub fn gauge_part_net(name: &str, suffix: &str) -> String {
    format!("{name}.{suffix}")
}

/// Which glass plate.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum PlateId {
    /// Segment plate (viewer side).
    Front,
    /// Common plate.
    Back,
}

impl PlateId {
    /// Lower-case name.
    pub fn name(self) -> &'static str {
        match self {
            PlateId::Front => "front",
            PlateId::Back => "back",
        }
    }
}

/// A bus trace drawn by the user.
#[derive(Debug, Clone, PartialEq)]
pub struct Bus {
    /// Net it belongs to.
    pub net: String,
    /// Plate it is on.
    pub plate: PlateId,
    /// Trace width.
    pub width: f64,
    /// Centre line.
    pub points: Vec<Pt>,
    /// Key path, for messages.
    pub key: String,
}

/// GDSII layer and datatype of each drawn layer.
#[derive(Debug, Clone, PartialEq)]
pub struct LayerMap {
    /// (layer, datatype) by layer name; names are those of [`crate::artwork::Layer::name`].
    pub entries: BTreeMap<String, (i16, i16)>,
}

impl LayerMap {
    /// segmask's own default numbers: ITO of a plate on a multiple of ten, its marks one
    /// above, cell layers in the thirties, outlines in the forties, window at 50; all
    /// datatype 0.
    pub fn defaults() -> LayerMap {
        let pairs = [
            ("front_ito", 10),
            ("front_marks", 11),
            ("back_ito", 20),
            ("back_marks", 21),
            ("seal", 30),
            ("transfer_dots", 31),
            ("front_glass", 40),
            ("back_glass", 41),
            ("window", 50),
        ];
        LayerMap { entries: pairs.iter().map(|(n, l)| (n.to_string(), (*l, 0))).collect() }
    }
}

impl DigitStyle {
    /// Segment names of the style, in drawing order (common practice: `a`–`f` clockwise
    /// from the top, `g` the middle bar; split bars get `1`/`2`, left before right; the
    /// inner strokes of the alphanumeric styles are `h`–`m`, clockwise from upper left).
    pub fn segment_names(self) -> &'static [&'static str] {
        match self {
            DigitStyle::Seven => &["a", "b", "c", "d", "e", "f", "g"],
            DigitStyle::Fourteen => &["a", "b", "c", "d", "e", "f", "g1", "g2", "h", "i", "j", "k", "l", "m"],
            DigitStyle::Sixteen => &[
                "a1", "a2", "b", "c", "d1", "d2", "e", "f", "g1", "g2", "h", "i", "j", "k", "l", "m",
            ],
        }
    }
}

/// Name of the decimal-point segment that follows a digit.
pub const DECIMAL_POINT: &str = "dp";
/// Name of the colon element that follows a digit under static drive (both dots are one
/// element on one line).
pub const COLON: &str = "col";
/// Names of the colon's upper and lower dot under multiplexed drive, where each dot is an
/// element of its own: the dots sit at different heights, and a common band at each height
/// reaches a dot from its neighbouring segments; one element would need one common
/// behind both dots, led across the bands between them.
pub const COLON_DOTS: [&str; 2] = ["col_top", "col_bottom"];

/// Net name of a segment: group name, 1-based digit number, dot, segment name (`D3.g`).
pub fn segment_net(group: &str, digit: u32, segment: &str) -> String {
    format!("{group}{digit}.{segment}")
}

/// Net name of multiplexed SEG line `index` (0-based): `SEG1`, `SEG2`, …
pub fn line_net(index: u32) -> String {
    format!("SEG{}", index + 1)
}

/// Net name of common electrode `index` (0-based): `COM1`, `COM2`, …
pub fn common_net(index: u32) -> String {
    format!("COM{}", index + 1)
}

/// The line of `key`, or of its nearest parent key that has one (a key the user left to
/// its default has no line of its own).
pub fn key_line(lines: &BTreeMap<String, usize>, key: &str) -> Option<usize> {
    let mut k = key;
    loop {
        if let Some(l) = lines.get(k) {
            return Some(*l);
        }
        let cut = k.rfind(['.', '['])?;
        k = &k[..cut];
    }
}

/// A small hand-built layout for unit tests of the later stages.
#[cfg(test)]
#[path = "layout_fixture.rs"]
pub mod fixture;

#[cfg(test)]
mod rules_tests {
    /// With the default rules (0.11 mm leads, 0.05 mm gaps; docs/layout-format.md) a
    /// lead between two segments needs 0.11 + 2 × 0.05 = 0.21 mm, and four 0.025 mm grid
    /// cells more at any drive.
    #[test]
    fn passing_gap_of_the_default_rules() {
        let r = crate::layout::fixture::tiny_layout().rules;
        assert_eq!((r.lead_width, r.min_gap), (0.11, 0.05), "the fixture keeps the default rules");
        assert!((r.grid_step() - 0.025).abs() < 1e-12);
        assert!((r.passing_gap() - 0.31).abs() < 1e-12);
    }
}

/// How the masks are made: decides the smallest line and space the mask itself holds
/// (`rules.film_min_feature` may not go below it) and the rules a layout gets when it
/// does not write them (docs/background.md, *Films, photoplots and chrome*).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Process {
    /// A laser or inkjet printer on transparency film.
    LaserFilm,
    /// A film written by a laser photoplotter.
    PhotoplotFilm,
    /// Chrome on glass written by a mask shop.
    Chrome,
}

impl Process {
    /// Every process with its name as written in layouts.
    pub const ALL: [(&'static str, Process); 3] =
        [("laser-film", Process::LaserFilm), ("photoplot-film", Process::PhotoplotFilm), ("chrome", Process::Chrome)];

    /// Name as written in layouts.
    pub fn name(self) -> &'static str {
        Process::ALL.iter().find(|(_, p)| *p == self).map(|(n, _)| *n).unwrap_or("photoplot-film")
    }

    /// Smallest line or space this process holds reliably on the mask, mm (*common
    /// practice*: laser transparency about 0.10–0.15 mm, photoplotted film about 30 µm;
    /// chrome a few µm, *from memory*). The default of `rules.film_min_feature`.
    pub fn mask_limit(self) -> f64 {
        match self {
            Process::LaserFilm => 0.15,
            Process::PhotoplotFilm => 0.03,
            Process::Chrome => 0.002,
        }
    }

    /// Suggested `(min_width, min_gap)` when the layout writes none: the mask limit kept
    /// with room for the wet etch. Photoplotted film and chrome keep segmask's long-standing
    /// defaults (the ITO etch, not the mask, limits them); laser film widens both to
    /// what it holds.
    pub fn suggested_rules(self) -> (f64, f64) {
        match self {
            Process::LaserFilm => (0.15, 0.15),
            Process::PhotoplotFilm | Process::Chrome => (0.1, 0.05),
        }
    }
}

/// A sheet size for the printable sheet of films.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sheet {
    /// ISO 216 A4, 210 × 297 mm.
    A4,
    /// US Letter, 8.5 × 11 in (215.9 × 279.4 mm).
    Letter,
}

impl Sheet {
    /// Width and height, mm (portrait).
    pub fn size(self) -> (f64, f64) {
        match self {
            Sheet::A4 => (210.0, 297.0),
            Sheet::Letter => (215.9, 279.4),
        }
    }

    /// Name as written in layouts.
    pub fn name(self) -> &'static str {
        match self {
            Sheet::A4 => "a4",
            Sheet::Letter => "letter",
        }
    }
}

/// How the mask files are made (`masks:` in the layout).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MaskOptions {
    /// The process the masks are made with.
    pub process: Process,
    /// Whether Gerber files and the GDSII mask structures carry each plate the way contact
    /// printing needs it (the back plate mirrored), like the films always do.
    pub mirror: bool,
    /// Sheet size of the printable sheet of films.
    pub sheet: Sheet,
    /// Copies of each plate's film on the printable sheet.
    pub copies: u32,
    /// Several cells on one substrate (`panel:`), when the layout asks for a panel.
    pub panel: Option<Panel>,
}

impl Default for MaskOptions {
    fn default() -> Self {
        MaskOptions { process: Process::PhotoplotFilm, mirror: true, sheet: Sheet::A4, copies: 1, panel: None }
    }
}

/// A panel: `rows` × `columns` copies of the cell on one substrate per plate, in the
/// viewer's frame (docs/outputs.md, *Panels*). Cells are stepped by the cell's footprint
/// (both glass outlines together) plus `spacing`; the array is centred on the substrate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Panel {
    /// Cells along y.
    pub rows: u32,
    /// Cells along x.
    pub columns: u32,
    /// Clear space between the footprints of neighbouring cells, mm (0: neighbours share
    /// their cut lines).
    pub spacing: f64,
    /// Width of the lane centred on every cut line in which nothing of the panel's own
    /// (alignment marks, label) may lie, mm; half of it may reach into a cell, which the
    /// cell's edge clearance must hold.
    pub scribe_lane: f64,
    /// Substrate width, mm.
    pub width: f64,
    /// Substrate height, mm.
    pub height: f64,
}

impl Panel {
    /// Room the panel keeps on every side of the cell array for its alignment marks, mm.
    pub const BORDER: f64 = 5.0;
    /// Outer size of a panel alignment mark, mm; each is centred `BORDER / 2` in from a
    /// substrate corner.
    pub const MARK: f64 = 2.0;

    /// The widest scribe lane that keeps clear of the panel's marks: every cut line lies
    /// at least `BORDER` from the substrate edge, the marks reach `(BORDER + MARK) / 2`.
    pub fn widest_lane() -> f64 {
        2.0 * (Panel::BORDER - (Panel::BORDER + Panel::MARK) / 2.0)
    }
}
