//! Gerber files for a photoplotter, one per plate: `NAME.front.gbr`, `NAME.back.gbr`.
//!
//! Takes the artwork and a plate, gives a Gerber file (Ucamco, *The Gerber Layer Format
//! Specification*, revision 2022.02; docs/background.md, *Gerber*) built with the
//! gerber-types crate. The image is the film exactly as it is to be plotted, dark where
//! the film is opaque: the plate's mask ([`super::mask`]: ITO and marks, compensated when
//! the rules ask, mirrored when `masks.mirror` asks) as G36/G37 regions. Positive resist:
//! the regions are dark (`%LPD*%`) and the file says `.FilePolarity,Positive` (dark is
//! ITO). Negative resist: a dark field — the glass grown by the films' field margin — is
//! drawn first and the regions are cut out of it in clear polarity (`%LPC*%`); the file
//! says `.FilePolarity,Negative` (dark is where no ITO stays) — the specification's
//! meaning of the attribute, checked against its text (section 5.6, *.FilePolarity*:
//! positive, the image is the presence of material; negative, its absence;
//! docs/background.md, *Gerber*). Regions are the hole-free
//! rings of the GDSII writer ([`super::split`]), so coordinates are the same whole
//! nanometres (`%FSLAX46Y46*%`, `%MOMM*%`: six decimals of a millimetre).

use super::film::dark_field;
use super::mask::{MaskPlate, mask_plate};
use super::split::{NmRing, boundary_rings};
use super::DrawnRings;
use crate::artwork::Artwork;
use crate::geom::rect;
use crate::layout::{PlateId, Resist};
use crate::{Error, Result};
use gerber_types::{
    Command, CommentContent, CoordinateFormat, CoordinateMode, CoordinateNumber, Coordinates, DCode, ExtendedCode,
    FileAttribute, FileFunction, FilePolarity, FunctionCode, GCode, GenerationSoftware, GerberCode, InterpolationMode,
    MCode, Operation, Polarity, Unit, ZeroOmission,
};

/// `%FSLAX46Y46*%`: leading zeros omitted, absolute, 4 integer and 6 decimal digits.
fn format() -> CoordinateFormat {
    CoordinateFormat::new(ZeroOmission::Leading, CoordinateMode::Absolute, 4, 6)
}

fn ext(e: impl Into<ExtendedCode>) -> Command {
    Command::ExtendedCode(e.into())
}

fn func(f: impl Into<FunctionCode>) -> Command {
    Command::FunctionCode(f.into())
}

fn comment(s: impl Into<String>) -> Command {
    func(GCode::Comment(CommentContent::String(s.into())))
}

/// A point in whole nanometres as Gerber coordinates (6 decimals of a mm = 1 nm).
fn at(p: (i32, i32)) -> Coordinates {
    Coordinates::new(CoordinateNumber::new(p.0 as i64), CoordinateNumber::new(p.1 as i64), format())
}

/// One region: G36, the contour (D02 to the first point, D01 to each next, back to the
/// first), G37.
fn region(ring: &NmRing, out: &mut Vec<Command>) {
    out.push(func(GCode::RegionMode(true)));
    out.push(func(DCode::Operation(Operation::Move(Some(at(ring[0]))))));
    for &p in &ring[1..] {
        out.push(func(DCode::Operation(Operation::Interpolate(Some(at(p)), None))));
    }
    out.push(func(GCode::RegionMode(false)));
}

/// Words for the plate in the file function.
fn function_words(plate: PlateId) -> String {
    format!("{} plate ITO", match plate {
        PlateId::Front => "Front",
        PlateId::Back => "Back",
    })
}

/// The Gerber file of one plate. `date` becomes `.CreationDate` (midnight UTC); `drawn`
/// gives the plate's etched polygons already cut into rings when at hand
/// ([`super::Ctx::drawn_rings`]), used when the mask is not compensated.
pub fn render_gerber(art: &Artwork, plate: PlateId, date: chrono::NaiveDateTime, drawn: Option<&DrawnRings>) -> Result<Vec<u8>> {
    let m = mask_plate(art, plate, art.masks.mirror && super::mask::contact_mirrored(plate));
    gerber_with_rings(art, &m, &function_words(plate), date, m.rings_from(drawn))
}

/// The Gerber file of a mask (a cell's or a panel's); `function` is the free text of
/// `.FileFunction,Other,…`.
pub fn gerber_of_mask(art: &Artwork, m: &MaskPlate, function: &str, date: chrono::NaiveDateTime) -> Result<Vec<u8>> {
    gerber_with_rings(art, m, function, date, None)
}

/// [`gerber_of_mask`] with the rings of the mask's etched polygons given (`None`: cut
/// here).
fn gerber_with_rings(art: &Artwork, m: &MaskPlate, function: &str, date: chrono::NaiveDateTime, rings: Option<Vec<NmRing>>) -> Result<Vec<u8>> {
    let plate = m.plate;
    let polarity = match art.resist {
        Resist::Positive => FilePolarity::Positive,
        Resist::Negative => FilePolarity::Negative,
    };
    let stamp = chrono::DateTime::<chrono::FixedOffset>::from_naive_utc_and_offset(date, chrono::FixedOffset::east_opt(0).unwrap_or_else(|| unreachable!()));
    let mut cmds = vec![
        comment(format!("{} {} plate mask, made by segmask", super::gds::gds_name(&art.name), plate.name())),
        comment(describe(art, m)),
        ext(FileAttribute::GenerationSoftware(GenerationSoftware::new("segmask", "segmask", Some(env!("CARGO_PKG_VERSION"))))),
        ext(FileAttribute::CreationDate(stamp)),
        ext(FileAttribute::FileFunction(FileFunction::Other(function.to_string()))),
        ext(FileAttribute::FilePolarity(polarity)),
        ext(format()),
        ext(Unit::Millimeters),
        func(GCode::InterpolationMode(InterpolationMode::Linear)),
    ];
    match art.resist {
        Resist::Positive => cmds.push(ext(Polarity::Dark)),
        Resist::Negative => {
            let (x0, y0, x1, y1) = dark_field(m);
            cmds.push(ext(Polarity::Dark));
            for ring in boundary_rings(&rect(x0, y0, x1, y1))? {
                region(&ring, &mut cmds);
            }
            cmds.push(ext(Polarity::Clear));
        }
    }
    match rings {
        Some(rings) => rings.iter().for_each(|ring| region(ring, &mut cmds)),
        None => {
            for p in &m.etched {
                for ring in boundary_rings(p)? {
                    region(&ring, &mut cmds);
                }
            }
        }
    }
    cmds.push(func(MCode::EndOfFile));
    let mut bytes = Vec::new();
    cmds.serialize(&mut bytes).map_err(|e| Error::Bug(format!("Gerber writer failed: {e}")))?;
    Ok(bytes)
}

/// A one-line description of what the image holds, for the G04 comment.
fn describe(art: &Artwork, m: &MaskPlate) -> String {
    let tone = match art.resist {
        Resist::Positive => "clear-field, dark = ITO stays",
        Resist::Negative => "dark-field, clear = ITO stays",
    };
    let reading = if m.mirrored { "mirrored for contact printing" } else { "as the viewer sees the display" };
    let comp = if m.compensated { format!("grown {:.1} um per edge for etch", m.bias * 1000.0) } else { "as drawn".into() };
    format!("{tone}; {reading}; {comp}; 1:1, mm")
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A region is written as the specification's G36, D02, D01…, G37 sequence with
    /// coordinates in FSLAX46Y46 (Gerber Layer Format Specification 2022.02, regions and
    /// coordinate format): 1.5 mm is `X1500000`.
    #[test]
    fn region_commands_follow_the_spec() {
        let mut cmds = Vec::new();
        region(&vec![(0, 0), (1_500_000, 0), (1_500_000, 2_000_000), (0, 0)], &mut cmds);
        let mut b = Vec::new();
        cmds.serialize(&mut b).unwrap();
        let s = String::from_utf8(b).unwrap();
        assert_eq!(s, "G36*\nX0Y0D02*\nX1500000Y0D01*\nX1500000Y2000000D01*\nX0Y0D01*\nG37*\n");
    }
}
