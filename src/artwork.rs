//! `Artwork`: the single geometric truth that every check and every writer reads.
//!
//! Contract (docs/architecture.md, *Contracts*): a flat list of polygons, each tagged
//! with its [`Layer`]
//! (which also says the plate), its [`Role`] and the net the generator meant it for; all
//! coordinates in mm in the front-plate frame (as the viewer sees the display, for both
//! plates: writers mirror, the artwork never does). Polygons are valid, counter-clockwise
//! outside, and may have holes. Beside the polygons the artwork carries the *intent* —
//! the net list, the pins and the designed pixels — which the checks compare against what
//! they re-derive from the polygons.

use crate::finding::Finding;
use crate::geom::{Polygon, Pt, Region};
use crate::layout::{Cell, DigitStyle, Drive, LayerMap, MaskOptions, PlateId, Resist, Rules};

/// A drawn layer. ITO and mark layers belong to one plate; the seal, transfer dots and
/// window lie between the plates.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Layer {
    /// ITO on the front (segment) plate.
    FrontIto,
    /// ITO on the back (common) plate.
    BackIto,
    /// Alignment marks on the front plate (etched in its ITO).
    FrontMarks,
    /// Alignment marks on the back plate (etched in its ITO).
    BackMarks,
    /// Seal glue line.
    Seal,
    /// Conductive transfer dots in the seal.
    TransferDots,
    /// Front glass outline.
    FrontGlass,
    /// Back glass outline.
    BackGlass,
    /// Viewing window.
    Window,
}

impl Layer {
    /// Every layer, in layer-map order.
    pub const ALL: [Layer; 9] = [
        Layer::FrontIto,
        Layer::BackIto,
        Layer::FrontMarks,
        Layer::BackMarks,
        Layer::Seal,
        Layer::TransferDots,
        Layer::FrontGlass,
        Layer::BackGlass,
        Layer::Window,
    ];

    /// Name used in the layer map, the report and the layout's `gds_layers` key.
    pub fn name(self) -> &'static str {
        match self {
            Layer::FrontIto => "front_ito",
            Layer::BackIto => "back_ito",
            Layer::FrontMarks => "front_marks",
            Layer::BackMarks => "back_marks",
            Layer::Seal => "seal",
            Layer::TransferDots => "transfer_dots",
            Layer::FrontGlass => "front_glass",
            Layer::BackGlass => "back_glass",
            Layer::Window => "window",
        }
    }

    /// The plate whose mask carries this layer, if any.
    pub fn plate(self) -> Option<PlateId> {
        match self {
            Layer::FrontIto | Layer::FrontMarks | Layer::FrontGlass => Some(PlateId::Front),
            Layer::BackIto | Layer::BackMarks | Layer::BackGlass => Some(PlateId::Back),
            Layer::Seal | Layer::TransferDots | Layer::Window => None,
        }
    }

    /// True for the layers that are etched ITO (and so printed on that plate's film).
    pub fn is_etched(self) -> bool {
        matches!(self, Layer::FrontIto | Layer::BackIto | Layer::FrontMarks | Layer::BackMarks)
    }

    /// The ITO layer of a plate.
    pub fn ito(plate: PlateId) -> Layer {
        match plate {
            PlateId::Front => Layer::FrontIto,
            PlateId::Back => Layer::BackIto,
        }
    }
}

/// What a polygon is for (intent only; checks never use it to decide connectivity).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Role {
    /// A segment, legend or icon electrode on the front plate.
    Segment,
    /// A common electrode (backplane) on the back plate.
    Common,
    /// A lead drawn by segmask.
    Lead,
    /// A bus trace drawn by the user.
    Bus,
    /// A contact pad on the ledge.
    Pad,
    /// The ITO pad under a transfer dot.
    TransferPad,
    /// An alignment mark.
    Mark,
    /// Seal, dot, glass or window outline.
    Outline,
}

/// One polygon of the artwork.
#[derive(Debug, Clone)]
pub struct Shape {
    /// Layer (and so plate).
    pub layer: Layer,
    /// Purpose.
    pub role: Role,
    /// Net the generator meant it for (`None` for marks and outlines).
    pub net: Option<String>,
    /// The polygon, mm.
    pub polygon: Polygon,
}

/// Kind of a net.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum NetKind {
    /// Front-plate SEG line driving one or more elements.
    Segment,
    /// Back-plate common electrode (COM).
    Common,
}

/// An intended net.
#[derive(Debug, Clone)]
pub struct Net {
    /// Unique name (`D1.a`, `COM1`, …).
    pub name: String,
    /// Plate its electrodes are on.
    pub plate: PlateId,
    /// Segment or common.
    pub kind: NetKind,
    /// 0-based COM index for commons, SEG line index for segment nets.
    pub index: u32,
    /// What it drives, for people ("digit 1 segment a", "common electrode 1").
    pub drives: String,
}

/// A contact pad on the ledge and the net on it.
#[derive(Debug, Clone)]
pub struct Pin {
    /// Pin number.
    pub number: u32,
    /// Net on this pin.
    pub net: String,
    /// The pad polygon (front plate).
    pub pad: Polygon,
}

/// A designed pixel: where the display is meant to switch for one element.
#[derive(Debug, Clone)]
pub struct Pixel {
    /// Element name (same as its segment net under static drive).
    pub element: String,
    /// What it shows, for people ("digit 1 segment a", "legend \"HOLD\"").
    pub drives: String,
    /// Front-plate net (SEG line).
    pub seg_net: String,
    /// Back-plate net (COM).
    pub com_net: String,
    /// The element's outline on the front plate.
    pub region: Region,
}

/// A transfer dot joining a back-plate net to a front-plate net at one place.
#[derive(Debug, Clone)]
pub struct TransferDot {
    /// Centre.
    pub at: Pt,
    /// The dot outline (also present as a `TransferDots` shape).
    pub dot: Polygon,
}

/// One digit position as the firmware sees it: which element each segment of its style
/// is (intent; the (COM, SEG) pair of each element is in the pixels).
#[derive(Debug, Clone, PartialEq)]
pub struct DigitSlot {
    /// Name of the digit group (`D`).
    pub group: String,
    /// 1-based position in its group.
    pub position: u32,
    /// Segment style, which decides the characters it can show.
    pub style: DigitStyle,
    /// (segment name, element name) of each segment the position has, in the style's
    /// order (`b` and `c` only for a half digit).
    pub segments: Vec<(String, String)>,
    /// Element of the decimal point after it, if any.
    pub point: Option<String>,
    /// Elements of the colon after it: none, one (static drive: both dots one element)
    /// or two (multiplexed: upper dot, then lower dot).
    pub colon: Vec<String>,
}

/// A non-ITO text placed on a film and as a GDSII TEXT (plate labels).
#[derive(Debug, Clone)]
pub struct Label {
    /// Plate whose film and structure carry it.
    pub plate: PlateId,
    /// Text.
    pub text: String,
    /// Lower-left of the text, mm.
    pub at: Pt,
    /// Cap height, mm.
    pub height: f64,
}

/// All geometry of both plates, plus the intent it was made for.
#[derive(Debug, Clone)]
pub struct Artwork {
    /// Layout name.
    pub name: String,
    /// Every polygon.
    pub shapes: Vec<Shape>,
    /// Intended nets.
    pub nets: Vec<Net>,
    /// Pads and their nets.
    pub pins: Vec<Pin>,
    /// Designed pixels.
    pub pixels: Vec<Pixel>,
    /// Digit positions in layout order (group by group), for firmware tables and `show`.
    pub digits: Vec<DigitSlot>,
    /// The cell and its drive as the layout describes them (mixture, gap, voltages,
    /// optics), for the electrical and optical plan.
    pub cell: Cell,
    /// Transfer dots.
    pub transfer_dots: Vec<TransferDot>,
    /// Region filled with liquid crystal (inside the seal's inner edge).
    pub lc_region: Polygon,
    /// Viewing window.
    pub window: Polygon,
    /// Ledge: front glass not covered by back glass.
    pub ledge: Region,
    /// Front glass outline.
    pub front_glass: Polygon,
    /// Back glass outline.
    pub back_glass: Polygon,
    /// Plate labels.
    pub labels: Vec<Label>,
    /// Rules in effect.
    pub rules: Rules,
    /// GDSII layer map.
    pub layers: LayerMap,
    /// Photoresist tone, which decides whether the films are clear-field or dark-field.
    pub resist: Resist,
    /// Drive scheme the nets were assigned for (static, or 1/N duty with its bias).
    pub drive: Drive,
    /// How the mask files are made (process, mirroring of Gerber and GDSII masks, print
    /// sheet).
    pub masks: MaskOptions,
    /// The etched layers as the films carry them when the rules ask for etch
    /// compensation: each net's ITO grown by the undercut. Empty when films carry the
    /// drawn shapes.
    pub film_shapes: Vec<Shape>,
    /// Problems found while generating (unroutable leads and the like).
    pub generation_findings: Vec<Finding>,
    /// The panel, when the layout asks for several cells on one substrate.
    pub panel: Option<PanelArt>,
}

/// Several cells on one substrate, in the *panel frame*: the viewer's frame of the whole
/// substrate, origin at its lower-left corner, mm (docs/outputs.md, *Panels*).
#[derive(Debug, Clone)]
pub struct PanelArt {
    /// The layout's `panel:`.
    pub panel: crate::layout::Panel,
    /// The substrate outline (both plates' substrates are this size).
    pub substrate: Polygon,
    /// Where each cell's front-plate frame origin lies in the panel frame, rows from the
    /// bottom, each row left to right.
    pub offsets: Vec<Pt>,
    /// Cut lines of the front plate, each across the whole substrate.
    pub front_cuts: Vec<[Pt; 2]>,
    /// Cut lines of the back plate, each across the whole substrate.
    pub back_cuts: Vec<[Pt; 2]>,
    /// The panel's alignment marks, on `FrontMarks` and `BackMarks`, as drawn.
    pub marks: Vec<(Layer, Polygon)>,
    /// The same marks as the masks carry them: grown by the film bias when the rules ask
    /// for etch compensation, else as drawn.
    pub film_marks: Vec<(Layer, Polygon)>,
}

impl Artwork {
    /// The cell's footprint: both glass outlines together, (x0, y0, x1, y1).
    pub fn glass_footprint(&self) -> (f64, f64, f64, f64) {
        let b = |p: &Polygon| {
            p.exterior().0.iter().fold((f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY), |b, q| {
                (b.0.min(q.x), b.1.min(q.y), b.2.max(q.x), b.3.max(q.y))
            })
        };
        let (f, k) = (b(&self.front_glass), b(&self.back_glass));
        (f.0.min(k.0), f.1.min(k.1), f.2.max(k.2), f.3.max(k.3))
    }
}

impl PanelArt {
    /// The cut lines of one plate.
    pub fn cuts(&self, plate: PlateId) -> &[[Pt; 2]] {
        match plate {
            PlateId::Front => &self.front_cuts,
            PlateId::Back => &self.back_cuts,
        }
    }
}

impl Artwork {
    /// Polygons on one layer.
    pub fn on_layer(&self, layer: Layer) -> impl Iterator<Item = &Shape> {
        self.shapes.iter().filter(move |s| s.layer == layer)
    }

    /// Polygons of an etched layer as the film must print them: the compensated
    /// `film_shapes` when there are any, else the drawn shapes.
    pub fn film_layer(&self, layer: Layer) -> impl Iterator<Item = &Shape> {
        let source = if self.film_shapes.is_empty() { &self.shapes } else { &self.film_shapes };
        source.iter().filter(move |s| s.layer == layer)
    }

    /// The glass outline of a plate.
    pub fn glass(&self, plate: PlateId) -> &Polygon {
        match plate {
            PlateId::Front => &self.front_glass,
            PlateId::Back => &self.back_glass,
        }
    }

    /// The net with this name.
    pub fn net(&self, name: &str) -> Option<&Net> {
        self.nets.iter().find(|n| n.name == name)
    }

    /// GDSII (layer, datatype) of a layer.
    pub fn gds_layer(&self, layer: Layer) -> (i16, i16) {
        self.layers.entries.get(layer.name()).copied().unwrap_or((0, 0))
    }
}
