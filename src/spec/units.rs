//! Units of the layout file: lengths with an optional unit suffix, angles in degrees.
//!
//! Takes the text of one scalar, gives millimetres (or degrees) or a message saying what
//! is wrong and what is allowed. Conversion factors are exact by definition: the
//! international inch of 1959 is 25.4 mm, a mil is a thousandth of it (NIST SP 811,
//! 2008 edition, appendix B.8).

/// Unit suffixes a length may carry, as listed in messages.
pub const LENGTH_UNITS: &str = "mm, um, µm, mil, in";

/// Why a scalar is not a length or an angle.
#[derive(Debug, Clone, PartialEq)]
pub struct UnitError {
    /// What is wrong.
    pub message: String,
    /// What is allowed.
    pub allowed: String,
}

/// Millimetres per unit, for every unit suffix we accept.
fn mm_per(unit: &str) -> Option<f64> {
    match unit {
        "" | "mm" => Some(1.0),
        // "µ" is U+00B5 MICRO SIGN; "μ" is U+03BC GREEK SMALL LETTER MU, which many
        // keyboards produce instead; both mean micro.
        "um" | "µm" | "μm" => Some(1e-3),
        "mil" => Some(0.0254),
        "in" => Some(25.4),
        _ => None,
    }
}

/// Splits `text` into its number and the rest, or `None` when it does not start with a
/// plain decimal number (optional sign, digits, optional fraction, optional exponent).
fn split_number(text: &str) -> Option<(f64, &str)> {
    let b = text.as_bytes();
    let mut i = 0;
    if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
        i += 1;
    }
    let int_start = i;
    while i < b.len() && b[i].is_ascii_digit() {
        i += 1;
    }
    let mut digits = i - int_start;
    if i < b.len() && b[i] == b'.' {
        i += 1;
        let frac_start = i;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        digits += i - frac_start;
    }
    if digits == 0 {
        return None;
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        let mut j = i + 1;
        if j < b.len() && (b[j] == b'+' || b[j] == b'-') {
            j += 1;
        }
        let exp_start = j;
        while j < b.len() && b[j].is_ascii_digit() {
            j += 1;
        }
        if j > exp_start {
            i = j;
        }
    }
    let value: f64 = text[..i].parse().ok()?;
    Some((value, &text[i..]))
}

/// Parses a length written as text: a number with an optional unit suffix, spaces
/// allowed between them (`"0.2"`, `"50um"`, `"2 mil"`, `"0.1 in"`). Gives millimetres.
///
/// ```
/// use segmask::spec::units::parse_length;
/// assert_eq!(parse_length("50um").unwrap(), 0.05);
/// assert!(parse_length("3cm").is_err());
/// ```
pub fn parse_length(text: &str) -> Result<f64, UnitError> {
    let t = text.trim();
    let Some((value, rest)) = split_number(t) else {
        return Err(UnitError {
            message: format!("`{t}` is not a length"),
            allowed: format!("a number in mm, or a number with a unit: {LENGTH_UNITS}"),
        });
    };
    let unit = rest.trim();
    let Some(factor) = mm_per(unit) else {
        return Err(UnitError { message: format!("unit `{unit}` not known"), allowed: LENGTH_UNITS.into() });
    };
    finite(value * factor, t)
}

/// Parses an angle written as text: degrees, with an optional `deg` or `°` suffix.
pub fn parse_angle(text: &str) -> Result<f64, UnitError> {
    let t = text.trim();
    let allowed = "a number of degrees, optionally followed by `deg` or `°`";
    let Some((value, rest)) = split_number(t) else {
        return Err(UnitError { message: format!("`{t}` is not an angle"), allowed: allowed.into() });
    };
    match rest.trim() {
        "" | "deg" | "°" => finite(value, t),
        unit => Err(UnitError { message: format!("angle unit `{unit}` not known"), allowed: allowed.into() }),
    }
}

/// Rejects infinities and NaN, which YAML can spell (`.inf`, `.nan`).
pub fn finite(value: f64, text: &str) -> Result<f64, UnitError> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(UnitError { message: format!("`{text}` is not a finite number"), allowed: "a finite number".into() })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1.0)
    }

    #[test]
    fn plain_numbers_are_millimetres() {
        assert_eq!(parse_length("0.2").unwrap(), 0.2);
        assert_eq!(parse_length("  7 ").unwrap(), 7.0);
        assert_eq!(parse_length("1.5mm").unwrap(), 1.5);
        assert_eq!(parse_length("-3 mm").unwrap(), -3.0);
        assert_eq!(parse_length(".5").unwrap(), 0.5);
        assert_eq!(parse_length("2.").unwrap(), 2.0);
        assert_eq!(parse_length("1e-3").unwrap(), 1e-3);
    }

    #[test]
    fn micrometres_in_every_spelling() {
        // SI: 1 µm = 1e-3 mm (BIPM SI Brochure, prefixes).
        assert!(close(parse_length("50um").unwrap(), 0.05));
        assert!(close(parse_length("50 µm").unwrap(), 0.05));
        assert!(close(parse_length("50μm").unwrap(), 0.05));
    }

    #[test]
    fn inch_and_mil_are_exact() {
        // NIST SP 811 (2008) B.8: 1 in = 2.54 cm exactly; 1 mil = 0.001 in = 25.4 µm.
        assert!(close(parse_length("1in").unwrap(), 25.4));
        assert!(close(parse_length("2 mil").unwrap(), 0.0508));
        assert!(close(parse_length("1000mil").unwrap(), 25.4));
        assert!(close(parse_length("0.1 in").unwrap(), 2.54));
    }

    #[test]
    fn unknown_units_name_the_allowed_ones() {
        let e = parse_length("3cm").unwrap_err();
        assert_eq!(e.message, "unit `cm` not known");
        assert_eq!(e.allowed, LENGTH_UNITS);
        assert!(parse_length("3 MM").is_err());
        assert!(parse_length("3 mils").is_err());
    }

    #[test]
    fn junk_is_not_a_length() {
        for t in ["", "mm", "abc", "1.2.3", "--1", "inf", "NaN", "e5"] {
            assert!(parse_length(t).is_err(), "{t:?} accepted");
        }
        assert!(parse_length("1e999").is_err());
    }

    #[test]
    fn angles_take_degrees() {
        assert_eq!(parse_angle("8").unwrap(), 8.0);
        assert_eq!(parse_angle("-8deg").unwrap(), -8.0);
        assert_eq!(parse_angle("12.5 °").unwrap(), 12.5);
        assert!(parse_angle("0.1rad").is_err());
        assert!(parse_angle("steep").is_err());
    }
}
