//! Benchmarks of the computation core (criterion): `cargo bench --bench core`.
//! Results are reported in README.md's performance section; nothing here asserts a time.

use criterion::{criterion_group, criterion_main, Criterion};
use doubleprime::materials::{library, permittivity, MaterialState};
use doubleprime::physics::permittivity::ComplexPermittivity;
use doubleprime::physics::waves::wave_properties;
use doubleprime::plan::band_comparison::compare;
use doubleprime::plan::plan;
use doubleprime::plan::product::Product;
use doubleprime::plan::sensitivity::sensitivity;
use doubleprime::scenario::{parse_scenario, Scenario};
use doubleprime::search::space::parse_space;
use doubleprime::search::{search, Search};
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

fn sensitivity_run(c: &mut Criterion) {
    // The sensitivity study alone (its rows re-run the plan core), on a plan already made; a full
    // plan() includes it.
    let scenario = demo("tempering-beef-blocks.json", 12);
    let product = Product::from_scenario(&scenario).expect("demo product");
    let base = plan(&scenario).expect("demo plans");
    c.bench_function("sensitivity run, tempering, 12 zones", |b| {
        b.iter(|| sensitivity(black_box(&scenario), black_box(&product), black_box(&base)))
    });
}

fn design_search(c: &mut Criterion) {
    // 2 bands x 13 classes (every catalogue class at 915 and 2450 MHz) x 2 redundancies x 20 belt
    // widths x 20 bed depths = 10 400 configurations, 10 zones; the bed-depth limit is off so
    // every configuration reaches every check (40 zone marches of 10 zones).
    let scenario = demo("pasteurising-potato-trays.json", 10);
    let space = parse_space(
        r#"{"bands_mhz": [915, 2450], "generator_classes": ["all"], "redundancy": ["n", "n_plus_1"],
            "belt_width_m": {"from": 0.3, "to": 1.2, "steps": 20}, "bed_depth_m": {"from": 0.01, "to": 0.05, "steps": 20},
            "zones": [10], "constraints": {"max_bed_over_penetration_depth": null}}"#,
    )
    .expect("bench space parses");
    let configurations = Search::new(&scenario, &space).expect("bench space resolves").progress().total;
    assert!(configurations >= 10_000, "the bench space has {configurations} configurations");
    let mut group = c.benchmark_group("design search");
    group.sample_size(10);
    group.bench_function(format!("{configurations} configurations, evaluation only"), |b| {
        b.iter(|| {
            let mut running = Search::new(black_box(&scenario), black_box(&space)).expect("resolves");
            running.step(usize::MAX)
        })
    });
    group.bench_function(format!("{configurations} configurations, with the best 5 re-planned"), |b| {
        b.iter(|| search(black_box(&scenario), black_box(&space)))
    });
    group.finish();
}

fn depth_profile_solve(c: &mut Criterion) {
    let layered = demo("layered-meal-trays.json", 1);
    let eps = ComplexPermittivity::new(36.0, 17.0);
    c.bench_function("depth profile, one solve (product, tray, belt, air gap, metal)", |b| {
        b.iter(|| {
            doubleprime::plan::depth_profile::depth_profile(black_box(&layered), black_box(2.45e9), black_box(eps))
        })
    });
}

criterion_group!(
    benches,
    depth_profile_solve,
    dielectric,
    material_lookup,
    full_plan,
    band_comparison,
    sensitivity_run,
    design_search
);
criterion_main!(benches);
