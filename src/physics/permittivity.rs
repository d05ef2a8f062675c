//! Complex relative permittivity eps* = eps' - j eps'' (time convention e^{+j omega t}; eps'' > 0 is loss).

use crate::error::{require_in, InputError};
use crate::physics::complex::Complex;
use serde::{Deserialize, Serialize};

/// Largest dielectric constant accepted anywhere: water is about 88 at 0 degC; 1000 leaves room
/// for ferroelectric ceramics.
pub const EPS_REAL_MAX: f64 = 1.0e3;
/// Largest loss factor accepted: a 10 S/m brine at 13.56 MHz reaches about 1.3e4; 1e6 covers
/// conductive loads at low RF frequencies.
pub const EPS_IMAG_MAX: f64 = 1.0e6;

/// Relative complex permittivity of a material.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct ComplexPermittivity {
    /// Dielectric constant eps' (relative).
    pub eps_real: f64,
    /// Loss factor eps'' (relative, >= 0).
    pub eps_imag: f64,
}

impl ComplexPermittivity {
    /// Free space.
    pub const VACUUM: ComplexPermittivity = ComplexPermittivity { eps_real: 1.0, eps_imag: 0.0 };

    /// A permittivity from its two parts, unchecked (use [`ComplexPermittivity::checked`] on input).
    pub const fn new(eps_real: f64, eps_imag: f64) -> Self {
        Self { eps_real, eps_imag }
    }

    /// A permittivity from user input: 1 <= eps' <= 1000 and 0 <= eps'' <= 1e6.
    pub fn checked(eps_real: f64, eps_imag: f64) -> Result<Self, InputError> {
        let eps_real = require_in("eps_real", eps_real, 1.0, EPS_REAL_MAX)?;
        let eps_imag = require_in("eps_imag", eps_imag, 0.0, EPS_IMAG_MAX)?;
        Ok(Self { eps_real, eps_imag })
    }

    /// As a complex number eps' - j eps''.
    pub fn to_complex(self) -> Complex {
        Complex::new(self.eps_real, -self.eps_imag)
    }

    /// From a complex number eps' - j eps''.
    pub fn from_complex(z: Complex) -> Self {
        Self { eps_real: z.re, eps_imag: -z.im }
    }

    /// Loss tangent tan(delta) = eps'' / eps'.
    pub fn loss_tangent(self) -> f64 {
        self.eps_imag / self.eps_real
    }

    /// Complex refractive index n = sqrt(eps*), with Im n <= 0 in this convention.
    pub fn refractive_index(self) -> Complex {
        self.to_complex().sqrt()
    }
}
