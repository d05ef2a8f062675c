//! Identities, limits and an independent characteristic-matrix computation for the layer solver.
// The crate denies `unwrap` for the library; in tests a panic is the failure report we want.
#![allow(clippy::unwrap_used)]

use super::*;
use crate::physics::waves::{penetration_depth_m, reflectance_normal};
use approx::assert_relative_eq;
use num_complex::Complex64;
use proptest::prelude::*;

/// Energy balance tolerance: R + T + sum A = 1 for any passive stack (the brief's requirement).
const BALANCE_TOLERANCE: f64 = 1e-9;
/// Tolerance on exact identities evaluated in floating point (a few hundred roundings).
const IDENTITY_TOLERANCE: f64 = 1e-12;

const F_2450_HZ: f64 = 2450e6;
const F_915_HZ: f64 = 915e6;

fn layer(name: &str, thickness_m: f64, eps_real: f64, eps_imag: f64, is_product: bool) -> Layer {
    Layer {
        name: name.to_string(),
        thickness_m,
        permittivity: ComplexPermittivity::new(eps_real, eps_imag),
        is_product,
    }
}

fn wavelength_m(frequency_hz: f64) -> f64 {
    SPEED_OF_LIGHT_M_PER_S / frequency_hz
}

fn balance(solution: &StackSolution) -> f64 {
    solution.reflectance + solution.transmittance + solution.layers.iter().map(|layer| layer.absorptance).sum::<f64>()
}

/// The amplitude reflection coefficient of a top-fed stack, straight from the solver.
fn top_reflection(frequency_hz: f64, layers: &[Layer], exit: Exit) -> Complex {
    let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
    let slabs: Vec<Slab> = layers.iter().map(slab_of).collect();
    solve_one_sided(k0, Complex::ONE, &slabs, exit).reflection
}

#[test]
fn lossless_half_wave_layer_is_invisible() {
    // Exact identity (Born & Wolf 1999, §1.6; shared/sources.md §11): d = lambda0 / (2 n) between
    // equal media gives M = -I, so r = 0 and T = 1.
    for (eps_real, frequency_hz) in [(4.0, F_2450_HZ), (2.1, F_915_HZ), (9.8, 27.12e6)] {
        let n = f64::sqrt(eps_real);
        let stack = [layer("window", wavelength_m(frequency_hz) / (2.0 * n), eps_real, 0.0, false)];
        let solution = solve_stack(frequency_hz, &stack, Backing::Air, Feed::Top, 11).unwrap();
        assert!(solution.reflectance < IDENTITY_TOLERANCE, "{solution:?}");
        assert_relative_eq!(solution.transmittance, 1.0, epsilon = IDENTITY_TOLERANCE);
    }
}

#[test]
fn quarter_wave_layer_in_air_reflects_as_published() {
    // Exact identity (shared/sources.md §11): a quarter-wave layer (d = lambda0 / (4 n)) between air
    // and air gives r = (1 - n^2) / (1 + n^2).
    for eps_real in [4.0, 2.1, 50.0] {
        let n = f64::sqrt(eps_real);
        let stack = [layer("plate", wavelength_m(F_2450_HZ) / (4.0 * n), eps_real, 0.0, false)];
        let r = top_reflection(F_2450_HZ, &stack, Exit::Medium(Complex::ONE));
        let expected = (1.0 - eps_real) / (1.0 + eps_real);
        assert_relative_eq!(r.re, expected, epsilon = IDENTITY_TOLERANCE);
        assert!(r.im.abs() < IDENTITY_TOLERANCE, "{r:?}");
        let solution = solve_stack(F_2450_HZ, &stack, Backing::Air, Feed::Top, 5).unwrap();
        assert_relative_eq!(solution.reflectance, expected * expected, epsilon = IDENTITY_TOLERANCE);
    }
}

#[test]
fn quarter_wave_matching_layer_removes_reflection() {
    // Exact identity (shared/sources.md §11): n_m = sqrt(n0 n_s), d = lambda0 / (4 n_m) gives R = 0.
    for (eps_substrate, frequency_hz) in [(16.0, F_2450_HZ), (9.0, F_915_HZ), (2.25, 5.8e9)] {
        let n_matching = f64::sqrt(f64::sqrt(eps_substrate));
        let eps_matching = n_matching * n_matching;
        let stack = [layer("matching", wavelength_m(frequency_hz) / (4.0 * n_matching), eps_matching, 0.0, false)];
        let backing = Backing::Material(ComplexPermittivity::new(eps_substrate, 0.0));
        let solution = solve_stack(frequency_hz, &stack, backing, Feed::Top, 5).unwrap();
        assert!(solution.reflectance < IDENTITY_TOLERANCE, "{solution:?}");
        assert_relative_eq!(solution.transmittance, 1.0, epsilon = IDENTITY_TOLERANCE);
    }
}

#[test]
fn thick_lossy_slab_reflects_like_a_half_space() {
    // Fresnel at normal incidence (physics::waves::reflectance_normal): once the slab is many
    // penetration depths thick, nothing returns from its far face. 0.5 m of water (Datta &
    // Ramaswamy 78 - j13.4 at 2450 MHz, Dp = 1.29 cm, shared/sources.md §4) is 38.8 Dp, so the
    // wave returning from the far face is e^-38.8 down in power; the other cases are made 40 Dp.
    for (frequency_hz, eps, thickness_m) in [
        (F_2450_HZ, ComplexPermittivity::new(78.0, 13.4), 0.5),
        (F_915_HZ, ComplexPermittivity::new(78.0, 8.0), f64::NAN),
        (27.12e6, ComplexPermittivity::new(70.0, 400.0), f64::NAN),
        (300e9, ComplexPermittivity::new(1000.0, 1e6), f64::NAN),
    ] {
        let dp = penetration_depth_m(frequency_hz, eps).unwrap();
        let thickness_m = if thickness_m.is_nan() { 40.0 * dp } else { thickness_m };
        let stack = [Layer { name: "water".into(), thickness_m, permittivity: eps, is_product: true }];
        for backing in [Backing::Air, Backing::Metal] {
            let solution = solve_stack(frequency_hz, &stack, backing, Feed::Top, 2001).unwrap();
            let fresnel = reflectance_normal(eps);
            assert_relative_eq!(solution.reflectance, fresnel, max_relative = 1e-12);
            assert_relative_eq!(solution.layers[0].absorptance, 1.0 - fresnel, max_relative = 1e-12);
            assert!(solution.transmittance < (-thickness_m / dp).exp(), "{}", solution.transmittance);
            assert!(solution
                .depth_profile
                .iter()
                .all(|sample| sample.power_density_per_incident_flux_per_m.is_finite()));
        }
    }
}

#[test]
fn half_space_profile_decays_with_the_penetration_depth() {
    // Exact for a half-space: p(z) = p(0) e^{-z / Dp} (shared/sources.md §4), so the 1/e depth is
    // Dp and the half-power depth ln 2 Dp. The slab is 15 Dp thick (back wave e^-15 down); the
    // linear interpolation between samples 1/333 Dp apart is good to about 1e-6 relative.
    let eps = ComplexPermittivity::new(78.0, 13.4);
    let dp = penetration_depth_m(F_2450_HZ, eps).unwrap();
    let stack = [Layer { name: "water".into(), thickness_m: 15.0 * dp, permittivity: eps, is_product: true }];
    let solution = solve_stack(F_2450_HZ, &stack, Backing::Air, Feed::Top, 5000).unwrap();
    let uniformity = solution.uniformity.as_ref().unwrap();
    assert_eq!(uniformity.fraction_depths.len(), 2);
    let half = uniformity.fraction_depths[0];
    let one_over_e = uniformity.fraction_depths[1];
    assert_relative_eq!(half.fraction, 0.5);
    assert_relative_eq!(half.depth_m.unwrap(), std::f64::consts::LN_2 * dp, max_relative = 1e-5);
    assert_relative_eq!(one_over_e.depth_m.unwrap(), dp, max_relative = 1e-5);
    // Far face at 15 Dp: with G = (n - 1)/(n + 1) on the face towards air, exactly
    // p(d)/p(0) = |1 + G|^2 e^{-2 alpha d} / |1 + G e^{-2 j k d}|^2, i.e. about e^-15 times the
    // standing-wave factor |2 n / (n + 1)|^2 = 3.2. The core lags by far.
    assert!(uniformity.core_lags);
    let n = eps.refractive_index();
    let g = (n - Complex::ONE) / (n + Complex::ONE);
    let k0 = 2.0 * PI * F_2450_HZ / SPEED_OF_LIGHT_M_PER_S;
    let round_trip = propagator(k0, n, 2.0 * stack[0].thickness_m);
    let expected = (Complex::ONE + g).norm_sqr() * round_trip.abs() / (Complex::ONE + g * round_trip).norm_sqr();
    assert_relative_eq!(uniformity.core_to_surface_ratio.unwrap(), expected, max_relative = 1e-12);
    assert!(solution.warnings.iter().any(|warning| warning.code == "core_lags"));
}

#[test]
fn metal_backed_lossless_stack_reflects_everything() {
    // Exact: no loss and a perfect conductor leave nowhere for the power to go.
    let stack = [
        layer("glass", 0.0123, 6.0, 0.0, true),
        layer("gap", 0.02, 1.0, 0.0, false),
        layer("ptfe", 0.004, 2.1, 0.0, false),
    ];
    for frequency_hz in [13.56e6, F_915_HZ, F_2450_HZ, 5.8e9] {
        let solution = solve_stack(frequency_hz, &stack, Backing::Metal, Feed::Top, 3).unwrap();
        assert_relative_eq!(solution.reflectance, 1.0, epsilon = IDENTITY_TOLERANCE);
        assert_eq!(solution.transmittance, 0.0);
        assert_eq!(solution.absorptance, 0.0);
    }
}

#[test]
fn bottom_feed_is_the_reversed_stack_fed_from_the_top() {
    // Exact by symmetry: with air on both sides, feeding from below equals feeding the reversed
    // stack from above, with depths mirrored.
    let stack = [
        layer("product", 0.04, 50.0, 15.0, true),
        layer("tray", 0.003, 2.6, 0.01, false),
        layer("belt", 0.002, 2.1, 0.0006, false),
    ];
    let reversed: Vec<Layer> = stack.iter().rev().cloned().collect();
    let bottom = solve_stack(F_2450_HZ, &stack, Backing::Air, Feed::Bottom, 41).unwrap();
    let top = solve_stack(F_2450_HZ, &reversed, Backing::Air, Feed::Top, 41).unwrap();
    assert_relative_eq!(bottom.reflectance, top.reflectance, max_relative = 1e-12);
    assert_relative_eq!(bottom.transmittance, top.transmittance, max_relative = 1e-12);
    for (index, result) in bottom.layers.iter().enumerate() {
        assert_relative_eq!(result.absorptance, top.layers[2 - index].absorptance, max_relative = 1e-12);
    }
    let total = 0.045;
    for sample in &bottom.depth_profile {
        let mirrored = top
            .depth_profile
            .iter()
            .find(|other| other.layer == 2 - sample.layer && (other.depth_m - (total - sample.depth_m)).abs() < 1e-12)
            .unwrap();
        assert_relative_eq!(
            sample.power_density_per_incident_flux_per_m,
            mirrored.power_density_per_incident_flux_per_m,
            max_relative = 1e-10
        );
    }
}

#[test]
fn two_sided_feed_is_the_mean_of_the_two_one_sided_feeds() {
    // The stated model: incoherent sum, half the power from each side.
    let stack = [layer("product", 0.06, 40.0, 12.0, true), layer("belt", 0.002, 2.1, 0.0006, false)];
    let top = solve_stack(F_915_HZ, &stack, Backing::Air, Feed::Top, 31).unwrap();
    let bottom = solve_stack(F_915_HZ, &stack, Backing::Air, Feed::Bottom, 31).unwrap();
    let both = solve_stack(F_915_HZ, &stack, Backing::Air, Feed::BothSides, 31).unwrap();
    assert_relative_eq!(both.reflectance, 0.5 * (top.reflectance + bottom.reflectance), max_relative = 1e-12);
    assert_eq!(both.sides.len(), 2);
    assert_relative_eq!(both.sides[0].reflectance, top.reflectance);
    assert_relative_eq!(both.sides[1].reflectance, bottom.reflectance);
    for ((a, b), c) in both.depth_profile.iter().zip(&top.depth_profile).zip(&bottom.depth_profile) {
        assert_relative_eq!(
            a.power_density_per_incident_flux_per_m,
            0.5 * (b.power_density_per_incident_flux_per_m + c.power_density_per_incident_flux_per_m),
            max_relative = 1e-12
        );
    }
    assert!((balance(&both) - 1.0).abs() < BALANCE_TOLERANCE);
}

#[test]
fn symmetric_slab_fed_from_both_sides_has_a_symmetric_profile_and_its_core_at_the_centre() {
    // Exact by symmetry; the centre of a 5 Dp slab (Dp of water at 2450 MHz) gets about
    // e^-2.5 / (1/2 (1 + e^-5)) = 0.163 of the surface value plus standing-wave terms: it lags.
    let stack = [layer("product", 0.065, 78.0, 13.4, true)];
    let both = solve_stack(F_2450_HZ, &stack, Backing::Air, Feed::BothSides, 131).unwrap();
    let profile = &both.depth_profile;
    for (a, b) in profile.iter().zip(profile.iter().rev()) {
        assert_relative_eq!(
            a.power_density_per_incident_flux_per_m,
            b.power_density_per_incident_flux_per_m,
            max_relative = 1e-9
        );
    }
    let uniformity = both.uniformity.as_ref().unwrap();
    assert_relative_eq!(uniformity.core_depth_m, 0.0325, max_relative = 1e-12);
    assert_relative_eq!(
        uniformity.core_power_density_per_m,
        profile[65].power_density_per_incident_flux_per_m,
        max_relative = 1e-12
    );
    let ratio = uniformity.core_to_surface_ratio.unwrap();
    assert!((0.1..0.25).contains(&ratio), "{ratio}");
    assert!(uniformity.core_lags);
}

#[test]
fn thin_product_does_not_lag() {
    // A 5 mm layer at 915 MHz is a small fraction of a penetration depth (Dp about 3 cm).
    let stack = [layer("product", 0.005, 60.0, 20.0, true), layer("belt", 0.002, 2.1, 0.0006, false)];
    let solution = solve_stack(F_915_HZ, &stack, Backing::Air, Feed::Top, 51).unwrap();
    let uniformity = solution.uniformity.as_ref().unwrap();
    assert!(!uniformity.core_lags, "{uniformity:?}");
    // The standing wave in a thin slab over air peaks at its bottom face (the wave reflects in
    // phase off the drop to a lower index), so the far face gets more than the fed one here.
    assert!(uniformity.core_to_surface_ratio.unwrap() > 1.0);
    assert!(uniformity.min_to_max_ratio.unwrap() > 0.5);
    assert!(uniformity.fraction_depths.iter().all(|depth| depth.depth_m.is_none()));
    assert!(!solution.warnings.iter().any(|warning| warning.code == "core_lags"));
}

#[test]
fn depth_profile_integrates_to_each_layers_absorptance() {
    // Composite Simpson over 2001 samples per layer: the error, of order h^4 |p''''|, is below
    // 1e-9 relative for these layers (h is under a 200th of the shortest wavelength). The
    // absorptance itself is the closed-form integral, so this checks the profile against it.
    let stack = [
        layer("product", 0.05, 50.0, 15.0, true),
        layer("gap", 0.01, 1.0, 0.0, false),
        layer("tray", 0.003, 2.6, 0.05, false),
        layer("belt", 0.002, 2.1, 0.0006, false),
    ];
    let samples = 2001;
    for (feed, backing) in [
        (Feed::Top, Backing::Air),
        (Feed::Top, Backing::Metal),
        (Feed::BothSides, Backing::Air),
        (Feed::Bottom, Backing::Material(ComplexPermittivity::new(4.0, 0.0))),
    ] {
        let solution = solve_stack(F_2450_HZ, &stack, backing, feed, samples).unwrap();
        for (index, result) in solution.layers.iter().enumerate() {
            let values: Vec<f64> = solution
                .depth_profile
                .iter()
                .filter(|sample| sample.layer == index)
                .map(|sample| sample.power_density_per_incident_flux_per_m)
                .collect();
            assert_eq!(values.len(), samples);
            let h = result.thickness_m / (samples - 1) as f64;
            let interior: f64 = values[1..samples - 1]
                .iter()
                .enumerate()
                .map(|(i, value)| if i % 2 == 0 { 4.0 * value } else { 2.0 * value })
                .sum();
            let integral = h / 3.0 * (values[0] + interior + values[samples - 1]);
            assert_relative_eq!(integral, result.absorptance, epsilon = 1e-15, max_relative = 1e-9);
        }
        assert!((balance(&solution) - 1.0).abs() < BALANCE_TOLERANCE);
    }
}

/// Independent route: the plain characteristic-matrix product of shared/sources.md §11 (Born &
/// Wolf 1999, §1.6, in the e^{+j omega t} form) in the `num-complex` crate. Returns (R, T).
fn characteristic_matrix(frequency_hz: f64, layers: &[Layer], backing: Backing) -> (f64, f64) {
    let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
    let j = Complex64::new(0.0, 1.0);
    let one = Complex64::new(1.0, 0.0);
    let zero = Complex64::new(0.0, 0.0);
    let index_of = |eps: ComplexPermittivity| Complex64::new(eps.eps_real, -eps.eps_imag).sqrt();
    let mut m = [[one, zero], [zero, one]];
    for layer in layers {
        let n = index_of(layer.permittivity);
        let delta = n * k0 * layer.thickness_m;
        let layer_matrix = [[delta.cos(), j * delta.sin() / n], [j * n * delta.sin(), delta.cos()]];
        m = [
            [
                m[0][0] * layer_matrix[0][0] + m[0][1] * layer_matrix[1][0],
                m[0][0] * layer_matrix[0][1] + m[0][1] * layer_matrix[1][1],
            ],
            [
                m[1][0] * layer_matrix[0][0] + m[1][1] * layer_matrix[1][0],
                m[1][0] * layer_matrix[0][1] + m[1][1] * layer_matrix[1][1],
            ],
        ];
    }
    // [E, eta0 H] at the bottom face: (1, n_s) into a half-space, (0, 1) on a perfect conductor.
    let (bottom, n_s) = match backing {
        Backing::Air => ([one, one], one),
        Backing::Material(eps) => {
            let n_s = index_of(eps);
            ([one, n_s], n_s)
        }
        Backing::Metal => ([zero, one], zero),
    };
    let b = m[0][0] * bottom[0] + m[0][1] * bottom[1];
    let c = m[1][0] * bottom[0] + m[1][1] * bottom[1];
    let r = (b - c) / (b + c);
    let t = 2.0 / (b + c);
    (r.norm_sqr(), n_s.re * t.norm_sqr())
}

fn arbitrary_layer() -> impl Strategy<Value = Layer> {
    (1e-4f64..0.3, 1.0f64..90.0, prop_oneof![Just(0.0), 0.0f64..1e-2, 0.0f64..30.0], any::<bool>()).prop_map(
        |(thickness_m, eps_real, eps_imag, is_product)| layer("random", thickness_m, eps_real, eps_imag, is_product),
    )
}

fn arbitrary_backing() -> impl Strategy<Value = Backing> {
    prop_oneof![
        Just(Backing::Air),
        Just(Backing::Metal),
        (1.0f64..90.0, 0.0f64..30.0)
            .prop_map(|(eps_real, eps_imag)| Backing::Material(ComplexPermittivity::new(eps_real, eps_imag))),
    ]
}

fn arbitrary_feed() -> impl Strategy<Value = Feed> {
    prop_oneof![Just(Feed::Top), Just(Feed::Bottom), Just(Feed::BothSides)]
}

proptest! {
    #[test]
    fn energy_is_conserved_for_any_passive_stack(
        frequency_hz in prop_oneof![1e6f64..1e8, 1e8f64..1e10, 1e10f64..3e11],
        layers in prop::collection::vec(arbitrary_layer(), 1..8),
        backing in arbitrary_backing(),
        feed in arbitrary_feed(),
    ) {
        // Metal refuses a feed from below, a lossy backing too (tested on their own).
        let feed = match backing {
            Backing::Metal => Feed::Top,
            Backing::Material(eps) if eps.eps_imag > 0.0 => Feed::Top,
            _ => feed,
        };
        let solution = solve_stack(frequency_hz, &layers, backing, feed, 9).unwrap();
        prop_assert!((balance(&solution) - 1.0).abs() < BALANCE_TOLERANCE, "{solution:?}");
        prop_assert!(solution.reflectance >= -BALANCE_TOLERANCE);
        prop_assert!(solution.transmittance >= 0.0);
        for result in &solution.layers {
            prop_assert!(result.absorptance >= 0.0 && result.absorptance.is_finite());
        }
        for sample in &solution.depth_profile {
            let density = sample.power_density_per_incident_flux_per_m;
            prop_assert!(density.is_finite() && density >= 0.0);
        }
    }

    #[test]
    fn metal_backed_lossless_stacks_reflect_everything(
        frequency_hz in 1e6f64..1e10,
        thicknesses in prop::collection::vec(1e-4f64..0.2, 1..6),
        eps_reals in prop::collection::vec(1.0f64..80.0, 6),
    ) {
        let layers: Vec<Layer> = thicknesses
            .iter()
            .zip(&eps_reals)
            .map(|(&d, &eps_real)| layer("lossless", d, eps_real, 0.0, false))
            .collect();
        let solution = solve_stack(frequency_hz, &layers, Backing::Metal, Feed::Top, 2).unwrap();
        prop_assert!((solution.reflectance - 1.0).abs() < IDENTITY_TOLERANCE);
    }

    #[test]
    fn matches_the_plain_characteristic_matrix(
        frequency_hz in 1e6f64..6e9,
        layers in prop::collection::vec(arbitrary_layer(), 1..6),
        backing in arbitrary_backing(),
    ) {
        // The plain matrix grows as e^{alpha d}; keep its products far from overflow and its
        // cancellation modest (total attenuation under 8 Np) so it is itself accurate to ~1e-10.
        let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
        let attenuation: f64 = layers
            .iter()
            .map(|l| -k0 * l.permittivity.refractive_index().im * l.thickness_m)
            .sum();
        prop_assume!(attenuation < 8.0);
        let ours = solve_stack(frequency_hz, &layers, backing, Feed::Top, 2).unwrap();
        let (reflectance, transmittance) = characteristic_matrix(frequency_hz, &layers, backing);
        prop_assert!((ours.reflectance - reflectance).abs() < 1e-9, "{} vs {reflectance}", ours.reflectance);
        prop_assert!((ours.transmittance - transmittance).abs() < 1e-9, "{} vs {transmittance}", ours.transmittance);
    }
}

#[test]
fn thick_and_very_lossy_layers_stay_finite() {
    // Stability, not a value: 10 m layers of the lossiest material accepted at both ends of the
    // frequency range, metal-backed and open, one and two sides.
    let extreme = [
        layer("brine", 10.0, 1000.0, 1e6, true),
        layer("water", 10.0, 78.0, 13.4, true),
        layer("ptfe", 10.0, 2.1, 0.0006, false),
    ];
    for frequency_hz in [FREQUENCY_MIN_HZ, F_2450_HZ, FREQUENCY_MAX_HZ] {
        for (backing, feed) in [
            (Backing::Air, Feed::BothSides),
            (Backing::Metal, Feed::Top),
            (Backing::Material(ComplexPermittivity::new(1000.0, 0.0)), Feed::Bottom),
            (Backing::Material(ComplexPermittivity::new(1000.0, 1e6)), Feed::Top),
        ] {
            let solution = solve_stack(frequency_hz, &extreme, backing, feed, 50).unwrap();
            assert!((balance(&solution) - 1.0).abs() < BALANCE_TOLERANCE, "{solution:?}");
            assert!(solution
                .depth_profile
                .iter()
                .all(|sample| sample.power_density_per_incident_flux_per_m.is_finite()));
            let uniformity = solution.uniformity.as_ref().unwrap();
            assert!(uniformity.min_power_density_per_m.is_finite());
        }
    }
}

#[test]
fn a_feed_from_below_needs_a_lossless_backing() {
    // Incident power is not defined inside a lossy half-space: refused, with the way out named.
    let stack = [layer("product", 0.02, 30.0, 10.0, true)];
    let backing = Backing::Material(ComplexPermittivity::new(10.0, 5.0));
    for feed in [Feed::Bottom, Feed::BothSides] {
        let error = solve_stack(F_2450_HZ, &stack, backing, feed, 5).unwrap_err();
        assert_eq!(error.field, "backing.eps_imag");
        assert!(error.valid.contains("layer"), "{error}");
    }
    let lossless = Backing::Material(ComplexPermittivity::new(10.0, 0.0));
    let solution = solve_stack(F_2450_HZ, &stack, lossless, Feed::BothSides, 5).unwrap();
    assert!((balance(&solution) - 1.0).abs() < BALANCE_TOLERANCE);
}

#[test]
fn air_gap_absorbs_nothing_and_gets_no_power_density() {
    let stack = [layer("product", 0.02, 50.0, 15.0, true), layer("gap", 0.01, 1.0, 0.0, false)];
    let solution = solve_stack(F_2450_HZ, &stack, Backing::Metal, Feed::Top, 11).unwrap();
    assert_eq!(solution.layers[1].absorptance, 0.0);
    assert!(solution
        .depth_profile
        .iter()
        .filter(|sample| sample.layer == 1)
        .all(|sample| sample.power_density_per_incident_flux_per_m == 0.0));
    assert_relative_eq!(solution.product_absorptance, solution.absorptance);
}

#[test]
fn metal_backing_refuses_a_feed_from_below() {
    let stack = [layer("product", 0.02, 50.0, 15.0, true)];
    for feed in [Feed::Bottom, Feed::BothSides] {
        let error = solve_stack(F_2450_HZ, &stack, Backing::Metal, feed, 11).unwrap_err();
        assert_eq!(error.field, "feed");
        assert!(error.valid.contains("metal backing"), "{error}");
    }
}

#[test]
fn bad_inputs_name_their_field_and_range() {
    let good = layer("product", 0.02, 50.0, 15.0, true);
    let solve = |layers: &[Layer], backing: Backing, samples: usize, frequency_hz: f64| {
        solve_stack(frequency_hz, layers, backing, Feed::Top, samples).unwrap_err()
    };
    let error = solve(&[], Backing::Air, 11, F_2450_HZ);
    assert_eq!(error.field, "layers");
    assert!(error.valid.contains("1 to 200"), "{error}");
    let error = solve(&vec![good.clone(); 201], Backing::Air, 11, F_2450_HZ);
    assert_eq!(error.field, "layers");

    for (bad, field) in [
        (layer("x", 0.0, 2.0, 0.0, false), "layers[2].thickness_m"),
        (layer("x", -1.0, 2.0, 0.0, false), "layers[2].thickness_m"),
        (layer("x", 10.5, 2.0, 0.0, false), "layers[2].thickness_m"),
        (layer("x", f64::NAN, 2.0, 0.0, false), "layers[2].thickness_m"),
        (layer("x", 0.01, 0.5, 0.0, false), "layers[2].eps_real"),
        (layer("x", 0.01, 2.0, -0.1, false), "layers[2].eps_imag"),
        (layer("x", 0.01, 2.0, f64::INFINITY, false), "layers[2].eps_imag"),
    ] {
        let error = solve(&[good.clone(), good.clone(), bad], Backing::Air, 11, F_2450_HZ);
        assert_eq!(error.field, field, "{error}");
    }
    let error =
        solve(std::slice::from_ref(&good), Backing::Material(ComplexPermittivity::new(0.2, 0.0)), 11, F_2450_HZ);
    assert_eq!(error.field, "backing.eps_real");
    for samples in [0, 1, SAMPLES_PER_LAYER_MAX + 1] {
        let error = solve(std::slice::from_ref(&good), Backing::Air, samples, F_2450_HZ);
        assert_eq!(error.field, "samples_per_layer");
    }
    for frequency_hz in [0.0, 999.0, 3.1e11, f64::NAN] {
        let error = solve(std::slice::from_ref(&good), Backing::Air, 11, frequency_hz);
        assert_eq!(error.field, "frequency_hz");
    }
}

#[test]
fn uniformity_settings_are_checked() {
    let stack = [layer("product", 0.02, 50.0, 15.0, true)];
    let settings = UniformitySettings { fractions: vec![0.5, 1.0], core_lag_threshold: 0.5 };
    let error = solve_stack_with(F_2450_HZ, &stack, Backing::Air, Feed::Top, 11, &settings).unwrap_err();
    assert_eq!(error.field, "fractions[1]");
    let settings = UniformitySettings { fractions: vec![0.25], core_lag_threshold: 0.0 };
    let error = solve_stack_with(F_2450_HZ, &stack, Backing::Air, Feed::Top, 11, &settings).unwrap_err();
    assert_eq!(error.field, "core_lag_threshold");
    let settings = UniformitySettings { fractions: vec![0.25], core_lag_threshold: 0.05 };
    let solution = solve_stack_with(F_2450_HZ, &stack, Backing::Air, Feed::Top, 201, &settings).unwrap();
    let uniformity = solution.uniformity.unwrap();
    assert_eq!(uniformity.fraction_depths.len(), 1);
    assert_eq!(uniformity.core_lag_threshold, 0.05);
}

#[test]
fn no_product_layer_gives_no_uniformity_and_says_so() {
    let stack = [layer("belt", 0.002, 2.1, 0.0006, false)];
    let solution = solve_stack(F_2450_HZ, &stack, Backing::Air, Feed::Top, 11).unwrap();
    assert_eq!(solution.uniformity, None);
    assert!(solution.warnings.iter().any(|warning| warning.code == "no_product_layer"));
}

#[test]
fn lossless_product_and_coarse_sampling_are_flagged() {
    let lossless = [layer("glass", 0.01, 6.0, 0.0, true)];
    let solution = solve_stack(F_2450_HZ, &lossless, Backing::Air, Feed::Top, 101).unwrap();
    assert!(solution.warnings.iter().any(|warning| warning.code == "product_lossless"));
    assert_eq!(solution.uniformity.as_ref().unwrap().min_to_max_ratio, None);

    // 5 cm of water at 2450 MHz holds about 7 half-wavelengths: 11 samples cannot resolve them.
    let water = [layer("water", 0.05, 78.0, 13.4, true)];
    let coarse = solve_stack(F_2450_HZ, &water, Backing::Air, Feed::Top, 11).unwrap();
    assert!(coarse.warnings.iter().any(|warning| warning.code == "coarse_depth_sampling"));
    let fine = solve_stack(F_2450_HZ, &water, Backing::Air, Feed::Top, 201).unwrap();
    assert!(!fine.warnings.iter().any(|warning| warning.code == "coarse_depth_sampling"));
}

#[test]
fn stack_document_reads_the_documented_format() {
    let text = r#"{
        "layers": [
            {"name": "product", "thickness_m": 0.05, "eps_real": 50, "eps_imag": 15, "product": true},
            {"thickness_m": 0.002, "eps_real": 2.1, "eps_imag": 0.0006}
        ],
        "backing": {"eps_real": 4, "eps_imag": 0.1}
    }"#;
    let document: StackDocument = serde_json::from_str(text).unwrap();
    let (layers, backing) = document.to_stack().unwrap();
    assert_eq!(layers.len(), 2);
    assert_eq!(layers[1].name, "layer 2");
    assert!(layers[0].is_product && !layers[1].is_product);
    assert_eq!(backing, Backing::Material(ComplexPermittivity::new(4.0, 0.1)));

    for (name, expected) in [("air", Backing::Air), ("metal", Backing::Metal)] {
        let text =
            format!(r#"{{"layers": [{{"thickness_m": 0.01, "eps_real": 2, "eps_imag": 0}}], "backing": "{name}"}}"#);
        let document: StackDocument = serde_json::from_str(&text).unwrap();
        assert_eq!(document.to_stack().unwrap().1, expected);
    }
    let default: StackDocument =
        serde_json::from_str(r#"{"layers": [{"thickness_m": 0.01, "eps_real": 2, "eps_imag": 0}]}"#).unwrap();
    assert_eq!(default.backing, BackingDocument::Air);

    let error = serde_json::from_str::<StackDocument>(
        r#"{"layers": [{"thickness_m": 0.01, "eps_real": 2, "eps_imag": 0}], "backing": "steel"}"#,
    )
    .unwrap_err();
    assert!(error.to_string().contains("\"metal\""), "{error}");
    let error =
        serde_json::from_str::<StackDocument>(r#"{"layers": [{"thickness": 0.01, "eps_real": 2, "eps_imag": 0}]}"#)
            .unwrap_err();
    assert!(error.to_string().contains("thickness"), "{error}");

    let bad: StackDocument = serde_json::from_str(
        r#"{"layers": [{"thickness_m": 0.01, "eps_real": 2, "eps_imag": 0}, {"thickness_m": 20, "eps_real": 2, "eps_imag": 0}]}"#,
    )
    .unwrap();
    assert_eq!(bad.to_stack().unwrap_err().field, "layers[1].thickness_m");
}

/// The profile as every sample was evaluated before the shared exponentials: two direct
/// exponentials per sample and side (the reference for `sampling`, kept here verbatim).
fn profile_by_direct_evaluation(solved: &Solved, layer_index: usize, samples: usize) -> Vec<f64> {
    let slab = solved.slabs[layer_index];
    let count = solved.slabs.len();
    let density = |one: &OneSided, position: usize, depth_in_slab_m: f64| {
        if slab.eps_imag == 0.0 {
            return 0.0;
        }
        let (forward, backward) = one.amplitudes[position];
        let field = forward * propagator(solved.k0, slab.index, depth_in_slab_m)
            + backward * propagator(solved.k0, slab.index, slab.thickness_m - depth_in_slab_m);
        solved.k0 * slab.eps_imag * field.norm_sqr() / one.incident_index_re
    };
    (0..samples)
        .map(|sample| {
            let local_m = if sample + 1 == samples {
                slab.thickness_m
            } else {
                slab.thickness_m * sample as f64 / (samples - 1) as f64
            };
            let mut total = 0.0;
            for (side, share, one) in solved.sides() {
                total += share
                    * match side {
                        FeedSide::Top => density(one, layer_index, local_m),
                        FeedSide::Bottom => density(one, count - 1 - layer_index, slab.thickness_m - local_m),
                    };
            }
            total
        })
        .collect()
}

fn check_sampling_against_direct_evaluation(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples: usize,
) {
    let solved = solve_sides(frequency_hz, layers, backing, feed, samples).unwrap();
    for layer_index in 0..layers.len() {
        let reference = profile_by_direct_evaluation(&solved, layer_index, samples);
        let sampled = LayerSamples::new(&solved, layer_index, samples);
        let mut profile = Vec::new();
        sampled.each(|_, density| profile.push(density));
        // Bit for bit: the same exponentials of the same distances, only shared.
        let bits = |values: &[f64]| values.iter().map(|v| v.to_bits()).collect::<Vec<_>>();
        assert_eq!(
            bits(&profile),
            bits(&reference),
            "layer {layer_index} of {layers:?} at {frequency_hz} Hz, {feed:?}"
        );
        let highest = reference.iter().copied().reduce(f64::max).unwrap();
        assert_eq!(sampled.peak().to_bits(), highest.to_bits(), "peak of layer {layer_index} of {layers:?}, {feed:?}");
    }
    // The march's reading is the full solution's, bit for bit.
    let optics = product_optics(frequency_hz, layers, backing, feed, samples).unwrap();
    let full = solve_stack(frequency_hz, layers, backing, feed, samples).unwrap();
    let full_max = full
        .depth_profile
        .iter()
        .filter(|sample| layers[sample.layer].is_product)
        .map(|sample| sample.power_density_per_incident_flux_per_m)
        .reduce(f64::max);
    assert_eq!(optics.product_absorptance.to_bits(), full.product_absorptance.to_bits());
    assert_eq!(optics.max_product_power_density_per_m.map(f64::to_bits), full_max.map(f64::to_bits));
}

#[test]
fn shared_exponentials_and_the_peak_search_change_no_bit() {
    // The cases where the peak's error bound is tightest or useless: a symmetric bed fed from
    // both sides (two equal candidates), a thin product on metal (the field nearly cancels
    // everywhere), thick and very lossy layers (underflow), and phases of millions of radians.
    let cases: &[(f64, &[Layer], Backing, Feed, usize)] = &[
        (915e6, &[layer("beef", 0.1, 4.0, 0.6, true)], Backing::Air, Feed::BothSides, 41),
        (915e6, &[layer("beef", 0.1, 4.0, 0.6, true)], Backing::Air, Feed::BothSides, 40),
        (2450e6, &[layer("wet", 0.065, 78.0, 13.4, true)], Backing::Air, Feed::BothSides, 131),
        (2450e6, &[layer("thin", 1e-4, 40.0, 12.0, true)], Backing::Metal, Feed::Top, 41),
        (
            1e6,
            &[layer("thin", 1e-4, 2.0, 1e-6, true), layer("gap", 0.01, 1.0, 0.0, false)],
            Backing::Metal,
            Feed::Top,
            41,
        ),
        (3e11, &[layer("deep", 10.0, 1000.0, 1e6, true)], Backing::Air, Feed::BothSides, 41),
        (3e11, &[layer("phase", 10.0, 1000.0, 1e-3, true)], Backing::Air, Feed::Top, 5000),
        (
            2450e6,
            &[layer("water", 0.5, 78.0, 10.0, false), layer("under", 0.02, 40.0, 12.0, true)],
            Backing::Air,
            Feed::Top,
            41,
        ),
        (
            2450e6,
            &[
                layer("product", 0.025, 36.0, 17.0, true),
                layer("tray", 0.0015, 2.25, 0.0011, false),
                layer("belt", 0.001, 2.9, 0.004, false),
                layer("air gap", 0.03, 1.0, 0.0, false),
            ],
            Backing::Metal,
            Feed::Top,
            41,
        ),
    ];
    for &(frequency_hz, layers, backing, feed, samples) in cases {
        check_sampling_against_direct_evaluation(frequency_hz, layers, backing, feed, samples);
    }
}

#[test]
fn a_mirrored_stack_fed_from_below_is_its_feed_from_above() {
    // The solver reuses the top-fed solution for a one-layer bed in air fed from both sides;
    // solving the reversed stack must give the same numbers to the bit.
    let stack = [layer("bed", 0.1, 4.0, 0.6, true)];
    let solved = solve_sides(915e6, &stack, Backing::Air, Feed::BothSides, 41).unwrap();
    let slabs: Vec<Slab> = stack.iter().map(slab_of).collect();
    let solved_again = solve_one_sided(solved.k0, Complex::ONE, &slabs, Exit::Medium(Complex::ONE));
    let bits = |one: &OneSided| {
        let mut bits = vec![one.reflectance.to_bits(), one.transmittance.to_bits(), one.incident_index_re.to_bits()];
        for (forward, backward) in &one.amplitudes {
            bits.extend([forward.re, forward.im, backward.re, backward.im].map(f64::to_bits));
        }
        bits.extend(one.absorptances.iter().map(|a| a.to_bits()));
        bits
    };
    let bottom = solved.sides().nth(1).map(|(_, _, one)| bits(one));
    assert_eq!(bottom, Some(bits(&solved_again)));
    assert!(matches!(solved.sides[1].2, SideSolution::TopFed));
}

proptest! {
    #[test]
    fn any_stack_samples_as_by_direct_evaluation(
        frequency_hz in prop_oneof![1e6f64..1e8, 1e8f64..1e10, 1e10f64..3e11],
        layers in prop::collection::vec(arbitrary_layer(), 1..6),
        backing in arbitrary_backing(),
        feed in arbitrary_feed(),
        samples in prop_oneof![2usize..8, 40usize..45, 100usize..140],
    ) {
        let feed = match backing {
            Backing::Metal => Feed::Top,
            Backing::Material(eps) if eps.eps_imag > 0.0 => Feed::Top,
            _ => feed,
        };
        check_sampling_against_direct_evaluation(frequency_hz, &layers, backing, feed, samples);
    }
}

proptest! {
    #[test]
    fn the_peak_searchs_error_bound_holds_at_every_sample(
        frequency_hz in prop_oneof![1e6f64..1e8, 1e8f64..1e10, 1e10f64..3e11],
        layers in prop::collection::vec(arbitrary_layer(), 1..6),
        backing in arbitrary_backing(),
        feed in arbitrary_feed(),
        samples in prop_oneof![2usize..8, 40usize..45, 1000usize..1100],
        one_bed_fed_alike in any::<bool>(),
    ) {
        // What makes the peak exact: every exact sample lies within its approximation's bound.
        // Half the cases are one bed in air fed from both sides, where the two sides mirror.
        let (layers, backing, feed) =
            if one_bed_fed_alike { (layers[..1].to_vec(), Backing::Air, Feed::BothSides) } else { (layers, backing, feed) };
        let feed = match backing {
            Backing::Metal => Feed::Top,
            Backing::Material(eps) if eps.eps_imag > 0.0 => Feed::Top,
            _ => feed,
        };
        let solved = solve_sides(frequency_hz, &layers, backing, feed, samples).unwrap();
        for layer_index in 0..layers.len() {
            let sampled = LayerSamples::new(&solved, layer_index, samples);
            let Some(approximate) = sampled.approximate() else { continue };
            for (index, value) in approximate.values.iter().enumerate() {
                let (exact, error) = (sampled.exact(index), approximate.error(*value));
                prop_assert!((value - exact).abs() <= error, "{index}: {value} +- {error} vs {exact}");
            }
        }
    }
}

#[test]
fn reused_buffers_give_every_solve_its_own_numbers() {
    // One set of buffers through stacks of different lengths, feeds and backings (a mirrored bed,
    // a stack fed from below on its own, metal-backed), in an order that leaves longer vectors
    // behind for shorter stacks: each result is the fresh solve's, bit for bit.
    let bed = layer("bed", 0.1, 12.0, 4.0, true);
    let stacks: Vec<(Vec<Layer>, Backing, Feed)> = vec![
        (
            vec![bed.clone(), layer("tray", 0.004, 3.0, 0.01, false), layer("belt", 0.002, 2.5, 0.02, false)],
            Backing::Air,
            Feed::BothSides,
        ),
        (vec![bed.clone()], Backing::Air, Feed::BothSides),
        (vec![layer("thin", 0.01, 40.0, 12.0, true), bed.clone()], Backing::Metal, Feed::Top),
        (vec![bed.clone(), layer("gap", 0.02, 1.0, 0.0, false)], Backing::Air, Feed::Bottom),
        (vec![bed.clone()], Backing::Air, Feed::Top),
        (vec![layer("lossless", 0.05, 2.0, 0.0, true)], Backing::Air, Feed::BothSides),
    ];
    let mut buffers = SolveBuffers::default();
    for round in 0..2 {
        for (layers, backing, feed) in &stacks {
            for samples in [41, 7] {
                let fresh = product_optics(915e6, layers, *backing, *feed, samples).unwrap();
                let reused = product_optics_with(915e6, layers, *backing, *feed, samples, &mut buffers).unwrap();
                let bits = |optics: &ProductOptics| {
                    (optics.product_absorptance.to_bits(), optics.max_product_power_density_per_m.map(f64::to_bits))
                };
                assert_eq!(bits(&reused), bits(&fresh), "round {round}, {layers:?}, {feed:?}, {samples} samples");
            }
        }
    }
    // A refused stack leaves the buffers fit for the next one.
    assert!(product_optics_with(915e6, &[], Backing::Air, Feed::Top, 41, &mut buffers).is_err());
    let (layers, backing, feed) = &stacks[0];
    assert_eq!(
        product_optics_with(915e6, layers, *backing, *feed, 41, &mut buffers).unwrap(),
        product_optics(915e6, layers, *backing, *feed, 41).unwrap()
    );
}
