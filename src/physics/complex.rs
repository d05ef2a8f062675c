//! A small complex number type for the wave and layer calculations.
//!
//! The core keeps its own type (a few dozen lines) rather than a dependency; the tests check it
//! against the `num-complex` crate as an independent implementation. Branches are the principal
//! ones, as in `num-complex` and the C99 library.

use serde::{Deserialize, Serialize};
use std::ops::{Add, Div, Mul, Neg, Sub};

/// A complex number `re + j im`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Complex {
    /// Real part.
    pub re: f64,
    /// Imaginary part.
    pub im: f64,
}

impl Complex {
    /// Zero.
    pub const ZERO: Complex = Complex { re: 0.0, im: 0.0 };
    /// One.
    pub const ONE: Complex = Complex { re: 1.0, im: 0.0 };
    /// The imaginary unit j.
    pub const J: Complex = Complex { re: 0.0, im: 1.0 };

    /// `re + j im`.
    pub const fn new(re: f64, im: f64) -> Self {
        Self { re, im }
    }

    /// A real number.
    pub const fn real(re: f64) -> Self {
        Self { re, im: 0.0 }
    }

    /// Modulus |z|, without overflow for large parts.
    pub fn abs(self) -> f64 {
        self.re.hypot(self.im)
    }

    /// |z|^2.
    pub fn norm_sqr(self) -> f64 {
        self.re * self.re + self.im * self.im
    }

    /// Argument in (-pi, pi].
    pub fn arg(self) -> f64 {
        self.im.atan2(self.re)
    }

    /// Complex conjugate.
    pub fn conj(self) -> Self {
        Self::new(self.re, -self.im)
    }

    /// Multiply by a real number.
    pub fn scale(self, k: f64) -> Self {
        Self::new(self.re * k, self.im * k)
    }

    /// Principal square root (real part >= 0).
    pub fn sqrt(self) -> Self {
        if self.re == 0.0 && self.im == 0.0 {
            return Self::ZERO;
        }
        // Half-angle form: stable for small imaginary parts on either side of the real axis.
        let modulus = self.abs();
        let root_re = ((modulus + self.re.abs()) / 2.0).sqrt();
        if self.re >= 0.0 {
            Self::new(root_re, self.im / (2.0 * root_re))
        } else {
            let root_im = if self.im >= 0.0 { root_re } else { -root_re };
            Self::new(self.im.abs() / (2.0 * root_re), root_im)
        }
    }

    /// e^z.
    pub fn exp(self) -> Self {
        let scale = self.re.exp();
        Self::new(scale * self.im.cos(), scale * self.im.sin())
    }

    /// Principal natural logarithm.
    pub fn ln(self) -> Self {
        Self::new(self.abs().ln(), self.arg())
    }

    /// z^p for a real power p, principal branch (z^p = exp(p ln z)); 0^p = 0 for p > 0.
    pub fn powf(self, p: f64) -> Self {
        if self.re == 0.0 && self.im == 0.0 {
            return Self::ZERO;
        }
        (self.ln().scale(p)).exp()
    }

    /// cos z.
    pub fn cos(self) -> Self {
        Self::new(self.re.cos() * self.im.cosh(), -self.re.sin() * self.im.sinh())
    }

    /// sin z.
    pub fn sin(self) -> Self {
        Self::new(self.re.sin() * self.im.cosh(), self.re.cos() * self.im.sinh())
    }

    /// 1/z.
    pub fn recip(self) -> Self {
        Self::ONE / self
    }

    /// True when both parts are finite.
    pub fn is_finite(self) -> bool {
        self.re.is_finite() && self.im.is_finite()
    }
}

impl Add for Complex {
    type Output = Complex;
    fn add(self, other: Complex) -> Complex {
        Complex::new(self.re + other.re, self.im + other.im)
    }
}

impl Sub for Complex {
    type Output = Complex;
    fn sub(self, other: Complex) -> Complex {
        Complex::new(self.re - other.re, self.im - other.im)
    }
}

impl Mul for Complex {
    type Output = Complex;
    fn mul(self, other: Complex) -> Complex {
        Complex::new(self.re * other.re - self.im * other.im, self.re * other.im + self.im * other.re)
    }
}

impl Div for Complex {
    type Output = Complex;
    fn div(self, other: Complex) -> Complex {
        // Smith's algorithm: avoids overflow when the divisor's parts differ greatly in size.
        if other.re.abs() >= other.im.abs() {
            let ratio = other.im / other.re;
            let denominator = other.re + other.im * ratio;
            Complex::new((self.re + self.im * ratio) / denominator, (self.im - self.re * ratio) / denominator)
        } else {
            let ratio = other.re / other.im;
            let denominator = other.re * ratio + other.im;
            Complex::new((self.re * ratio + self.im) / denominator, (self.im * ratio - self.re) / denominator)
        }
    }
}

impl Neg for Complex {
    type Output = Complex;
    fn neg(self) -> Complex {
        Complex::new(-self.re, -self.im)
    }
}

#[cfg(test)]
mod tests {
    //! Checked against the `num-complex` crate (an independent implementation from the registry).
    use super::*;
    use approx::assert_relative_eq;
    use num_complex::Complex64;

    const SAMPLES: [(f64, f64); 9] = [
        (78.4, -9.9),
        (4.0, -1.0),
        (2.08, -6e-4),
        (-3.0, 4.0),
        (-3.0, -4.0),
        (0.5, 1e-12),
        (-1.0, 0.0),
        (1e-8, -1e8),
        (60.0, -1325.0),
    ];

    fn close(ours: Complex, theirs: Complex64) {
        let scale = theirs.norm().max(1e-300);
        assert!(
            (ours.re - theirs.re).abs() <= 1e-12 * scale && (ours.im - theirs.im).abs() <= 1e-12 * scale,
            "ours {ours:?} vs num-complex {theirs:?}"
        );
    }

    #[test]
    fn elementary_functions_match_num_complex() {
        for (re, im) in SAMPLES {
            let ours = Complex::new(re, im);
            let theirs = Complex64::new(re, im);
            close(ours.sqrt(), theirs.sqrt());
            close(ours.ln(), theirs.ln());
            close(ours.powf(0.5), theirs.powf(0.5));
            close(ours.powf(1.0 / 3.0), theirs.powf(1.0 / 3.0));
            close(ours / Complex::new(3.0, -2.0), theirs / Complex64::new(3.0, -2.0));
            close(Complex::new(1.0, 2.0) / ours, Complex64::new(1.0, 2.0) / theirs);
        }
        for (re, im) in [(0.3, -0.2), (12.0, -3.5), (-2.0, 0.7)] {
            close(Complex::new(re, im).cos(), Complex64::new(re, im).cos());
            close(Complex::new(re, im).sin(), Complex64::new(re, im).sin());
            close(Complex::new(re, im).exp(), Complex64::new(re, im).exp());
        }
    }

    #[test]
    fn square_root_squares_back() {
        for (re, im) in SAMPLES {
            let z = Complex::new(re, im);
            let back = z.sqrt() * z.sqrt();
            assert_relative_eq!(back.re, re, epsilon = 1e-9 * z.abs());
            assert_relative_eq!(back.im, im, epsilon = 1e-9 * z.abs());
        }
    }
}
