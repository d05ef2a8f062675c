//! Library materials reproduce their tabulated values exactly, and the stored values match their
//! sources (rows copied from the sources so a typo in library.json is caught).
//! - Datta & Ramaswamy (eds.), Microwave Technology for Food Applications (2001), 2.45 GHz, as
//!   reproduced in Table 1.2 of Introduction to Advanced Food Process Engineering (published).
//! - Zhang et al. (2004) via Jha et al. (2011) Table 4 (published).
//! - von Hippel (1954) at 3 GHz, 25 degC (from memory, shared/sources.md 3.3).
//! - Torgovnikov (1993) at 2.45 GHz, 20 degC (from memory, midpoints of recalled ranges).

use crate::materials::{library, permittivity, DielectricModel, MaterialState};

struct Row {
    name: &'static str,
    freq_mhz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    eps_real: f64,
    eps_imag: f64,
}

const fn row(name: &'static str, freq_mhz: f64, temp_c: f64, eps_real: f64, eps_imag: f64) -> Row {
    Row { name, freq_mhz, temp_c, moisture_wb: None, eps_real, eps_imag }
}

const ROWS: [Row; 21] = [
    // Datta & Ramaswamy (2001), 2.45 GHz, room temperature (stored at 22 degC).
    row("apple", 2450.0, 22.0, 54.0, 10.0),
    row("banana", 2450.0, 22.0, 60.0, 18.0),
    row("carrot", 2450.0, 22.0, 56.0, 15.0),
    row("grape", 2450.0, 22.0, 65.0, 17.0),
    row("mango", 2450.0, 22.0, 61.0, 14.0),
    row("potato-raw", 2450.0, 22.0, 57.0, 17.0),
    row("milk-fat", 2450.0, 22.0, 2.6, 0.2),
    // Zhang et al. (2004) via Jha et al. (2011), Table 4.
    row("pork-luncheon-roll", 2450.0, 5.0, 36.08, 17.14),
    // von Hippel (1954), from memory: eps' and eps'' = eps' tan(delta).
    row("ptfe", 2450.0, 25.0, 2.08, 0.0006),
    row("polyethylene", 2450.0, 25.0, 2.26, 0.0007),
    row("polypropylene", 2450.0, 25.0, 2.24, 0.001),
    row("polystyrene", 2450.0, 25.0, 2.55, 0.0008),
    row("nylon-66", 2450.0, 25.0, 3.0, 0.04),
    row("quartz-glass", 2450.0, 25.0, 3.78, 0.0004),
    row("borosilicate-glass", 2450.0, 25.0, 4.7, 0.025),
    row("alumina", 2450.0, 25.0, 9.4, 0.003),
    row("rubber-natural", 2450.0, 25.0, 2.3, 0.006),
    // Torgovnikov (1993), from memory; wood moisture converted from dry basis.
    Row {
        name: "wood-softwood",
        freq_mhz: 2450.0,
        temp_c: 20.0,
        moisture_wb: Some(0.0),
        eps_real: 1.9,
        eps_imag: 0.075,
    },
    Row {
        name: "wood-softwood",
        freq_mhz: 2450.0,
        temp_c: 20.0,
        moisture_wb: Some(0.0909),
        eps_real: 2.5,
        eps_imag: 0.3,
    },
    Row {
        name: "wood-softwood",
        freq_mhz: 2450.0,
        temp_c: 20.0,
        moisture_wb: Some(0.2308),
        eps_real: 4.5,
        eps_imag: 1.25,
    },
    Row {
        name: "wood-softwood",
        freq_mhz: 2450.0,
        temp_c: 20.0,
        moisture_wb: Some(0.4118),
        eps_real: 12.5,
        eps_imag: 4.0,
    },
];

/// Exact reproduction: a stored point is returned unchanged (one point, weight 1).
fn check(row: &Row) {
    let material = library().get(row.name).unwrap();
    let state = MaterialState { moisture_wb: row.moisture_wb, ..MaterialState::at(row.temp_c) };
    let lookup = permittivity(material, row.freq_mhz * 1e6, &state).unwrap();
    assert_eq!(
        (lookup.eps.eps_real, lookup.eps.eps_imag),
        (row.eps_real, row.eps_imag),
        "{} at {} MHz, {} degC",
        row.name,
        row.freq_mhz,
        row.temp_c
    );
    assert!(lookup.in_range, "{}: {:?}", row.name, lookup.out_of_range);
    assert_eq!(lookup.points_used.len(), 1);
    assert!(!lookup.points_used[0].source.is_empty());
}

#[test]
fn library_reproduces_its_sources() {
    for row in &ROWS {
        check(row);
    }
    let distinct: std::collections::BTreeSet<&str> = ROWS.iter().map(|r| r.name).collect();
    assert!(distinct.len() >= 10);
}

#[test]
fn every_table_point_of_every_material_is_reproduced() {
    for material in library() {
        if let DielectricModel::Table { points, .. } = &material.dielectric {
            for point in points {
                let state = MaterialState { moisture_wb: point.moisture_wb, ..MaterialState::at(point.temp_c) };
                let lookup = permittivity(material, point.freq_mhz * 1e6, &state).unwrap();
                assert_eq!(lookup.eps.eps_real, point.eps_real, "{}", material.name);
                assert_eq!(lookup.eps.eps_imag, point.eps_imag, "{}", material.name);
                assert!(lookup.in_range);
            }
        }
    }
}

#[test]
fn wood_interpolates_in_moisture_between_torgovnikov_points() {
    let wood = library().get("wood-softwood").unwrap();
    let state = MaterialState { moisture_wb: Some(0.16085), ..MaterialState::at(20.0) };
    let lookup = permittivity(wood, 2.45e9, &state).unwrap();
    assert!((lookup.eps.eps_real - 3.5).abs() < 1e-9, "{lookup:?}");
    assert_eq!(lookup.points_used.len(), 2);
    assert!(lookup.in_range);
}
