//! The guard at the report boundary: no non-finite number reaches a plot, a CSV or
//! `summary.json`. A plot of an infinite amplitude never finishes (the plotting library's
//! axis ticks loop), a CSV would say `inf` and JSON `null`, so a result that could not be
//! computed finitely is an error naming the stage, the mode, the quantity and the inputs it
//! depends on, raised before anything is staged.
//!
//! The search walks each result through its `Serialize` implementation (the same view the
//! JSON writer has), so a field added later is covered without changing this file.

use serde::ser::{self, Serialize};
use thiserror::Error;

use crate::case::{Case, Wind};
use crate::modal::StageModes;
use crate::remedy::RemedyResults;
use crate::wind::VortexResults;

/// A result that is infinite or not a number.
#[derive(Debug, Error)]
#[error(
    "{place}: {quantity} = {value} cannot be computed finitely, so no output was written; it \
     depends on {inputs} (check those values)"
)]
pub struct NonFiniteResult {
    /// "stage `lined`, mode 2" or "stage `lined`" or "remedies".
    pub place: String,
    /// Path of the quantity inside the result, e.g. `approach1.tip_amplitude_m`.
    pub quantity: String,
    /// `inf`, `-inf` or `NaN`.
    pub value: String,
    /// The case-file inputs the quantity depends on, with their values.
    pub inputs: String,
}

/// Checks the modes, the vortex results and the remedies of a run.
pub fn check_results(
    case: &Case,
    stages: &[StageModes],
    vortex: Option<&VortexResults>,
    remedies: Option<&RemedyResults>,
) -> Result<(), NonFiniteResult> {
    let wind = vortex.map(|v| &v.wind);
    let fail = |place: String, (quantity, value): (String, f64)| NonFiniteResult {
        inputs: driving_inputs(case, wind, &quantity),
        place,
        quantity,
        value: format!("{value}"),
    };
    for s in stages {
        for (j, m) in s.modes.iter().enumerate() {
            if let Some(found) = first_non_finite(m) {
                return Err(fail(
                    format!("stage `{}`, mode {}", s.stage.name, j + 1),
                    found,
                ));
            }
        }
        if let Some(found) = first_non_finite(&s.model) {
            return Err(fail(format!("stage `{}`", s.stage.name), found));
        }
    }
    for (w, s) in vortex
        .iter()
        .flat_map(|v| v.stages.iter().map(move |s| (&v.wind, s)))
    {
        for m in &s.modes {
            if let Some(found) = first_non_finite(m) {
                let mut e = fail(format!("stage `{}`, mode {}", s.stage, m.mode), found);
                if e.quantity.contains("speed") {
                    // The profile speed is taken at the mode's shedding height.
                    e.inputs = format!(
                        "the wind profile at this mode's shedding height z = {} m \
                         (wind.reference_height_m = {}, wind.reference_speed_m_s = {}, the \
                         stage's c_prob = {})",
                        m.reference_height_m,
                        w.reference_height_m,
                        w.reference_speed_m_s,
                        s.climate.c_prob
                    );
                }
                return Err(e);
            }
        }
    }
    if let Some(found) = remedies.and_then(first_non_finite) {
        return Err(fail("remedies".into(), found));
    }
    Ok(())
}

/// The inputs a quantity depends on, most likely first.
fn driving_inputs(case: &Case, wind: Option<&Wind>, quantity: &str) -> String {
    let q = quantity.to_ascii_lowercase();
    let v = &case.vortex;
    let Some(w) = wind else {
        return "the shell, lining and point-mass values of the stage".to_string();
    };
    let damping = format!(
        "vortex.log_decrement = {}, wind.air_density_kg_m3 = {}",
        v.log_decrement, w.air_density_kg_m3
    );
    let life = format!("vortex.design_life_years = {}", v.design_life_years);
    let speed = format!("wind.reference_speed_m_s = {}", w.reference_speed_m_s);
    if q.contains("cycle") || q.contains("fatigue") {
        format!("{life}, {speed}")
    } else if q.contains("reynolds") {
        format!(
            "wind.kinematic_viscosity_m2_s = {}, {speed}",
            w.kinematic_viscosity_m2_s
        )
    } else if q.contains("frequency") || q.contains("mass") || q.contains("shape") {
        "the shell, lining and point-mass values of the stage".to_string()
    } else {
        format!("{damping}, {speed}")
    }
}

/// Path and value of the first non-finite number in `value`'s serialised form.
pub fn first_non_finite<T: Serialize + ?Sized>(value: &T) -> Option<(String, f64)> {
    let mut finder = Finder::default();
    let _ = value.serialize(&mut finder);
    finder.found
}

#[derive(Default)]
struct Finder {
    path: Vec<String>,
    found: Option<(String, f64)>,
}

impl Finder {
    fn float(&mut self, v: f64) {
        if !v.is_finite() && self.found.is_none() {
            self.found = Some((self.path.join("."), v));
        }
    }

    fn nested<T: Serialize + ?Sized>(&mut self, key: String, value: &T) -> Result<(), Stop> {
        if self.found.is_some() {
            return Ok(());
        }
        self.path.push(key);
        let r = value.serialize(&mut *self);
        self.path.pop();
        r
    }
}

/// Never raised: the search records what it finds and carries on.
#[derive(Debug)]
struct Stop;

impl std::fmt::Display for Stop {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("stop")
    }
}
impl std::error::Error for Stop {}
impl ser::Error for Stop {
    fn custom<T: std::fmt::Display>(_: T) -> Self {
        Stop
    }
}

macro_rules! ignore {
    ($($name:ident: $t:ty),*) => {
        $(fn $name(self, _: $t) -> Result<(), Stop> { Ok(()) })*
    };
}

impl<'a> ser::Serializer for &'a mut Finder {
    type Ok = ();
    type Error = Stop;
    type SerializeSeq = Seq<'a>;
    type SerializeTuple = Seq<'a>;
    type SerializeTupleStruct = Seq<'a>;
    type SerializeTupleVariant = Seq<'a>;
    type SerializeMap = Map<'a>;
    type SerializeStruct = Self;
    type SerializeStructVariant = Self;

    ignore!(serialize_bool: bool, serialize_i8: i8, serialize_i16: i16, serialize_i32: i32,
        serialize_i64: i64, serialize_u8: u8, serialize_u16: u16, serialize_u32: u32,
        serialize_u64: u64, serialize_char: char, serialize_str: &str, serialize_bytes: &[u8],
        serialize_unit_struct: &'static str);

    fn serialize_f32(self, v: f32) -> Result<(), Stop> {
        self.float(f64::from(v));
        Ok(())
    }
    fn serialize_f64(self, v: f64) -> Result<(), Stop> {
        self.float(v);
        Ok(())
    }
    fn serialize_none(self) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_some<T: Serialize + ?Sized>(self, value: &T) -> Result<(), Stop> {
        value.serialize(self)
    }
    fn serialize_unit(self) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_unit_variant(self, _: &'static str, _: u32, _: &'static str) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_newtype_struct<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        value: &T,
    ) -> Result<(), Stop> {
        value.serialize(self)
    }
    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        value: &T,
    ) -> Result<(), Stop> {
        self.nested(variant.to_string(), value)
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Seq<'a>, Stop> {
        Ok(Seq { f: self, i: 0 })
    }
    fn serialize_tuple(self, _: usize) -> Result<Seq<'a>, Stop> {
        Ok(Seq { f: self, i: 0 })
    }
    fn serialize_tuple_struct(self, _: &'static str, _: usize) -> Result<Seq<'a>, Stop> {
        Ok(Seq { f: self, i: 0 })
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Seq<'a>, Stop> {
        Ok(Seq { f: self, i: 0 })
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Map<'a>, Stop> {
        Ok(Map {
            f: self,
            key: String::new(),
        })
    }
    fn serialize_struct(self, _: &'static str, _: usize) -> Result<Self, Stop> {
        Ok(self)
    }
    fn serialize_struct_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Self, Stop> {
        Ok(self)
    }
}

/// Elements of a sequence, tuple or tuple variant, found by index.
struct Seq<'a> {
    f: &'a mut Finder,
    i: usize,
}

impl Seq<'_> {
    fn element<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Stop> {
        let key = format!("[{}]", self.i);
        self.i += 1;
        self.f.nested(key, value)
    }
}

macro_rules! seq_like {
    ($($tr:ident::$m:ident),*) => {
        $(impl ser::$tr for Seq<'_> {
            type Ok = ();
            type Error = Stop;
            fn $m<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Stop> {
                self.element(value)
            }
            fn end(self) -> Result<(), Stop> {
                Ok(())
            }
        })*
    };
}
seq_like!(
    SerializeSeq::serialize_element,
    SerializeTuple::serialize_element,
    SerializeTupleStruct::serialize_field,
    SerializeTupleVariant::serialize_field
);

/// Entries of a map, found by key (keys that are not strings show as `?`).
struct Map<'a> {
    f: &'a mut Finder,
    key: String,
}

impl ser::SerializeMap for Map<'_> {
    type Ok = ();
    type Error = Stop;
    fn serialize_key<T: Serialize + ?Sized>(&mut self, key: &T) -> Result<(), Stop> {
        self.key = serde_json::to_value(key)
            .ok()
            .and_then(|v| v.as_str().map(str::to_string))
            .unwrap_or_else(|| "?".into());
        Ok(())
    }
    fn serialize_value<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Stop> {
        let key = std::mem::take(&mut self.key);
        self.f.nested(key, value)
    }
    fn end(self) -> Result<(), Stop> {
        Ok(())
    }
}

macro_rules! struct_like {
    ($($tr:ident),*) => {
        $(impl ser::$tr for &mut Finder {
            type Ok = ();
            type Error = Stop;
            fn serialize_field<T: Serialize + ?Sized>(
                &mut self,
                key: &'static str,
                value: &T,
            ) -> Result<(), Stop> {
                self.nested(key.to_string(), value)
            }
            fn end(self) -> Result<(), Stop> {
                Ok(())
            }
        })*
    };
}
struct_like!(SerializeStruct, SerializeStructVariant);

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Serialize)]
    struct Inner {
        ok_m: f64,
        tip_amplitude_m: Option<f64>,
    }

    #[derive(serde::Serialize)]
    struct Outer {
        name: String,
        rows: Vec<Inner>,
    }

    #[test]
    fn the_first_non_finite_number_is_found_with_its_path() {
        let mut o = Outer {
            name: "x".into(),
            rows: vec![
                Inner {
                    ok_m: 1.0,
                    tip_amplitude_m: None,
                },
                Inner {
                    ok_m: 2.0,
                    tip_amplitude_m: Some(f64::INFINITY),
                },
            ],
        };
        let (path, v) = first_non_finite(&o).unwrap();
        assert_eq!(path, "rows.[1].tip_amplitude_m");
        assert!(v.is_infinite());
        o.rows[1].tip_amplitude_m = Some(0.1);
        assert!(first_non_finite(&o).is_none());
        o.rows[0].ok_m = f64::NAN;
        assert_eq!(first_non_finite(&o).unwrap().0, "rows.[0].ok_m");
    }

    #[test]
    fn the_demo_results_are_finite() {
        let case = crate::input::demo_case();
        let results = crate::commands::check::analyse(case, Default::default()).unwrap();
        check_results(
            &results.case,
            &results.stages,
            Some(&results.vortex),
            Some(&results.remedies),
        )
        .unwrap();
    }

    #[test]
    fn an_infinite_amplitude_is_an_error_naming_stage_mode_quantity_and_inputs() {
        let case = crate::input::demo_case();
        let mut r = crate::commands::check::analyse(case, Default::default()).unwrap();
        let m = &mut r.vortex.stages[1].modes[0];
        m.scruton = f64::INFINITY;
        let (stage, mode) = (m.stage.clone(), m.mode);
        let e = check_results(&r.case, &r.stages, Some(&r.vortex), None).unwrap_err();
        assert_eq!(
            e.to_string(),
            format!(
                "stage `{stage}`, mode {mode}: scruton = inf cannot be computed finitely, so no \
                 output was written; it depends on vortex.log_decrement = 0.03, \
                 wind.air_density_kg_m3 = 1.25, wind.reference_speed_m_s = 26 (check those \
                 values)"
            )
        );
    }
}
