//! Benchmarks of the computation core (criterion): `cargo bench --bench core`.
//! Results are reported in README.md's performance section; nothing here asserts a time.

use criterion::{criterion_group, criterion_main, Criterion};
use doubleprime::materials::{library, permittivity, MaterialState};
use doubleprime::physics::permittivity::ComplexPermittivity;
use doubleprime::physics::waves::wave_properties;
use doubleprime::plan::band_comparison::compare;
use doubleprime::plan::plan;
use doubleprime::scenario::{parse_scenario, Scenario};
use std::hint::black_box;

fn demo(name: &str, zones: u32) -> Scenario {
    let path = format!("{}/demo-loads/{name}", env!("CARGO_MANIFEST_DIR"));
    let mut scenario = parse_scenario(&std::fs::read_to_string(path).expect("demo load")).expect("demo parses");
    scenario.tunnel.zones = zones;
    scenario
}

fn dielectric(c: &mut Criterion) {
    let eps = ComplexPermittivity::new(56.0, 21.0);
    c.bench_function("dielectric evaluation (waves at 915 MHz)", |b| {
        b.iter(|| wave_properties(black_box(915e6), black_box(eps)))
    });
}

fn material_lookup(c: &mut Criterion) {
    let beef = library().get("beef-lean").expect("library has beef-lean");
    let potato = library().get("potato-raw").expect("library has potato-raw");
    let frozen = MaterialState { temp_c: -4.0, moisture_wb: None, salt_pct: None };
    let warm = MaterialState { temp_c: 30.0, moisture_wb: None, salt_pct: None };
    c.bench_function("material lookup, frozen-food model (beef at -4 degC)", |b| {
        b.iter(|| permittivity(beef, black_box(915e6), black_box(&frozen)))
    });
    c.bench_function("material lookup, table interpolation (potato at 30 degC)", |b| {
        b.iter(|| permittivity(potato, black_box(1500e6), black_box(&warm)))
    });
}

fn full_plan(c: &mut Criterion) {
    let one_zone = demo("tempering-beef-blocks.json", 1);
    let many_zones = demo("tempering-beef-blocks.json", 200);
    let layered = demo("layered-meal-trays.json", 200);
    c.bench_function("plan, tempering, 1 zone", |b| b.iter(|| plan(black_box(&one_zone))));
    c.bench_function("plan, tempering, 200 zones", |b| b.iter(|| plan(black_box(&many_zones))));
    c.bench_function("plan, layered trays, 200 zones", |b| b.iter(|| plan(black_box(&layered))));
}

fn band_comparison(c: &mut Criterion) {
    let scenario = demo("drying-sand-cores.json", 10);
    c.bench_function("band comparison, sand cores, 10 zones", |b| b.iter(|| compare(black_box(&scenario))));
}

criterion_group!(benches, dielectric, material_lookup, full_plan, band_comparison);
criterion_main!(benches);
