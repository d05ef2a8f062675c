//! No finite or non-finite input makes the public entry points panic or return NaN without an error.

use crate::materials::thermal;
use crate::materials::{library, permittivity, permittivity_value, MaterialState};
use proptest::prelude::*;

fn any_number() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        Just(-0.0),
        Just(f64::MAX),
        Just(f64::MIN_POSITIVE),
        -1e3..1e3f64,
        -1e12..1e12f64,
        0.0..1.0f64,
        proptest::num::f64::ANY,
    ]
}

fn optional_number() -> impl Strategy<Value = Option<f64>> {
    prop_oneof![Just(None), any_number().prop_map(Some), (0.0..0.95f64).prop_map(Some)]
}

/// A library material (by index, wrapped) and a state to look it up at: frequency, temperature,
/// moisture and salt, each awkward or plausible.
fn lookup_request() -> impl Strategy<Value = (usize, f64, f64, Option<f64>, Option<f64>)> {
    (
        0usize..64,
        prop_oneof![any_number(), 1e6..1e10f64],
        prop_oneof![any_number(), -60.0..300.0f64],
        optional_number(),
        prop_oneof![Just(None), any_number().prop_map(Some), (0.0..26.0f64).prop_map(Some)],
    )
}

fn finite_or_error(result: Result<f64, crate::error::InputError>) -> bool {
    result.map_or(true, f64::is_finite)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn permittivity_never_panics_or_returns_nan(
        (index, f, t, m, s) in lookup_request(),
    ) {
        let material = library().iter().nth(index % library().iter().count()).expect("the library is not empty");
        let state = MaterialState { temp_c: t, moisture_wb: m, salt_pct: s };
        if let Ok(lookup) = permittivity(material, f, &state) {
            prop_assert!(lookup.eps.eps_real.is_finite() && lookup.eps.eps_imag.is_finite());
            prop_assert!(lookup.eps.eps_imag >= 0.0);
            for point in &lookup.points_used {
                prop_assert!(point.weight.is_finite());
            }
        }
        prop_assert!(finite_or_error(material.enthalpy_j_per_kg(t, m)));
        prop_assert!(finite_or_error(material.specific_heat_j_per_kg_k(t, m)));
        prop_assert!(finite_or_error(material.frozen_fraction_at(t, m)));
        prop_assert!(finite_or_error(material.bulk_density_kg_per_m3(m)));
    }

    #[test]
    fn the_value_alone_is_the_lookups_value_bit_for_bit(
        (index, f, t, m, s) in lookup_request(),
    ) {
        let material = library().iter().nth(index % library().iter().count()).expect("the library is not empty");
        let state = MaterialState { temp_c: t, moisture_wb: m, salt_pct: s };
        let lookup = permittivity(material, f, &state).map(|lookup| lookup.eps);
        prop_assert_eq!(permittivity_value(material, f, &state), lookup.clone());
        prop_assert_eq!(material.permittivity_curve(m, s).value(f, t), lookup);
    }

    #[test]
    fn thermal_functions_never_panic_or_return_nan(t in any_number(), p in any_number()) {
        prop_assert!(finite_or_error(thermal::latent_heat_vaporization_j_per_kg(t)));
        prop_assert!(finite_or_error(thermal::saturation_pressure_pa(t)));
        prop_assert!(finite_or_error(thermal::saturated_liquid_enthalpy_j_per_kg(t)));
        prop_assert!(finite_or_error(thermal::boiling_point_c(p)));
        prop_assert!(finite_or_error(thermal::ice_specific_heat_j_per_kg_k(t)));
    }

    #[test]
    fn warnings_never_panic(
        t0 in any_number(), t1 in -60.0..300.0f64, bed in any_number(), dp in optional_number()
    ) {
        let beef = library().get("beef-lean").unwrap();
        let _ = crate::materials::warnings::runaway_risk(beef, 915e6, &MaterialState::at(t0), &MaterialState::at(t1));
        if let Ok(check) = crate::materials::warnings::bed_depth_check(dp, bed) {
            prop_assert!(check.depth_ratio.is_finite() && check.middle_power_ratio_two_sides.is_finite());
        }
    }
}

/// Found by `warnings_never_panic`: a subnormal penetration depth made bed / Dp overflow to
/// infinity. It is now refused by name.
#[test]
fn a_subnormal_penetration_depth_is_refused() {
    let error =
        crate::materials::warnings::bed_depth_check(Some(2.992262981800266e-309), 0.7504731637420365).unwrap_err();
    assert_eq!(error.field, "penetration_depth_m");
}

/// The value alone against the full lookup over every material, across frozen, thawed, hot, dry
/// and wet states and the ISM bands (exact equality: the same functions compute both).
#[test]
fn the_value_alone_matches_every_material_on_a_grid() {
    for material in library().iter() {
        for f in [13.56e6, 27.12e6, 915e6, 2450e6, 5800e6] {
            for t in [-60.0, -18.0, -4.0, -1.0, 0.0, 4.0, 25.0, 72.0, 100.0, 150.0, 300.0] {
                for m in [None, Some(0.0), Some(0.1), Some(0.5), Some(0.74), Some(0.95)] {
                    for s in [None, Some(0.0), Some(2.0)] {
                        let state = MaterialState { temp_c: t, moisture_wb: m, salt_pct: s };
                        let lookup = permittivity(material, f, &state).map(|lookup| lookup.eps);
                        assert_eq!(permittivity_value(material, f, &state), lookup, "{} {f} {state:?}", material.name);
                        let curve = material.permittivity_curve(m, s).value(f, t);
                        assert_eq!(curve, lookup, "curve: {} {f} {state:?}", material.name);
                    }
                }
            }
        }
    }
}
