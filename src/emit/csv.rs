//! CSV cells for the tables the emit stage writes (pin map, segment map).
//!
//! Takes text or numbers, gives cells per RFC 4180: a field holding a comma, a quote or
//! a line break is quoted and its quotes doubled; numbers are fixed-point.

/// Quotes a CSV field when it needs it (RFC 4180 §2.6–2.7).
pub fn field(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) { format!("\"{}\"", s.replace('"', "\"\"")) } else { s.to_string() }
}

/// A number rounded to 4 decimals, as the tables and JSON carry lengths and areas
/// (0.1 µm, 100 µm²): far finer than a film resolves, coarse enough to read.
pub fn round4(v: f64) -> f64 {
    let r = (v * 1e4).round() / 1e4;
    // -0.0 would print as "-0.0000"; a rounded zero is plain zero.
    if r == 0.0 { 0.0 } else { r }
}

/// A number as a CSV cell with 4 decimals.
pub fn fixed4(v: f64) -> String {
    format!("{:.4}", round4(v))
}

/// An optional whole number as a CSV cell: empty when absent.
pub fn opt_u32(v: Option<u32>) -> String {
    v.map(|n| n.to_string()).unwrap_or_default()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// RFC 4180 §2.6–2.7: fields with commas, quotes or line breaks are quoted, quotes
    /// doubled; plain fields stay bare.
    #[test]
    fn fields_are_quoted_per_rfc_4180() {
        assert_eq!(field("D1.a"), "D1.a");
        assert_eq!(field("digit 1, segment a"), "\"digit 1, segment a\"");
        assert_eq!(field("the \"a\" bar"), "\"the \"\"a\"\" bar\"");
        assert_eq!(field("two\nlines"), "\"two\nlines\"");
    }

    #[test]
    fn numbers_are_fixed_point_and_never_negative_zero() {
        assert_eq!(fixed4(12.345_67), "12.3457");
        assert_eq!(fixed4(-0.000_01), "0.0000");
        assert_eq!(fixed4(3.0), "3.0000");
        assert_eq!(opt_u32(None), "");
        assert_eq!(opt_u32(Some(7)), "7");
    }
}
