//! A guard against silent NaN: walk any serializable result and report the first number that is
//! not finite, with its path (`zones[3].absorbed_kw`).
//!
//! The plan runs every result through this before handing it out, so a model that divides by
//! zero somewhere becomes a named error instead of a `null` in the JSON or a blank on screen.

use serde::ser::{self, Serialize};
use std::fmt;

/// The path of the first non-finite number in `value`, if there is one.
pub fn first_non_finite<T: Serialize + ?Sized>(value: &T) -> Option<String> {
    let mut walker = Walker { path: Vec::new(), found: None };
    // The walker's only error is "found one", so the result itself carries nothing more.
    let _ = value.serialize(&mut walker);
    walker.found
}

struct Walker {
    path: Vec<Segment>,
    found: Option<String>,
}

/// One step of the path. Names and indices stay as they are until a non-finite number is found:
/// the plan passes through here on every call, and formatting a string per field would cost
/// about a sixth of a 200-zone plan.
enum Segment {
    Field(&'static str),
    Index(usize),
    Key(String),
}

impl Segment {
    fn write_to(&self, out: &mut String) {
        match self {
            Segment::Field(name) => {
                out.push('.');
                out.push_str(name);
            }
            Segment::Index(index) => out.push_str(&format!("[{index}]")),
            Segment::Key(key) => {
                out.push('.');
                out.push_str(key);
            }
        }
    }
}

#[derive(Debug)]
struct Found;

impl fmt::Display for Found {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str("non-finite number")
    }
}

impl std::error::Error for Found {}

impl ser::Error for Found {
    fn custom<M: fmt::Display>(_message: M) -> Self {
        Found
    }
}

impl Walker {
    fn number(&mut self, value: f64) -> Result<(), Found> {
        if value.is_finite() {
            Ok(())
        } else {
            let mut text = String::new();
            for segment in &self.path {
                segment.write_to(&mut text);
            }
            self.found = Some(text.trim_start_matches('.').to_string());
            Err(Found)
        }
    }

    fn nested<T: Serialize + ?Sized>(&mut self, segment: Segment, value: &T) -> Result<(), Found> {
        self.path.push(segment);
        let result = value.serialize(&mut *self);
        self.path.pop();
        result
    }
}

impl<'a> ser::Serializer for &'a mut Walker {
    type Ok = ();
    type Error = Found;
    type SerializeSeq = Sequence<'a>;
    type SerializeTuple = Sequence<'a>;
    type SerializeTupleStruct = Sequence<'a>;
    type SerializeTupleVariant = Sequence<'a>;
    type SerializeMap = Fields<'a>;
    type SerializeStruct = Fields<'a>;
    type SerializeStructVariant = Fields<'a>;

    fn serialize_f64(self, v: f64) -> Result<(), Found> {
        self.number(v)
    }
    fn serialize_f32(self, v: f32) -> Result<(), Found> {
        self.number(f64::from(v))
    }
    fn serialize_bool(self, _: bool) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_i8(self, _: i8) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_i16(self, _: i16) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_i32(self, _: i32) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_i64(self, _: i64) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_u8(self, _: u8) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_u16(self, _: u16) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_u32(self, _: u32) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_u64(self, _: u64) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_char(self, _: char) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_str(self, _: &str) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_bytes(self, _: &[u8]) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_none(self) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_some<T: Serialize + ?Sized>(self, value: &T) -> Result<(), Found> {
        value.serialize(self)
    }
    fn serialize_unit(self) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_unit_struct(self, _: &'static str) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_unit_variant(self, _: &'static str, _: u32, _: &'static str) -> Result<(), Found> {
        Ok(())
    }
    fn serialize_newtype_struct<T: Serialize + ?Sized>(self, _: &'static str, value: &T) -> Result<(), Found> {
        value.serialize(self)
    }
    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        value: &T,
    ) -> Result<(), Found> {
        self.nested(Segment::Field(variant), value)
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Sequence<'a>, Found> {
        Ok(Sequence { walker: self, index: 0 })
    }
    fn serialize_tuple(self, _: usize) -> Result<Sequence<'a>, Found> {
        Ok(Sequence { walker: self, index: 0 })
    }
    fn serialize_tuple_struct(self, _: &'static str, _: usize) -> Result<Sequence<'a>, Found> {
        Ok(Sequence { walker: self, index: 0 })
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Sequence<'a>, Found> {
        Ok(Sequence { walker: self, index: 0 })
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Fields<'a>, Found> {
        Ok(Fields { walker: self, key: String::new() })
    }
    fn serialize_struct(self, _: &'static str, _: usize) -> Result<Fields<'a>, Found> {
        Ok(Fields { walker: self, key: String::new() })
    }
    fn serialize_struct_variant(self, _: &'static str, _: u32, _: &'static str, _: usize) -> Result<Fields<'a>, Found> {
        Ok(Fields { walker: self, key: String::new() })
    }
}

/// Elements of a sequence or tuple, indexed in the path.
struct Sequence<'a> {
    walker: &'a mut Walker,
    index: usize,
}

impl Sequence<'_> {
    fn element<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        let segment = Segment::Index(self.index);
        self.index += 1;
        self.walker.nested(segment, value)
    }
}

impl ser::SerializeSeq for Sequence<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_element<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        self.element(value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

impl ser::SerializeTuple for Sequence<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_element<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        self.element(value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

impl ser::SerializeTupleStruct for Sequence<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        self.element(value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

impl ser::SerializeTupleVariant for Sequence<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        self.element(value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

/// Fields of a struct or entries of a map, named in the path.
struct Fields<'a> {
    walker: &'a mut Walker,
    key: String,
}

impl ser::SerializeStruct for Fields<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, key: &'static str, value: &T) -> Result<(), Found> {
        self.walker.nested(Segment::Field(key), value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

impl ser::SerializeStructVariant for Fields<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, key: &'static str, value: &T) -> Result<(), Found> {
        self.walker.nested(Segment::Field(key), value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

impl ser::SerializeMap for Fields<'_> {
    type Ok = ();
    type Error = Found;
    fn serialize_key<T: Serialize + ?Sized>(&mut self, key: &T) -> Result<(), Found> {
        // Keys are names in our documents; their text becomes the path segment.
        self.key = serde_json::to_string(key).unwrap_or_default().trim_matches('"').to_string();
        Ok(())
    }
    fn serialize_value<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Found> {
        let segment = Segment::Key(std::mem::take(&mut self.key));
        self.walker.nested(segment, value)
    }
    fn end(self) -> Result<(), Found> {
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::collections::BTreeMap;

    #[derive(serde::Serialize)]
    struct Inner {
        ok: f64,
        maybe: Option<f64>,
    }

    #[derive(serde::Serialize)]
    struct Outer {
        name: &'static str,
        list: Vec<Inner>,
        map: BTreeMap<&'static str, f64>,
    }

    #[test]
    fn finds_the_path_of_a_nan_or_infinity() {
        let mut map = BTreeMap::new();
        map.insert("a", 1.0);
        let good = Outer { name: "x", list: vec![Inner { ok: 1.0, maybe: None }], map: map.clone() };
        assert_eq!(first_non_finite(&good), None);
        let bad = Outer {
            name: "x",
            list: vec![Inner { ok: 1.0, maybe: None }, Inner { ok: 2.0, maybe: Some(f64::NAN) }],
            map,
        };
        assert_eq!(first_non_finite(&bad).as_deref(), Some("list[1].maybe"));
        let mut map = BTreeMap::new();
        map.insert("speed", f64::INFINITY);
        assert_eq!(first_non_finite(&Outer { name: "y", list: vec![], map }).as_deref(), Some("map.speed"));
    }

    #[derive(serde::Serialize)]
    enum Shape {
        Wrapped(f64),
        Pair(f64, f64),
        Named { width: f64 },
    }

    #[test]
    fn names_variants_tuples_and_nested_sequences() {
        assert_eq!(first_non_finite(&vec![Shape::Wrapped(f64::NAN)]).as_deref(), Some("[0].Wrapped"));
        assert_eq!(first_non_finite(&Shape::Pair(1.0, f64::NEG_INFINITY)).as_deref(), Some("[1]"));
        assert_eq!(
            first_non_finite(&[Shape::Named { width: 1.0 }, Shape::Named { width: f64::NAN }]).as_deref(),
            Some("[1].width")
        );
        assert_eq!(first_non_finite(&vec![vec![1.0], vec![2.0, 3.0, f64::INFINITY]]).as_deref(), Some("[1][2]"));
        assert_eq!(first_non_finite(&(1.0, 2.0)), None);
    }
}
