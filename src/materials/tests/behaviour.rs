//! Behaviour the issue asks for, across the library: out-of-range flags, moisture limits of the
//! mixing rule in a material, continuity and monotonicity of enthalpy, and the trends of water.

use crate::materials::mixing::{mix, MixingRule};
use crate::materials::{library, permittivity, DielectricModel, MaterialState};
use crate::physics::complex::Complex;
use approx::assert_relative_eq;

#[test]
fn out_of_range_requests_are_flagged_not_clamped_silently() {
    // A published single point (Datta & Ramaswamy 2.45 GHz) asked at 915 MHz and 60 degC.
    let apple = library().get("apple").unwrap();
    let lookup = permittivity(apple, 915e6, &MaterialState::at(60.0)).unwrap();
    assert!(!lookup.in_range);
    assert!(lookup.out_of_range.iter().any(|f| f.starts_with("freq_mhz = 915")));
    assert!(lookup.out_of_range.iter().any(|f| f.starts_with("temp_c = 60")));
    // Water above its fitted 0-100 degC range.
    let water = library().get("water").unwrap();
    let hot = permittivity(water, 2.45e9, &MaterialState::at(121.0)).unwrap();
    assert!(!hot.in_range && hot.out_of_range[0].contains("0 to 100"));
    // Inside the range nothing is flagged.
    assert!(permittivity(water, 2.45e9, &MaterialState::at(50.0)).unwrap().in_range);
    // A constant polymer value outside its declared temperatures.
    let nylon = library().get("nylon-66").unwrap();
    assert!(!permittivity(nylon, 2.45e9, &MaterialState::at(120.0)).unwrap().in_range);
    // A moist material dried below its declared moisture range.
    let grain = library().get("wheat-grain").unwrap();
    let dry = MaterialState { moisture_wb: Some(0.02), ..MaterialState::at(20.0) };
    let lookup = permittivity(grain, 2.45e9, &dry).unwrap();
    assert!(lookup.out_of_range.iter().any(|f| f.starts_with("moisture_wb = 0.02")));
}

#[test]
fn invalid_requests_are_errors_naming_the_field() {
    let water = library().get("water").unwrap();
    let error = permittivity(water, 2.45e9, &MaterialState::at(400.0)).unwrap_err();
    assert_eq!(error.field, "temp_c");
    assert!(error.valid.contains("-60 to 300"));
    let error = permittivity(water, -1.0, &MaterialState::at(20.0)).unwrap_err();
    assert_eq!(error.field, "freq_mhz");
    let bad_salt = MaterialState { salt_pct: Some(30.0), ..MaterialState::at(20.0) };
    assert_eq!(permittivity(water, 915e6, &bad_salt).unwrap_err().field, "salt_pct");
    let bad_moisture = MaterialState { moisture_wb: Some(1.0), ..MaterialState::at(20.0) };
    assert_eq!(permittivity(water, 915e6, &bad_moisture).unwrap_err().field, "moisture_wb");
    let ptfe = library().get("ptfe").unwrap();
    let error =
        crate::materials::permittivity_with_conductivity(ptfe, 915e6, &MaterialState::at(20.0), Some(1.0)).unwrap_err();
    assert_eq!(error.field, "conductivity_s_per_m");
}

#[test]
fn moist_material_limits_no_water_and_wetter() {
    // No water: the moist model is the mix of the solid and air only (Looyenga).
    let paper = library().get("paper").unwrap();
    let DielectricModel::Moist {
        solid_eps_real,
        solid_eps_imag,
        solid_density_kg_per_m3,
        dry_bulk_density_kg_per_m3,
        ..
    } = &paper.dielectric
    else {
        panic!("paper is a moist-model material");
    };
    let v_solid = dry_bulk_density_kg_per_m3 / solid_density_kg_per_m3;
    let dry_mix = mix(
        &[(v_solid, Complex::new(*solid_eps_real, -solid_eps_imag)), (1.0 - v_solid, Complex::ONE)],
        MixingRule::Looyenga,
    );
    let dry = MaterialState { moisture_wb: Some(0.0), ..MaterialState::at(20.0) };
    let lookup = permittivity(paper, 2.45e9, &dry).unwrap();
    assert_relative_eq!(lookup.eps.eps_real, dry_mix.re, max_relative = 1e-12);
    assert_relative_eq!(lookup.eps.eps_imag, -dry_mix.im, max_relative = 1e-12);
    // The recalled dry-paper value the solid was derived from (von Hippel 1954, 2.85 - j0.17).
    assert_relative_eq!(lookup.eps.eps_real, 2.85, max_relative = 0.01);
    assert_relative_eq!(lookup.eps.eps_imag, 0.17, max_relative = 0.05);
    // eps' and eps'' rise monotonically with moisture during drying's reverse.
    let mut previous = (0.0, 0.0);
    for m in [0.0, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6] {
        let state = MaterialState { moisture_wb: Some(m), ..MaterialState::at(40.0) };
        let eps = permittivity(paper, 915e6, &state).unwrap().eps;
        assert!(eps.eps_real > previous.0 && eps.eps_imag > previous.1, "{m}");
        previous = (eps.eps_real, eps.eps_imag);
    }
    // Nearly all water: dough at the highest accepted moisture (0.95) tends to its brine; 3.5 vol %
    // of solids remain, which lowers eps' by about 7 % under Looyenga, so 8 % is allowed.
    let dough = library().get("wheat-dough").unwrap();
    let wet = MaterialState { moisture_wb: Some(0.95), ..MaterialState::at(20.0) };
    let lookup = permittivity(dough, 2.45e9, &wet).unwrap();
    let water = crate::materials::saline::permittivity(2.45e9, 20.0, 0.011 / (0.95 + 0.011), None).eps;
    assert!((lookup.eps.eps_real / water.re - 1.0).abs() < 0.08, "{lookup:?} vs {water:?}");
}

#[test]
fn enthalpy_is_continuous_and_rising_for_every_material() {
    for material in library() {
        let mut previous = f64::NEG_INFINITY;
        let mut t = -60.0;
        while t <= 150.0 {
            let h = material.enthalpy_j_per_kg(t, None).unwrap();
            assert!(h.is_finite() && h > previous, "{} at {t}", material.name);
            // Continuity: a 1 mK step moves H by less than 1 kJ/kg (the steepest apparent specific
            // heat, peas just below -0.6 degC, is about 430 kJ/(kg K)), except pure ice melting.
            let step = material.enthalpy_j_per_kg(t + 1e-3, None).unwrap() - h;
            let melting = material.name == "ice" && t < 0.0 && t + 1e-3 >= 0.0;
            assert!(melting || step.abs() < 1000.0, "{} jumps {step} at {t}", material.name);
            previous = h;
            t += 0.25;
        }
    }
}

#[test]
fn ice_to_water_includes_the_latent_heat() {
    let ice = library().get("ice").unwrap();
    let step = ice.enthalpy_j_per_kg(0.0, None).unwrap() - ice.enthalpy_j_per_kg(-1e-9, None).unwrap();
    assert_relative_eq!(step, crate::materials::thermal::LATENT_HEAT_FUSION_J_PER_KG, max_relative = 1e-6);
}

#[test]
fn water_loss_falls_and_tempering_loss_rises() {
    let water = library().get("water").unwrap();
    let at = |t: f64| permittivity(water, 915e6, &MaterialState::at(t)).unwrap().eps.eps_imag;
    assert!(at(20.0) > 4.0 * at(100.0));
    let ice = library().get("ice").unwrap();
    let ice_loss = permittivity(ice, 915e6, &MaterialState::at(-10.0)).unwrap().eps.eps_imag;
    assert!(ice_loss < 1e-3 * at(20.0));
}

#[test]
fn lookups_name_their_model_and_sources() {
    for material in library() {
        let (t, f) = (material.ranges().temp_c[0].max(-60.0), 2.45e9);
        let lookup = permittivity(material, f, &MaterialState::at(t)).unwrap();
        assert!(!lookup.model.is_empty() && !lookup.source.is_empty(), "{}", material.name);
        assert!(material.specific_heat_j_per_kg_k(t, None).unwrap() > 100.0, "{}", material.name);
    }
}

#[test]
fn drying_changes_bulk_density_and_specific_heat() {
    let paper = library().get("paper").unwrap();
    let wet = paper.bulk_density_kg_per_m3(Some(0.5)).unwrap();
    let dry = paper.bulk_density_kg_per_m3(Some(0.0)).unwrap();
    assert!(wet > dry);
    assert!(
        paper.specific_heat_j_per_kg_k(20.0, Some(0.5)).unwrap()
            > paper.specific_heat_j_per_kg_k(20.0, Some(0.05)).unwrap()
    );
    let bread = library().get("bread").unwrap();
    assert!(
        bread.specific_heat_j_per_kg_k(20.0, Some(0.1)).unwrap() < bread.specific_heat_j_per_kg_k(20.0, None).unwrap()
    );
}
