//! The zone march and the sensitivity study: energy conservation along the tunnel, the march with
//! constant properties, tempering near the thaw, drying with a falling loss factor, the peak field
//! and coupling warnings, the sensitivity ranking, and a property test over zone counts and inputs.

use crate::support::run_json;
use approx::assert_relative_eq;
use doubleprime::plan::zone_march::{cavity_coupling, WALL_LOSS_PER_PASS};
use doubleprime::plan::{plan, plan_json, Plan};
use doubleprime::scenario::parse_scenario;
use proptest::prelude::*;
use std::path::Path;

/// Zone powers are shares of the balance's absorbed power that sum to one: the sum equals it to
/// rounding (exact identity; a few ulp per zone over at most 1000 zones).
const CONSERVATION_TOLERANCE: f64 = 1e-9;
/// The enthalpy inversion stops within 1e-9 K; a constant-cp product's temperatures are exact
/// otherwise (exact identity), so 1e-6 K leaves room for rounding in the sums.
const TEMPERATURE_TOLERANCE_K: f64 = 1e-6;

const DEMO_LOADS: [&str; 6] = [
    "tempering-beef-blocks.json",
    "pasteurising-potato-trays.json",
    "drying-sand-cores.json",
    "layered-meal-trays.json",
    "rf-drying-cotton-packages.json",
    "curing-rubber-profile.json",
];

fn demo_text(name: &str) -> String {
    std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-loads").join(name)).unwrap()
}

fn planned(text: &str) -> Plan {
    plan_json(text).unwrap_or_else(|errors| panic!("plan refused: {errors:?}"))
}

fn codes(plan: &Plan) -> Vec<&'static str> {
    plan.warnings.iter().map(|w| w.code).collect()
}

/// A user-defined material with a constant permittivity and specific heat.
fn constant_product(eps_real: f64, eps_imag: f64, specific_heat: f64) -> String {
    format!(
        r#"{{"custom": {{"name": "constant test load", "density_kg_per_m3": 1000, "specific_heat_j_per_kg_k": {specific_heat},
            "dielectric": {{"model": "constant", "eps_real": {eps_real}, "eps_imag": {eps_imag}}}}}}}"#
    )
}

/// A heating scenario: no loss allowances, no auxiliaries, the rest given.
fn heating_scenario(
    product: &str,
    frequency_mhz: f64,
    zones: u32,
    inlet_c: f64,
    outlet_c: f64,
    tunnel: &str,
) -> String {
    format!(
        r#"{{"schema": 1, "process": "heating", "product": {product}, "throughput_kg_per_h": 500,
            "inlet": {{"temp_c": {inlet_c}}}, "outlet": {{"temp_c": {outlet_c}}}, "frequency_mhz": {frequency_mhz},
            "losses": {{"surface_pct": 0, "belt_pct": 0, "vapour_pct": 0}},
            "site": {{"auxiliary_kw": 0}},
            "tunnel": {tunnel_with_zones}}}"#,
        tunnel_with_zones = tunnel.replace("ZONES", &zones.to_string())
    )
}

const PLAIN_TUNNEL: &str =
    r#"{"belt_width_m": 0.5, "bed_depth_m": 0.03, "residence": {"tunnel_length_m": 4}, "zones": ZONES}"#;

fn assert_conserves(plan: &Plan, label: &str) {
    let sum: f64 = plan.zones.iter().map(|z| z.absorbed_kw).sum();
    assert_relative_eq!(sum, plan.absorbed_power_kw, max_relative = CONSERVATION_TOLERANCE);
    let model = plan.zone_model.as_ref().unwrap_or_else(|| panic!("{label}: a zone model"));
    assert_relative_eq!(model.zones_absorbed_sum_kw, plan.absorbed_power_kw, max_relative = CONSERVATION_TOLERANCE);
    // The water removed zone by zone is the balance's (exact identity up to rounding).
    let water: f64 = plan.zones.iter().map(|z| z.water_removed_kg_per_h).sum();
    assert_relative_eq!(water, plan.water_removed_kg_per_h, max_relative = 1e-9, epsilon = 1e-9);
}

#[test]
fn every_demo_load_shares_the_balance_exactly() {
    for name in DEMO_LOADS {
        let scenario = parse_scenario(&demo_text(name)).unwrap();
        let plan = plan(&scenario).unwrap();
        assert_eq!(plan.zones.len(), scenario.tunnel.zones as usize, "{name}");
        assert_conserves(&plan, name);
        let model = plan.zone_model.as_ref().unwrap();
        assert!(model.converged, "{name}: the split settles within {} passes", model.passes);
        // The zones tile the tunnel from the inlet.
        assert_eq!(plan.zones[0].start_m, 0.0, "{name}");
        assert_relative_eq!(plan.zones.last().unwrap().end_m, plan.tunnel_length_m, max_relative = 1e-12);
        for pair in plan.zones.windows(2) {
            assert_relative_eq!(pair[0].end_m, pair[1].start_m, max_relative = 1e-12);
        }
        // The last zone leaves at the end of the balance's path: the outlet, or the evaporation
        // temperature for a dried product that leaves cooler than that (the RF cotton at 95 degC:
        // the balance counts no heat below T_e, the product cools in the air).
        let last = plan.zones.last().unwrap();
        let path_end = if plan.water_removed_kg_per_h > 0.0 {
            scenario.outlet.temp_c.max(plan.assumptions.evaporation_temp_c)
        } else {
            scenario.outlet.temp_c
        };
        assert_relative_eq!(last.temp_c, path_end, epsilon = TEMPERATURE_TOLERANCE_K);
        assert_relative_eq!(last.moisture_wb, plan.assumptions.outlet_moisture_wb, epsilon = 1e-12);
        // Lossy loads in a metal tunnel: the cavity couples better than the assumed efficiency,
        // so none of the demo loads warns of a shortfall.
        assert!(!codes(&plan).contains(&"coupling_below_assumed"), "{name}: {}", model.mean_coupling);
        assert!(
            plan.peak_field_v_per_m.unwrap()
                >= plan.zones.iter().filter_map(|z| z.peak_field_v_per_m).fold(0.0, f64::max)
        );
    }
}

#[test]
fn plan_json_carries_zones_sensitivity_and_the_zone_model() {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-loads").join("drying-sand-cores.json");
    let json = run_json(&["plan", &path.to_string_lossy()]);
    let zones = json["zones"].as_array().unwrap();
    assert_eq!(zones.len(), 10);
    for key in [
        "index",
        "start_m",
        "end_m",
        "temp_c",
        "moisture_wb",
        "frozen_fraction",
        "eps_real",
        "eps_imag",
        "absorbed_kw",
        "stage",
        "coupling",
        "single_pass_absorptance",
        "penetration_depth_m",
        "mean_power_density_kw_per_m3",
        "peak_field_v_per_m",
        "runaway",
        "water_removed_kg_per_h",
    ] {
        assert!(zones[0].get(key).is_some(), "zones[0].{key}");
    }
    assert!(json["sensitivity"].as_array().unwrap().len() >= 10);
    assert_eq!(json["zone_model"]["applicator"], "cavity");
    for key in ["depth_profile", "mean_field_v_per_m", "peak_field_v_per_m", "uniformity"] {
        assert!(json.get(key).is_some(), "{key}");
    }
}

#[test]
fn constant_properties_give_every_zone_the_same_share_and_the_outlet() {
    for (frequency_mhz, zones) in [(915.0, 7), (2450.0, 1), (27.12, 5)] {
        let text =
            heating_scenario(&constant_product(20.0, 4.0, 2500.0), frequency_mhz, zones, 20.0, 80.0, PLAIN_TUNNEL);
        let plan = planned(&text);
        // By hand: 500 kg/h x 2500 J/kg K x 60 K = 20.833 kW, no allowances.
        assert_relative_eq!(plan.absorbed_power_kw, 500.0 * 2500.0 * 60.0 / 3.6e6, max_relative = 1e-12);
        assert_conserves(&plan, "constant");
        let share = plan.absorbed_power_kw / f64::from(zones);
        for (index, zone) in plan.zones.iter().enumerate() {
            assert_relative_eq!(zone.absorbed_kw, share, max_relative = 1e-12);
            // Constant cp and an even split: the temperature rises linearly (exact identity).
            let expected = 20.0 + 60.0 * (index + 1) as f64 / f64::from(zones);
            assert_relative_eq!(zone.temp_c, expected, epsilon = TEMPERATURE_TOLERANCE_K);
            assert_eq!(zone.eps_imag, 4.0);
            assert!(!zone.runaway);
        }
        let model = plan.zone_model.as_ref().unwrap();
        assert_eq!(model.passes, 1, "nothing changes along the tunnel: one pass");
        assert_relative_eq!(model.outlet_temp_c, 80.0, epsilon = TEMPERATURE_TOLERANCE_K);
        let zone = &plan.zones[0];
        if frequency_mhz < 300.0 {
            // RF: capacitive applicator, the scenario's efficiency as the coupling, no plane-wave passes.
            assert_eq!(model.applicator, "capacitive");
            assert_eq!(zone.coupling, plan.assumptions.efficiency.applicator);
            assert_eq!(zone.single_pass_absorptance, None);
        } else {
            assert_eq!(model.applicator, "cavity");
            let single_pass = zone.single_pass_absorptance.unwrap();
            assert_eq!(zone.coupling, cavity_coupling(single_pass, WALL_LOSS_PER_PASS));
            assert_relative_eq!(model.mean_coupling, zone.coupling, max_relative = 1e-12);
        }
    }
}

#[test]
fn one_and_a_thousand_zones_conserve_and_end_at_the_outlet() {
    for zones in [1, 2, 1000] {
        let text = heating_scenario(r#"{"library": "beef-lean"}"#, 915.0, zones, 2.0, 70.0, PLAIN_TUNNEL);
        let plan = planned(&text);
        assert_eq!(plan.zones.len(), zones as usize);
        assert_conserves(&plan, "beef heating");
        assert_relative_eq!(plan.zones.last().unwrap().temp_c, 70.0, epsilon = TEMPERATURE_TOLERANCE_K);
        for pair in plan.zones.windows(2) {
            assert!(pair[1].temp_c > pair[0].temp_c, "heating only rises");
        }
    }
}

#[test]
fn tempering_flags_the_loss_factor_rising_towards_the_thaw() {
    // Lean beef at 915 MHz: eps'' about 1.2 at -18 degC and several times that at -3 degC, the
    // ice melting out (ASHRAE ice fraction and the frozen-food mixing model, sources.md 3.2, 7).
    let text = r#"{"schema": 1, "process": "tempering", "product": {"library": "beef-lean"}, "throughput_kg_per_h": 2000,
        "inlet": {"temp_c": -18}, "outlet": {"temp_c": -3}, "frequency_mhz": 915,
        "tunnel": {"belt_width_m": 1.0, "bed_depth_m": 0.05, "residence": {"residence_time_s": 300}, "feed": "both", "zones": 8}}"#;
    let plan = planned(text);
    assert_conserves(&plan, "tempering");
    let zones = &plan.zones;
    for pair in zones.windows(2) {
        assert!(pair[1].eps_imag > pair[0].eps_imag, "eps'' rises zone by zone");
        assert!(pair[1].frozen_fraction < pair[0].frozen_fraction, "the ice melts zone by zone");
    }
    assert!(zones.last().unwrap().eps_imag > 3.0 * zones[0].eps_imag);
    assert!(zones.iter().all(|z| z.runaway), "every zone's loss factor rises faster than 1 %/K");
    let runaway = plan.warnings.iter().find(|w| w.code == "runaway_risk").expect("a runaway warning");
    assert!(
        runaway.message.contains("zone march") && runaway.message.contains("zones 1-8 of 8"),
        "{}",
        runaway.message
    );
    assert_eq!(plan.zone_model.as_ref().unwrap().runaway_zones, (1..=8).collect::<Vec<u32>>());
}

#[test]
fn drying_at_2450_absorbs_less_as_the_loss_factor_falls() {
    // The sand-core demo: water-glass cores dried from 4 % to 0.5 %; eps'' falls with moisture
    // (mixing model of the library entry), so the bed's single-pass absorptance and the cavity
    // coupling fall along the evaporating zones and so does their share of the power.
    let plan = planned(&demo_text("drying-sand-cores.json"));
    let evaporating: Vec<_> = plan.zones.iter().filter(|z| z.stage == "evaporating").collect();
    assert!(evaporating.len() >= 4, "most of the tunnel evaporates");
    for pair in evaporating.windows(2) {
        assert!(pair[1].moisture_wb < pair[0].moisture_wb);
        assert!(pair[1].eps_imag < pair[0].eps_imag);
        assert!(pair[1].absorbed_kw < pair[0].absorbed_kw, "{} then {}", pair[0].absorbed_kw, pair[1].absorbed_kw);
        assert!(pair[1].water_removed_kg_per_h > 0.0);
    }
    let (first, last) = (evaporating[0], evaporating[evaporating.len() - 1]);
    assert!(last.absorbed_kw < 0.98 * first.absorbed_kw);
    assert!(last.penetration_depth_m.unwrap() > 2.0 * first.penetration_depth_m.unwrap());
    // Evaporation holds the temperature: no runaway flag in those zones.
    assert!(evaporating[..evaporating.len() - 1].iter().all(|z| !z.runaway));
    assert!(evaporating[..evaporating.len() - 1]
        .iter()
        .all(|z| (z.temp_c - plan.assumptions.evaporation_temp_c).abs() < TEMPERATURE_TOLERANCE_K));
}

#[test]
fn a_product_entering_above_the_boiling_point_flashes_in_the_first_zone() {
    // Vacuum drying at 20 kPa (T_e about 60 degC) of paper entering at 80 degC: the balance credits
    // the heat above T_e to evaporation, so the march starts evaporating at the inlet.
    let text = r#"{"schema": 1, "process": "drying", "product": {"library": "paper"}, "throughput_kg_per_h": 200, "pressure_kpa": 20,
        "inlet": {"temp_c": 80, "moisture_wb": 0.5}, "outlet": {"temp_c": 70, "moisture_wb": 0.1}, "frequency_mhz": 2450,
        "tunnel": {"belt_width_m": 1.0, "bed_depth_m": 0.02, "residence": {"tunnel_length_m": 4}, "zones": 5}}"#;
    let plan = planned(text);
    assert_conserves(&plan, "vacuum flash");
    let first = &plan.zones[0];
    assert_eq!(first.stage, "evaporating");
    assert_relative_eq!(first.temp_c, plan.assumptions.evaporation_temp_c, epsilon = TEMPERATURE_TOLERANCE_K);
    assert_relative_eq!(plan.zones.last().unwrap().temp_c, 70.0, epsilon = TEMPERATURE_TOLERANCE_K);
}

#[test]
fn a_lossless_product_is_shared_evenly_and_warned_about() {
    let text = heating_scenario(&constant_product(4.0, 0.0, 800.0), 2450.0, 5, 20.0, 60.0, PLAIN_TUNNEL);
    let plan = planned(&text);
    assert_conserves(&plan, "lossless");
    for zone in &plan.zones {
        assert_eq!(zone.coupling, 0.0);
        assert_eq!(zone.peak_field_v_per_m, None);
        assert_eq!(zone.penetration_depth_m, None);
        assert_relative_eq!(zone.absorbed_kw, plan.absorbed_power_kw / 5.0, max_relative = 1e-12);
    }
    assert!(codes(&plan).contains(&"coupling_below_assumed"));
    assert!(codes(&plan).contains(&"low_loss_product"));
}

#[test]
fn a_low_loss_bed_couples_below_the_assumed_efficiency_but_not_at_rf() {
    // PTFE (eps'' 6e-4 in the library, von Hippel 1954) in a 30 mm bed: a single pass absorbs
    // almost nothing (by hand, before reflections: 2 alpha d = k0 d eps''/sqrt(eps') = 6.4e-4), so
    // the walls take nearly all: eta = a / (a + 0.03 (1 - a)) is about 0.02.
    let text = heating_scenario(r#"{"library": "ptfe"}"#, 2450.0, 4, 20.0, 60.0, PLAIN_TUNNEL);
    let plan = planned(&text);
    let model = plan.zone_model.as_ref().unwrap();
    assert!(model.mean_coupling < 0.1, "{}", model.mean_coupling);
    let warning = plan.warnings.iter().find(|w| w.code == "coupling_below_assumed").expect("a coupling warning");
    assert!(warning.message.contains("85 %"), "{}", warning.message);
    // RF applicators are not cavities: no coupling model, no such warning.
    let rf = planned(&heating_scenario(r#"{"library": "ptfe"}"#, 27.12, 4, 20.0, 60.0, PLAIN_TUNNEL));
    assert!(!codes(&rf).contains(&"coupling_below_assumed"));
}

#[test]
fn the_arcing_warning_reads_the_zone_peak_field() {
    // A thin, nearly lossless film heated hard: E = sqrt(p / (2 pi f eps0 eps'')) passes the
    // 300 kV/m margin (a tenth of the ~3 MV/m breakdown of air, sources.md 9.5, from memory).
    let tunnel =
        r#"{"belt_width_m": 0.1, "bed_depth_m": 0.001, "residence": {"tunnel_length_m": 0.5}, "zones": ZONES}"#;
    let plan = planned(&heating_scenario(&constant_product(2.5, 0.001, 1000.0), 2450.0, 4, 20.0, 200.0, tunnel));
    let peak = plan.peak_field_v_per_m.unwrap();
    assert!(peak > 3.0e5);
    assert!(peak >= plan.mean_field_v_per_m.unwrap() * (1.0 - 1e-12), "the peak is at least the mean");
    let warning = plan.warnings.iter().find(|w| w.code == "arcing_risk").expect("an arcing warning");
    assert!(warning.message.contains("peak field"), "{}", warning.message);
    // A lossy food bed stays far below it (by hand: ~0.9 MW/m^3 mean into eps'' 22.5 at 915 MHz
    // gives about 0.9 kV/m; the layered peak is under twice that).
    assert!(planned(&demo_text("pasteurising-potato-trays.json")).peak_field_v_per_m.unwrap() < 3.0e4);
}

#[test]
fn sensitivity_is_ranked_and_honest_about_the_loss_factor() {
    for name in DEMO_LOADS {
        let scenario = parse_scenario(&demo_text(name)).unwrap();
        let plan = plan(&scenario).unwrap();
        let rows = &plan.sensitivity;
        // Two rows each for eps'', throughput, inlet temperature (and inlet moisture), one per efficiency.
        let has_moisture = scenario.inlet.moisture_wb.is_some();
        assert_eq!(rows.len(), if has_moisture { 12 } else { 10 }, "{name}");
        assert_eq!(rows.iter().map(|r| r.rank).collect::<Vec<_>>(), (1..=rows.len() as u32).collect::<Vec<_>>());
        let planned_changes: Vec<f64> = rows.iter().filter_map(|r| r.mains_power_change_kw).map(f64::abs).collect();
        for pair in planned_changes.windows(2) {
            assert!(pair[0] >= pair[1] - 1e-9, "{name}: ranked by the change in mains power");
        }
        assert_eq!(rows.iter().any(|r| r.parameter == "inlet.moisture_wb"), has_moisture, "{name}");
        for row in rows {
            assert!(row.planned, "{name}: {} {}: {:?}", row.parameter, row.change, row.note);
            if row.parameter == "product.loss_factor" {
                // eps'' is not in the balance or the chain: nothing in the quote moves (exact identity).
                assert_eq!(row.mains_power_change_kw, Some(0.0), "{name}");
                assert_eq!(row.generator_count_change, Some(0), "{name}");
                assert!(row.note.as_deref().unwrap().contains("do not move"));
                // It does move the penetration depth: a lossier product is penetrated less.
                let base_dp = [plan.dielectric_inlet.penetration_depth_m, plan.dielectric_outlet.penetration_depth_m]
                    .into_iter()
                    .flatten()
                    .reduce(f64::min)
                    .unwrap();
                let dp = row.penetration_depth_min_m.unwrap();
                if row.perturbed_value > 1.0 {
                    assert!(dp < base_dp, "{name}");
                } else {
                    assert!(dp > base_dp, "{name}");
                }
            }
            if row.parameter.starts_with("efficiency.") {
                assert!(row.perturbed_value < row.base_value);
                assert!(row.mains_power_change_kw.unwrap() > 0.0, "{name}: a worse efficiency draws more");
            }
        }
    }
}

#[test]
fn sensitivity_by_hand_for_a_linear_load() {
    // Constant cp, no allowances, no auxiliaries: mains = absorbed / overall efficiency, absorbed
    // = m cp dT / 3600. Then (by hand): throughput +10 % -> mains +10 %; one efficiency -5 % ->
    // mains x 1/0.95; inlet +2 K of a 60 K rise -> mains x 58/60.
    // The efficiencies are given, so a change of generator class cannot change them.
    let text = heating_scenario(&constant_product(20.0, 4.0, 2500.0), 915.0, 3, 20.0, 80.0, PLAIN_TUNNEL).replace(
        r#""losses""#,
        r#""efficiency": {"power_supply": 0.95, "generator": 0.7, "transmission": 0.96, "applicator": 0.85}, "losses""#,
    );
    let plan = planned(&text);
    let mains = plan.mains_power_kw;
    let row = |parameter: &str, perturbed_above_base: bool| {
        plan.sensitivity
            .iter()
            .find(|r| r.parameter == parameter && (r.perturbed_value > r.base_value) == perturbed_above_base)
            .unwrap_or_else(|| panic!("a {parameter} row"))
    };
    assert_relative_eq!(
        row("throughput_kg_per_h", true).mains_power_change_kw.unwrap(),
        0.1 * mains,
        max_relative = 1e-9
    );
    assert_relative_eq!(
        row("throughput_kg_per_h", false).mains_power_change_kw.unwrap(),
        -0.1 * mains,
        max_relative = 1e-9
    );
    for parameter in
        ["efficiency.power_supply", "efficiency.generator", "efficiency.transmission", "efficiency.applicator"]
    {
        assert_relative_eq!(
            row(parameter, false).mains_power_change_kw.unwrap(),
            mains * (1.0 / 0.95 - 1.0),
            max_relative = 1e-9
        );
    }
    assert_relative_eq!(
        row("inlet.temp_c", true).mains_power_change_kw.unwrap(),
        mains * (58.0 / 60.0 - 1.0),
        max_relative = 1e-9
    );
    assert_relative_eq!(
        row("inlet.temp_c", false).mains_power_change_kw.unwrap(),
        mains * (62.0 / 60.0 - 1.0),
        max_relative = 1e-9
    );
    // Ties in mains (the four efficiencies) are broken by the generator count; the loss-factor
    // rows, which move nothing, come after every row that moves the mains.
    let first_loss_factor = plan.sensitivity.iter().position(|r| r.parameter == "product.loss_factor").unwrap();
    assert!(plan.sensitivity[first_loss_factor..].iter().all(|r| r.mains_power_change_kw == Some(0.0)));
}

#[test]
fn a_moved_scenario_that_cannot_plan_is_a_row_not_an_error() {
    // Drying from 10 % to 9.5 %: inlet moisture -10 % (9 %) falls below the outlet, which the
    // scenario rules refuse. The plan itself stands; the row says why it has no numbers.
    let text = r#"{"schema": 1, "process": "drying", "product": {"library": "paper"}, "throughput_kg_per_h": 200,
        "inlet": {"temp_c": 20, "moisture_wb": 0.10}, "outlet": {"temp_c": 100, "moisture_wb": 0.095}, "frequency_mhz": 2450,
        "tunnel": {"belt_width_m": 1.0, "bed_depth_m": 0.02, "residence": {"tunnel_length_m": 4}, "zones": 6}}"#;
    let plan = planned(text);
    let row = plan
        .sensitivity
        .iter()
        .find(|r| r.parameter == "inlet.moisture_wb" && r.perturbed_value < r.base_value)
        .unwrap();
    assert!(!row.planned);
    assert!(row.note.as_deref().unwrap().contains("not planned"), "{:?}", row.note);
    assert_eq!(plan.sensitivity.last().unwrap().parameter, "inlet.moisture_wb", "rows without numbers rank last");
}

fn arbitrary_scenario() -> impl Strategy<Value = String> {
    let zones = prop_oneof![1u32..=12, 1u32..=1000];
    let frequency = prop_oneof![Just(27.12), Just(915.0), Just(2450.0)];
    let product = prop_oneof![
        (1.0f64..80.0, 0.0f64..30.0, 500.0f64..5000.0).prop_map(|(re, im, cp)| constant_product(re, im, cp)),
        Just(r#"{"library": "beef-lean"}"#.to_string()),
        Just(r#"{"library": "potato-raw"}"#.to_string()),
        Just(r#"{"library": "nylon-66"}"#.to_string()),
    ];
    (zones, frequency, product, 10.0f64..5000.0, -20.0f64..40.0, 1.0f64..100.0, 0.005f64..0.3, 0.1f64..20.0, 0.3f64..1.0)
        .prop_map(|(zones, frequency, product, throughput, inlet, rise, bed, length, applicator)| {
            format!(
                r#"{{"schema": 1, "process": "heating", "product": {product}, "throughput_kg_per_h": {throughput},
                    "inlet": {{"temp_c": {inlet}}}, "outlet": {{"temp_c": {outlet}}}, "frequency_mhz": {frequency},
                    "efficiency": {{"applicator": {applicator}}},
                    "tunnel": {{"belt_width_m": 0.6, "bed_depth_m": {bed}, "residence": {{"tunnel_length_m": {length}}}, "zones": {zones}}}}}"#,
                outlet = inlet + rise
            )
        })
}

fn arbitrary_drying() -> impl Strategy<Value = String> {
    let zones = prop_oneof![1u32..=12, 1u32..=400];
    let material =
        prop_oneof![Just("paper"), Just("foundry-core-waterglass"), Just("cotton-textile"), Just("wheat-dough")];
    let frequency = prop_oneof![Just(27.12), Just(915.0), Just(2450.0)];
    (zones, material, frequency, 0.2f64..0.45, 0.3f64..0.95, 5.0f64..60.0, 60.0f64..130.0, 50.0f64..101.325)
        .prop_map(|(zones, material, frequency, inlet_moisture, dried_share, inlet, outlet, pressure)| {
            format!(
                r#"{{"schema": 1, "process": "drying", "product": {{"library": "{material}"}}, "throughput_kg_per_h": 300,
                    "inlet": {{"temp_c": {inlet}, "moisture_wb": {inlet_moisture}}},
                    "outlet": {{"temp_c": {outlet}, "moisture_wb": {outlet_moisture}}},
                    "pressure_kpa": {pressure}, "frequency_mhz": {frequency},
                    "tunnel": {{"belt_width_m": 1.0, "bed_depth_m": 0.03, "residence": {{"residence_time_s": 600}}, "zones": {zones}}}}}"#,
                outlet_moisture = inlet_moisture * (1.0 - dried_share)
            )
        })
}

fn check_plan_or_refusal(text: &str) -> Result<(), TestCaseError> {
    // Never a panic; a refusal names a field; a plan is finite (plan() refuses any non-finite
    // number) and conserves energy along the tunnel.
    match plan_json(text) {
        Ok(plan) => {
            let sum: f64 = plan.zones.iter().map(|z| z.absorbed_kw).sum();
            prop_assert!((sum - plan.absorbed_power_kw).abs() <= CONSERVATION_TOLERANCE * plan.absorbed_power_kw);
            prop_assert_eq!(plan.zones.len(), parse_scenario(text).unwrap().tunnel.zones as usize);
            prop_assert!(plan.zones.iter().all(|z| z.coupling >= 0.0 && z.coupling <= 1.0));
            prop_assert!(plan.sensitivity.len() >= 10);
            for row in &plan.sensitivity {
                prop_assert!(row.mains_power_change_kw.is_none_or(f64::is_finite));
            }
        }
        Err(errors) => {
            prop_assert!(!errors.is_empty());
            prop_assert!(errors.iter().all(|e| !e.field.is_empty()));
            prop_assert!(
                errors.iter().all(|e| !e.to_string().contains("not a finite number")),
                "a non-finite result: {:?}",
                errors
            );
        }
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, ..ProptestConfig::default() })]

    #[test]
    fn heating_plans_conserve_over_any_zone_count(text in arbitrary_scenario()) {
        check_plan_or_refusal(&text)?;
    }

    #[test]
    fn drying_plans_conserve_over_any_zone_count(text in arbitrary_drying()) {
        check_plan_or_refusal(&text)?;
    }
}
