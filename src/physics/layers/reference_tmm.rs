//! Reference values from an independent transfer-matrix code: the Python package `tmm` 0.2.0 from
//! PyPI (S. J. Byrnes, "Multilayer optical calculations", arXiv:1603.02720, 2016), run with
//! numpy 2.4 at normal incidence, s polarisation (the same at normal incidence), lengths in metres.
//!
//! `tmm` uses the e^{-i omega t} convention, so it was given n = sqrt(eps' + i eps''), the complex
//! conjugate of our index; reflectance, transmittance, absorptance and the absorbed power density
//! (`position_resolved(...)['absor']`, fraction of incident power per metre) do not depend on the
//! convention. The script, for re-running:
//!
//! ```text
//! import numpy as np, tmm; from numpy import inf
//! n = lambda er, ei: np.sqrt(complex(er, ei))
//! data = tmm.coh_tmm('s', [n(*incident)] + [n(er, ei) for (d, er, ei) in layers] + [n(*exit)],
//!                    [inf] + [d for (d, er, ei) in layers] + [inf], 0, 299792458.0 / f)
//! R, T, A = data['R'], data['T'], tmm.absorp_in_each_layer(data)[1:-1]
//! p = tmm.position_resolved(layer + 1, distance, data)['absor']
//! ```
//!
//! Layers below are listed in the order the wave meets them; for the bottom-fed row that is the
//! reverse of the stack's top-down order, and `tmm`'s incident medium is the backing.

use super::{solve_stack, Backing, ComplexPermittivity, Feed, Layer};
use approx::assert_relative_eq;

/// Relative tolerance on R, T and the product's absorptance: both codes are exact up to rounding,
/// and the values are printed to 16 digits; 1e-9 leaves room for the different algebra.
const POWER_TOLERANCE_RELATIVE: f64 = 1e-9;
/// Absolute tolerance on absorptances of nearly lossless layers: `tmm` takes them as a difference
/// of Poynting fluxes, which leaves about 1e-17 of rounding (it prints 6.9e-18 for an air gap).
const POWER_TOLERANCE_ABSOLUTE: f64 = 1e-14;
/// Relative tolerance on the power density at a point, 1/m.
const DENSITY_TOLERANCE_RELATIVE: f64 = 1e-9;
/// Samples per layer: puts a profile sample on every reference depth listed below.
const SAMPLES: usize = 201;

struct Row {
    name: &'static str,
    frequency_hz: f64,
    /// (thickness m, eps', eps'') in the order the wave meets them.
    layers_in_wave_order: &'static [(f64, f64, f64)],
    backing: Backing,
    feed: Feed,
    reflectance: f64,
    transmittance: f64,
    /// In the order the wave meets the layers.
    absorptances_in_wave_order: &'static [f64],
    /// (layer in wave order, distance from that layer's entry face in m, p in 1/m).
    points: &'static [(usize, f64, f64)],
}

const ROWS: &[Row] = &[
    Row {
        name: "product_on_belt_2450",
        frequency_hz: 2450e6,
        layers_in_wave_order: &[(0.05, 50.0, 15.0), (0.002, 2.1, 0.0006)],
        backing: Backing::Air,
        feed: Feed::Top,
        reflectance: 5.752985795882681e-01,
        transmittance: 8.515960954040324e-04,
        absorptances_in_wave_order: &[4.238497720448288e-01, 5.227149896356188e-08],
        points: &[
            (0, 0.0, 4.59913436286396e+01),
            (0, 0.005, 2.668474612623536e+01),
            (0, 0.0125, 1.166311681125748e+01),
            (0, 0.025, 3.396059426098391e+00),
            (0, 0.049, 5.624499961436504e-01),
            (0, 0.05, 6.483657815324652e-01),
            (1, 0.001, 2.616080477323544e-05),
        ],
    },
    Row {
        name: "gap_tray_on_block_915",
        frequency_hz: 915e6,
        layers_in_wave_order: &[(0.03, 60.0, 20.0), (0.01, 1.0, 0.0), (0.004, 4.0, 0.04)],
        backing: Backing::Material(ComplexPermittivity::new(3.0, 0.3)),
        feed: Feed::Top,
        reflectance: 6.828214985407683e-01,
        transmittance: 4.120799328722467e-02,
        absorptances_in_wave_order: &[2.758972591894599e-01, 6.938893903907228e-18, 7.324898254715273e-05],
        points: &[
            (0, 0.0, 1.158303599987881e+01),
            (0, 0.0099, 1.473846661075527e+01),
            (0, 0.0198, 2.149260862117297e+00),
            (0, 0.0297, 9.88896821877126e+00),
            (1, 0.0045, 0.0),
            (2, 0.002, 1.832136048315333e-02),
        ],
    },
    Row {
        name: "conductive_rf_27",
        frequency_hz: 27.12e6,
        layers_in_wave_order: &[(0.1, 70.0, 400.0), (0.005, 3.0, 0.01)],
        backing: Backing::Air,
        feed: Feed::Top,
        reflectance: 8.418738178427836e-01,
        transmittance: 6.696476186275549e-03,
        absorptances_in_wave_order: &[1.514295156603992e-01, 1.903105416294765e-07],
        points: &[
            (0, 0.0, 1.685572786776482e+00),
            (0, 0.02, 1.520929451908234e+00),
            (0, 0.05, 1.474147076898152e+00),
            (0, 0.099, 1.522424241019809e+00),
            (1, 0.002, 3.806209192944787e-05),
        ],
    },
    Row {
        name: "bottom_fed_through_window_2450",
        frequency_hz: 2450e6,
        layers_in_wave_order: &[(0.003, 2.6, 0.01), (0.04, 20.0, 6.0)],
        backing: Backing::Material(ComplexPermittivity::new(4.0, 0.0)),
        feed: Feed::Bottom,
        reflectance: 1.502946439077998e-01,
        transmittance: 3.337792717412579e-02,
        absorptances_in_wave_order: &[3.849104660069713e-04, 8.159425184520673e-01],
        points: &[
            (0, 0.0, 1.631995256537835e-01),
            (0, 0.0015, 1.253829180270868e-01),
            (1, 0.0128, 2.941234966636758e+01),
            (1, 0.03, 8.312180403193375e+00),
            (1, 0.0398, 1.026283289504631e+01),
        ],
    },
];

fn check(row: &Row) {
    let count = row.layers_in_wave_order.len();
    let bottom_fed = row.feed == Feed::Bottom;
    // The stack is given top-down: reverse the wave order for a bottom-fed row.
    let to_stack_index = |wave_index: usize| {
        if bottom_fed {
            count - 1 - wave_index
        } else {
            wave_index
        }
    };
    let mut layers: Vec<Layer> = row
        .layers_in_wave_order
        .iter()
        .enumerate()
        .map(|(index, &(thickness_m, eps_real, eps_imag))| Layer {
            name: format!("wave-order layer {index}"),
            thickness_m,
            permittivity: ComplexPermittivity::new(eps_real, eps_imag),
            is_product: index == 0,
        })
        .collect();
    if bottom_fed {
        layers.reverse();
    }
    let solution = solve_stack(row.frequency_hz, &layers, row.backing, row.feed, SAMPLES)
        .unwrap_or_else(|error| panic!("{}: {error}", row.name));
    assert_relative_eq!(solution.reflectance, row.reflectance, max_relative = POWER_TOLERANCE_RELATIVE);
    assert_relative_eq!(solution.transmittance, row.transmittance, max_relative = POWER_TOLERANCE_RELATIVE);
    for (wave_index, &expected) in row.absorptances_in_wave_order.iter().enumerate() {
        let ours = solution.layers[to_stack_index(wave_index)].absorptance;
        assert_relative_eq!(
            ours,
            expected,
            epsilon = POWER_TOLERANCE_ABSOLUTE,
            max_relative = POWER_TOLERANCE_RELATIVE
        );
    }
    for &(wave_index, distance_m, expected) in row.points {
        let layer = to_stack_index(wave_index);
        let thickness = layers[layer].thickness_m;
        let local_from_top = if bottom_fed { thickness - distance_m } else { distance_m };
        let depth_m = solution.layers[layer].top_depth_m + local_from_top;
        let sample = solution
            .depth_profile
            .iter()
            .find(|sample| sample.layer == layer && (sample.depth_m - depth_m).abs() < 1e-12)
            .unwrap_or_else(|| panic!("{}: no sample at {depth_m} m", row.name));
        assert_relative_eq!(
            sample.power_density_per_incident_flux_per_m,
            expected,
            epsilon = 1e-15,
            max_relative = DENSITY_TOLERANCE_RELATIVE
        );
    }
}

#[test]
fn matches_the_tmm_package() {
    for row in ROWS {
        check(row);
    }
}
