//! Property tests: no finite or non-finite input panics the physics core or yields NaN silently.

use doubleprime::physics::heating::{conductivity_loss_factor, power_density_w_per_m3};
use doubleprime::physics::waves::wave_properties_checked;
use proptest::prelude::*;

/// Any f64 at all, with the awkward ones (NaN, infinities, zero, subnormals) well represented.
fn any_number() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        Just(-0.0),
        Just(f64::MIN_POSITIVE / 2.0),
        Just(f64::MAX),
        any::<f64>(),
        -1e7..1e7f64,
        1e-3..3e5f64,
    ]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 2000, ..ProptestConfig::default() })]

    #[test]
    fn wave_properties_are_finite_or_refused(f in any_number(), a in any_number(), b in any_number()) {
        if let Ok(props) = wave_properties_checked(f, a, b) {
            for value in [
                props.wavelength_free_space_m,
                props.wavelength_in_material_m,
                props.attenuation_np_per_m,
                props.phase_constant_rad_per_m,
                props.loss_tangent,
                props.reflectance_normal,
                props.transmittance_normal,
            ] {
                prop_assert!(value.is_finite(), "non-finite output for f={f} eps'={a} eps''={b}: {props:?}");
            }
            for depth in [props.penetration_depth_m, props.penetration_depth_low_loss_m, props.half_power_depth_m].into_iter().flatten() {
                prop_assert!(depth.is_finite() && depth > 0.0, "{props:?}");
            }
            prop_assert!((0.0..=1.0).contains(&props.reflectance_normal));
            let power = power_density_w_per_m3(f * 1e6, b, 1e3);
            prop_assert!(power.is_finite() && power >= 0.0);
            prop_assert!(conductivity_loss_factor(1.0, f * 1e6).is_finite());
        }
    }
}
