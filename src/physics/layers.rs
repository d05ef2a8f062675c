//! Layered loads: a one-dimensional stack of dielectric layers (product, tray, belt, air gap) hit by
//! a plane wave at normal incidence, solved for reflection, transmission, absorption per layer and
//! the power density profile through the depth, standing waves included.
//!
//! # Model
//!
//! Normal incidence of a plane wave from a semi-infinite incident medium (free space, n0 = 1, for a
//! feed from above) onto layers j = 1..N of thickness d_j and relative permittivity
//! eps_j = eps'_j - j eps''_j (time convention e^{+j omega t}), then a semi-infinite backing.
//! Non-magnetic materials (mu_r = 1), infinite lateral extent, linear and time-harmonic fields.
//!
//! In layer j, with local depth u in [0, d_j] measured from the layer's top face:
//!
//! ```text
//! n_j = sqrt(eps_j)  (Im n_j <= 0),   k_j = k0 n_j = beta_j - j alpha_j,   k0 = 2 pi f / c0
//! E(u)      = a_j e^{-j k_j u} + c_j e^{-j k_j (d_j - u)}
//! eta0 H(u) = n_j [a_j e^{-j k_j u} - c_j e^{-j k_j (d_j - u)}]
//! ```
//!
//! where a_j is the forward (downward) wave at the layer's top face and c_j the backward wave at its
//! bottom face. Both exponentials decay away from the face they are referred to, so no quantity
//! grows with the thickness: half a metre of water at 2450 MHz underflows harmlessly to zero
//! instead of overflowing (the plain characteristic matrix, whose cos/sin of a complex phase grow
//! as e^{alpha d}, overflows there).
//!
//! The solution runs twice over the stack (the reflection-coefficient form of the transfer-matrix
//! method, Orfanidis, *Electromagnetic Waves and Antennas*, ch. 6 "Multilayer Structures", the
//! layer recursion for Gamma, from memory). First bottom to top, the ratio G_j of backward to
//! forward wave at the bottom face of layer j, and the stack's reflection coefficient r; then top
//! to bottom, the forward waves from the continuity of E and H across each interface:
//!
//! ```text
//! r_j = (n_j - n_{j+1}) / (n_j + n_{j+1})         Fresnel, normal incidence (n_0 = incident)
//! G_N = (n_N - n_s) / (n_N + n_s)                 into a backing of index n_s
//! G_N = -1                                        on a metal (E = 0)
//! g_j = G_j e^{-2 j k_j d_j}                      the same ratio at the layer's top face
//! G_j = (r_j + g_{j+1}) / (1 + r_j g_{j+1})
//! r   = (r_0 + g_1) / (1 + r_0 g_1)
//! a_1 = (1 + r_0) / (1 + r_0 g_1)                 for a unit incident wave
//! a_{j+1} = a_j e^{-j k_j d_j} (1 + r_j) / (1 + r_j g_{j+1})
//! c_j = G_j a_j e^{-j k_j d_j}
//! a_s = a_N e^{-j k_N d_N} (1 + r_N)              the wave entering the backing
//! ```
//!
//! The denominators equal 2 n_{j+1} (n_j + Y) / ((n_j + n_{j+1}) (n_{j+1} + Y)), with Y the
//! admittance looking down, and never vanish for a passive load (Re Y >= 0, Re n_j > 0).
//!
//! This is algebraically the same as the Abelès characteristic matrix of Born & Wolf, *Principles
//! of Optics*, 7th ed. (1999), §1.6 (there for e^{-i omega t}), written for e^{+j omega t} in
//! shared/sources.md §11; the tests compute that product independently with the `num-complex`
//! crate and compare:
//!
//! ```text
//! M_j = [[cos delta_j, j sin delta_j / n_j], [j n_j sin delta_j, cos delta_j]],  delta_j = k0 n_j d_j
//! [B, C]^T = (prod M_j) [1, n_s]^T,   r = (n0 B - C) / (n0 B + C),   t = 2 n0 / (n0 B + C)
//! ```
//!
//! # Powers, all as fractions of the incident power flux
//!
//! Peak phasors throughout; the ratios below are the same for RMS phasors. The incident flux is
//! S_inc = Re(n0) |E_inc|^2 / (2 eta0), the time-averaged power density
//! p(z) = (1/2) omega eps0 eps'' |E(z)|^2 in W/m^3. Their ratio (omega eps0 eta0 = k0) is the depth
//! profile reported here, and the absorptance of layer j is its exact integral over the layer:
//!
//! ```text
//! p(z) / S_inc = k0 eps''(z) |E(z) / E_inc|^2 / Re(n0)      1/m, i.e. W/m^3 per W/m^2 incident
//! A_j = k0 eps''_j / Re(n0) [ (|a_j|^2 + |c_j|^2) (1 - e^{-2 alpha_j d_j}) / (2 alpha_j)
//!                             + 2 Re(a_j conj c_j) e^{-alpha_j d_j} sin(beta_j d_j) / beta_j ]
//! R = |r|^2                                                  the incident medium is lossless
//! T = Re(n_s) |a_s|^2 / Re(n0)                               into the backing; 0 on metal
//! ```
//!
//! R + T + sum A_j = 1 is not built in: the tests check it to 1e-9 as an energy balance.
//!
//! # Feeding
//!
//! - `Top`: the wave comes from free space above the first layer; the backing lies below the last.
//! - `Bottom`: the whole arrangement reversed: the wave comes up through the backing medium (free
//!   space for an `Air` backing), meets the last layer first, and leaves into free space above the
//!   first layer. A `Metal` backing blocks a feed from below and is refused; so is a lossy
//!   `Material` backing, since incident power is not defined inside a lossy half-space (give the
//!   lossy material as a layer instead).
//! - `BothSides`: one top-fed and one bottom-fed solution, each with half the incident power, summed
//!   incoherently (power densities add; the two sources are assumed mutually incoherent, e.g.
//!   separate magnetrons, so their standing waves do not interfere). Reflectance and transmittance
//!   are then the halves' averages: power going back towards its own source, and through to the
//!   opposite side.
//!
//! # Uniformity
//!
//! Over the layers marked as product: the ratio of minimum to maximum sampled power density, the
//! depth from the fed surface at which the power density first falls to each stated fraction of the
//! surface value, and a "core lags" warning when the lagging point (the product's far face for a
//! one-sided feed, its centre for two-sided feeding) gets less than a threshold fraction of the fed
//! surface's value. The default threshold of one half ([`CORE_LAG_THRESHOLD_DEFAULT`]) is common
//! practice, a planning rule of thumb rather than a published limit.
//!
//! # Stack file (JSON), read by the `doubleprime layers` command
//!
//! ```json
//! {
//!   "layers": [
//!     {"name": "product", "thickness_m": 0.05, "eps_real": 50, "eps_imag": 15, "product": true},
//!     {"name": "tray", "thickness_m": 0.003, "eps_real": 2.6, "eps_imag": 0.01},
//!     {"name": "belt", "thickness_m": 0.002, "eps_real": 2.1, "eps_imag": 0.0006}
//!   ],
//!   "backing": "air"
//! }
//! ```
//!
//! Layers are listed from the top down. `name` is optional (default `layer N`), `product` is
//! optional (default `false`). `backing` is optional (default `"air"`): `"air"` (free space below),
//! `"metal"` (a perfectly conducting plate directly below the last layer) or
//! `{"eps_real": .., "eps_imag": ..}` (a semi-infinite material). An air gap is a layer with
//! `eps_real` 1 and `eps_imag` 0. Limits: 1 to 200 layers, 0 < thickness_m <= 10,
//! 1 <= eps_real <= 1000, 0 <= eps_imag <= 1e6. Unknown keys are refused. A feed from below
//! needs an `"air"` backing or a lossless material one.

use crate::error::{require_in, require_positive, InputError};
use crate::physics::complex::Complex;
use crate::physics::constants::SPEED_OF_LIGHT_M_PER_S;
use crate::physics::permittivity::ComplexPermittivity;
use sampling::LayerSamples;
use serde::{Deserialize, Deserializer, Serialize};
use std::f64::consts::PI;
use std::fmt;

#[cfg(test)]
mod reference_tmm;
mod sampling;
#[cfg(test)]
mod tests;

/// Most layers accepted in one stack.
pub const LAYERS_MAX: usize = 200;
/// Thickest layer accepted, m.
pub const THICKNESS_MAX_M: f64 = 10.0;
/// Lowest frequency accepted, Hz (0.001 MHz), as for a plane wave.
pub const FREQUENCY_MIN_HZ: f64 = crate::physics::waves::FREQUENCY_MIN_HZ;
/// Highest frequency accepted, Hz (300 GHz, as everywhere in the core).
pub const FREQUENCY_MAX_HZ: f64 = crate::physics::waves::FREQUENCY_MAX_HZ;
/// Fewest depth samples per layer (both faces).
pub const SAMPLES_PER_LAYER_MIN: usize = 2;
/// Most depth samples per layer: 200 layers at 5000 samples stay near a million points.
pub const SAMPLES_PER_LAYER_MAX: usize = 5000;
/// Fractions of the surface power density whose depths are reported by default: one half and 1/e.
pub const FRACTIONS_DEFAULT: [f64; 2] = [0.5, 0.367_879_441_171_442_3];
/// Default core-lag threshold: the lagging point should get at least half the surface power
/// density (common practice: a planning rule of thumb, not a published limit).
pub const CORE_LAG_THRESHOLD_DEFAULT: f64 = 0.5;
/// Standing-wave resolution below which a warning is given: samples per half wavelength in a
/// product layer (|E|^2 repeats every half wavelength; ten points per period keeps the sampled
/// minimum and maximum within a few per cent of the true ones for moderate standing waves).
pub const SAMPLES_PER_HALF_WAVELENGTH_MIN: f64 = 10.0;

/// One layer of the stack, listed from the top down.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Layer {
    /// What the layer is ("product", "tray", "belt", "air gap").
    pub name: String,
    /// Thickness, m (0 < d <= 10).
    pub thickness_m: f64,
    /// Relative complex permittivity.
    pub permittivity: ComplexPermittivity,
    /// True for the layers whose heating uniformity is assessed.
    pub is_product: bool,
}

/// What lies beyond the last layer.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Backing {
    /// Free space: what passes the stack leaves into air.
    Air,
    /// A perfectly conducting plate against the last layer (E = 0 there): a short.
    Metal,
    /// A semi-infinite material (no wave returns from its far side).
    Material(ComplexPermittivity),
}

/// From which side the power arrives.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Feed {
    /// From free space above the first layer.
    Top,
    /// From below, through the backing medium, the stack reversed.
    Bottom,
    /// Half the power from each side, the two summed incoherently.
    BothSides,
}

/// One feeding side, as used in the per-side results.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum FeedSide {
    /// Fed from above.
    Top,
    /// Fed from below.
    Bottom,
}

/// How the uniformity of the product's heating is measured.
#[derive(Debug, Clone, PartialEq)]
pub struct UniformitySettings {
    /// Fractions of the surface power density (each 0 < f < 1) whose depths are reported.
    pub fractions: Vec<f64>,
    /// The core lags when it gets less than this fraction of the surface power density (0 < t <= 1).
    pub core_lag_threshold: f64,
}

impl UniformitySettings {
    /// The default settings: fractions 0.5 and 1/e, threshold 0.5 (common practice).
    pub fn common_practice() -> Self {
        Self { fractions: FRACTIONS_DEFAULT.to_vec(), core_lag_threshold: CORE_LAG_THRESHOLD_DEFAULT }
    }
}

/// The result for one layer.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LayerResult {
    /// The layer's name.
    pub name: String,
    /// Thickness, m.
    pub thickness_m: f64,
    /// Depth of the layer's top face below the stack's top surface, m.
    pub top_depth_m: f64,
    /// Whether the layer is product.
    pub is_product: bool,
    /// Fraction of the incident power absorbed in this layer.
    pub absorptance: f64,
}

/// Reflection and transmission for one feeding side, per unit of that side's own incident power.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SideResult {
    /// The side the power comes from.
    pub side: FeedSide,
    /// Share of the total incident power that this side delivers (1 or 0.5).
    pub incident_share: f64,
    /// Fraction of this side's power reflected back towards it.
    pub reflectance: f64,
    /// Fraction of this side's power leaving through the far side.
    pub transmittance: f64,
    /// Fraction of this side's power absorbed in the stack.
    pub absorptance: f64,
}

/// One point of the depth profile.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct DepthSample {
    /// Depth below the stack's top surface, m.
    pub depth_m: f64,
    /// Index of the layer (in the order given) the sample belongs to. Interfaces appear twice,
    /// once for each layer, since the power density jumps with eps''.
    pub layer: usize,
    /// Power density per unit incident power flux, W/m^3 per W/m^2 = 1/m.
    pub power_density_per_incident_flux_per_m: f64,
}

/// Depth at which the power density first falls to a fraction of the surface value.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct FractionDepth {
    /// The fraction of the fed surface's power density.
    pub fraction: f64,
    /// Distance from the fed product surface into the product, m (for two-sided feeding the
    /// shallower of the two sides, each searched up to the centre); `None` if it never falls so low.
    pub depth_m: Option<f64>,
}

/// How evenly the product heats, from the sampled depth profile.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Uniformity {
    /// Total product thickness from its top face to its bottom face, m.
    pub product_thickness_m: f64,
    /// Lowest sampled power density in the product, 1/m (per unit incident flux).
    pub min_power_density_per_m: f64,
    /// Highest sampled power density in the product, 1/m.
    pub max_power_density_per_m: f64,
    /// min / max; `None` when the product absorbs nothing (lossless).
    pub min_to_max_ratio: Option<f64>,
    /// Power density at the fed product surface, 1/m (two-sided: the higher of the two faces).
    pub surface_power_density_per_m: f64,
    /// Depth below the stack's top surface of the point that heats last by geometry: the far face
    /// for a one-sided feed, the product's centre for two-sided feeding, m.
    pub core_depth_m: f64,
    /// Power density there, 1/m.
    pub core_power_density_per_m: f64,
    /// core / surface; `None` when the surface value is zero.
    pub core_to_surface_ratio: Option<f64>,
    /// Depths reaching each requested fraction of the surface value.
    pub fraction_depths: Vec<FractionDepth>,
    /// The threshold used for `core_lags`.
    pub core_lag_threshold: f64,
    /// True when core_to_surface_ratio < core_lag_threshold.
    pub core_lags: bool,
}

/// "Computed, but look at this": a code for programs and a sentence for people.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StackWarning {
    /// Stable identifier (`core_lags`, `no_product_layer`, ...).
    pub code: &'static str,
    /// The explanation and what to do about it.
    pub message: String,
}

/// Everything solved for one stack at one frequency.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StackSolution {
    /// Frequency, Hz.
    pub frequency_hz: f64,
    /// How the stack is fed.
    pub feed: Feed,
    /// Depth samples per layer in the profile.
    pub samples_per_layer: usize,
    /// Fraction of the total incident power reflected (towards its source).
    pub reflectance: f64,
    /// Fraction of the total incident power passing through to the far side.
    pub transmittance: f64,
    /// Fraction absorbed in all layers together.
    pub absorptance: f64,
    /// Fraction absorbed in the product layers.
    pub product_absorptance: f64,
    /// Per layer, in the order given.
    pub layers: Vec<LayerResult>,
    /// Per feeding side.
    pub sides: Vec<SideResult>,
    /// Power density through the depth, top to bottom.
    pub depth_profile: Vec<DepthSample>,
    /// Uniformity of the product's heating with [`UniformitySettings::common_practice`];
    /// `None` when no layer is product.
    pub uniformity: Option<Uniformity>,
    /// Things worth a look.
    pub warnings: Vec<StackWarning>,
}

/// Solve a stack fed at normal incidence. See the module documentation for the model.
///
/// `samples_per_layer` points are placed evenly in each layer, both faces included.
pub fn solve_stack(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
) -> Result<StackSolution, InputError> {
    solve_stack_with(frequency_hz, layers, backing, feed, samples_per_layer, &UniformitySettings::common_practice())
}

/// Check a stack (layer count, thicknesses, permittivities, backing) without solving it.
pub fn validate_stack(layers: &[Layer], backing: Backing) -> Result<(), InputError> {
    if layers.is_empty() || layers.len() > LAYERS_MAX {
        return Err(InputError::new("layers", format!("{} layers", layers.len()), format!("1 to {LAYERS_MAX} layers")));
    }
    for (index, layer) in layers.iter().enumerate() {
        // The prefix is written only on failure: a march validates a stack per zone.
        let within = |error: InputError| error.within(&format!("layers[{index}]"));
        require_positive("thickness_m", layer.thickness_m, THICKNESS_MAX_M).map_err(within)?;
        ComplexPermittivity::checked(layer.permittivity.eps_real, layer.permittivity.eps_imag).map_err(within)?;
    }
    if let Backing::Material(eps) = backing {
        ComplexPermittivity::checked(eps.eps_real, eps.eps_imag).map_err(|error| error.within("backing"))?;
    }
    Ok(())
}

fn validate_request(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
) -> Result<(), InputError> {
    require_in("frequency_hz", frequency_hz, FREQUENCY_MIN_HZ, FREQUENCY_MAX_HZ)?;
    validate_stack(layers, backing)?;
    if !(SAMPLES_PER_LAYER_MIN..=SAMPLES_PER_LAYER_MAX).contains(&samples_per_layer) {
        return Err(InputError::new(
            "samples_per_layer",
            samples_per_layer,
            format!("a whole number from {SAMPLES_PER_LAYER_MIN} to {SAMPLES_PER_LAYER_MAX}"),
        ));
    }
    if let (Backing::Material(eps), Feed::Bottom | Feed::BothSides) = (backing, feed) {
        if eps.eps_imag != 0.0 {
            return Err(InputError::new(
                "backing.eps_imag",
                eps.eps_imag,
                "0 when fed from below: a wave cannot be launched from inside a lossy \
                 half-space; give the lossy material as a layer over a lossless backing or air",
            ));
        }
    }
    if backing == Backing::Metal && feed != Feed::Top {
        let feed_name = match feed {
            Feed::Bottom => "bottom",
            _ => "both",
        };
        return Err(InputError::new("feed", feed_name, "top only: a metal backing blocks any feed from below"));
    }
    Ok(())
}

/// The far side of a one-sided solution.
#[derive(Debug, Clone, Copy)]
enum Exit {
    /// A semi-infinite medium of this refractive index.
    Medium(Complex),
    /// A perfect conductor.
    Short,
}

/// One layer as the solver sees it.
#[derive(Debug, Clone, Copy)]
struct Slab {
    thickness_m: f64,
    index: Complex,
    eps_imag: f64,
}

impl Slab {
    /// The same slab to the last bit (so that solving either gives the same numbers).
    fn same_bits(&self, other: &Slab) -> bool {
        let bits = |slab: &Slab| {
            [slab.thickness_m.to_bits(), slab.index.re.to_bits(), slab.index.im.to_bits(), slab.eps_imag.to_bits()]
        };
        bits(self) == bits(other)
    }
}

/// A one-sided solution: the wave amplitudes in each slab, in the order the wave meets them.
#[derive(Clone)]
struct OneSided {
    /// Amplitude reflection coefficient r at the entry face (read by the identity tests).
    #[cfg_attr(not(test), allow(dead_code))]
    reflection: Complex,
    reflectance: f64,
    transmittance: f64,
    incident_index_re: f64,
    /// Per slab: forward amplitude at the top face, backward amplitude at the bottom face.
    amplitudes: Vec<(Complex, Complex)>,
    absorptances: Vec<f64>,
}

/// e^{-j k d} for k = k0 n: decays for Im n <= 0.
fn propagator(k0: f64, index: Complex, distance_m: f64) -> Complex {
    (Complex::new(0.0, -k0 * distance_m) * index).exp()
}

fn fresnel(from: Complex, to: Complex) -> Complex {
    (from - to) / (from + to)
}

/// [`solve_one_sided_in`] in new vectors.
#[cfg(test)]
fn solve_one_sided(k0: f64, incident: Complex, slabs: &[Slab], exit: Exit) -> OneSided {
    solve_one_sided_in(k0, incident, slabs, exit, (Vec::new(), Vec::new()))
}

/// Solve a stack fed from `incident` (a semi-infinite medium of that index) with a unit incident
/// wave at the first slab's top face, in the vectors of `room` (amplitudes, absorptances;
/// whatever they hold is replaced).
fn solve_one_sided_in(k0: f64, incident: Complex, slabs: &[Slab], exit: Exit, room: OneSidedRoom) -> OneSided {
    let (mut amplitudes, mut absorptances) = room;
    let count = slabs.len();
    // Pass 1, bottom to top: G at the bottom face of each slab, and G at its top face. Pass 2
    // writes each slab's amplitudes over its ratios once it has read them, so one vector holds
    // both.
    amplitudes.clear();
    amplitudes.resize(count, (Complex::ZERO, Complex::ZERO));
    for index in (0..count).rev() {
        let slab = slabs[index];
        let bottom_ratio = if index + 1 == count {
            match exit {
                Exit::Medium(exit_index) => fresnel(slab.index, exit_index),
                Exit::Short => -Complex::ONE,
            }
        } else {
            let interface = fresnel(slab.index, slabs[index + 1].index);
            let below = amplitudes[index + 1].1;
            (interface + below) / (Complex::ONE + interface * below)
        };
        let round_trip = propagator(k0, slab.index, 2.0 * slab.thickness_m);
        amplitudes[index] = (bottom_ratio, bottom_ratio * round_trip);
    }
    let top_ratio_first = amplitudes[0].1;
    let entry = fresnel(incident, slabs[0].index);
    let reflection = (entry + top_ratio_first) / (Complex::ONE + entry * top_ratio_first);

    // Pass 2, top to bottom: forward amplitudes from the continuity of E and H.
    let mut forward = (Complex::ONE + entry) / (Complex::ONE + entry * top_ratio_first);
    let mut exit_forward = Complex::ZERO;
    for index in 0..count {
        let slab = slabs[index];
        let at_bottom = forward * propagator(k0, slab.index, slab.thickness_m);
        let bottom_ratio = amplitudes[index].0;
        amplitudes[index] = (forward, bottom_ratio * at_bottom);
        if index + 1 < count {
            let interface = fresnel(slab.index, slabs[index + 1].index);
            // The slab below still holds its ratios.
            let top_ratio_below = amplitudes[index + 1].1;
            forward = at_bottom * (Complex::ONE + interface) / (Complex::ONE + interface * top_ratio_below);
        } else if let Exit::Medium(exit_index) = exit {
            exit_forward = at_bottom * (Complex::ONE + fresnel(slab.index, exit_index));
        }
    }

    // The incident medium is lossless (air, or a lossless backing for a feed from below), so the
    // incident and reflected waves carry their powers separately.
    let incident_index_re = incident.re;
    let reflectance = reflection.norm_sqr();
    let transmittance = match exit {
        Exit::Medium(exit_index) => exit_index.re * exit_forward.norm_sqr() / incident_index_re,
        Exit::Short => 0.0,
    };
    absorptances.clear();
    absorptances.extend(
        slabs
            .iter()
            .zip(&amplitudes)
            .map(|(slab, &(forward, backward))| slab_absorptance(k0, *slab, forward, backward) / incident_index_re),
    );
    OneSided { reflection, reflectance, transmittance, incident_index_re, amplitudes, absorptances }
}

/// k0 eps'' times the exact integral of |E|^2 over the slab (per unit incident |E|^2).
fn slab_absorptance(k0: f64, slab: Slab, forward: Complex, backward: Complex) -> f64 {
    if slab.eps_imag == 0.0 {
        return 0.0;
    }
    let alpha = -k0 * slab.index.im;
    let beta = k0 * slab.index.re;
    let d = slab.thickness_m;
    // (1 - e^{-2 alpha d}) / (2 alpha), written with expm1 so that a very low loss keeps its digits.
    let decaying = if alpha > 0.0 { -(-2.0 * alpha * d).exp_m1() / (2.0 * alpha) } else { d };
    let cross = 2.0 * (forward * backward.conj()).re * (-alpha * d).exp() * (beta * d).sin() / beta;
    let integral = (forward.norm_sqr() + backward.norm_sqr()) * decaying + cross;
    // The integral of |E|^2 is non-negative; rounding near a perfect node must not make it negative.
    (k0 * slab.eps_imag * integral).max(0.0)
}

fn slab_of(layer: &Layer) -> Slab {
    Slab {
        thickness_m: layer.thickness_m,
        index: layer.permittivity.refractive_index(),
        eps_imag: layer.permittivity.eps_imag,
    }
}

/// A feeding side's solution: its own, or the top-fed one (a mirrored stack fed from below, whose
/// solution is the top-fed one number for number, read from the other end).
enum SideSolution {
    Own(OneSided),
    TopFed,
}

/// The one-sided solutions of a stack and what they give per layer, before any sampling.
struct Solved {
    k0: f64,
    slabs: Vec<Slab>,
    /// (side, share of the incident power, solution); the bottom-fed solution holds its slabs in
    /// reverse order.
    sides: Vec<(FeedSide, f64, SideSolution)>,
    /// Per layer in the order given, as fractions of the total incident power.
    absorptances: Vec<f64>,
    reflectance: f64,
    transmittance: f64,
}

/// Room for one one-sided solution: its amplitudes and its absorptances.
type OneSidedRoom = (Vec<(Complex, Complex)>, Vec<f64>);

/// Vectors that a run of solves reuses (a zone march solves its bed hundreds of times): only
/// their room is kept from one solve to the next, never what they held.
#[derive(Default)]
pub struct SolveBuffers {
    slabs: Vec<Slab>,
    sides: Vec<(FeedSide, f64, SideSolution)>,
    one_sided: Vec<OneSidedRoom>,
    absorptances: Vec<f64>,
    powers: Vec<Complex>,
    values: Vec<f64>,
}

impl SolveBuffers {
    fn one_sided_room(&mut self) -> OneSidedRoom {
        self.one_sided.pop().unwrap_or_default()
    }

    /// Take back the vectors of a solution.
    fn recycle(&mut self, solved: Solved) {
        let Solved { slabs, mut sides, absorptances, .. } = solved;
        for (_, _, solution) in sides.drain(..) {
            if let SideSolution::Own(one) = solution {
                self.one_sided.push((one.amplitudes, one.absorptances));
            }
        }
        (self.slabs, self.sides, self.absorptances) = (slabs, sides, absorptances);
    }
}

fn solve_sides(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
) -> Result<Solved, InputError> {
    solve_sides_with(frequency_hz, layers, backing, feed, samples_per_layer, &mut SolveBuffers::default())
}

/// [`solve_sides`] in the vectors of `buffers` (give them back with [`SolveBuffers::recycle`]).
fn solve_sides_with(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
    buffers: &mut SolveBuffers,
) -> Result<Solved, InputError> {
    validate_request(frequency_hz, layers, backing, feed, samples_per_layer)?;
    let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
    let mut slabs = std::mem::take(&mut buffers.slabs);
    slabs.clear();
    slabs.extend(layers.iter().map(slab_of));
    let air = Complex::ONE;
    let backing_index = match backing {
        Backing::Air => Some(air),
        Backing::Metal => None,
        Backing::Material(eps) => Some(eps.refractive_index()),
    };

    let mut sides = std::mem::take(&mut buffers.sides);
    sides.clear();
    let top_share = match feed {
        Feed::Top => Some(1.0),
        Feed::BothSides => Some(0.5),
        Feed::Bottom => None,
    };
    let bottom_share = match feed {
        Feed::Bottom => Some(1.0),
        Feed::BothSides => Some(0.5),
        Feed::Top => None,
    };
    if let Some(share) = top_share {
        let exit = backing_index.map_or(Exit::Short, Exit::Medium);
        let room = buffers.one_sided_room();
        sides.push((FeedSide::Top, share, SideSolution::Own(solve_one_sided_in(k0, air, &slabs, exit, room))));
    }
    if let (Some(share), Some(incident)) = (bottom_share, backing_index) {
        // Air on both sides and a stack that reads the same both ways (one bed of product): the
        // feed from below is the feed from above, number for number.
        let mirrored = incident.re.to_bits() == air.re.to_bits()
            && incident.im.to_bits() == air.im.to_bits()
            && slabs.iter().zip(slabs.iter().rev()).all(|(a, b)| a.same_bits(b));
        let one = if mirrored && !sides.is_empty() {
            SideSolution::TopFed
        } else {
            let reversed: Vec<Slab> = slabs.iter().rev().copied().collect();
            let room = buffers.one_sided_room();
            SideSolution::Own(solve_one_sided_in(k0, incident, &reversed, Exit::Medium(air), room))
        };
        sides.push((FeedSide::Bottom, share, one));
    }

    let count = layers.len();
    let mut solved = Solved { k0, slabs, sides, absorptances: Vec::new(), reflectance: 0.0, transmittance: 0.0 };
    let mut absorptances = std::mem::take(&mut buffers.absorptances);
    absorptances.clear();
    absorptances.resize(count, 0.0);
    let mut reflectance = 0.0;
    let mut transmittance = 0.0;
    for (side, share, one) in solved.sides() {
        for (position, absorbed) in one.absorptances.iter().enumerate() {
            let layer_index = match side {
                FeedSide::Top => position,
                FeedSide::Bottom => count - 1 - position,
            };
            absorptances[layer_index] += share * absorbed;
        }
        reflectance += share * one.reflectance;
        transmittance += share * one.transmittance;
    }
    solved.absorptances = absorptances;
    solved.reflectance = reflectance;
    solved.transmittance = transmittance;
    Ok(solved)
}

impl Solved {
    /// The feeding sides, each with its share of the incident power and its solution.
    fn sides(&self) -> impl Iterator<Item = (FeedSide, f64, &OneSided)> + '_ {
        self.sides.iter().filter_map(move |(side, share, solution)| {
            let one = match solution {
                SideSolution::Own(one) => one,
                SideSolution::TopFed => match self.sides.first() {
                    Some((FeedSide::Top, _, SideSolution::Own(top))) => top,
                    _ => return None,
                },
            };
            Some((*side, *share, one))
        })
    }
}

/// Solve without the uniformity assessment (the part [`solve_stack_with`] adds).
fn solve_unassessed(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
) -> Result<StackSolution, InputError> {
    let solved = solve_sides(frequency_hz, layers, backing, feed, samples_per_layer)?;
    let sides = solved
        .sides()
        .map(|(side, share, one)| SideResult {
            side,
            incident_share: share,
            reflectance: one.reflectance,
            transmittance: one.transmittance,
            absorptance: one.absorptances.iter().sum(),
        })
        .collect();

    let count = layers.len();
    let mut layer_results = Vec::with_capacity(count);
    let mut depth_profile = Vec::with_capacity(count * samples_per_layer);
    let mut top_depth_m = 0.0;
    for (layer_index, layer) in layers.iter().enumerate() {
        LayerSamples::new(&solved, layer_index, samples_per_layer).each(|local_m, density| {
            depth_profile.push(DepthSample {
                depth_m: top_depth_m + local_m,
                layer: layer_index,
                power_density_per_incident_flux_per_m: density,
            });
        });
        layer_results.push(LayerResult {
            name: layer.name.clone(),
            thickness_m: layer.thickness_m,
            top_depth_m,
            is_product: layer.is_product,
            absorptance: solved.absorptances[layer_index],
        });
        top_depth_m += layer.thickness_m;
    }

    let absorptance = solved.absorptances.iter().sum();
    let product_absorptance =
        layer_results.iter().filter(|layer| layer.is_product).map(|layer| layer.absorptance).sum();
    Ok(StackSolution {
        frequency_hz,
        feed,
        samples_per_layer,
        reflectance: solved.reflectance,
        transmittance: solved.transmittance,
        absorptance,
        product_absorptance,
        layers: layer_results,
        sides,
        depth_profile,
        uniformity: None,
        warnings: Vec::new(),
    })
}

/// What a zone march needs from a stack: the product's absorptance and its highest sampled power
/// density, from the same solver as [`solve_stack`] without the uniformity assessment and the
/// warning texts (which cost more than the solution itself when a tunnel has hundreds of zones).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ProductOptics {
    /// Fraction of the incident power the product layers absorb.
    pub product_absorptance: f64,
    /// Highest sampled power density in the product, 1/m per unit incident flux; `None` with no product.
    pub max_product_power_density_per_m: Option<f64>,
}

/// Solve a stack for [`ProductOptics`] only: the numbers [`solve_stack`] gives, bit for bit,
/// without building the profile, the layer results or any text, and with the product's peak found
/// by evaluating only the samples that can hold it (see `sampling`).
pub fn product_optics(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
) -> Result<ProductOptics, InputError> {
    product_optics_with(frequency_hz, layers, backing, feed, samples_per_layer, &mut SolveBuffers::default())
}

/// [`product_optics`] in the vectors of `buffers`, which keep their room for the next solve: the
/// same numbers, bit for bit, without allocating once the buffers have grown.
pub fn product_optics_with(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
    buffers: &mut SolveBuffers,
) -> Result<ProductOptics, InputError> {
    let solved = solve_sides_with(frequency_hz, layers, backing, feed, samples_per_layer, buffers)?;
    let product_absorptance =
        layers.iter().zip(&solved.absorptances).filter(|(layer, _)| layer.is_product).map(|(_, a)| *a).sum();
    let (mut powers, mut values) = (std::mem::take(&mut buffers.powers), std::mem::take(&mut buffers.values));
    let max_product_power_density_per_m = (0..layers.len())
        .filter(|&layer_index| layers[layer_index].is_product)
        .map(|layer_index| {
            LayerSamples::new(&solved, layer_index, samples_per_layer).peak_with(&mut powers, &mut values)
        })
        .reduce(f64::max);
    (buffers.powers, buffers.values) = (powers, values);
    buffers.recycle(solved);
    Ok(ProductOptics { product_absorptance, max_product_power_density_per_m })
}

/// Solve a stack and assess its uniformity with the given settings instead of the defaults.
pub fn solve_stack_with(
    frequency_hz: f64,
    layers: &[Layer],
    backing: Backing,
    feed: Feed,
    samples_per_layer: usize,
    settings: &UniformitySettings,
) -> Result<StackSolution, InputError> {
    validate_settings(settings)?;
    let mut solution = solve_unassessed(frequency_hz, layers, backing, feed, samples_per_layer)?;
    let uniformity = product_uniformity(&solution, layers, settings)?;
    add_uniformity_warnings(&mut solution, layers, uniformity.as_ref(), frequency_hz);
    solution.uniformity = uniformity;
    Ok(solution)
}

fn validate_settings(settings: &UniformitySettings) -> Result<(), InputError> {
    if settings.fractions.len() > 10 {
        return Err(InputError::new(
            "fractions",
            format!("{} fractions", settings.fractions.len()),
            "at most 10 fractions",
        ));
    }
    for (index, &fraction) in settings.fractions.iter().enumerate() {
        if !(fraction.is_finite() && fraction > 0.0 && fraction < 1.0) {
            return Err(InputError::new(format!("fractions[{index}]"), fraction, "more than 0 and less than 1"));
        }
    }
    require_positive("core_lag_threshold", settings.core_lag_threshold, 1.0)?;
    Ok(())
}

/// The uniformity of the product's heating from a solution's depth profile; `None` when no layer
/// is product. `layers` must be the stack the solution was solved for.
pub fn product_uniformity(
    solution: &StackSolution,
    layers: &[Layer],
    settings: &UniformitySettings,
) -> Result<Option<Uniformity>, InputError> {
    validate_settings(settings)?;
    if layers.len() != solution.layers.len() {
        return Err(InputError::new(
            "layers",
            format!("{} layers", layers.len()),
            format!("the {} layers the solution was solved for", solution.layers.len()),
        ));
    }
    let product: Vec<DepthSample> = solution
        .depth_profile
        .iter()
        .filter(|sample| layers.get(sample.layer).is_some_and(|layer| layer.is_product))
        .copied()
        .collect();
    let (Some(first), Some(last)) = (product.first(), product.last()) else {
        return Ok(None);
    };
    let density = |sample: &DepthSample| sample.power_density_per_incident_flux_per_m;
    let min = product.iter().map(density).fold(f64::INFINITY, f64::min);
    let max = product.iter().map(density).fold(0.0, f64::max);
    let product_top_m = first.depth_m;
    let product_bottom_m = last.depth_m;
    let centre_m = 0.5 * (product_top_m + product_bottom_m);
    let reversed: Vec<DepthSample> = product.iter().rev().copied().collect();

    let (surface, core_depth_m) = match solution.feed {
        Feed::Top => (density(first), product_bottom_m),
        Feed::Bottom => (density(last), product_top_m),
        Feed::BothSides => (density(first).max(density(last)), centre_m),
    };
    let core = match solution.feed {
        Feed::Top => density(last),
        Feed::Bottom => density(first),
        Feed::BothSides => interpolate_at(&product, centre_m),
    };
    let fraction_depths = settings
        .fractions
        .iter()
        .map(|&fraction| {
            let depth_m = match solution.feed {
                Feed::Top => first_fall(&product, fraction, product_bottom_m),
                Feed::Bottom => first_fall(&reversed, fraction, product_top_m),
                Feed::BothSides => {
                    let from_top = first_fall(&product, fraction, centre_m);
                    let from_bottom = first_fall(&reversed, fraction, centre_m);
                    match (from_top, from_bottom) {
                        (Some(a), Some(b)) => Some(a.min(b)),
                        (a, b) => a.or(b),
                    }
                }
            };
            FractionDepth { fraction, depth_m }
        })
        .collect();
    let core_to_surface_ratio = (surface > 0.0).then(|| core / surface);
    Ok(Some(Uniformity {
        product_thickness_m: product_bottom_m - product_top_m,
        min_power_density_per_m: min,
        max_power_density_per_m: max,
        min_to_max_ratio: (max > 0.0).then(|| min / max),
        surface_power_density_per_m: surface,
        core_depth_m,
        core_power_density_per_m: core,
        core_to_surface_ratio,
        fraction_depths,
        core_lag_threshold: settings.core_lag_threshold,
        core_lags: core_to_surface_ratio.is_some_and(|ratio| ratio < settings.core_lag_threshold),
    }))
}

/// Walking `samples` from the first (the fed surface), the distance from it at which the power
/// density first falls to `fraction` of its value, linearly interpolated; the walk stops at
/// `limit_m` (a depth below the stack's top).
fn first_fall(samples: &[DepthSample], fraction: f64, limit_m: f64) -> Option<f64> {
    let surface = samples.first()?;
    let target = fraction * surface.power_density_per_incident_flux_per_m;
    if target <= 0.0 {
        return None;
    }
    let within = |sample: &DepthSample| {
        (sample.depth_m - surface.depth_m).abs() <= (limit_m - surface.depth_m).abs() * (1.0 + 1e-12)
    };
    for pair in samples.windows(2) {
        let (above, below) = (pair[0], pair[1]);
        if !within(&below) {
            return None;
        }
        let p_above = above.power_density_per_incident_flux_per_m;
        let p_below = below.power_density_per_incident_flux_per_m;
        if p_below <= target && p_above > target {
            let share = (p_above - target) / (p_above - p_below);
            let depth = above.depth_m + share * (below.depth_m - above.depth_m);
            return Some((depth - surface.depth_m).abs());
        }
    }
    None
}

/// The power density at depth `depth_m`, linearly interpolated between product samples.
fn interpolate_at(samples: &[DepthSample], depth_m: f64) -> f64 {
    let density = |sample: &DepthSample| sample.power_density_per_incident_flux_per_m;
    for pair in samples.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        if a.depth_m <= depth_m && depth_m <= b.depth_m {
            let span = b.depth_m - a.depth_m;
            if span <= 0.0 {
                return density(&a).min(density(&b));
            }
            let share = (depth_m - a.depth_m) / span;
            return density(&a) + share * (density(&b) - density(&a));
        }
    }
    samples.first().map_or(0.0, density)
}

fn add_uniformity_warnings(
    solution: &mut StackSolution,
    layers: &[Layer],
    uniformity: Option<&Uniformity>,
    frequency_hz: f64,
) {
    let Some(uniformity) = uniformity else {
        solution.warnings.push(StackWarning {
            code: "no_product_layer",
            message: "No layer is marked as product (\"product\": true), so no uniformity is \
                      assessed; reflection, transmission and absorption are still computed."
                .to_string(),
        });
        return;
    };
    if uniformity.max_power_density_per_m <= 0.0 {
        solution.warnings.push(StackWarning {
            code: "product_lossless",
            message: "The product layers have no loss (eps_imag = 0): they absorb nothing and \
                      their uniformity cannot be judged. Check the loss factor."
                .to_string(),
        });
    }
    if uniformity.core_lags {
        let ratio = uniformity.core_to_surface_ratio.unwrap_or(0.0);
        let (place, remedies) = match solution.feed {
            Feed::Top => ("its bottom face", "feeding from both sides, "),
            Feed::Bottom => ("its top face", "feeding from both sides, "),
            Feed::BothSides => ("its centre", ""),
        };
        solution.warnings.push(StackWarning {
            code: "core_lags",
            message: format!(
                "The product's core lags: at {place} ({:.4} m deep) the power density is {:.0} % \
                 of the fed surface's, below the {:.0} % that common practice asks for. The \
                 surface will overheat while the core catches up by conduction: consider \
                 {remedies}a lower frequency band (deeper penetration), a thinner layer or an \
                 equalising hold.",
                uniformity.core_depth_m,
                100.0 * ratio,
                100.0 * uniformity.core_lag_threshold
            ),
        });
    }
    // Warn when the standing wave in a product layer is sampled too coarsely to trust min/max.
    let samples = solution.samples_per_layer.max(SAMPLES_PER_LAYER_MIN);
    let lambda0 = SPEED_OF_LIGHT_M_PER_S / frequency_hz;
    let coarse = layers.iter().filter(|layer| layer.is_product).any(|layer| {
        let half_wavelength = 0.5 * lambda0 / layer.permittivity.refractive_index().re;
        let spacing = layer.thickness_m / (samples - 1) as f64;
        half_wavelength / spacing < SAMPLES_PER_HALF_WAVELENGTH_MIN
    });
    if coarse {
        solution.warnings.push(StackWarning {
            code: "coarse_depth_sampling",
            message: format!(
                "The depth samples are more than a twentieth of a wavelength apart in a product \
                 layer, so the standing wave is under-resolved and the sampled minimum and \
                 maximum may miss its true extremes; raise the samples per layer (now {samples})."
            ),
        });
    }
}

/// The stack file as written by people: see the module documentation for the format.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StackDocument {
    /// Layers from the top down.
    pub layers: Vec<LayerDocument>,
    /// What lies below the last layer (default: air).
    #[serde(default = "air_backing")]
    pub backing: BackingDocument,
}

/// One layer as written in a stack file.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LayerDocument {
    /// Name (optional; `layer N` when missing).
    #[serde(default)]
    pub name: Option<String>,
    /// Thickness, m.
    pub thickness_m: f64,
    /// Dielectric constant eps'.
    pub eps_real: f64,
    /// Loss factor eps''.
    pub eps_imag: f64,
    /// Whether the layer is product (default false).
    #[serde(default)]
    pub product: bool,
}

/// A backing as written in a stack file: `"air"`, `"metal"` or `{"eps_real": .., "eps_imag": ..}`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum BackingDocument {
    /// `"air"`.
    Air,
    /// `"metal"`.
    Metal,
    /// `{"eps_real": .., "eps_imag": ..}`.
    Material {
        /// Dielectric constant eps'.
        eps_real: f64,
        /// Loss factor eps''.
        eps_imag: f64,
    },
}

fn air_backing() -> BackingDocument {
    BackingDocument::Air
}

impl<'de> Deserialize<'de> for BackingDocument {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        struct BackingVisitor;

        #[derive(Deserialize)]
        #[serde(deny_unknown_fields)]
        struct MaterialFields {
            eps_real: f64,
            eps_imag: f64,
        }

        impl<'de> serde::de::Visitor<'de> for BackingVisitor {
            type Value = BackingDocument;

            fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                write!(f, "\"air\", \"metal\" or {{\"eps_real\": number, \"eps_imag\": number}}")
            }

            fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Self::Value, E> {
                match text {
                    "air" => Ok(BackingDocument::Air),
                    "metal" => Ok(BackingDocument::Metal),
                    other => Err(E::invalid_value(serde::de::Unexpected::Str(other), &self)),
                }
            }

            fn visit_map<A: serde::de::MapAccess<'de>>(self, map: A) -> Result<Self::Value, A::Error> {
                let fields = MaterialFields::deserialize(serde::de::value::MapAccessDeserializer::new(map))?;
                Ok(BackingDocument::Material { eps_real: fields.eps_real, eps_imag: fields.eps_imag })
            }
        }

        deserializer.deserialize_any(BackingVisitor)
    }
}

impl StackDocument {
    /// The checked layers and backing, or the first field that is wrong (`layers[2].thickness_m`).
    pub fn to_stack(&self) -> Result<(Vec<Layer>, Backing), InputError> {
        let layers: Vec<Layer> = self
            .layers
            .iter()
            .enumerate()
            .map(|(index, layer)| Layer {
                name: layer.name.clone().unwrap_or_else(|| format!("layer {}", index + 1)),
                thickness_m: layer.thickness_m,
                permittivity: ComplexPermittivity::new(layer.eps_real, layer.eps_imag),
                is_product: layer.product,
            })
            .collect();
        let backing = match self.backing {
            BackingDocument::Air => Backing::Air,
            BackingDocument::Metal => Backing::Metal,
            BackingDocument::Material { eps_real, eps_imag } => {
                Backing::Material(ComplexPermittivity::new(eps_real, eps_imag))
            }
        };
        validate_stack(&layers, backing)?;
        Ok((layers, backing))
    }
}
