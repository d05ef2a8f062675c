//! Reference-table tests, one module per published source (see each module's header).

#[test]
#[ignore]
fn explore() {
    use crate::materials::*;
    for m in library() {
        for r in &m.reference_points {
            let s = MaterialState { temp_c: r.temp_c, moisture_wb: r.moisture_wb, salt_pct: None };
            let l = permittivity(m, r.freq_mhz * 1e6, &s).unwrap();
            println!("{:22} {:6} MHz {:6} C  ref {:6.2} {:?}  model {:7.3} {:7.3}  {:?}", m.name, r.freq_mhz, r.temp_c, r.eps_real, r.eps_imag, l.eps.eps_real, l.eps.eps_imag, l.notes);
        }
    }
    for f in [27.12e6, 915e6, 2.45e9] {
        for t in [0.0, 20.0, 25.0, 50.0, 80.0, 100.0] {
            let e = water::permittivity(f, t);
            println!("water {f:e} {t}: {:.3} {:.3}", e.re, -e.im);
        }
    }
}

mod water_models;
mod iapws_saturation;
mod ashrae_frozen_enthalpy;
mod jha_2011_table4;
mod sen_goode_1992;
mod tabulated_points;
mod behaviour;
mod robustness;
