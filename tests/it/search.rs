//! The design search: a tiny space worked by hand, each constraint excluding what it should, the
//! best configuration against a full plan of it, slicing, random spaces, and the CLI.

use crate::support::{run_json, run_refused};
use approx::assert_relative_eq;
use doubleprime::finite::first_non_finite;
use doubleprime::plan::plan;
use doubleprime::scenario::{parse_scenario, FeedSides, Scenario};
use doubleprime::search::space::{parse_space, SearchSpace, CONFIGURATIONS_MAX};
use doubleprime::search::{search, Search, SearchResult};
use proptest::prelude::*;
use std::io::Write;

/// Full plans and the search's figures come from the same functions on the same inputs: they
/// agree to rounding. The peak field is rescaled by sqrt(V_ref / V) (a few ulps).
const SAME_FIGURE_RELATIVE: f64 = 1e-12;
const RESCALED_FIELD_RELATIVE: f64 = 1e-9;

fn demo_path(name: &str) -> String {
    format!("{}/demo-loads/{name}", env!("CARGO_MANIFEST_DIR"))
}

fn demo(name: &str) -> Scenario {
    parse_scenario(&std::fs::read_to_string(demo_path(name)).unwrap()).unwrap()
}

fn space(json: &str) -> SearchSpace {
    parse_space(json).unwrap_or_else(|errors| panic!("space refused: {errors:?}"))
}

fn run(scenario: &Scenario, space_json: &str) -> SearchResult {
    let result = search(scenario, &space(space_json)).unwrap_or_else(|errors| panic!("search refused: {errors:?}"));
    assert_counts_add_up(&result);
    result
}

fn assert_counts_add_up(result: &SearchResult) {
    assert!(result.complete);
    assert_eq!(result.evaluated, result.configurations);
    let rejected: usize = result.rejected_by.total();
    assert_eq!(result.feasible + rejected, result.evaluated, "{:?}", result.rejected_by);
}

/// A constant product worked by hand: cp 2000 J/(kg K) (H = 2000 T), eps* = 10 - j2, 1 kg/s heated
/// 20 -> 70 degC with no loss allowances: 100 kW absorbed; applicator 0.8, transmission 1, so
/// 125 kW of generator output. Bulk density 1000 kg/m^3, residence 100 s: the bed volume under
/// power is 3.6 m^3/h x 100 s = 0.1 m^3 and the tunnel is 0.1 / (W d) m long.
fn by_hand(frequency_mhz: f64, residence: &str, throughput_kg_per_h: f64) -> Scenario {
    parse_scenario(&format!(
        r#"{{"schema": 1, "process": "heating",
            "product": {{"custom": {{"name": "by hand", "density_kg_per_m3": 1000, "specific_heat_j_per_kg_k": 2000,
                "dielectric": {{"model": "constant", "eps_real": 10, "eps_imag": 2}}}}}},
            "throughput_kg_per_h": {throughput_kg_per_h}, "inlet": {{"temp_c": 20}}, "outlet": {{"temp_c": 70}},
            "frequency_mhz": {frequency_mhz}, "efficiency": {{"transmission": 1.0, "applicator": 0.8}},
            "tunnel": {{"belt_width_m": 1, "bed_depth_m": 0.1, "bulk_density_kg_per_m3": 1000, "residence": {residence}, "zones": 1}},
            "losses": {{"surface_pct": 0, "belt_pct": 0, "vapour_pct": 0}},
            "site": {{"auxiliary_kw": 0, "tariff_per_kwh": 0.1}}}}"#
    ))
    .unwrap()
}

const TINY_SPACE: &str = r#"{"bands_mhz": [27.12], "generator_classes": ["rf-27-15", "rf-27-50"],
    "belt_width_m": [0.5, 1.0], "bed_depth_m": [0.05, 0.1], "zones": [1], "redundancy": ["n", "n_plus_1"]}"#;

#[test]
fn a_tiny_space_by_hand() {
    let result = run(&by_hand(27.12, r#"{"residence_time_s": 100}"#, 3600.0), TINY_SPACE);
    // 2 classes x 2 redundancies x 2 depths x 2 widths; nothing breaks a default constraint
    // (tunnels 1 to 4 m, RF penetration depths of metres, a field of 18 kV/m).
    assert_eq!((result.configurations, result.feasible), (16, 16));
    // rf-27-15 gives 13.5 kW usable: ceil(125 / 13.5) = 10 units; rf-27-50, 45 kW: 3 units (by
    // hand); N+1 adds one. Both classes draw 125 / 0.65 / 0.92 = 209.030 kW from the mains.
    // Order: width fastest, then depth, then redundancy, then class. So index 8..11 are
    // rf-27-50 with N, tunnels 4, 2, 2, 1 m. Best by count, then by tunnel, then by place:
    let best: Vec<(usize, u32, f64)> = result
        .best
        .iter()
        .map(|b| (b.candidate.index, b.candidate.generator_count, b.candidate.tunnel_length_m))
        .collect();
    assert_eq!(best.len(), 5);
    let expected = [(11, 3, 1.0), (9, 3, 2.0), (10, 3, 2.0), (8, 3, 4.0), (15, 4, 1.0)];
    for ((index, count, tunnel), (want_index, want_count, want_tunnel)) in best.iter().zip(expected) {
        assert_eq!((*index, *count), (want_index, want_count));
        assert_relative_eq!(*tunnel, want_tunnel, max_relative = SAME_FIGURE_RELATIVE);
    }
    let first = &result.best[0].candidate;
    assert_eq!(first.generator_class, "rf-27-50");
    assert_relative_eq!(first.mains_power_kw, 125.0 / 0.65 / 0.92, max_relative = SAME_FIGURE_RELATIVE);
    // 209.030 kW x 0.1 per kWh over 3.6 t/h (by hand).
    assert_relative_eq!(
        first.energy_cost_per_tonne,
        125.0 / 0.65 / 0.92 * 0.1 / 3.6,
        max_relative = SAME_FIGURE_RELATIVE
    );
    // RF: an even field through the bed, p = 100 kW / 0.1 m^3 everywhere, so
    // E = sqrt(1e6 / (2 pi 27.12e6 eps0 2)) = 18.2 kV/m (eps0 CODATA 2018), and the hot spot is
    // the outlet temperature.
    let eps0 = 8.854_187_812_8e-12;
    let field = (1e6 / (2.0 * std::f64::consts::PI * 27.12e6 * eps0 * 2.0)).sqrt();
    for entry in &result.best {
        assert_relative_eq!(entry.candidate.peak_field_v_per_m.unwrap(), field, max_relative = RESCALED_FIELD_RELATIVE);
        assert_eq!(entry.candidate.hot_spot_temp_c, 70.0);
        assert_eq!(entry.candidate.hot_spot_energy_factor, 1.0);
        assert!(entry.plan_check.agrees, "{:?}", entry.plan_check);
    }
    // The frontier: the shortest tunnel is 1 m for every count, so only 3 units at 1 m is not
    // dominated.
    let frontier: Vec<(u32, usize)> = result.frontier.iter().map(|c| (c.generator_count, c.index)).collect();
    assert_eq!(frontier, [(3, 11)]);
}

#[test]
fn other_objectives_rank_by_hand() {
    let scenario = by_hand(27.12, r#"{"residence_time_s": 100}"#, 3600.0);
    // Shortest tunnel first: the four 1 m tunnels, tied, by generator count: 3, 4, 10, 11.
    let by_length = run(&scenario, &TINY_SPACE.replace("}", r#", "objective": "tunnel_length_m", "best": 4}"#));
    let counts: Vec<u32> = by_length.best.iter().map(|b| b.candidate.generator_count).collect();
    assert_eq!(counts, [3, 4, 10, 11]);
    assert!(by_length.best.iter().all(|b| b.candidate.objective_value == b.candidate.tunnel_length_m));
    // Weighted: 1 per unit + 1 per metre: rf-27-50 N at 1 m is 3 + 1 = 4 (by hand).
    let weighted = run(
        &scenario,
        &TINY_SPACE
            .replace("}", r#", "objective": {"weighted": {"generator_count": 1, "tunnel_length_m": 1}}, "best": 1}"#),
    );
    assert_relative_eq!(weighted.best[0].candidate.objective_value, 4.0, max_relative = SAME_FIGURE_RELATIVE);
    assert_eq!(weighted.best[0].candidate.index, 11);
}

#[test]
fn the_tunnel_length_limit_excludes_the_long_tunnels() {
    let result = run(
        &by_hand(27.12, r#"{"residence_time_s": 100}"#, 3600.0),
        &TINY_SPACE.replace("}", r#", "constraints": {"max_tunnel_length_m": 1.5}}"#),
    );
    // The 2 m, 2 m and 4 m tunnels of each (class, redundancy) go: 12; the four 1 m ones stay.
    assert_eq!((result.rejected_by.max_tunnel_length_m, result.feasible), (12, 4));
    assert!(result.best.iter().all(|b| b.candidate.tunnel_length_m <= 1.5));
}

#[test]
fn the_peak_field_limit_excludes_the_small_beds() {
    // A fixed 2 m tunnel: the bed volume is W d 2, so 0.05, 0.1, 0.1, 0.2 m^3 and the field
    // 18.2 kV/m x sqrt(0.1 / V): 25.7, 18.2, 18.2, 12.9 kV/m (by hand).
    let result = run(
        &by_hand(27.12, r#"{"tunnel_length_m": 2}"#, 3600.0),
        &TINY_SPACE.replace("}", r#", "constraints": {"max_peak_field_v_per_m": 20000}, "best": 50}"#),
    );
    assert_eq!((result.rejected_by.max_peak_field_v_per_m, result.feasible), (4, 12));
    let eps0 = 8.854_187_812_8e-12;
    let field_at = |volume_m3: f64| (100e3 / volume_m3 / (2.0 * std::f64::consts::PI * 27.12e6 * eps0 * 2.0)).sqrt();
    for entry in &result.best {
        let c = &entry.candidate;
        let volume = c.configuration.belt_width_m * c.configuration.bed_depth_m * 2.0;
        assert_relative_eq!(c.peak_field_v_per_m.unwrap(), field_at(volume), max_relative = RESCALED_FIELD_RELATIVE);
        assert!(c.peak_field_v_per_m.unwrap() <= 20_000.0);
        assert!(entry.plan_check.agrees, "{:?}", entry.plan_check);
    }
    assert!(result.warnings.iter().any(|w| w.code == "fixed_tunnel_length"));
}

#[test]
fn the_penetration_depth_limit_excludes_deep_beds_per_fed_face() {
    // eps* = 10 - j2 at 2450 MHz: Dp = 1 / (2 alpha) = 30.9 mm (exact formula, by hand), so a
    // 50 mm bed is 1.6 Dp: too deep fed from one face, fine from two; 20 mm is 0.65 Dp.
    let space = r#"{"bands_mhz": [2450], "generator_classes": ["auto"], "belt_width_m": [0.5, 1.0],
        "bed_depth_m": [0.02, 0.05], "zones": [4], "redundancy": ["n"], "best": 50}"#;
    let top = run(&by_hand(2450.0, r#"{"residence_time_s": 100}"#, 3600.0), space);
    assert_eq!((top.rejected_by.max_bed_over_penetration_depth, top.feasible), (2, 2));
    for entry in &top.best {
        assert_eq!(entry.candidate.configuration.bed_depth_m, 0.02);
        let ratio = entry.candidate.bed_over_penetration_depth.unwrap();
        assert_relative_eq!(ratio, 0.02 / 0.030_946, max_relative = 1e-3);
        assert!(entry.plan_check.agrees, "{:?}", entry.plan_check);
    }
    let mut both = by_hand(2450.0, r#"{"residence_time_s": 100}"#, 3600.0);
    both.tunnel.feed = FeedSides::Both;
    let fed_twice = run(&both, space);
    assert_eq!((fed_twice.rejected_by.max_bed_over_penetration_depth, fed_twice.feasible), (0, 4));
    assert_eq!(fed_twice.space.fed_faces, 2);
}

#[test]
fn the_product_temperature_limit_excludes_the_microwave_hot_spots() {
    // At RF the field is even and the hot spot is the outlet (70 degC); a 2450 MHz bed peaks
    // above its mean, so its hot spot is hotter.
    let space = r#"{"bands_mhz": [27.12, 2450], "generator_classes": ["auto"], "belt_width_m": [1.0],
        "bed_depth_m": [0.02, 0.03], "zones": [4], "redundancy": ["n"], "best": 50,
        "constraints": {"max_product_temp_c": 70.5}}"#;
    let scenario = by_hand(27.12, r#"{"residence_time_s": 100}"#, 3600.0);
    let result = run(&scenario, space);
    assert_eq!((result.rejected_by.max_product_temp_c, result.feasible), (2, 2));
    assert!(result.best.iter().all(|b| b.candidate.configuration.frequency_mhz == 27.12));
    // Switched off: the microwave beds come back with their hot spots above the outlet.
    let open = run(&scenario, &space.replace("70.5", "null"));
    assert_eq!(open.feasible, 4);
    for entry in open.best.iter().filter(|b| b.candidate.configuration.frequency_mhz == 2450.0) {
        assert!(entry.candidate.hot_spot_energy_factor > 1.0);
        assert!(entry.candidate.hot_spot_temp_c > 70.5, "{}", entry.candidate.hot_spot_temp_c);
    }
}

#[test]
fn the_core_to_surface_limit_excludes_the_beds_whose_core_lags() {
    let space = r#"{"bands_mhz": [2450], "generator_classes": ["auto"], "belt_width_m": [1.0],
        "bed_depth_m": [0.005, 0.02, 0.06], "zones": [1], "redundancy": ["n"], "best": 50,
        "constraints": {"max_bed_over_penetration_depth": null, "min_core_to_surface_ratio": 0.5}}"#;
    let scenario = by_hand(2450.0, r#"{"residence_time_s": 100}"#, 3600.0);
    let result = run(&scenario, space);
    // The layered solution's far face gets 1.82, 0.76 and 0.30 of the surface power density (a
    // thin slab resonates): only the 60 mm bed lags.
    assert_eq!((result.rejected_by.min_core_to_surface_ratio, result.feasible), (1, 2));
    assert!(result.best.iter().all(|b| b.candidate.core_to_surface_ratio.unwrap() >= 0.5));
    let open = run(&scenario, &space.replace("0.5}", "null}"));
    assert_eq!(open.feasible, 3);
    assert!(open.best.iter().any(|b| b.candidate.core_to_surface_ratio.unwrap() < 0.5));
}

#[test]
fn a_class_too_big_for_the_load_is_rejected_by_the_generator_selection() {
    // 36 kg/h: 1 kW absorbed, 1.25 kW of output. rf-27-100 would run at 1.25 % of its rating,
    // below its 10 % minimum; the 5 kW solid-state source at 25 %, above its 5 %.
    let space = r#"{"bands_mhz": [27.12], "generator_classes": ["rf-27-100", "rf-27-5-ss"], "belt_width_m": [0.5, 1.0],
        "bed_depth_m": [0.05, 0.1], "zones": [1], "redundancy": ["n", "n_plus_1"], "best": 50}"#;
    let result = run(&by_hand(27.12, r#"{"residence_time_s": 100}"#, 36.0), space);
    assert_eq!((result.rejected_by.generator_selection, result.feasible), (8, 8));
    assert!(result.best.iter().all(|b| b.candidate.generator_class == "rf-27-5-ss"));
}

/// The demo loads over small spaces that move every axis: the search's figures for its best
/// configurations are those of a full plan of each, built here from the candidate's fields.
#[test]
fn the_best_configurations_equal_full_plans_of_them() {
    for (name, space_json) in [
        (
            "tempering-beef-blocks.json",
            r#"{"bands_mhz": [896, 915], "belt_width_m": [0.8, 1.0, 1.4], "bed_depth_m": [0.06, 0.1], "zones": [12]}"#,
        ),
        (
            "layered-meal-trays.json",
            r#"{"bands_mhz": [915, 2450], "generator_classes": ["auto", "mw-2450-6"], "belt_width_m": {"from": 0.3, "to": 0.9, "steps": 4}, "bed_depth_m": [0.01, 0.0125], "zones": [10, 40], "redundancy": ["n", "n_plus_1"]}"#,
        ),
        (
            "drying-sand-cores.json",
            r#"{"bands_mhz": [915, 2450], "belt_width_m": [0.6, 0.8], "bed_depth_m": [0.03, 0.06], "constraints": {"max_bed_over_penetration_depth": null}}"#,
        ),
        (
            "rf-drying-cotton-packages.json",
            r#"{"bands_mhz": [27.12, 40.68], "belt_width_m": [1.0, 1.2], "bed_depth_m": [0.2, 0.25], "objective": "mains_kw"}"#,
        ),
        (
            "pasteurising-potato-trays.json",
            r#"{"bands_mhz": [915], "belt_width_m": [0.5, 0.6, 0.7], "bed_depth_m": [0.01, 0.015], "objective": "energy_cost_per_tonne"}"#,
        ),
    ] {
        let base = demo(name);
        let result = run(&base, space_json);
        assert!(!result.best.is_empty(), "{name}: nothing feasible: {:?}", result.rejected_by);
        for entry in &result.best {
            let c = &entry.candidate;
            let mut scenario = base.clone();
            let own_band = doubleprime::physics::bands::band_containing(base.frequency_mhz).map(|b| b.name);
            if doubleprime::physics::bands::band_containing(c.configuration.frequency_mhz).map(|b| b.name) != own_band {
                scenario.efficiency.generator = None;
                scenario.efficiency.power_supply = None;
            }
            scenario.frequency_mhz = c.configuration.frequency_mhz;
            scenario.generator.class = c.configuration.class_choice.id().map(str::to_string);
            scenario.generator.redundancy = c.configuration.redundancy;
            scenario.tunnel.belt_width_m = c.configuration.belt_width_m;
            scenario.tunnel.bed_depth_m = c.configuration.bed_depth_m;
            scenario.tunnel.zones = c.configuration.zones;
            let full = plan(&scenario).unwrap();
            assert_eq!(full.generator_class, c.generator_class, "{name}");
            assert_eq!(full.generator_count, c.generator_count, "{name}");
            assert_relative_eq!(full.mains_power_kw, c.mains_power_kw, max_relative = SAME_FIGURE_RELATIVE);
            assert_relative_eq!(
                full.utilities.energy_cost_per_tonne,
                c.energy_cost_per_tonne,
                max_relative = SAME_FIGURE_RELATIVE
            );
            assert_relative_eq!(full.tunnel_length_m, c.tunnel_length_m, max_relative = SAME_FIGURE_RELATIVE);
            assert_relative_eq!(full.residence_time_s, c.residence_time_s, max_relative = SAME_FIGURE_RELATIVE);
            assert_relative_eq!(
                full.bed_over_penetration_depth.unwrap(),
                c.bed_over_penetration_depth.unwrap(),
                max_relative = SAME_FIGURE_RELATIVE
            );
            assert_relative_eq!(
                full.peak_field_v_per_m.unwrap(),
                c.peak_field_v_per_m.unwrap(),
                max_relative = RESCALED_FIELD_RELATIVE
            );
            assert!(entry.plan_check.agrees, "{name}: {:?}", entry.plan_check);
            assert_eq!(
                entry.plan_check.warning_codes,
                full.warnings.iter().map(|w| w.code).collect::<Vec<_>>(),
                "{name}"
            );
        }
    }
}

#[test]
fn slices_give_the_same_answer_as_one_run_and_dropping_cancels() {
    let base = demo("layered-meal-trays.json");
    let space_doc =
        space(r#"{"bands_mhz": [915, 2450], "belt_width_m": [0.4, 0.5], "bed_depth_m": [0.02, 0.025], "zones": [5]}"#);
    let whole = search(&base, &space_doc).unwrap();
    let mut sliced = Search::new(&base, &space_doc).unwrap();
    let total = sliced.progress().total;
    assert_eq!(total, whole.configurations);
    let mut last = 0;
    loop {
        let progress = sliced.step(3);
        assert!(progress.evaluated <= last + 3 && progress.evaluated >= last);
        assert!((0.0..=1.0).contains(&progress.fraction()));
        last = progress.evaluated;
        if progress.done {
            break;
        }
        // The ranking so far is readable between slices.
        assert!(sliced.best().len() <= 5);
    }
    assert_eq!(sliced.step(10).evaluated, total, "a finished search stays finished");
    assert_eq!(sliced.finish(), whole);
    // Stopping part way: an incomplete result that says so; then the search is simply dropped.
    let mut stopped = Search::new(&base, &space_doc).unwrap();
    stopped.step(5);
    let part = stopped.finish();
    assert!(!part.complete && part.evaluated == 5);
    assert!(part.warnings.iter().any(|w| w.code == "search_incomplete"));
    drop(stopped);
}

#[test]
fn a_search_can_be_held_by_the_ui_between_slices() {
    // The browser keeps the running search in reactive storage between slices, which asks for an
    // owned value that may be shared: 'static, Send and Sync (checked at compile time).
    fn held<T: Send + Sync + 'static>() {}
    held::<Search>();
    held::<SearchResult>();
}

#[test]
fn bad_spaces_are_refused_by_field() {
    let base = demo("pasteurising-potato-trays.json");
    let fields = |json: &str| -> Vec<String> {
        match parse_space(json) {
            Err(errors) => errors.into_iter().map(|e| e.field).collect(),
            Ok(doc) => match Search::new(&base, &doc) {
                Err(errors) => errors.into_iter().map(|e| e.field).collect(),
                Ok(_) => Vec::new(),
            },
        }
    };
    assert_eq!(fields(r#"{"belt_width_m": {"from": 0.4, "to": 1.2, "steps": 0}}"#), ["space.belt_width_m.steps"]);
    assert_eq!(fields(r#"{"belt_width_m": {"from": 0.4, "to": 1.2, "steps": 2.5}}"#), ["space.belt_width_m.steps"]);
    assert_eq!(fields(r#"{"belt_width_m": {"from": 1.2, "to": 0.4, "steps": 3}}"#), ["space.belt_width_m.to"]);
    assert_eq!(fields(r#"{"bed_depth_m": [0.04, -1, 0.04]}"#), ["space.bed_depth_m[1]", "space.bed_depth_m[2]"]);
    assert_eq!(fields(r#"{"bands_mhz": [5800]}"#), ["space.bands_mhz[0]"]);
    assert_eq!(fields(r#"{"generator_classes": ["nope"]}"#), ["space.generator_classes[0]"]);
    // A class that serves none of the bands is named; a band left without a class, when the
    // classes themselves are fine.
    assert_eq!(fields(r#"{"bands_mhz": [915], "generator_classes": ["mw-2450-6"]}"#), ["space.generator_classes[0]"]);
    assert_eq!(fields(r#"{"bands_mhz": [915, 2450], "generator_classes": ["mw-2450-6"]}"#), ["space.bands_mhz[0]"]);
    assert_eq!(fields(r#"{"zones": [0, 10, 10]}"#), ["space.zones[0]", "space.zones[2]"]);
    assert_eq!(fields(r#"{"redundancy": ["n", "n"]}"#), ["space.redundancy"]);
    assert_eq!(
        fields(r#"{"constraints": {"max_peak_field_v_per_m": -3}}"#),
        ["space.constraints.max_peak_field_v_per_m"]
    );
    assert_eq!(fields(r#"{"constraints": {"max_speed": 3}}"#), ["space.constraints"]);
    assert_eq!(fields(r#"{"objective": "cheapest"}"#), ["space.objective"]);
    assert_eq!(fields(r#"{"objective": {"weighted": {}}}"#), ["space.objective.weighted"]);
    assert_eq!(fields(r#"{"best": 0}"#), ["space.best"]);
    assert_eq!(fields(r#"{"colour": "red"}"#), ["space.colour"]);
    assert_eq!(fields("[1, 2]"), ["space"]);
    // 6 bands x 22 classes x 1000 x 1000 is far over the cap: named, with the cap.
    let huge = parse_space(r#"{"belt_width_m": {"from": 0.1, "to": 2, "steps": 1000}, "bed_depth_m": {"from": 0.01, "to": 0.2, "steps": 1000}}"#).unwrap();
    let error = Search::new(&base, &huge).err().unwrap();
    assert_eq!(error[0].field, "space");
    assert!(error[0].valid.contains(&CONFIGURATIONS_MAX.to_string()), "{}", error[0]);
    // A scenario that needs no heat is refused up front, not counted as a million rejections.
    let mut cold = base.clone();
    cold.outlet.temp_c = cold.inlet.temp_c - 1.0;
    let errors = Search::new(&cold, &SearchSpace::default()).err().unwrap();
    assert!(errors.iter().any(|e| e.field == "outlet.temp_c"), "{errors:?}");
}

#[test]
fn the_default_space_surrounds_the_scenario() {
    let base = demo("tempering-beef-blocks.json");
    let result = search(&base, &SearchSpace::default()).unwrap();
    assert_counts_add_up(&result);
    let space = &result.space;
    // The scenario's own width and depth are on the axes, and its zones and redundancy.
    assert!(space.belt_width_m.contains(&base.tunnel.belt_width_m));
    assert!(space.bed_depth_m.contains(&base.tunnel.bed_depth_m));
    assert_eq!(space.zones, [base.tunnel.zones]);
    let bands: Vec<f64> = space.bands.iter().map(|b| b.frequency_mhz).collect();
    assert_eq!(bands, [13.56, 27.12, 40.68, 896.0, 915.0, 2450.0]);
    assert_eq!(space.constraints.max_peak_field_v_per_m, Some(3e5));
    assert!(result.best.iter().all(|b| b.plan_check.agrees));
}

/// An awkward value where a number belongs (JSON has no NaN or infinity).
fn awkward() -> impl Strategy<Value = serde_json::Value> {
    prop_oneof![
        Just(serde_json::Value::from(-1.0)),
        Just(serde_json::Value::from(0.0)),
        Just(serde_json::Value::from(1e308)),
        Just(serde_json::Value::Null),
        Just(serde_json::Value::from("0.5")),
    ]
}

/// Mostly a valid axis within `low..high` (a list or a grid), sometimes an awkward one.
fn axis(low: f64, high: f64) -> impl Strategy<Value = serde_json::Value> {
    prop_oneof![
        6 => prop::collection::vec(low..high, 1..4).prop_map(serde_json::Value::from),
        3 => (low..high, 0.0..1.0f64, 2u32..4).prop_map(move |(from, spread, steps)| {
            serde_json::json!({"from": from, "to": from + spread * (high - from), "steps": steps})
        }),
        1 => prop::collection::vec(awkward(), 0..3).prop_map(serde_json::Value::from),
        1 => (awkward(), low..high, 0u32..3).prop_map(|(from, to, steps)| serde_json::json!({"from": from, "to": to, "steps": steps})),
    ]
}

fn random_space() -> impl Strategy<Value = serde_json::Value> {
    let bands = prop_oneof![
        8 => prop::sample::subsequence(vec![13.56, 27.12, 40.68, 896.0, 915.0, 2450.0], 1..4),
        1 => prop::sample::subsequence(vec![27.12, 915.0, 5800.0, -1.0], 0..3),
    ];
    let classes = prop::sample::select(vec![
        vec!["auto"],
        vec!["all"],
        vec!["all"],
        vec!["auto", "all"],
        vec!["auto", "all"],
        vec!["auto", "mw-2450-30", "rf-27-50", "mw-915-75", "mw-896-75", "rf-13-25", "rf-40-40"],
        vec!["nope"],
    ]);
    let zones = prop_oneof![9 => prop::collection::vec(1u32..25, 1..3), 1 => prop::collection::vec(0u32..2000, 0..3)];
    let best = prop_oneof![9 => 1u32..8, 1 => Just(0u32)];
    let redundancy = prop::sample::select(vec![vec!["n"], vec!["n_plus_1"], vec!["n", "n_plus_1"]]);
    let constraint = prop::option::of(prop_oneof![
        8 => (0.5..90.0f64).prop_map(serde_json::Value::from),
        1 => Just(serde_json::Value::Null),
        1 => Just(serde_json::Value::from(-5.0)),
    ]);
    let objective = prop::sample::select(vec![
        serde_json::json!("generator_count"),
        serde_json::json!("mains_kw"),
        serde_json::json!("energy_cost_per_tonne"),
        serde_json::json!("tunnel_length_m"),
        serde_json::json!({"weighted": {"generator_count": 1, "mains_kw": 0.01}}),
    ]);
    let constraints = (constraint.clone(), constraint.clone(), constraint.clone(), constraint);
    (bands, classes, axis(0.1, 2.0), axis(0.003, 0.15), zones, redundancy, constraints, objective, best).prop_map(
        |(bands, classes, widths, depths, zones, redundancy, (c1, c2, c3, c4), objective, best)| {
            let mut constraints = serde_json::Map::new();
            for (name, value) in [
                ("max_tunnel_length_m", c1),
                ("max_bed_over_penetration_depth", c2),
                ("max_product_temp_c", c3),
                ("max_peak_field_v_per_m", c4.map(|v| v.as_f64().map_or(v, |x| serde_json::Value::from(x * 1000.0)))),
            ] {
                if let Some(value) = value {
                    constraints.insert(name.into(), value);
                }
            }
            serde_json::json!({"bands_mhz": bands, "generator_classes": classes, "belt_width_m": widths, "bed_depth_m": depths,
                "zones": zones, "redundancy": redundancy, "constraints": constraints, "objective": objective, "best": best})
        },
    )
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]
    /// Whatever the space, the search never panics, its numbers are finite, every configuration
    /// is counted once, the best are in order and the frontier is non-dominated; a refused space
    /// names a field of the space.
    #[test]
    fn random_spaces_are_searched_or_refused_by_name(
        demo_index in 0usize..6,
        space_json in random_space(),
    ) {
        let demos = ["tempering-beef-blocks.json", "pasteurising-potato-trays.json", "drying-sand-cores.json",
            "rf-drying-cotton-packages.json", "curing-rubber-profile.json", "layered-meal-trays.json"];
        let base = demo(demos[demo_index]);
        let outcome = parse_space(&space_json.to_string()).and_then(|doc| search(&base, &doc));
        match outcome {
            Err(errors) => {
                prop_assert!(!errors.is_empty());
                for error in errors {
                    prop_assert!(error.field.starts_with("space"), "{}", error);
                    prop_assert!(!error.valid.is_empty());
                }
            }
            Ok(result) => {
                prop_assert_eq!(first_non_finite(&result), None);
                prop_assert_eq!(result.evaluated, result.configurations);
                prop_assert_eq!(result.feasible + result.rejected_by.total(), result.evaluated);
                prop_assert!(result.best.len() <= (result.space.best as usize).min(result.feasible));
                for pair in result.best.windows(2) {
                    prop_assert!(pair[0].candidate.objective_value <= pair[1].candidate.objective_value);
                }
                for entry in &result.best {
                    prop_assert!(entry.plan_check.agrees, "{:?}", entry.plan_check);
                }
                for pair in result.frontier.windows(2) {
                    prop_assert!(pair[0].generator_count < pair[1].generator_count);
                    prop_assert!(pair[0].tunnel_length_m > pair[1].tunnel_length_m);
                }
            }
        }
    }
}

fn temp_file(name: &str, text: &str) -> String {
    let path = std::env::temp_dir().join(format!("doubleprime-cli-search-{}-{name}", std::process::id()));
    std::fs::File::create(&path).unwrap().write_all(text.as_bytes()).unwrap();
    path.to_string_lossy().into_owned()
}

#[test]
fn cli_search_prints_the_contract_keys() {
    let space = temp_file(
        "space.json",
        r#"{"bands_mhz": [896, 915], "belt_width_m": {"from": 0.8, "to": 1.2, "steps": 3}, "bed_depth_m": [0.05, 0.075],
            "redundancy": ["n", "n_plus_1"], "objective": "mains_kw", "best": 3}"#,
    );
    let result = run_json(&["search", &demo_path("tempering-beef-blocks.json"), "--space", &space]);
    for key in ["evaluated", "feasible", "configurations"] {
        assert!(result[key].is_u64(), "missing {key}");
    }
    assert_eq!(result["objective"], "mains_kw");
    let best = result["best"].as_array().unwrap();
    assert_eq!(best.len(), 3);
    for entry in best {
        for key in [
            "frequency_mhz",
            "belt_width_m",
            "bed_depth_m",
            "tunnel_length_m",
            "mains_power_kw",
            "energy_cost_per_tonne",
            "objective_value",
            "hot_spot_temp_c",
        ] {
            assert!(entry[key].is_number(), "missing {key} in {entry}");
        }
        for key in ["generator_class", "class_choice", "redundancy"] {
            assert!(entry[key].is_string(), "missing {key}");
        }
        assert!(entry["generator_count"].is_u64() && entry["zones"].is_u64());
        let check = &entry["plan_check"];
        assert_eq!(check["agrees"], true);
        assert_eq!(check["generator_count"], entry["generator_count"]);
        assert!(check["mains_power_kw"].is_number() && check["warning_codes"].is_array());
    }
    assert!(!result["frontier"].as_array().unwrap().is_empty());
    for name in [
        "not_planned",
        "generator_selection",
        "max_tunnel_length_m",
        "max_bed_over_penetration_depth",
        "max_peak_field_v_per_m",
        "max_product_temp_c",
        "min_core_to_surface_ratio",
    ] {
        assert!(result["rejected_by"][name].is_u64(), "missing rejected_by.{name}");
    }
    assert!(result["warnings"].is_array());
    // Without --space: the default space around the scenario.
    let default = run_json(&["search", &demo_path("curing-rubber-profile.json")]);
    assert_eq!(default["objective"], "generator_count");
    assert!(default["configurations"].as_u64().unwrap() > 100);
}

#[test]
fn cli_search_refuses_a_bad_space_in_one_line() {
    let scenario = demo_path("pasteurising-potato-trays.json");
    let bad = temp_file("bad-space.json", r#"{"belt_width_m": {"from": 0.4, "to": 1.2, "steps": 0}}"#);
    let line = run_refused(&["search", &scenario, "--space", &bad]);
    assert!(line.contains("space.belt_width_m.steps") && line.contains(&bad), "{line}");
    let unknown = temp_file("unknown-space.json", r#"{"colour": "red", "belt_width_m": "wide"}"#);
    let line = run_refused(&["search", &scenario, "--space", &unknown]);
    assert!(line.contains("space.colour") && line.contains("space.belt_width_m"), "{line}");
    let broken = temp_file("broken-space.json", "{");
    assert!(run_refused(&["search", &scenario, "--space", &broken]).contains("not JSON"));
    assert!(
        run_refused(&["search", &scenario, "--space", "/nonexistent/space.json"]).contains("/nonexistent/space.json")
    );
    assert!(run_refused(&["search", &scenario, "--colour", "red"]).contains("--space"));
    // Scenario and space both wrong: one line naming each file.
    let text = std::fs::read_to_string(&scenario)
        .unwrap()
        .replace(r#""throughput_kg_per_h": 800"#, r#""throughput_kg_per_h": -5"#);
    let bad_scenario = temp_file("bad-scenario.json", &text);
    let over = temp_file("over-space.json", r#"{"bands_mhz": [5800]}"#);
    let line = run_refused(&["search", &bad_scenario, "--space", &over]);
    assert!(line.contains("throughput_kg_per_h") && line.contains("space.bands_mhz[0]"), "{line}");
}
