//! Sensitivity of the quote: the generator count and mains power when one input moves by a stated
//! amount, ranked by what the quote is most sensitive to.
//!
//! Each row re-plans the scenario with one input moved and everything else held:
//!
//! | input | moves | how |
//! |---|---|---|
//! | the product's loss factor eps'' | x 0.8 and x 1.2 | [`Product::loss_factor_multiplier`] on every lookup |
//! | throughput | -10 % and +10 % | `throughput_kg_per_h` |
//! | inlet moisture (only when the scenario gives one) | -10 % and +10 % relative, at most 0.95 | `inlet.moisture_wb` |
//! | inlet temperature | -2 K and +2 K | `inlet.temp_c` |
//! | each efficiency: power supply, generator, transmission, applicator | -5 % relative | `efficiency.*` |
//!
//! The steps are planning conventions of our own (common practice in spirit: the spread of
//! measured loss factors between batches, a line's throughput tolerance, a thermometer's error,
//! a maker's efficiency tolerance), not published figures. Efficiencies only fall: a rise would
//! often pass the cap of 1 (a 0.96 transmission cannot gain 5 %), and the quote must survive the
//! fall. A moisture rise capped at 0.95 that leaves the value unchanged is not listed.
//!
//! Ranking: largest change in mains power first (absolute kW, compared to the microwatt so that
//! equal changes tie exactly), ties broken by the larger change in generator count; rows whose
//! scenario could not be planned come last.
//!
//! The loss factor does not enter the energy balance or the efficiency chain: the absorbed power is
//! the balance's, the forward power follows from the scenario's applicator efficiency, and the zone
//! march only shares the absorbed power out along the tunnel. So in this design eps'' leaves the
//! mains power and the generator count exactly unchanged, and its rows say so, reporting what does
//! move: the penetration depth, the evenness through the bed and the single-pass absorptance (the
//! cavity coupling the plan compares with the assumed applicator efficiency).
//!
//! Each row runs the plan core without the zone march, the warnings or a sensitivity study of its
//! own (no recursion, and a few tens of microseconds per row). Rows that leave the product's
//! permittivity alone (throughput, efficiencies) skip the layered profiles too and carry the
//! plan's evenness and absorptance over; the pressure never moves, so every row carries the
//! plan's evaporation temperature instead of solving the saturation line again.

use super::product::Product;
use super::{plan_core, Plan, PlanDepth};
use crate::scenario::{self, Scenario};
use serde::Serialize;

/// Relative step of the loss factor (+-20 %).
pub const LOSS_FACTOR_STEP: f64 = 0.2;
/// Relative step of the throughput (+-10 %).
pub const THROUGHPUT_STEP: f64 = 0.1;
/// Relative step of the inlet moisture (+-10 %).
pub const MOISTURE_STEP: f64 = 0.1;
/// Step of the inlet temperature, K.
pub const INLET_TEMP_STEP_K: f64 = 2.0;
/// Relative fall of each efficiency (-5 %).
pub const EFFICIENCY_STEP: f64 = 0.05;
/// Highest inlet moisture a step may reach (the scenario's limit).
const MOISTURE_MAX_WB: f64 = scenario::validation::MOISTURE_MAX_WB;
/// Changes in mains power are compared at this resolution, kW (a microwatt), so that equal
/// changes tie exactly.
const MAINS_RESOLUTION_KW: f64 = 1e-9;

/// One input moved and what the quote did.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SensitivityRow {
    /// Place in the ranking, 1 = the quote moves most.
    pub rank: u32,
    /// The input, as a scenario field name (`product.loss_factor` for the eps'' multiplier).
    pub parameter: &'static str,
    /// The move, in words (`+10 %`, `-2 K`).
    pub change: String,
    /// The input's value in the plan (the multiplier 1 for the loss factor).
    pub base_value: f64,
    /// The value re-planned.
    pub perturbed_value: f64,
    /// Whether the moved scenario could be planned.
    pub planned: bool,
    /// Generators installed.
    pub generator_count: Option<u32>,
    /// Change in generators installed.
    pub generator_count_change: Option<i64>,
    /// Mains power, kW.
    pub mains_power_kw: Option<f64>,
    /// Change in mains power, kW.
    pub mains_power_change_kw: Option<f64>,
    /// Change in mains power, % of the plan's.
    pub mains_power_change_pct: Option<f64>,
    /// Smallest penetration depth at the inlet and outlet, m.
    pub penetration_depth_min_m: Option<f64>,
    /// Lowest min/max power-density ratio through the bed at the inlet and outlet.
    pub min_to_max_ratio: Option<f64>,
    /// Lowest single-pass absorptance of the bed at the inlet and outlet (microwave only: RF
    /// applicators are not modelled as cavities).
    pub single_pass_absorptance_min: Option<f64>,
    /// What else to know about the row.
    pub note: Option<String>,
}

/// What a row changes.
enum Move {
    /// The product's eps'' multiplier.
    LossFactor(f64),
    /// A moved scenario.
    Scenario(Box<Scenario>),
}

struct Case {
    parameter: &'static str,
    change: String,
    base_value: f64,
    perturbed_value: f64,
    what: Move,
    /// Whether the move can change the permittivity the product has in the tunnel.
    moves_permittivity: bool,
}

fn signed_percent(fraction: f64) -> String {
    format!("{}{:.0} %", if fraction >= 0.0 { "+" } else { "-" }, fraction.abs() * 100.0)
}

/// Writes a moved value into a scenario.
type Setter = dyn Fn(&mut Scenario, f64);

fn cases(scenario: &Scenario, base: &Plan) -> Vec<Case> {
    let mut cases = Vec::new();
    for sign in [-1.0, 1.0] {
        let factor = 1.0 + sign * LOSS_FACTOR_STEP;
        cases.push(Case {
            parameter: "product.loss_factor",
            change: format!("eps'' {}", signed_percent(sign * LOSS_FACTOR_STEP)),
            base_value: 1.0,
            perturbed_value: factor,
            what: Move::LossFactor(factor),
            moves_permittivity: true,
        });
    }
    let mut scenario_case = |parameter: &'static str,
                             change: String,
                             base_value: f64,
                             value: f64,
                             moves_permittivity: bool,
                             set: &Setter| {
        // A cap that leaves the value where it was is no move at all.
        if (value - base_value).abs() <= f64::EPSILON * base_value.abs().max(1.0) {
            return;
        }
        let mut moved = scenario.clone();
        set(&mut moved, value);
        cases.push(Case {
            parameter,
            change,
            base_value,
            perturbed_value: value,
            what: Move::Scenario(Box::new(moved)),
            moves_permittivity,
        });
    };
    for sign in [-1.0, 1.0] {
        let throughput = scenario.throughput_kg_per_h;
        scenario_case(
            "throughput_kg_per_h",
            signed_percent(sign * THROUGHPUT_STEP),
            throughput,
            throughput * (1.0 + sign * THROUGHPUT_STEP),
            false,
            &|s, v| s.throughput_kg_per_h = v,
        );
    }
    if let Some(moisture) = scenario.inlet.moisture_wb {
        for sign in [-1.0, 1.0] {
            scenario_case(
                "inlet.moisture_wb",
                signed_percent(sign * MOISTURE_STEP),
                moisture,
                (moisture * (1.0 + sign * MOISTURE_STEP)).min(MOISTURE_MAX_WB),
                true,
                &|s, v| s.inlet.moisture_wb = Some(v),
            );
        }
    }
    for sign in [-1.0, 1.0] {
        let temp = scenario.inlet.temp_c;
        scenario_case(
            "inlet.temp_c",
            format!("{}{INLET_TEMP_STEP_K} K", if sign > 0.0 { "+" } else { "-" }),
            temp,
            temp + sign * INLET_TEMP_STEP_K,
            true,
            &|s, v| s.inlet.temp_c = v,
        );
    }
    let chain = &base.assumptions.efficiency;
    let efficiencies: [(&'static str, f64, &Setter); 4] = [
        ("efficiency.power_supply", chain.power_supply, &|s, v| s.efficiency.power_supply = Some(v)),
        ("efficiency.generator", chain.generator, &|s, v| s.efficiency.generator = Some(v)),
        ("efficiency.transmission", chain.transmission, &|s, v| s.efficiency.transmission = v),
        ("efficiency.applicator", chain.applicator, &|s, v| s.efficiency.applicator = v),
    ];
    for (parameter, value, set) in efficiencies {
        scenario_case(parameter, signed_percent(-EFFICIENCY_STEP), value, value * (1.0 - EFFICIENCY_STEP), false, set);
    }
    cases
}

/// The figures a row reads from a plan.
struct Reading {
    generator_count: u32,
    mains_power_kw: f64,
    penetration_depth_min_m: Option<f64>,
    min_to_max_ratio: Option<f64>,
    single_pass_absorptance_min: Option<f64>,
}

fn reading(plan: &Plan) -> Reading {
    let capacitive = super::zone_march::is_capacitive(plan.frequency_mhz * 1e6);
    Reading {
        generator_count: plan.generator_count,
        mains_power_kw: plan.mains_power_kw,
        penetration_depth_min_m: [
            plan.dielectric_inlet.penetration_depth_m,
            plan.dielectric_outlet.penetration_depth_m,
        ]
        .into_iter()
        .flatten()
        .reduce(f64::min),
        min_to_max_ratio: plan.uniformity.iter().filter_map(|u| u.min_to_max_ratio).reduce(f64::min),
        single_pass_absorptance_min: if capacitive {
            None
        } else {
            plan.uniformity.iter().map(|u| u.single_pass_absorptance).reduce(f64::min)
        },
    }
}

fn millimetres(depth_m: Option<f64>) -> String {
    depth_m.map_or_else(|| "none (lossless)".into(), |d| format!("{:.1} mm", d * 1000.0))
}

fn ratio_text(value: Option<f64>) -> String {
    value.map_or_else(|| "n/a".into(), |v| format!("{v:.3}"))
}

fn loss_factor_note(base: &Reading, moved: &Reading) -> String {
    let absorptance = match (base.single_pass_absorptance_min, moved.single_pass_absorptance_min) {
        (Some(from), Some(to)) => format!(
            " and the single-pass absorptance {from:.3} -> {to:.3} (the cavity coupling the plan checks against the assumed applicator efficiency)"
        ),
        _ => String::new(),
    };
    format!(
        "eps'' enters neither the energy balance nor the efficiency chain (the zone march only shares the balance's absorbed power along the tunnel), so the mains power and generator count do not move. It moves the penetration depth {} -> {}, the evenness through the bed (min/max {} -> {}){absorptance}.",
        millimetres(base.penetration_depth_min_m),
        millimetres(moved.penetration_depth_min_m),
        ratio_text(base.min_to_max_ratio),
        ratio_text(moved.min_to_max_ratio),
    )
}

/// The sensitivity rows of a plan, ranked. Perturbed scenarios that cannot be planned are rows
/// with `planned: false` and the reason, never an error of the plan itself.
pub fn sensitivity(scenario: &Scenario, product: &Product, base: &Plan) -> Vec<SensitivityRow> {
    let base_reading = reading(base);
    // The pressure never moves: carry its boiling point over (the plan uses a given evaporation
    // temperature as is, so the rows see exactly the plan's).
    let mut held = scenario.clone();
    held.evaporation_temp_c = Some(base.assumptions.evaporation_temp_c);
    let mut rows: Vec<SensitivityRow> = cases(&held, base)
        .into_iter()
        .map(|case| {
            let depth = if case.moves_permittivity { &PlanDepth::ROW_DIELECTRIC } else { &PlanDepth::ROW_SIZING };
            let outcome = match &case.what {
                Move::LossFactor(factor) => {
                    let moved = Product { loss_factor_multiplier: *factor, ..product.clone() };
                    plan_core(&held, &moved, depth)
                }
                Move::Scenario(moved) => {
                    let problems = scenario::validate(moved);
                    if problems.is_empty() {
                        plan_core(moved, product, depth)
                    } else {
                        Err(problems)
                    }
                }
            };
            let mut row = SensitivityRow {
                rank: 0,
                parameter: case.parameter,
                change: case.change,
                base_value: case.base_value,
                perturbed_value: case.perturbed_value,
                planned: false,
                generator_count: None,
                generator_count_change: None,
                mains_power_kw: None,
                mains_power_change_kw: None,
                mains_power_change_pct: None,
                penetration_depth_min_m: None,
                min_to_max_ratio: None,
                single_pass_absorptance_min: None,
                note: None,
            };
            match outcome {
                Ok(plan) => {
                    let mut moved = reading(&plan);
                    if !case.moves_permittivity {
                        // Not solved in this row: the bed is the plan's.
                        moved.min_to_max_ratio = base_reading.min_to_max_ratio;
                        moved.single_pass_absorptance_min = base_reading.single_pass_absorptance_min;
                    }
                    let change_kw = moved.mains_power_kw - base_reading.mains_power_kw;
                    row.planned = true;
                    row.generator_count = Some(moved.generator_count);
                    row.generator_count_change =
                        Some(i64::from(moved.generator_count) - i64::from(base_reading.generator_count));
                    row.mains_power_kw = Some(moved.mains_power_kw);
                    row.mains_power_change_kw = Some(change_kw);
                    row.mains_power_change_pct =
                        (base_reading.mains_power_kw > 0.0).then(|| 100.0 * change_kw / base_reading.mains_power_kw);
                    row.penetration_depth_min_m = moved.penetration_depth_min_m;
                    row.min_to_max_ratio = moved.min_to_max_ratio;
                    row.single_pass_absorptance_min = moved.single_pass_absorptance_min;
                    if matches!(case.what, Move::LossFactor(_)) {
                        row.note = Some(loss_factor_note(&base_reading, &moved));
                    }
                }
                Err(errors) => {
                    row.note = Some(format!(
                        "not planned: {}",
                        errors.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")
                    ));
                }
            }
            row
        })
        .collect();
    rank(&mut rows);
    rows
}

/// Sort by |change in mains| (to the microwatt), then |change in generator count|, planned rows
/// first; number the ranks. The key is integer, so the order is total and the sort stable.
fn rank(rows: &mut [SensitivityRow]) {
    rows.sort_by_key(|row| match (row.planned, row.mains_power_change_kw, row.generator_count_change) {
        (true, Some(kw), Some(count)) => {
            let quantised = (kw.abs() / MAINS_RESOLUTION_KW).round();
            // Finite and far inside i64 for any plan (a megawatt is 1e15 at this resolution).
            let quantised = if quantised.is_finite() { quantised.min(9.0e18) as i64 } else { i64::MAX };
            (0_u8, std::cmp::Reverse(quantised), std::cmp::Reverse(count.abs()))
        }
        _ => (1_u8, std::cmp::Reverse(0), std::cmp::Reverse(0)),
    });
    for (index, row) in rows.iter_mut().enumerate() {
        row.rank = index as u32 + 1;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn row(parameter: &'static str, change_kw: Option<f64>, count: Option<i64>) -> SensitivityRow {
        SensitivityRow {
            rank: 0,
            parameter,
            change: String::new(),
            base_value: 0.0,
            perturbed_value: 0.0,
            planned: change_kw.is_some(),
            generator_count: None,
            generator_count_change: count,
            mains_power_kw: None,
            mains_power_change_kw: change_kw,
            mains_power_change_pct: None,
            penetration_depth_min_m: None,
            min_to_max_ratio: None,
            single_pass_absorptance_min: None,
            note: None,
        }
    }

    #[test]
    fn ranking_by_mains_then_count_then_planned() {
        let mut rows = vec![
            row("a", Some(0.0), Some(0)),
            row("b", Some(-5.0), Some(0)),
            row("c", None, None),
            row("d", Some(5.0), Some(1)),
            row("e", Some(2.0), Some(0)),
        ];
        rank(&mut rows);
        let order: Vec<&str> = rows.iter().map(|r| r.parameter).collect();
        // d and b tie on |5 kW|; d adds a generator, so it ranks first.
        assert_eq!(order, ["d", "b", "e", "a", "c"]);
        assert_eq!(rows.iter().map(|r| r.rank).collect::<Vec<_>>(), [1, 2, 3, 4, 5]);
    }

    #[test]
    fn a_row_without_texts_has_the_numbers_of_one_with_them() {
        // Every demo load, both row depths: the plan without texts is the plan with them, once
        // the texts it leaves out are blanked (exact: the same functions compute the numbers).
        let loads = [
            include_str!("../../demo-loads/tempering-beef-blocks.json"),
            include_str!("../../demo-loads/layered-meal-trays.json"),
            include_str!("../../demo-loads/drying-sand-cores.json"),
            include_str!("../../demo-loads/pasteurising-potato-trays.json"),
            include_str!("../../demo-loads/rf-drying-cotton-packages.json"),
            include_str!("../../demo-loads/curing-rubber-profile.json"),
        ];
        for text in loads {
            let scenario = crate::scenario::parse_scenario(text).expect("a demo load parses");
            let product = Product::from_scenario(&scenario).expect("a demo load's product");
            for depth in [PlanDepth::ROW_SIZING, PlanDepth::ROW_DIELECTRIC] {
                let with_texts = PlanDepth { texts: true, ..depth };
                let plain = serde_json::to_value(plan_core(&scenario, &product, &depth).expect("plans")).unwrap();
                let mut full =
                    serde_json::to_value(plan_core(&scenario, &product, &with_texts).expect("plans")).unwrap();
                assert!(!full["cautions"].as_array().unwrap().is_empty());
                full["cautions"] = serde_json::json!([]);
                full["assumptions"]["material"] = serde_json::json!("");
                full["assumptions"]["material_source"] = serde_json::json!("");
                for state in ["dielectric_inlet", "dielectric_outlet"] {
                    assert!(!full[state]["model"].as_str().unwrap().is_empty());
                    full[state]["model"] = serde_json::json!("");
                    full[state]["in_range"] = serde_json::json!(true);
                }
                assert_eq!(plain, full, "{}", scenario.name);
            }
        }
    }

    #[test]
    fn percent_text() {
        assert_eq!(signed_percent(0.1), "+10 %");
        assert_eq!(signed_percent(-0.05), "-5 %");
    }
}
