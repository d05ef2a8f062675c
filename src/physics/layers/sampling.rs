//! The depth samples of a solved stack: every sample of a layer (the profile), or only the highest
//! one (the zone march's peak), each with the value the other would give for it, bit for bit.
//!
//! A sample at local depth u of a layer of thickness d needs e^{-j k u} and e^{-j k (d - u)} from
//! the top, and for a feed from below e^{-j k (d - u)} and e^{-j k (d - (d - u))}. These complex
//! exponentials are nearly all the cost of a solve, so:
//!
//! - the profile evaluates each distinct distance once (most of them are another sample's u bit
//!   for bit);
//! - the peak first approximates every sample with the powers of one step, e^{-j k u_s} ~ w^s, and
//!   a bound on the approximation's error, then evaluates exactly only the samples that can still
//!   be the highest. The bound, with eps the unit roundoff and phi = k0 d (|n'| + |n''|):
//!
//! ```text
//! |w^s - e^{-j k u_s}| <= delta = 16 eps (phi + S + 1)      S samples; (7 phi + 6 S + 3) eps by hand:
//!                                                           argument rounding, libm, s products
//! |E~ - E| <= (|a| + |c|) (delta + 4 eps) = D               per side, a and c its two amplitudes
//! |p~ - p| <= 4 q (A + D) D + 16 eps q (A + D)^2 + floor    q = k0 eps'' / n0, A = |a| + |c|
//! ```
//!
//! (|e^{-j k x}| <= 1 for a passive layer, Im n <= 0.) Each bound holds with room to spare, so the
//! sample that is highest when evaluated exactly is always among those evaluated exactly, and the
//! peak is the profile's maximum exactly. Where the bound is useless (phases of millions of
//! radians) or anything is not finite, every sample is evaluated.

use super::{propagator, FeedSide, Solved};
use crate::physics::complex::Complex;

/// Unit roundoff of f64 (half the machine epsilon would do; the whole one is the safer side).
const ROUNDOFF: f64 = f64::EPSILON;
/// Absolute slack for densities near underflow, 1/m (subnormal products lose their relative
/// precision; no density the plan reads is anywhere near this small).
const UNDERFLOW_FLOOR_PER_M: f64 = 1e-290;
/// The part of a sample's error bound in proportion to its value: the rounding of the exact sum
/// over the sides.
const VALUE_ROUNDING: f64 = 4.0 * ROUNDOFF;
/// Beyond this error on the powers the approximation cannot rank samples: evaluate them all.
const POWERS_ERROR_MAX: f64 = 1e-6;

/// One layer of a solved stack, sampled at `samples` points evenly, both faces included.
pub(super) struct LayerSamples<'a> {
    solved: &'a Solved,
    layer_index: usize,
    samples: usize,
}

impl<'a> LayerSamples<'a> {
    pub(super) fn new(solved: &'a Solved, layer_index: usize, samples: usize) -> Self {
        Self { solved, layer_index, samples }
    }

    /// Local depth of sample `index`, m. Exact faces at both ends: the last sample sits on the
    /// bottom face, not near it.
    #[inline]
    fn depth(&self, index: usize) -> f64 {
        let thickness_m = self.solved.slabs[self.layer_index].thickness_m;
        let last = self.samples - 1;
        if index == last {
            thickness_m
        } else {
            thickness_m * index as f64 / last as f64
        }
    }

    /// p / S_inc at sample `index`, summed over the feeding sides, 1/m; `propagate(x, hint)` gives
    /// e^{-j k x}, where `hint` is the sample whose own depth x is most likely to be.
    fn density(&self, index: usize, propagate: &impl Fn(f64, usize) -> Complex) -> f64 {
        let slab = self.solved.slabs[self.layer_index];
        if slab.eps_imag == 0.0 {
            return 0.0;
        }
        let count = self.solved.slabs.len();
        let last = self.samples - 1;
        let local_m = self.depth(index);
        let rest_m = slab.thickness_m - local_m;
        let to_bottom = propagate(rest_m, last - index);
        let mut density = 0.0;
        for (side, share, one) in self.solved.sides() {
            let field = match side {
                FeedSide::Top => {
                    let (forward, backward) = one.amplitudes[self.layer_index];
                    forward * propagate(local_m, index) + backward * to_bottom
                }
                FeedSide::Bottom => {
                    let (forward, backward) = one.amplitudes[count - 1 - self.layer_index];
                    forward * to_bottom + backward * propagate(slab.thickness_m - rest_m, index)
                }
            };
            density += share * (self.solved.k0 * slab.eps_imag * field.norm_sqr() / one.incident_index_re);
        }
        density
    }

    /// e^{-j k x} for the samples' distances: directly, except that a distance equal bit for bit
    /// to the hinted sample's depth reuses that sample's value in `from_top` (when it holds one).
    fn propagate<'b>(&'b self, from_top: &'b [Complex]) -> impl Fn(f64, usize) -> Complex + 'b {
        let (k0, index) = (self.solved.k0, self.solved.slabs[self.layer_index].index);
        move |x, hint| match from_top.get(hint) {
            Some(&known) if x.to_bits() == self.depth(hint).to_bits() => known,
            _ => propagator(k0, index, x),
        }
    }

    /// Every sample, in depth order: `sample(local depth, density)`.
    pub(super) fn each(&self, mut sample: impl FnMut(f64, f64)) {
        let slab = self.solved.slabs[self.layer_index];
        let from_top: Vec<Complex> = if slab.eps_imag == 0.0 {
            Vec::new()
        } else {
            (0..self.samples).map(|index| propagator(self.solved.k0, slab.index, self.depth(index))).collect()
        };
        let propagate = self.propagate(&from_top);
        for index in 0..self.samples {
            sample(self.depth(index), self.density(index, &propagate));
        }
    }

    /// Sample `index` alone, as [`LayerSamples::each`] gives it.
    pub(super) fn exact(&self, index: usize) -> f64 {
        let (k0, refractive_index) = (self.solved.k0, self.solved.slabs[self.layer_index].index);
        let own_depth = self.depth(index);
        let own = propagator(k0, refractive_index, own_depth);
        // The distance back from the bottom face, d - (d - u), is mostly u again bit for bit.
        self.density(index, &|x, _| {
            if x.to_bits() == own_depth.to_bits() {
                own
            } else {
                propagator(k0, refractive_index, x)
            }
        })
    }

    /// [`LayerSamples::peak_with`] in new vectors.
    #[cfg(test)]
    pub(super) fn peak(&self) -> f64 {
        self.peak_with(&mut Vec::new(), &mut Vec::new())
    }

    /// The highest sample's density (what the maximum over [`LayerSamples::each`] gives), working
    /// in `powers` and `values` (whatever they hold is replaced; a caller solving many stacks
    /// passes the same two and keeps their room).
    pub(super) fn peak_with(&self, powers: &mut Vec<Complex>, values: &mut Vec<f64>) -> f64 {
        if self.solved.slabs[self.layer_index].eps_imag == 0.0 {
            return 0.0;
        }
        let mut highest: Option<f64> = None;
        let mut evaluate = |index: usize| {
            let density = self.exact(index);
            highest = Some(highest.map_or(density, |max| max.max(density)));
        };
        match self.approximate_into(powers, values) {
            Some(shared_error) => {
                let error = |value: f64| error_bound(shared_error, value);
                // Every value and bound is finite here (`approximate` says so), so a plain comparison
                // is `f64::max` (which the size-optimised build calls out of line).
                let lower = values.iter().map(|&value| value - error(value)).fold(f64::NEG_INFINITY, |lower, bound| {
                    if bound > lower {
                        bound
                    } else {
                        lower
                    }
                });
                for (index, &value) in values.iter().enumerate() {
                    if value + error(value) >= lower {
                        evaluate(index);
                    }
                }
            }
            None => (0..self.samples).for_each(evaluate),
        }
        highest.unwrap_or(0.0)
    }

    /// [`LayerSamples::approximate_into`] as an [`Approximation`].
    #[cfg(test)]
    pub(super) fn approximate(&self) -> Option<Approximation> {
        let mut values = Vec::new();
        let shared_error = self.approximate_into(&mut Vec::new(), &mut values)?;
        Some(Approximation { values, shared_error })
    }

    /// Every sample's density from the powers of one step (in `values`, the powers in `powers`),
    /// with the part of its error bound common to all samples (see [`error_bound`]); `None` when
    /// the bound cannot rank them.
    fn approximate_into(&self, powers: &mut Vec<Complex>, values: &mut Vec<f64>) -> Option<f64> {
        let slab = self.solved.slabs[self.layer_index];
        let (k0, count, samples) = (self.solved.k0, self.solved.slabs.len(), self.samples);
        let phase = k0 * slab.thickness_m * (slab.index.re.abs() + slab.index.im.abs());
        let delta = 16.0 * ROUNDOFF * (phase + samples as f64 + 1.0);
        // A NaN phase fails this test too.
        if !delta.is_finite() || delta >= POWERS_ERROR_MAX {
            return None;
        }
        let step = propagator(k0, slab.index, slab.thickness_m / (samples - 1) as f64);
        powers.clear();
        powers.reserve(samples);
        let mut power = Complex::ONE;
        for _ in 0..samples {
            powers.push(power);
            power = power * step;
        }
        let powers = powers.as_slice();
        values.clear();
        values.resize(samples, 0.0);
        let mut shared_error = 0.0;
        let mut previous: Option<(f64, Complex, Complex)> = None;
        for (side, share, one) in self.solved.sides() {
            let (forward, backward) = match side {
                FeedSide::Top => one.amplitudes[self.layer_index],
                FeedSide::Bottom => one.amplitudes[count - 1 - self.layer_index],
            };
            let q = k0 * slab.eps_imag / one.incident_index_re;
            let amplitude = forward.abs() + backward.abs();
            let field_error = amplitude * (delta + 4.0 * ROUNDOFF);
            let reach = amplitude + field_error;
            shared_error +=
                share * (4.0 * q * reach * field_error + 16.0 * ROUNDOFF * q * reach * reach + UNDERFLOW_FLOOR_PER_M);
            let weight = share * q;
            if side == FeedSide::Bottom && previous.is_some_and(|seen| same_bits(seen, (weight, forward, backward))) {
                // A bed fed alike from both sides: the feed from below is the one from above read
                // backwards, so the sum over the sides is symmetric.
                // Pairs (i, S - 1 - i) for i < S / 2; an odd middle sample is in neither half.
                let (head, tail) = values.split_at_mut(samples / 2);
                for (value, mirror) in head.iter_mut().zip(tail.iter_mut().rev()) {
                    let sum = *value + *mirror;
                    *value = sum;
                    *mirror = sum;
                }
                if samples % 2 == 1 {
                    values[samples / 2] *= 2.0;
                }
                continue;
            }
            // E ~ a w^i + c w^(S-1-i) at sample i, for a wave entering at the top face (a feed from
            // below enters at the last sample, so its powers run the other way).
            // (A plain loop: under the size-optimised build a closure here stayed a call per sample.)
            for (index, (value, &power)) in values.iter_mut().zip(powers).enumerate() {
                let mirrored = powers[samples - 1 - index];
                let (near, far) = match side {
                    FeedSide::Top => (power, mirrored),
                    FeedSide::Bottom => (mirrored, power),
                };
                *value += weight * (forward * near + backward * far).norm_sqr();
            }
            previous = Some((weight, forward, backward));
        }
        let finite = shared_error.is_finite() && values.iter().all(|value| value.is_finite());
        finite.then_some(shared_error)
    }
}

fn same_bits(a: (f64, Complex, Complex), b: (f64, Complex, Complex)) -> bool {
    let bits = |(w, x, y): (f64, Complex, Complex)| {
        [w.to_bits(), x.re.to_bits(), x.im.to_bits(), y.re.to_bits(), y.im.to_bits()]
    };
    bits(a) == bits(b)
}

/// Approximate densities of a layer's samples and the bound on their distance from the exact
/// ones, 1/m.
#[cfg(test)]
pub(super) struct Approximation {
    pub(super) values: Vec<f64>,
    /// The part of the bound common to all samples.
    shared_error: f64,
}

#[cfg(test)]
impl Approximation {
    /// The bound for a sample of approximate density `value`: the shared part and
    /// [`VALUE_ROUNDING`] of the value.
    #[inline]
    pub(super) fn error(&self, value: f64) -> f64 {
        error_bound(self.shared_error, value)
    }
}

/// The bound for a sample of approximate density `value` given the shared part of the bound.
#[inline]
fn error_bound(shared_error: f64, value: f64) -> f64 {
    shared_error + VALUE_ROUNDING * value.abs()
}
