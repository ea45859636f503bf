//! Assignments for seven- and fourteen-segment digits at duty 1/2, 1/3 and 1/4 that leave
//! both plates routable in a row of digits.
//!
//! The commons are numbered from the top of the digit down. The reasoning, for a row of
//! digits whose leads leave at the bottom (docs/background.md,
//! *Where the plates interact*; the planar-routing argument is ours, written out in
//! docs/architecture.md, *Multiplexing*):
//! - the top common reaches the seal above the window from `a`; the bottom common reaches
//!   the seal below from `d` (its leads may cross front leads under the seal);
//! - every common in between must run through each digit and across the gaps between
//!   digits, so it needs a way in on the left and a way out on the right;
//! - each SEG line is joined on the front inside its digit, through the counters and
//!   the gaps at corners and junctions, and reaches the bottom.
//!
//! At 1/4 duty the second common `{b, g}` enters each digit through the left junction
//! (between the tips of `f` and `e`, beside the tip of `g`): that gap is kept free of
//! front leads ([`Template::passages`]). At 1/3 duty the middle common `{e, g, c}` joins
//! through the lower counter and runs from `e` to `c`. At 1/2 duty the two commons are the
//! upper and lower halves.
//!
//! A row whose leads leave at the top (pads on the top side) takes these mirrored top to
//! bottom ([`Exit::Up`]), except in a digit with a point, which has no mirror image.
//!
//! Fourteen-segment digits take the upper and lower halves on the top and bottom commons
//! at every duty ([`fourteen_segment`]), eight lines a digit.

/// One seven-segment assignment: for each segment name, (COM index, SEG slot within the
/// digit). Slots are numbered 0 … lines-1 inside a digit; the caller numbers them globally.
#[derive(Debug, Clone, Copy)]
pub struct Template {
    /// Commons this template is for.
    pub commons: u32,
    /// `(segment, com, slot)` rows.
    pub rows: &'static [(&'static str, u32, u32)],
    /// Segment junctions to keep free of front leads, as `(segment whose tip, which
    /// end)`: `(g, Left)` is the left junction.
    pub passages: &'static [(&'static str, End)],
    /// Commons of a colon's upper and lower dot after a digit, when the template sets
    /// them: the commons that cross the gap between two digits at each dot's height, so
    /// that each dot's back electrode joins a band that passes anyway.
    pub colon: Option<[u32; 2]>,
    /// Whether other elements (legends, icons, bar-graph steps) may take the places the
    /// template leaves free on a digit's lines. The fourteen-segment template's free
    /// places are on the commons between its halves, which cannot reach an element
    /// through the digit, so they stay free.
    pub lends_free_places: bool,
    /// Segments whose SEG lines the front router leads first, in this order (every
    /// digit's line of the first, then of the second, …): joins through a tight node
    /// route before the joins that can go round them.
    pub route_first: &'static [&'static str],
    /// Whether a digit with a point takes the template mirrored too when its leads leave
    /// at the top (see [`Template::place_for`]).
    pub mirrors_with_point: bool,
}

/// Which end of a segment's outline.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum End {
    /// The vertex with the smallest x.
    Left,
    /// The vertex with the largest x.
    Right,
}

const DUTY_2: Template = Template {
    commons: 2,
    rows: &[
        ("f", 0, 0),
        ("e", 1, 0),
        ("b", 0, 1),
        ("c", 1, 1),
        ("g", 0, 2),
        ("d", 1, 2),
        ("a", 0, 3),
        ("dp", 1, 3),
    ],
    passages: &[],
    colon: None,
    lends_free_places: true,
    route_first: &[],
    mirrors_with_point: false,
};

const DUTY_3: Template = Template {
    commons: 3,
    rows: &[
        ("f", 0, 0),
        ("e", 1, 0),
        ("d", 2, 0),
        ("b", 0, 1),
        ("c", 1, 1),
        ("dp", 2, 1),
        ("a", 0, 2),
        ("g", 1, 2),
    ],
    passages: &[],
    colon: None,
    lends_free_places: true,
    route_first: &[],
    mirrors_with_point: false,
};

const DUTY_4: Template = Template {
    commons: 4,
    rows: &[
        ("f", 0, 0),
        ("g", 1, 0),
        ("e", 2, 0),
        ("d", 3, 0),
        ("a", 0, 1),
        ("b", 1, 1),
        ("c", 2, 1),
        ("dp", 3, 1),
    ],
    passages: &[("g", End::Left)],
    // The upper dot sits between `b` of one digit and `f` of the next, at the height
    // where the second common `{b, g}` crosses the gap; the lower dot where the third
    // `{e, c}` does. Measured on a 4-digit layout under 0.15 mm rules: these two routed
    // clean, the other pairings left commons cut off.
    colon: Some([1, 2]),
    lends_free_places: true,
    route_first: &[],
    mirrors_with_point: false,
};

/// The seven-segment template for `commons` commons, if there is one.
pub fn seven_segment(commons: u32) -> Option<&'static Template> {
    match commons {
        2 => Some(&DUTY_2),
        3 => Some(&DUTY_3),
        4 => Some(&DUTY_4),
        _ => None,
    }
}

/// A fourteen-segment digit on two commons: the upper half (`a f b h i j g1 g2`) on the
/// top common, the lower half (`e c d m l k dp`) on the bottom one (`$bottom`, the last
/// at this duty), eight SEG lines a digit. Each line joins one segment of each half
/// where they meet: `g1`–`e` at the left junction, `g2`–`c` at the right one, the three
/// pairs `i`–`l`, `h`–`m` and `j`–`k` through the centre node (three leads side by side,
/// hence the wider default gap, `Rules::centre_gap`), `f`–`d` and `b`–`dp` round the
/// outside, and `a` alone. Once three leads cross the centre, a middle common would be
/// shut in between the halves, so at 1/3 and 1/4 duty the commons in between stay free
/// (other elements take them on lines of their own; docs/architecture.md,
/// *Multiplexing*). Measured on two digits under 0.1/0.05 mm rules: this division routed
/// clean at 1/2, 1/3 and 1/4 duty with gaps of 0.55 to 0.8 mm; every division on five
/// lines a digit (the fewest at 1/3) left parts of commons cut off.
macro_rules! fourteen {
    ($commons:expr, $bottom:expr) => {
        Template {
            commons: $commons,
            rows: &[
                ("g1", 0, 0),
                ("e", $bottom, 0),
                ("g2", 0, 1),
                ("c", $bottom, 1),
                ("i", 0, 2),
                ("l", $bottom, 2),
                ("h", 0, 3),
                ("m", $bottom, 3),
                ("j", 0, 4),
                ("k", $bottom, 4),
                ("f", 0, 5),
                ("d", $bottom, 5),
                ("b", 0, 6),
                ("dp", $bottom, 6),
                ("a", 0, 7),
            ],
            passages: &[],
            // A colon's upper dot beside the upper halves, on their common; the lower
            // dot on the lower halves' (on the common between, each dot would be shut in
            // by the leads that run down between the digits).
            colon: Some([0, $bottom]),
            lends_free_places: false,
            // `g2`–`c` and `f`–`d` first, then the three joins through the centre node
            // (`h`–`m`, `i`–`l`, `j`–`k`). Routed by their distance to the pads, the
            // later ones found the centre or the sides taken: on the six-digit demo
            // every digit's `f`–`d` line stuck in the first attempt and its `g2`–`c`
            // line in the second (three front attempts, 10 s of routing, one attempt and
            // 1.4-1.9 s in this order at every position of its sweep).
            route_first: &["g2", "f", "h", "i", "j"],
            // Mirrored, the point takes the top common's free place beside `c`; two
            // digits with points and the pads on top routed clean that way and left a
            // SEG line unjoined with the template as written.
            mirrors_with_point: true,
        }
    };
}

const FOURTEEN_2: Template = fourteen!(2, 1);
const FOURTEEN_3: Template = fourteen!(3, 2);
const FOURTEEN_4: Template = fourteen!(4, 3);

/// The fourteen-segment template for `commons` commons, if there is one.
pub fn fourteen_segment(commons: u32) -> Option<&'static Template> {
    match commons {
        2 => Some(&FOURTEEN_2),
        3 => Some(&FOURTEEN_3),
        4 => Some(&FOURTEEN_4),
        _ => None,
    }
}

/// Which way a row of digits sends its leads: the templates are written for leads that
/// leave at the bottom; a row whose leads leave at the top (pads on the top side) takes
/// them mirrored top to bottom.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Exit {
    /// Leads leave the row at the bottom.
    Down,
    /// Leads leave the row at the top.
    Up,
}

/// The segment in the same place of a digit mirrored top to bottom (`a`↔`d`, `b`↔`c`,
/// `f`↔`e`, and of fourteen segments `h`↔`m`, `i`↔`l`, `j`↔`k`; `g`, `g1`, `g2` and the
/// point keep their names: the point has no mirror image and takes the place left over).
fn mirrored(segment: &str) -> &str {
    match segment {
        "a" => "d",
        "d" => "a",
        "b" => "c",
        "c" => "b",
        "f" => "e",
        "e" => "f",
        "h" => "m",
        "m" => "h",
        "i" => "l",
        "l" => "i",
        "j" => "k",
        "k" => "j",
        other => other,
    }
}

impl Template {
    /// COM and slot of a segment, if the template places it.
    pub fn place(&self, segment: &str) -> Option<(u32, u32)> {
        self.rows.iter().find(|r| r.0 == segment).map(|r| (r.1, r.2))
    }

    /// COM and slot of a segment in a row whose leads leave by `exit`, in a digit with
    /// or without a point.
    ///
    /// Leaving at the top, a digit without a point takes the template mirrored top to
    /// bottom with the commons renumbered from the top again: the place the point would
    /// take falls on the top common, beside the pads, where legends and icons between
    /// the digits and the pads can use it. A seven-segment digit with a point keeps the
    /// template as written: mirrored, the point would sit on the top common, which cannot
    /// reach it; a fourteen-segment one takes it mirrored ([`Template::mirrors_with_point`]).
    /// Both keep the same commons at the same heights across the gaps between digits.
    pub fn place_for(&self, segment: &str, exit: Exit, has_point: bool) -> Option<(u32, u32)> {
        match exit {
            Exit::Up if !has_point || self.mirrors_with_point => self.place(mirrored(segment)).map(|(com, slot)| (self.commons - 1 - com, slot)),
            _ => self.place(segment),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every template is a valid multiplex: COM within the duty, each (COM, slot) pair
    /// once, and the segments a–g and dp fill exactly ⌈8/N⌉ slots (N + ⌈S/N⌉ pins per
    /// digit, docs/background.md, *Drive and pin count*).
    #[test]
    fn templates_use_each_pair_once_and_the_fewest_slots() {
        for n in 2..=4 {
            let t = seven_segment(n).unwrap();
            assert_eq!(t.commons, n);
            let mut pairs = std::collections::BTreeSet::new();
            for (s, c, slot) in t.rows {
                assert!(*c < n, "{s}");
                assert!(pairs.insert((*c, *slot)), "pair used twice at 1/{n}: {s}");
            }
            let slots = t.rows.iter().map(|r| r.2).max().unwrap() + 1;
            assert_eq!(slots, 8u32.div_ceil(n));
            for s in ["a", "b", "c", "d", "e", "f", "g", "dp"] {
                assert!(t.place(s).is_some(), "{s} missing at 1/{n}");
            }
        }
        assert!(seven_segment(1).is_none());
    }

    /// The fourteen-segment template is a valid multiplex at every duty it serves: each
    /// (COM, slot) pair once, all fifteen segments (with the point) placed, on the top
    /// and bottom commons only, in eight slots, which at 1/2 duty is the fewest, ⌈15/2⌉
    /// (docs/background.md, *Drive and pin count*). Mirrored for pads on top it stays valid
    /// and keeps each half on its common.
    #[test]
    fn the_fourteen_segment_template_uses_the_outer_commons() {
        let names = ["a", "b", "c", "d", "e", "f", "g1", "g2", "h", "i", "j", "k", "l", "m", "dp"];
        for n in 2..=4 {
            let t = fourteen_segment(n).unwrap();
            assert_eq!(t.commons, n);
            let mut pairs = std::collections::BTreeSet::new();
            let mut mirrored_pairs = std::collections::BTreeSet::new();
            for s in names {
                let (c, slot) = t.place(s).unwrap_or_else(|| panic!("{s} missing at 1/{n}"));
                assert!(c == 0 || c == n - 1, "{s} on COM{} at 1/{n}", c + 1);
                assert!(slot < 8 && pairs.insert((c, slot)), "{s} at 1/{n}");
                if s != "dp" {
                    let up = t.place_for(s, Exit::Up, false).unwrap();
                    assert!(mirrored_pairs.insert(up), "{s} mirrored at 1/{n}");
                }
            }
            let upper = ["a", "b", "f", "g1", "g2", "h", "i", "j"];
            assert!(upper.iter().all(|s| t.place(s).unwrap().0 == 0), "upper half at 1/{n}");
            assert_eq!(t.place_for("a", Exit::Up, false).unwrap().0, 0);
            assert_eq!(t.place_for("d", Exit::Up, false).unwrap().0, n - 1);
        }
        assert_eq!(15u32.div_ceil(2), 8);
        assert!(fourteen_segment(1).is_none());
    }

    /// Leaving at the top, a digit without a point keeps a valid multiplex, keeps `a` on
    /// the top common and `d` on the bottom one (so the commons cross the gaps between
    /// digits at the same heights whichever way a neighbour is placed), and its one free
    /// place — where the point would go — is on the top common, beside the pads; a digit
    /// with a point keeps the template as written.
    #[test]
    fn digits_leaving_at_the_top_take_the_mirrored_template() {
        let segments = ["a", "b", "c", "d", "e", "f", "g"];
        for n in 2..=4 {
            let t = seven_segment(n).unwrap();
            let mut used = std::collections::BTreeSet::new();
            for s in segments {
                let up = t.place_for(s, Exit::Up, false).unwrap();
                assert!(up.0 < n && used.insert(up), "{s} at 1/{n}");
                assert_eq!(t.place_for(s, Exit::Up, true), t.place(s));
                assert_eq!(t.place_for(s, Exit::Down, false), t.place(s));
            }
            assert_eq!(t.place_for("a", Exit::Up, false).unwrap().0, t.place("a").unwrap().0);
            assert_eq!(t.place_for("d", Exit::Up, false).unwrap().0, t.place("d").unwrap().0);
            let slots = 8u32.div_ceil(n);
            let free: Vec<(u32, u32)> = (0..n).flat_map(|c| (0..slots).map(move |k| (c, k))).filter(|p| !used.contains(p)).collect();
            assert!(!free.is_empty() && free.iter().all(|p| p.0 == 0), "free places at 1/{n}: {free:?}");
        }
    }
}
