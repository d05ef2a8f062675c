//! The conveyor tunnel: belt speed, residence time, length and power per unit of belt.
//!
//!   volumetric flow Q = m_dot / rho_bulk;  belt speed v = Q / (W d);  L = v t
//! where W is the loaded belt width, d the bed depth and t the residence time under power. The
//! residence time comes from one of three rules: a given tunnel length (t = L / v), a given
//! residence time, or an allowed heating rate r: t = dT / r, where dT is the temperature rise the
//! rate applies to. The plan passes the product's own rise, except when drying, where the
//! temperature hardly moves while the water leaves; there it passes the sensible-heat equivalent
//! e_abs / c_p (e_abs the absorbed energy per kg), which caps the specific power at c_p r.

use crate::error::{require_in, require_positive, InputError};
use serde::{Deserialize, Serialize};

/// How the time under power is fixed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ResidenceRule {
    /// The heated length is given, m.
    TunnelLengthM(f64),
    /// The time under power is given, s.
    ResidenceTimeS(f64),
    /// The highest sensible-equivalent heating rate allowed, K/min.
    HeatingRateKPerMin(f64),
}

/// Tunnel geometry from the scenario.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct TunnelInput {
    /// Loaded belt width, m.
    pub belt_width_m: f64,
    /// Bed (product layer) depth on the belt, m.
    pub bed_depth_m: f64,
    /// Bulk density of the bed as loaded, kg/m^3.
    pub bulk_density_kg_per_m3: f64,
    /// How the residence time is set.
    pub residence: ResidenceRule,
}

impl TunnelInput {
    /// Check the geometry; field names as in the scenario (`tunnel.belt_width_m`).
    pub fn validate(&self) -> Vec<InputError> {
        let mut problems: Vec<InputError> = [
            require_in("tunnel.belt_width_m", self.belt_width_m, 0.02, 10.0).err(),
            require_in("tunnel.bed_depth_m", self.bed_depth_m, 0.0005, 2.0).err(),
            require_in("tunnel.bulk_density_kg_per_m3", self.bulk_density_kg_per_m3, 5.0, 8000.0).err(),
        ]
        .into_iter()
        .flatten()
        .collect();
        let rule = match self.residence {
            ResidenceRule::TunnelLengthM(length) => require_in("tunnel.residence.tunnel_length_m", length, 0.1, 1000.0),
            ResidenceRule::ResidenceTimeS(time) => require_in("tunnel.residence.residence_time_s", time, 1.0, 86_400.0),
            ResidenceRule::HeatingRateKPerMin(rate) => {
                require_positive("tunnel.residence.heating_rate_k_per_min", rate, 10_000.0)
            }
        };
        problems.extend(rule.err());
        problems
    }
}

/// The tunnel as planned.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Tunnel {
    /// Volume of product carried per hour, m^3/h.
    pub volumetric_flow_m3_per_h: f64,
    /// Belt speed, m/min.
    pub belt_speed_m_per_min: f64,
    /// Time under power, s.
    pub residence_time_s: f64,
    /// Heated tunnel length, m.
    pub tunnel_length_m: f64,
    /// Product mass under power at any moment, kg.
    pub product_in_tunnel_kg: f64,
    /// Belt loading, kg per m^2 of belt.
    pub belt_loading_kg_per_m2: f64,
    /// Absorbed power per metre of heated length, kW/m.
    pub absorbed_power_per_metre_kw_per_m: f64,
    /// Absorbed power per m^2 of loaded belt, kW/m^2.
    pub absorbed_power_per_area_kw_per_m2: f64,
    /// Mean absorbed power density in the bed, kW/m^3.
    pub mean_power_density_kw_per_m3: f64,
}

/// Lay out the tunnel. `rate_basis_rise_k` is the temperature rise the heating-rate rule applies
/// to; `absorbed_kw` gives the power per unit of belt.
pub fn lay_out(input: &TunnelInput, throughput_kg_per_h: f64, absorbed_kw: f64, rate_basis_rise_k: f64) -> Tunnel {
    let volumetric_flow_m3_per_h = throughput_kg_per_h / input.bulk_density_kg_per_m3;
    let belt_speed_m_per_h = volumetric_flow_m3_per_h / (input.belt_width_m * input.bed_depth_m);
    let belt_speed_m_per_s = belt_speed_m_per_h / 3600.0;
    let residence_time_s = match input.residence {
        ResidenceRule::TunnelLengthM(length) => length / belt_speed_m_per_s,
        ResidenceRule::ResidenceTimeS(time) => time,
        // At least one second under power, whatever the rise: a zero rise would give a zero-length tunnel.
        ResidenceRule::HeatingRateKPerMin(rate) => (rate_basis_rise_k.abs() / (rate / 60.0)).max(1.0),
    };
    let tunnel_length_m = belt_speed_m_per_s * residence_time_s;
    let bed_volume_m3 = input.belt_width_m * input.bed_depth_m * tunnel_length_m;
    Tunnel {
        volumetric_flow_m3_per_h,
        belt_speed_m_per_min: belt_speed_m_per_h / 60.0,
        residence_time_s,
        tunnel_length_m,
        product_in_tunnel_kg: bed_volume_m3 * input.bulk_density_kg_per_m3,
        belt_loading_kg_per_m2: input.bulk_density_kg_per_m3 * input.bed_depth_m,
        absorbed_power_per_metre_kw_per_m: absorbed_kw / tunnel_length_m,
        absorbed_power_per_area_kw_per_m2: absorbed_kw / (input.belt_width_m * tunnel_length_m),
        mean_power_density_kw_per_m3: absorbed_kw / bed_volume_m3,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn belt(rule: ResidenceRule) -> TunnelInput {
        TunnelInput { belt_width_m: 0.5, bed_depth_m: 0.1, bulk_density_kg_per_m3: 1000.0, residence: rule }
    }

    #[test]
    fn belt_speed_from_mass_flow() {
        // 3000 kg/h at 1000 kg/m^3 is 3 m^3/h; over 0.5 m x 0.1 m that is 60 m/h = 1 m/min (by hand).
        let tunnel = lay_out(&belt(ResidenceRule::TunnelLengthM(4.0)), 3000.0, 100.0, 1.0);
        assert_relative_eq!(tunnel.belt_speed_m_per_min, 1.0, max_relative = 1e-12);
        assert_relative_eq!(tunnel.residence_time_s, 240.0, max_relative = 1e-12);
        assert_relative_eq!(tunnel.product_in_tunnel_kg, 200.0, max_relative = 1e-12);
        assert_relative_eq!(tunnel.absorbed_power_per_metre_kw_per_m, 25.0, max_relative = 1e-12);
        assert_relative_eq!(tunnel.mean_power_density_kw_per_m3, 500.0, max_relative = 1e-12);
    }

    #[test]
    fn heating_rate_rule_is_delta_t_over_rate_for_plain_heating() {
        // 70 K of heating at 10 K/min takes 7 min (by hand).
        let tunnel = lay_out(&belt(ResidenceRule::HeatingRateKPerMin(10.0)), 3000.0, 100.0, 70.0);
        assert_relative_eq!(tunnel.residence_time_s, 420.0, max_relative = 1e-12);
        assert_relative_eq!(tunnel.tunnel_length_m, 7.0, max_relative = 1e-12);
    }

    #[test]
    fn geometry_is_checked_with_field_names() {
        let mut input = belt(ResidenceRule::HeatingRateKPerMin(0.0));
        input.bed_depth_m = -1.0;
        let fields: Vec<String> = input.validate().into_iter().map(|e| e.field).collect();
        assert_eq!(fields, ["tunnel.bed_depth_m", "tunnel.residence.heating_rate_k_per_min"]);
    }
}
