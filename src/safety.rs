//! Cautions that go with every plan: microwave and RF exposure, leakage, high voltage, interlocks,
//! arcing and fire, thermal runaway and ceramic dust from broken tubes.
//!
//! The figures quoted are reference points for a planner, not a compliance check. Sources:
//! 21 CFR 1030.10 (US performance standard for microwave ovens), IEC 60519-6 (safety of industrial
//! microwave and HF dielectric heating equipment), ICNIRP 2020 guidelines (Health Phys. 118(5),
//! Tables 5 and 6), US OSHA 29 CFR 1910.1024 (beryllium). The IEC leakage figure and the
//! whole-body reference levels are marked "from memory" in shared/sources.md 9 and say so here.

use serde::Serialize;

/// One caution.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Caution {
    /// Stable identifier (`high_voltage`).
    pub code: &'static str,
    /// Short heading.
    pub title: &'static str,
    /// What to know and do.
    pub text: String,
}

/// Who is exposed, for the ICNIRP reference levels.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Exposed {
    /// Trained workers aware of the exposure.
    Occupational,
    /// Anyone else.
    GeneralPublic,
}

/// ICNIRP 2020 whole-body reference level as plane-wave power density, W/m^2, for 400 MHz to
/// 300 GHz (Table 5; from memory per shared/sources.md 9.2): occupational f/40 up to 2 GHz then
/// 50 W/m^2; general public f/200 then 10 W/m^2. `None` outside that range (RF heating bands
/// are set by field strength there instead).
pub fn icnirp_whole_body_power_density_w_per_m2(freq_mhz: f64, exposed: Exposed) -> Option<f64> {
    if !(400.0..=300_000.0).contains(&freq_mhz) {
        return None;
    }
    let (divisor, ceiling) = match exposed {
        Exposed::Occupational => (40.0, 50.0),
        Exposed::GeneralPublic => (200.0, 10.0),
    };
    Some(if freq_mhz <= 2000.0 { freq_mhz / divisor } else { ceiling })
}

/// ICNIRP 2020 whole-body reference level as RMS electric field, V/m, for 0.1 to 400 MHz
/// (Table 5; from memory per shared/sources.md 9.2): occupational 660/f^0.7 up to 30 MHz then
/// 61 V/m; general public 300/f^0.7 then 27.7 V/m.
pub fn icnirp_whole_body_field_v_per_m(freq_mhz: f64, exposed: Exposed) -> Option<f64> {
    if !(0.1..400.0).contains(&freq_mhz) {
        return None;
    }
    let (coefficient, flat) = match exposed {
        Exposed::Occupational => (660.0, 61.0),
        Exposed::GeneralPublic => (300.0, 27.7),
    };
    Some(if freq_mhz <= 30.0 { coefficient / freq_mhz.powf(0.7) } else { flat })
}

/// The cautions for a line at `freq_mhz` whose generators run at about `supply_kv`.
pub fn cautions(freq_mhz: f64, supply_kv: f64, combustible_product: bool) -> Vec<Caution> {
    let microwave = freq_mhz >= 300.0;
    let exposure = if microwave {
        let occupational = icnirp_whole_body_power_density_w_per_m2(freq_mhz, Exposed::Occupational).unwrap_or(50.0);
        let public = icnirp_whole_body_power_density_w_per_m2(freq_mhz, Exposed::GeneralPublic).unwrap_or(10.0);
        format!(
            "Leakage from doors, tunnel openings, waveguide flanges and viewing windows must be measured with a calibrated survey meter at commissioning, after any maintenance that opens the microwave path, and at regular intervals. Industrial equipment is tested to IEC 60519-6 (a limit of 50 W/m² at 50 mm from accessible surfaces, from memory: check the edition in force); ovens for sale in the US must not exceed 1 mW/cm² (10 W/m²) at 5 cm before purchase and 5 mW/cm² after (21 CFR 1030.10). Whole-body exposure reference levels at {freq_mhz} MHz (ICNIRP 2020, from memory): about {occupational:.0} W/m² for workers and {public:.0} W/m² for the public. Local regulations prevail."
        )
    } else {
        let occupational = icnirp_whole_body_field_v_per_m(freq_mhz, Exposed::Occupational).unwrap_or(61.0);
        let public = icnirp_whole_body_field_v_per_m(freq_mhz, Exposed::GeneralPublic).unwrap_or(27.7);
        format!(
            "RF applicators radiate strongly from open electrode systems: stray fields near the applicator, feeders and product openings must be surveyed at commissioning and after maintenance, and the line must meet IEC 60519-6 and the radio-interference limits for ISM equipment. Whole-body reference levels at {freq_mhz} MHz (ICNIRP 2020, from memory): about {occupational:.0} V/m for workers and {public:.0} V/m for the public. Local regulations prevail."
        )
    };
    let mut list = vec![
        Caution { code: "exposure_and_leakage", title: "Microwave and RF exposure, leakage", text: exposure },
        Caution {
            code: "high_voltage",
            title: "High voltage",
            text: format!(
                "The generators run at about {supply_kv:.0} kV, with stored energy in filter capacitors that can kill after the supply is off. Work on supplies and tube sockets only isolated, locked out, discharged with an earthing stick and tested dead, by people licensed for high-voltage work."
            ),
        },
        Caution {
            code: "interlocks",
            title: "Interlocks",
            text: "Every door, access panel and waveguide section that can be opened must cut the generators through a safety-rated interlock chain; product entry and exit openings need absorbing or reactive chokes sized for the belt load. Never bridge an interlock to run a test.".to_string(),
        },
        Caution {
            code: "arcing_and_fire",
            title: "Arcing and fire",
            text: "Sharp metal edges, foil, wire ties, loose screws and metal-detector misses concentrate the field and arc. A dried organic product (wood, paper, textiles, grain, snacks) can char and ignite, and an arc in a tunnel full of vapour or dust can start a fire. Fit arc detectors and fire detection that cut power, keep the tunnel clean, and never run the tunnel empty or with a stalled belt.".to_string(),
        },
        Caution {
            code: "thermal_runaway",
            title: "Thermal runaway",
            text: "Where the loss factor rises with temperature (thawing meat and fish, salted foods, alumina and many ceramics, some polymers) hot spots heat faster than their surroundings. Limit the power density, watch product temperatures at the outlet, and stop short of full thawing when tempering.".to_string(),
        },
        Caution {
            code: "ceramic_dust",
            title: "Broken tube insulators",
            text: "Some magnetron and RF-valve insulators and output windows are beryllium oxide ceramic. Intact, they are safe; broken or ground, they release dust that causes chronic beryllium disease and is a known human carcinogen (IARC Group 1; US OSHA 29 CFR 1910.1024 sets 0.2 µg/m³ over 8 h). Never break, grind or open failed tubes; bag them and return or dispose of them as hazardous waste.".to_string(),
        },
    ];
    if combustible_product {
        list.push(Caution {
            code: "combustible_product",
            title: "Combustible product",
            text: "This product burns. Plan for detection and suppression inside the tunnel, and for what happens to product left under power when the belt stops.".to_string(),
        });
    }
    list.push(Caution {
        code: "local_codes",
        title: "Local codes and licensed practice",
        text: "This plan is an engineering estimate. Electrical installation, radio-frequency emissions, machine safety and exposure are governed by local codes and standards: the design, installation and commissioning must be checked and signed off by licensed professionals.".to_string(),
    });
    list
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn reference_levels() {
        // ICNIRP 2020 Table 5 (from memory, shared/sources.md 9.2): occupational f/40 at 915 MHz.
        assert_relative_eq!(icnirp_whole_body_power_density_w_per_m2(915.0, Exposed::Occupational).unwrap(), 22.875);
        assert_relative_eq!(icnirp_whole_body_power_density_w_per_m2(2450.0, Exposed::GeneralPublic).unwrap(), 10.0);
        assert_eq!(icnirp_whole_body_power_density_w_per_m2(27.12, Exposed::Occupational), None);
        assert_relative_eq!(
            icnirp_whole_body_field_v_per_m(27.12, Exposed::Occupational).unwrap(),
            660.0 / 27.12_f64.powf(0.7)
        );
        assert_relative_eq!(icnirp_whole_body_field_v_per_m(40.68, Exposed::GeneralPublic).unwrap(), 27.7);
    }

    #[test]
    fn every_plan_carries_the_standing_cautions() {
        for freq in [27.12, 915.0, 2450.0] {
            let codes: Vec<&str> = cautions(freq, 17.0, false).iter().map(|c| c.code).collect();
            for required in [
                "exposure_and_leakage",
                "high_voltage",
                "interlocks",
                "arcing_and_fire",
                "thermal_runaway",
                "ceramic_dust",
                "local_codes",
            ] {
                assert!(codes.contains(&required), "{required} missing at {freq} MHz");
            }
        }
        assert!(cautions(915.0, 17.0, true).iter().any(|c| c.code == "combustible_product"));
    }
}
