//! The layout file as serde reads it: one struct per YAML mapping, unknown keys refused,
//! every key optional (missing required keys are reported by the resolver, all at once),
//! every leaf a lenient [`Scalar`] so that bad values are reported with their key path.
//! The JSON Schema of the layout format (`segmask schema`) is derived from these structs
//! (`schema.rs` gives the leaves' schemas).

use super::scalar::{Entries, OneOrList, RawPoint, Scalar};
use serde::Deserialize as DeriveDeserialize;
use serde::de::{self, Deserialize, Deserializer, MapAccess, Visitor};
use std::fmt;

/// The whole file.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a layout: a mapping with keys such as name, glass, window, pads")]
#[schemars(rename = "Layout")]
pub struct RawLayout {
    pub name: Option<Scalar>,
    pub glass: Option<RawGlass>,
    pub window: Option<RawRect>,
    pub cell_gap: Option<Scalar>,
    pub resist: Option<Scalar>,
    pub tolerance: Option<Scalar>,
    pub rules: Option<RawRules>,
    pub masks: Option<RawMasks>,
    pub panel: Option<RawPanel>,
    pub seal: Option<RawSeal>,
    pub transfer_dots: Option<RawTransfer>,
    pub pads: Option<RawPads>,
    pub drive: Option<RawDrive>,
    pub marks: Option<RawMarks>,
    pub digits: Option<Vec<RawDigits>>,
    pub legends: Option<Vec<RawLegend>>,
    pub icons: Option<Vec<RawIcon>>,
    pub bars: Option<Vec<RawBar>>,
    pub buses: Option<Vec<RawBus>>,
    pub gds_layers: Option<Entries<OneOrList>>,
    pub fonts: Option<Vec<Scalar>>,
    pub mixture: Option<RawMixture>,
    pub electrical: Option<RawElectrical>,
    pub optics: Option<RawOptics>,
}

/// `mixture:` — the liquid crystal's data-sheet values.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys birefringence, permittivity_parallel, permittivity_perpendicular, threshold and saturation")]
#[schemars(rename = "Mixture")]
pub struct RawMixture {
    pub birefringence: Option<Scalar>,
    pub permittivity_parallel: Option<Scalar>,
    pub permittivity_perpendicular: Option<Scalar>,
    pub threshold: Option<Scalar>,
    pub saturation: Option<Scalar>,
}

/// `electrical:` — ITO and drive.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys sheet_resistance, frame_rate, rc_limit and voltage")]
#[schemars(rename = "Electrical")]
pub struct RawElectrical {
    pub sheet_resistance: Option<Scalar>,
    pub frame_rate: Option<Scalar>,
    pub rc_limit: Option<Scalar>,
    pub voltage: Option<Scalar>,
}

/// `optics:` — wavelength and viewing side.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys wavelength and viewing")]
#[schemars(rename = "Optics")]
pub struct RawOptics {
    pub wavelength: Option<Scalar>,
    pub viewing: Option<Scalar>,
}

/// `glass:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys front and back")]
#[schemars(rename = "Glass")]
pub struct RawGlass {
    pub front: Option<RawSize>,
    pub back: Option<RawRect>,
}

/// `{width, height}`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys width and height")]
#[schemars(rename = "Size")]
pub struct RawSize {
    pub width: Option<Scalar>,
    pub height: Option<Scalar>,
}

/// `{x, y, width, height}`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys x, y, width and height")]
#[schemars(rename = "Rect")]
pub struct RawRect {
    pub x: Option<Scalar>,
    pub y: Option<Scalar>,
    pub width: Option<Scalar>,
    pub height: Option<Scalar>,
}

/// `rules:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping of design rules")]
#[schemars(rename = "Rules")]
pub struct RawRules {
    pub min_width: Option<Scalar>,
    pub min_gap: Option<Scalar>,
    pub undercut: Option<Scalar>,
    pub compensate: Option<Scalar>,
    pub film_min_feature: Option<Scalar>,
    pub backplane_overlap: Option<Scalar>,
    pub edge_clearance: Option<Scalar>,
    pub lead_width: Option<Scalar>,
    pub registration: Option<Scalar>,
}

/// `masks:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys process, mirror, sheet and copies")]
#[schemars(rename = "Masks")]
pub struct RawMasks {
    pub process: Option<Scalar>,
    pub mirror: Option<Scalar>,
    pub sheet: Option<Scalar>,
    pub copies: Option<Scalar>,
}

/// `panel:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys rows, columns, spacing, scribe_lane and substrate")]
#[schemars(rename = "Panel")]
pub struct RawPanel {
    pub rows: Option<Scalar>,
    pub columns: Option<Scalar>,
    pub spacing: Option<Scalar>,
    pub scribe_lane: Option<Scalar>,
    pub substrate: Option<RawSize>,
}

/// `seal:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys width, inset and fill_port")]
#[schemars(rename = "Seal")]
pub struct RawSeal {
    pub width: Option<Scalar>,
    pub inset: Option<Scalar>,
    pub fill_port: Option<RawFillPort>,
}

/// `seal.fill_port:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys side, at and width")]
#[schemars(rename = "FillPort")]
pub struct RawFillPort {
    pub side: Option<Scalar>,
    pub at: Option<Scalar>,
    pub width: Option<Scalar>,
}

/// `transfer_dots:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys diameter and pad")]
#[schemars(rename = "Transfer")]
pub struct RawTransfer {
    pub diameter: Option<Scalar>,
    pub pad: Option<Scalar>,
}

/// `pads:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping describing the pad row")]
#[schemars(rename = "Pads")]
pub struct RawPads {
    pub side: Option<Scalar>,
    pub pitch: Option<Scalar>,
    pub width: Option<Scalar>,
    pub length: Option<Scalar>,
    pub edge_margin: Option<Scalar>,
    pub first_pin: Option<Scalar>,
    pub start: Option<Scalar>,
    pub count: Option<Scalar>,
    pub fixed: Option<Entries<Scalar>>,
    pub second_row: Option<Box<RawPads>>,
}

/// `drive:` — the word `static`, or a mapping with duty and bias.
#[derive(Debug)]
pub enum RawDrive {
    /// A single word.
    Word(Scalar),
    /// `{duty, bias}`.
    Multiplexed(RawMultiplex),
}

/// `drive: {duty, bias}`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys duty, bias and fixed")]
#[schemars(rename = "Multiplex")]
pub struct RawMultiplex {
    pub duty: Option<Scalar>,
    pub bias: Option<Scalar>,
    pub fixed: Option<Entries<RawFixedLine>>,
}

/// `drive.fixed.ELEMENT: {com, seg}`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys com and seg")]
#[schemars(rename = "FixedLine")]
pub struct RawFixedLine {
    pub com: Option<Scalar>,
    pub seg: Option<Scalar>,
}

impl<'de> Deserialize<'de> for RawDrive {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = RawDrive;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("`static` or a mapping with keys duty and bias")
            }
            fn visit_map<A: MapAccess<'de>>(self, map: A) -> Result<RawDrive, A::Error> {
                RawMultiplex::deserialize(de::value::MapAccessDeserializer::new(map)).map(RawDrive::Multiplexed)
            }
            fn visit_str<E: de::Error>(self, v: &str) -> Result<RawDrive, E> {
                Ok(RawDrive::Word(Scalar::text(v)))
            }
            fn visit_bool<E: de::Error>(self, v: bool) -> Result<RawDrive, E> {
                Ok(RawDrive::Word(Scalar::text(&v.to_string())))
            }
            fn visit_i64<E: de::Error>(self, v: i64) -> Result<RawDrive, E> {
                Ok(RawDrive::Word(Scalar::text(&v.to_string())))
            }
            fn visit_u64<E: de::Error>(self, v: u64) -> Result<RawDrive, E> {
                Ok(RawDrive::Word(Scalar::text(&v.to_string())))
            }
            fn visit_f64<E: de::Error>(self, v: f64) -> Result<RawDrive, E> {
                Ok(RawDrive::Word(Scalar::text(&v.to_string())))
            }
        }
        d.deserialize_any(V)
    }
}

/// `marks:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys size and line")]
#[schemars(rename = "Marks")]
pub struct RawMarks {
    pub size: Option<Scalar>,
    pub line: Option<Scalar>,
}

/// One item of `digits:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a digit group: a mapping with keys such as name, style, count, origin")]
#[schemars(rename = "Digits")]
pub struct RawDigits {
    pub name: Option<Scalar>,
    pub style: Option<Scalar>,
    pub count: Option<Scalar>,
    pub origin: Option<RawPoint>,
    pub height: Option<Scalar>,
    pub width: Option<Scalar>,
    pub pitch: Option<Scalar>,
    pub slant: Option<Scalar>,
    pub stroke: Option<Scalar>,
    pub gap: Option<Scalar>,
    pub decimal_points: Option<OneOrList>,
    pub colons: Option<OneOrList>,
    pub half_digits: Option<OneOrList>,
}

/// One item of `legends:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a legend: a mapping with keys name, text, at, height")]
#[schemars(rename = "Legend")]
pub struct RawLegend {
    pub name: Option<Scalar>,
    pub text: Option<Scalar>,
    pub at: Option<RawPoint>,
    pub height: Option<Scalar>,
    pub stroke: Option<Scalar>,
    pub align: Option<Scalar>,
}

/// One item of `icons:`: a name and exactly one shape.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "an icon: a mapping with a name and one shape")]
#[schemars(rename = "Icon")]
pub struct RawIcon {
    pub name: Option<Scalar>,
    pub icon: Option<Scalar>,
    pub at: Option<RawPoint>,
    pub size: Option<Scalar>,
    pub stroke: Option<Scalar>,
    pub rectangle: Option<RawRectangle>,
    pub circle: Option<RawCircle>,
    pub ring: Option<RawRing>,
    pub polygon: Option<Vec<RawPoint>>,
    pub path: Option<RawPath>,
    pub gauge: Option<Scalar>,
}

/// `rectangle:` icon.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys at, width, height and corner")]
#[schemars(rename = "Rectangle")]
pub struct RawRectangle {
    pub at: Option<RawPoint>,
    pub width: Option<Scalar>,
    pub height: Option<Scalar>,
    pub corner: Option<Scalar>,
}

/// `circle:` icon.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys centre and radius")]
#[schemars(rename = "Circle")]
pub struct RawCircle {
    pub centre: Option<RawPoint>,
    pub radius: Option<Scalar>,
}

/// `ring:` icon.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys centre, outer and inner")]
#[schemars(rename = "Ring")]
pub struct RawRing {
    pub centre: Option<RawPoint>,
    pub outer: Option<Scalar>,
    pub inner: Option<Scalar>,
}

/// `path:` icon.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys d and at")]
#[schemars(rename = "Path")]
pub struct RawPath {
    pub d: Option<Scalar>,
    pub at: Option<RawPoint>,
}

/// One item of `bars:`: a name, a count, exactly one of `line` and `arc`, step sizes.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a bar graph: a mapping with keys such as name, count, line or arc, length")]
#[schemars(rename = "Bar")]
pub struct RawBar {
    pub name: Option<Scalar>,
    pub count: Option<Scalar>,
    pub line: Option<RawBarLine>,
    pub arc: Option<RawBarArc>,
    pub shape: Option<Scalar>,
    pub side: Option<Scalar>,
    pub length: Option<Scalar>,
    pub last_length: Option<Scalar>,
    pub thickness: Option<Scalar>,
    pub gap: Option<Scalar>,
}

/// `bars[i].line:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys from and angle or to")]
#[schemars(rename = "BarLine")]
pub struct RawBarLine {
    pub from: Option<RawPoint>,
    pub angle: Option<Scalar>,
    pub to: Option<RawPoint>,
}

/// `bars[i].arc:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a mapping with keys centre, radius, start and end")]
#[schemars(rename = "BarArc")]
pub struct RawBarArc {
    pub centre: Option<RawPoint>,
    pub radius: Option<Scalar>,
    pub start: Option<Scalar>,
    pub end: Option<Scalar>,
}

/// One item of `buses:`.
#[derive(Debug, DeriveDeserialize, schemars::JsonSchema)]
#[serde(deny_unknown_fields, expecting = "a bus: a mapping with keys net, plate, width and points")]
#[schemars(rename = "Bus")]
pub struct RawBus {
    pub net: Option<Scalar>,
    pub plate: Option<Scalar>,
    pub width: Option<Scalar>,
    pub points: Option<Vec<RawPoint>>,
}
