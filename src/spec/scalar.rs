//! Lenient leaf values of the raw layout: anything YAML may put where a number, word or
//! point is expected is kept, so that the resolver can report every bad value with its
//! key path instead of serde stopping at the first one.

use serde::de::{self, Deserialize, Deserializer, IgnoredAny, MapAccess, SeqAccess, Visitor};
use std::fmt;

/// One YAML leaf as written: its text and what kind of value YAML made of it.
#[derive(Debug, Clone, PartialEq)]
pub struct Scalar {
    /// The value as text (numbers as YAML read them).
    pub text: String,
    /// What YAML made of it.
    pub kind: ScalarKind,
}

/// The YAML type of a [`Scalar`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ScalarKind {
    /// A number (integer or float); its value.
    Number(f64),
    /// An integer, exactly.
    Integer(i128),
    /// A string.
    Text,
    /// `true` or `false`.
    Bool,
    /// A list or mapping where a single value belongs.
    Nested,
}

impl Scalar {
    /// A string scalar (for tests and defaults).
    pub fn text(s: &str) -> Scalar {
        Scalar { text: s.to_string(), kind: ScalarKind::Text }
    }
    /// A number scalar.
    pub fn number(v: f64) -> Scalar {
        Scalar { text: v.to_string(), kind: ScalarKind::Number(v) }
    }
}

impl<'de> Deserialize<'de> for Scalar {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        d.deserialize_any(ScalarVisitor)
    }
}

struct ScalarVisitor;

impl<'de> Visitor<'de> for ScalarVisitor {
    type Value = Scalar;

    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str("a single value")
    }
    fn visit_bool<E: de::Error>(self, v: bool) -> Result<Scalar, E> {
        Ok(Scalar { text: v.to_string(), kind: ScalarKind::Bool })
    }
    fn visit_i64<E: de::Error>(self, v: i64) -> Result<Scalar, E> {
        Ok(Scalar { text: v.to_string(), kind: ScalarKind::Integer(v as i128) })
    }
    fn visit_u64<E: de::Error>(self, v: u64) -> Result<Scalar, E> {
        Ok(Scalar { text: v.to_string(), kind: ScalarKind::Integer(v as i128) })
    }
    fn visit_i128<E: de::Error>(self, v: i128) -> Result<Scalar, E> {
        Ok(Scalar { text: v.to_string(), kind: ScalarKind::Integer(v) })
    }
    fn visit_u128<E: de::Error>(self, v: u128) -> Result<Scalar, E> {
        Ok(Scalar { text: v.to_string(), kind: ScalarKind::Integer(i128::try_from(v).unwrap_or(i128::MAX)) })
    }
    fn visit_f64<E: de::Error>(self, v: f64) -> Result<Scalar, E> {
        Ok(Scalar::number(v))
    }
    fn visit_str<E: de::Error>(self, v: &str) -> Result<Scalar, E> {
        Ok(Scalar::text(v))
    }
    fn visit_unit<E: de::Error>(self) -> Result<Scalar, E> {
        Ok(Scalar::text(""))
    }
    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<Scalar, A::Error> {
        while seq.next_element::<IgnoredAny>()?.is_some() {}
        Ok(Scalar { text: "a list".into(), kind: ScalarKind::Nested })
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<Scalar, A::Error> {
        while map.next_entry::<IgnoredAny, IgnoredAny>()?.is_some() {}
        Ok(Scalar { text: "a mapping".into(), kind: ScalarKind::Nested })
    }
}

/// A point as written: `[x, y]` or `{x: .., y: ..}`; anything else is kept as a message.
#[derive(Debug, Clone, PartialEq)]
pub struct RawPoint(pub Result<[Scalar; 2], String>);

impl<'de> Deserialize<'de> for RawPoint {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        d.deserialize_any(PointVisitor)
    }
}

struct PointVisitor;

const POINT_SHAPE: &str = "a point is written `[x, y]` or `{x: .., y: ..}`";

impl<'de> Visitor<'de> for PointVisitor {
    type Value = RawPoint;

    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str(POINT_SHAPE)
    }
    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<RawPoint, A::Error> {
        let mut items = Vec::new();
        while let Some(s) = seq.next_element::<Scalar>()? {
            items.push(s);
        }
        match <[Scalar; 2]>::try_from(items) {
            Ok(xy) => Ok(RawPoint(Ok(xy))),
            Err(items) => Ok(RawPoint(Err(format!("a point needs 2 coordinates, got {}", items.len())))),
        }
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<RawPoint, A::Error> {
        let (mut x, mut y, mut other) = (None, None, None);
        while let Some((k, v)) = map.next_entry::<Scalar, Scalar>()? {
            match k.text.as_str() {
                "x" => x = Some(v),
                "y" => y = Some(v),
                _ => other = Some(k.text),
            }
        }
        Ok(RawPoint(match (x, y, other) {
            (_, _, Some(k)) => Err(format!("unknown key `{k}` in a point (keys are x and y)")),
            (Some(x), Some(y), None) => Ok([x, y]),
            _ => Err("a point needs both x and y".into()),
        }))
    }
    fn visit_bool<E: de::Error>(self, v: bool) -> Result<RawPoint, E> {
        Ok(RawPoint(Err(format!("`{v}` is not a point"))))
    }
    fn visit_i64<E: de::Error>(self, v: i64) -> Result<RawPoint, E> {
        Ok(RawPoint(Err(format!("`{v}` is not a point"))))
    }
    fn visit_u64<E: de::Error>(self, v: u64) -> Result<RawPoint, E> {
        Ok(RawPoint(Err(format!("`{v}` is not a point"))))
    }
    fn visit_f64<E: de::Error>(self, v: f64) -> Result<RawPoint, E> {
        Ok(RawPoint(Err(format!("`{v}` is not a point"))))
    }
    fn visit_str<E: de::Error>(self, v: &str) -> Result<RawPoint, E> {
        Ok(RawPoint(Err(format!("`{v}` is not a point"))))
    }
    fn visit_unit<E: de::Error>(self) -> Result<RawPoint, E> {
        Ok(RawPoint(Err("empty value is not a point".into())))
    }
}

/// A single value or a list of values (`decimal_points: all` or `[1, 2]`).
#[derive(Debug, Clone, PartialEq)]
pub enum OneOrList {
    /// A single value such as `all`.
    One(Scalar),
    /// A list.
    List(Vec<Scalar>),
}

impl<'de> Deserialize<'de> for OneOrList {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = OneOrList;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("a list of digit numbers or `all`")
            }
            fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<OneOrList, A::Error> {
                let mut items = Vec::new();
                while let Some(s) = seq.next_element::<Scalar>()? {
                    items.push(s);
                }
                Ok(OneOrList::List(items))
            }
            fn visit_map<A: MapAccess<'de>>(self, map: A) -> Result<OneOrList, A::Error> {
                ScalarVisitor.visit_map(map).map(OneOrList::One)
            }
            fn visit_bool<E: de::Error>(self, v: bool) -> Result<OneOrList, E> {
                ScalarVisitor.visit_bool(v).map(OneOrList::One)
            }
            fn visit_i64<E: de::Error>(self, v: i64) -> Result<OneOrList, E> {
                ScalarVisitor.visit_i64(v).map(OneOrList::One)
            }
            fn visit_u64<E: de::Error>(self, v: u64) -> Result<OneOrList, E> {
                ScalarVisitor.visit_u64(v).map(OneOrList::One)
            }
            fn visit_f64<E: de::Error>(self, v: f64) -> Result<OneOrList, E> {
                ScalarVisitor.visit_f64(v).map(OneOrList::One)
            }
            fn visit_str<E: de::Error>(self, v: &str) -> Result<OneOrList, E> {
                ScalarVisitor.visit_str(v).map(OneOrList::One)
            }
            fn visit_unit<E: de::Error>(self) -> Result<OneOrList, E> {
                Ok(OneOrList::List(Vec::new()))
            }
        }
        d.deserialize_any(V)
    }
}

/// A mapping kept in file order with repeated keys kept (so they can be reported), for
/// maps whose keys are the user's names (`pads.fixed`, `gds_layers`).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Entries<V>(pub Vec<(Scalar, V)>);

impl<'de, V: Deserialize<'de>> Deserialize<'de> for Entries<V> {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct EntriesVisitor<V>(std::marker::PhantomData<V>);
        impl<'de, V: Deserialize<'de>> Visitor<'de> for EntriesVisitor<V> {
            type Value = Entries<V>;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("a mapping of names to values")
            }
            fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<Entries<V>, A::Error> {
                let mut out = Vec::new();
                while let Some(kv) = map.next_entry::<Scalar, V>()? {
                    out.push(kv);
                }
                Ok(Entries(out))
            }
            fn visit_unit<E: de::Error>(self) -> Result<Entries<V>, E> {
                Ok(Entries(Vec::new()))
            }
        }
        d.deserialize_any(EntriesVisitor(std::marker::PhantomData))
    }
}
