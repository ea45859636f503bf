//! Reading raw leaves into typed values: lengths, angles, integers, words, points. Each
//! reader notes a problem at its key and returns a placeholder when the value is bad or
//! missing, so resolution goes on and every problem is reported.

use super::problems::Problems;
use super::limits::{MAX_ANGLE_DEG, MAX_LENGTH_MM, MAX_WHOLE};
use super::scalar::{RawPoint, Scalar, ScalarKind};
use super::units::{LENGTH_UNITS, parse_angle, parse_length};
use crate::geom::{Pt, pt};

/// What sign a length must have.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Sign {
    /// Greater than 0.
    Positive,
    /// 0 or more.
    NonNegative,
    /// Any finite value (coordinates).
    Any,
}

/// Placeholder for a bad or missing length; never used for output because the layout is
/// rejected whenever a placeholder was needed.
const PLACEHOLDER: f64 = 1.0;

impl Problems {
    /// Notes that a required key is missing.
    pub fn missing(&mut self, key: &str, what: &str) {
        self.bad(key, "missing (this key is required)", what);
    }

    /// A length in mm; `default` when absent (`None` makes the key required).
    pub fn length(&mut self, v: Option<&Scalar>, key: &str, default: Option<f64>, sign: Sign) -> f64 {
        let Some(v) = v else {
            return default.unwrap_or_else(|| {
                self.missing(key, &length_allowed(sign));
                PLACEHOLDER
            });
        };
        let value = match v.kind {
            ScalarKind::Number(x) if x.is_finite() => Ok(x),
            ScalarKind::Integer(i) => Ok(i as f64),
            ScalarKind::Text => parse_length(&v.text).map_err(|e| (e.message, e.allowed)),
            _ => Err((format!("{} is not a length", describe(v)), length_allowed(sign))),
        };
        match value {
            Err((m, a)) => {
                self.add(key, m, Some(a));
                PLACEHOLDER
            }
            Ok(x) if x.abs() > MAX_LENGTH_MM => {
                self.add(
                    key,
                    format!("{} is beyond the largest length segmask takes", mm(x)),
                    Some(format!("at most {MAX_LENGTH_MM} mm (1 m) either way")),
                );
                PLACEHOLDER
            }
            Ok(x) => self.signed(x, key, sign),
        }
    }

    fn signed(&mut self, x: f64, key: &str, sign: Sign) -> f64 {
        let ok = match sign {
            Sign::Positive => x > 0.0,
            Sign::NonNegative => x >= 0.0,
            Sign::Any => true,
        };
        if !ok {
            let m = if sign == Sign::Positive { "must be greater than 0" } else { "must not be negative" };
            self.add(key, format!("{m} (got {})", mm(x)), Some(length_allowed(sign)));
            return PLACEHOLDER;
        }
        x
    }

    /// An angle in degrees, `default` when absent.
    pub fn angle(&mut self, v: Option<&Scalar>, key: &str, default: f64) -> f64 {
        let Some(v) = v else { return default };
        let value = match v.kind {
            ScalarKind::Number(x) if x.is_finite() => Ok(x),
            ScalarKind::Integer(i) => Ok(i as f64),
            ScalarKind::Text => parse_angle(&v.text).map_err(|e| (e.message, e.allowed)),
            _ => Err((format!("{} is not an angle", describe(v)), "a number of degrees".to_string())),
        };
        match value {
            Ok(x) if x.abs() > MAX_ANGLE_DEG => {
                self.add(key, format!("{}° is more than two turns", number(x)), Some(format!("-{MAX_ANGLE_DEG} to {MAX_ANGLE_DEG} degrees")));
                default
            }
            Ok(x) => x,
            Err((m, a)) => {
                self.add(key, m, Some(a));
                default
            }
        }
    }

    /// A whole number at least `min`; `default` when absent (`None`: required).
    pub fn int(&mut self, v: Option<&Scalar>, key: &str, default: Option<i64>, min: i64) -> i64 {
        let Some(v) = v else {
            return default.unwrap_or_else(|| {
                self.missing(key, &format!("a whole number, at least {min}"));
                min
            });
        };
        let n = match v.kind {
            ScalarKind::Integer(i) => Some(i64::try_from(i).unwrap_or(if i > 0 { i64::MAX } else { i64::MIN })),
            ScalarKind::Number(x) if x.fract() == 0.0 && x.abs() < 1e15 => Some(x as i64),
            ScalarKind::Number(x) if x.is_finite() && x.fract() == 0.0 => Some(if x > 0.0 { i64::MAX } else { i64::MIN }),
            ScalarKind::Text => v.text.trim().parse::<i64>().ok(),
            _ => None,
        };
        match n {
            Some(n) if n > MAX_WHOLE => {
                self.add(
                    key,
                    format!("{n} is more than segmask counts to"),
                    Some(format!("a whole number from {min} to {MAX_WHOLE}")),
                );
                min
            }
            Some(n) if n >= min => n,
            Some(n) => {
                self.add(
                    key,
                    format!("must be at least {min} (got {n})"),
                    Some(format!("a whole number, at least {min}")),
                );
                min
            }
            None => {
                self.add(
                    key,
                    format!("{} is not a whole number", describe(v)),
                    Some(format!("a whole number, at least {min}")),
                );
                min
            }
        }
    }

    /// One of the words in `choices`; `default` when absent (`None`: required).
    pub fn word<T: Copy>(&mut self, v: Option<&Scalar>, key: &str, choices: &[(&str, T)], default: Option<T>) -> T {
        let names: Vec<&str> = choices.iter().map(|(n, _)| *n).collect();
        let allowed = names.join(", ");
        let Some(v) = v else {
            return default.unwrap_or_else(|| {
                self.missing(key, &allowed);
                choices[0].1
            });
        };
        if let Some((_, t)) = choices.iter().find(|(n, _)| *n == v.text.trim()) {
            return *t;
        }
        let what = match v.kind {
            ScalarKind::Text => format!("`{}`", v.text),
            _ => describe(v),
        };
        let mut m = format!("unknown {} {what}", key.rsplit('.').next().unwrap_or(key));
        if let Some(near) = super::problems::nearest(v.text.trim(), names.iter().copied()) {
            m.push_str(&format!(" (did you mean `{near}`?)"));
        }
        self.add(key, m, Some(allowed));
        default.unwrap_or(choices[0].1)
    }

    /// `true` or `false`; `default` when absent.
    pub fn boolean(&mut self, v: Option<&Scalar>, key: &str, default: bool) -> bool {
        match v {
            None => default,
            Some(s) if s.kind == ScalarKind::Bool => s.text == "true",
            Some(s) => {
                self.bad(key, format!("{} is not true or false", describe(s)), "true, false");
                default
            }
        }
    }

    /// A text value (numbers are taken as written); `default` when absent (`None`:
    /// required). Empty text is refused.
    pub fn text(&mut self, v: Option<&Scalar>, key: &str, default: Option<&str>, what: &str) -> String {
        match v {
            None => match default {
                Some(d) => d.to_string(),
                None => {
                    self.missing(key, what);
                    String::new()
                }
            },
            Some(s) if s.kind == ScalarKind::Nested => {
                self.bad(key, format!("{} is not a single value", s.text), what);
                String::new()
            }
            Some(s) if s.text.is_empty() => {
                self.bad(key, "must not be empty", what);
                String::new()
            }
            Some(s) => s.text.clone(),
        }
    }

    /// A point in the front-plate frame, mm; `default` when absent (`None`: required).
    pub fn point(&mut self, v: Option<&RawPoint>, key: &str, default: Option<Pt>) -> Pt {
        let Some(v) = v else {
            return default.unwrap_or_else(|| {
                self.missing(key, "a point `[x, y]`");
                pt(0.0, 0.0)
            });
        };
        match &v.0 {
            Err(m) => {
                self.bad(key, m.clone(), "`[x, y]` or `{x: .., y: ..}`, lengths in mm or with a unit");
                pt(0.0, 0.0)
            }
            Ok([x, y]) => {
                let x = self.length(Some(x), &format!("{key}[0]"), None, Sign::Any);
                let y = self.length(Some(y), &format!("{key}[1]"), None, Sign::Any);
                pt(x, y)
            }
        }
    }
}

/// A value's description for messages (`` `true` ``, `a list`).
fn describe(v: &Scalar) -> String {
    match v.kind {
        ScalarKind::Nested => v.text.clone(),
        ScalarKind::Text if v.text.is_empty() => "an empty value".into(),
        _ => format!("`{}`", v.text),
    }
}

fn length_allowed(sign: Sign) -> String {
    let range = match sign {
        Sign::Positive => "a length greater than 0",
        Sign::NonNegative => "a length of 0 or more",
        Sign::Any => "a length",
    };
    format!("{range}, in mm or with a unit: {LENGTH_UNITS}")
}

/// A length for messages: mm with up to 4 decimals, trailing zeros dropped.
pub fn mm(x: f64) -> String {
    format!("{} mm", number(x))
}

/// A number for messages: up to 4 decimals, trailing zeros dropped; huge values (from a
/// slip such as `1e300`) in exponent form rather than three hundred digits.
pub fn number(x: f64) -> String {
    if x.abs() >= 1e7 || !x.is_finite() {
        return format!("{x:e}");
    }
    let s = format!("{x:.4}");
    s.trim_end_matches('0').trim_end_matches('.').to_string()
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::Path;

    fn problems() -> Problems {
        Problems::new(Path::new("t.yaml"), Default::default(), Default::default())
    }

    #[test]
    fn lengths_from_numbers_and_text() {
        let mut p = problems();
        assert_eq!(p.length(Some(&Scalar::number(0.2)), "a", None, Sign::Positive), 0.2);
        assert_eq!(p.length(Some(&Scalar::text("7um")), "a", None, Sign::Positive), 0.007);
        assert_eq!(p.length(None, "a", Some(1.5), Sign::Positive), 1.5);
        assert!(p.is_empty());
    }

    #[test]
    fn bad_lengths_are_noted_with_their_key() {
        let mut p = problems();
        p.length(Some(&Scalar::number(-1.0)), "pads.width", None, Sign::Positive);
        p.length(Some(&Scalar::text("3cm")), "cell_gap", None, Sign::Positive);
        p.length(None, "pads.pitch", None, Sign::Positive);
        let v = p.into_sorted();
        assert_eq!(v.len(), 3);
        assert_eq!(v[0].key, "pads.width");
        assert!(v[0].message.contains("greater than 0"));
        assert!(v[1].message.contains("unit `cm` not known"));
        assert!(v[2].message.contains("missing"));
    }

    #[test]
    fn words_suggest_the_nearest_choice() {
        let mut p = problems();
        let r = p.word(Some(&Scalar::text("sevn")), "digits[0].style", &[("seven", 7), ("fourteen", 14)], None);
        assert_eq!(r, 7);
        let v = p.into_sorted();
        assert_eq!(v[0].message, "unknown style `sevn` (did you mean `seven`?)");
        assert_eq!(v[0].allowed.as_deref(), Some("seven, fourteen"));
    }

    #[test]
    fn integers_refuse_fractions() {
        let mut p = problems();
        assert_eq!(p.int(Some(&Scalar::number(4.0)), "n", None, 1), 4);
        p.int(Some(&Scalar::number(4.5)), "n", None, 1);
        p.int(Some(&Scalar::text("0")), "n", None, 1);
        assert_eq!(p.into_sorted().len(), 2);
    }

    #[test]
    fn mm_prints_short() {
        assert_eq!(mm(1.5), "1.5 mm");
        assert_eq!(mm(2.0), "2 mm");
        assert_eq!(mm(0.00012), "0.0001 mm");
        assert_eq!(mm(1e300), "1e300 mm");
    }
}
