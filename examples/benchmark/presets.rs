//! Named benchmark sizes: `--preset NAME` → the generator's parameters.
//!
//! Each is a layout docs/performance.md reports on (*Several rows and fourteen segments:
//! where the router stands*), so the figures there can be made again by name.

use crate::layout_gen::{Drive, Params, Style};

/// Every preset: name, what it is, parameters.
pub const PRESETS: [(&str, &str, Params); 3] = [
    (
        "two-rows",
        "32 seven-segment digits in 2 rows of 16, 40 icons in a band under them, 1/4 duty",
        Params { digits: 32, rows: Some(2), style: Style::Seven, icons: 40, drive: Drive::Duty(4) },
    ),
    (
        "two-rows-third",
        "16 seven-segment digits in 2 rows of 8, no icons, 1/3 duty",
        Params { digits: 16, rows: Some(2), style: Style::Seven, icons: 0, drive: Drive::Duty(3) },
    ),
    (
        "fourteen",
        "6 fourteen-segment digits in one row, no icons, 1/3 duty",
        Params { digits: 6, rows: Some(1), style: Style::Fourteen, icons: 0, drive: Drive::Duty(3) },
    ),
];

/// The parameters of preset `name`, or a message listing the names.
pub fn parse(name: &str) -> Result<Params, String> {
    let name = name.trim();
    PRESETS.iter().find(|(n, _, _)| *n == name).map(|(_, _, p)| *p).ok_or_else(|| {
        let names: Vec<&str> = PRESETS.iter().map(|(n, _, _)| *n).collect();
        format!("unknown preset `{name}` (allowed: {})", names.join(", "))
    })
}
