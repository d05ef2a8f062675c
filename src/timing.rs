//! The timed workloads behind the browser timing harness (`bash .ci/browser-timing.sh`) and
//! `doubleprime timing`: the same plans and the same design search, timed against a clock the
//! caller hands in, so WebAssembly in the page and the native build time identical work and their
//! ratio means something. The criterion benchmarks (`cargo bench --bench core`) stay the
//! reference for native figures; this is the like-for-like comparison.
//!
//! The core has no clock of its own (it does no I/O): the caller passes `now_ms`, which is
//! `performance.now()` in the page and `std::time::Instant` on the command line.

use crate::error::InputError;
use crate::plan::band_comparison::compare;
use crate::plan::plan;
use crate::scenario::{parse_scenario, Scenario};
use crate::search::space::{parse_space, SearchSpace};
use crate::search::Search;
use serde::Serialize;
use std::hint::black_box;

const TEMPERING_JSON: &str = include_str!("../demo-loads/tempering-beef-blocks.json");
const LAYERED_JSON: &str = include_str!("../demo-loads/layered-meal-trays.json");
const SAND_CORES_JSON: &str = include_str!("../demo-loads/drying-sand-cores.json");
const POTATO_JSON: &str = include_str!("../demo-loads/pasteurising-potato-trays.json");

/// The design-search workload's space, the one `cargo bench` uses: 2 bands x 13 classes x 2
/// redundancies x 20 belt widths x 20 bed depths = 10,400 configurations of 10 zones, with the
/// bed-depth limit off so every configuration reaches every check.
const SEARCH_SPACE_JSON: &str = r#"{"bands_mhz": [915, 2450], "generator_classes": ["all"],
    "redundancy": ["n", "n_plus_1"], "belt_width_m": {"from": 0.3, "to": 1.2, "steps": 20},
    "bed_depth_m": {"from": 0.01, "to": 0.05, "steps": 20}, "zones": [10],
    "constraints": {"max_bed_over_penetration_depth": null}}"#;

/// Each sample times enough repetitions to last at least this long, so a coarse clock (the
/// browser may round `performance.now()` to 0.1 ms) still resolves a sub-millisecond plan.
const MIN_SAMPLE_MS: f64 = 5.0;
/// Fewer samples than this and the median means little.
const MIN_SAMPLES: usize = 5;

/// What one workload took.
#[derive(Debug, Clone, Serialize)]
pub struct WorkloadTiming {
    /// Stable key, the same in the page and on the command line (`plan_tempering_200_zones`, ...).
    pub key: &'static str,
    /// What the workload does, in words.
    pub description: &'static str,
    /// How many times the work ran in the timed samples (warm-up excluded).
    pub iterations: usize,
    /// Median over the samples of the time per run, in milliseconds.
    pub median_ms: f64,
    /// Fastest sample's time per run, in milliseconds.
    pub min_ms: f64,
}

/// One timing run: where it ran and each workload's figures.
#[derive(Debug, Clone, Serialize)]
pub struct TimingReport {
    /// `"native"` or `"wasm"`, as the caller says.
    pub runtime: String,
    /// The time each workload was given, in milliseconds.
    pub budget_ms_per_workload: f64,
    /// The workloads, in a fixed order.
    pub workloads: Vec<WorkloadTiming>,
}

/// One piece of timed work, ready to run: its inputs are parsed before timing starts.
struct Workload {
    key: &'static str,
    description: &'static str,
    run: Box<dyn Fn()>,
}

fn demo(text: &str, zones: u32) -> Result<Scenario, Vec<InputError>> {
    let mut scenario = parse_scenario(text)?;
    scenario.tunnel.zones = zones;
    Ok(scenario)
}

fn plan_workload(key: &'static str, description: &'static str, scenario: Scenario) -> Workload {
    Workload {
        key,
        description,
        run: Box::new(move || {
            let _ = black_box(plan(black_box(&scenario)));
        }),
    }
}

fn workloads() -> Result<Vec<Workload>, Vec<InputError>> {
    let comparison_scenario = demo(SAND_CORES_JSON, 10)?;
    let search_scenario = demo(POTATO_JSON, 10)?;
    let space: SearchSpace = parse_space(SEARCH_SPACE_JSON)?;
    // Resolving the space once here refuses a bad space before any timing starts.
    Search::new(&search_scenario, &space)?;
    Ok(vec![
        plan_workload("plan_tempering_1_zone", "plan, tempering demo load, 1 zone", demo(TEMPERING_JSON, 1)?),
        plan_workload("plan_tempering_200_zones", "plan, tempering demo load, 200 zones", demo(TEMPERING_JSON, 200)?),
        plan_workload("plan_layered_200_zones", "plan, layered meal trays, 200 zones", demo(LAYERED_JSON, 200)?),
        Workload {
            key: "band_comparison",
            description: "band comparison, sand cores, 10 zones",
            run: Box::new(move || {
                let _ = black_box(compare(black_box(&comparison_scenario)));
            }),
        },
        Workload {
            key: "search_10400_configurations",
            description: "design search, 10,400 configurations, evaluation only",
            run: Box::new(move || {
                if let Ok(mut running) = Search::new(black_box(&search_scenario), black_box(&space)) {
                    black_box(running.step(usize::MAX));
                }
            }),
        },
    ])
}

/// The keys of the workloads, in report order.
pub fn workload_keys() -> Vec<&'static str> {
    workloads().map(|list| list.iter().map(|w| w.key).collect()).unwrap_or_default()
}

/// Time every workload for about `budget_ms` each (at least [`MIN_SAMPLES`] samples), reading
/// the clock with `now_ms`. `runtime` labels the report.
pub fn time_workloads(
    runtime: &str,
    budget_ms: f64,
    now_ms: &dyn Fn() -> f64,
) -> Result<TimingReport, Vec<InputError>> {
    let budget_ms = crate::error::require_in("budget_ms", budget_ms, 1.0, 600_000.0).map_err(|e| vec![e])?;
    let timings = workloads()?
        .iter()
        .map(|workload| {
            let (iterations, median_ms, min_ms) = time_runs(&*workload.run, budget_ms, now_ms);
            WorkloadTiming { key: workload.key, description: workload.description, iterations, median_ms, min_ms }
        })
        .collect();
    Ok(TimingReport { runtime: runtime.to_string(), budget_ms_per_workload: budget_ms, workloads: timings })
}

/// Largest batch the warm-up grows to: a clock that never advances must not stall the run.
const MAX_BATCH: usize = 1 << 14;

/// Most samples one workload takes, for the same reason.
const MAX_SAMPLES: usize = 1000;

/// Time `run`: (runs timed, median ms per run, fastest sample's ms per run).
fn time_runs(run: &dyn Fn(), budget_ms: f64, now_ms: &dyn Fn() -> f64) -> (usize, f64, f64) {
    // Warm-up, which also sizes the batch: repeat until one batch lasts MIN_SAMPLE_MS.
    let mut batch = 1usize;
    loop {
        let started = now_ms();
        for _ in 0..batch {
            run();
        }
        let elapsed = now_ms() - started;
        if elapsed >= MIN_SAMPLE_MS || batch >= MAX_BATCH {
            break;
        }
        // Aim past the threshold in one step when the clock saw anything at all.
        let factor = if elapsed > 0.0 { (MIN_SAMPLE_MS * 1.5 / elapsed).ceil() as usize } else { 10 };
        batch = batch.saturating_mul(factor.clamp(2, 100)).min(MAX_BATCH);
    }
    let mut per_run_ms = Vec::new();
    let started = now_ms();
    while per_run_ms.len() < MIN_SAMPLES || (per_run_ms.len() < MAX_SAMPLES && now_ms() - started < budget_ms) {
        let sample_started = now_ms();
        for _ in 0..batch {
            run();
        }
        per_run_ms.push((now_ms() - sample_started) / batch as f64);
    }
    per_run_ms.sort_by(f64::total_cmp);
    (per_run_ms.len() * batch, median(&per_run_ms), per_run_ms[0])
}

/// Median of sorted, non-empty values.
fn median(sorted: &[f64]) -> f64 {
    let middle = sorted.len() / 2;
    if sorted.len() % 2 == 1 {
        sorted[middle]
    } else {
        (sorted[middle - 1] + sorted[middle]) / 2.0
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::cell::Cell;

    #[test]
    fn every_workload_input_is_valid() {
        assert_eq!(
            workload_keys(),
            [
                "plan_tempering_1_zone",
                "plan_tempering_200_zones",
                "plan_layered_200_zones",
                "band_comparison",
                "search_10400_configurations"
            ]
        );
    }

    #[test]
    fn the_search_workload_has_the_configurations_it_names() {
        let scenario = demo(POTATO_JSON, 10).unwrap();
        let space = parse_space(SEARCH_SPACE_JSON).unwrap();
        assert_eq!(Search::new(&scenario, &space).unwrap().progress().total, 10_400);
    }

    #[test]
    fn a_fake_clock_gives_exact_figures() {
        // The clock moves only when the work runs, 0.5 ms a run: the warm-up grows the batch to
        // 15 runs (7.5 ms >= 5 ms), and a 20 ms budget takes 5 samples (the minimum) of 15.
        let clock = Cell::new(0.0);
        let run = || clock.set(clock.get() + 0.5);
        let (iterations, median_ms, min_ms) = time_runs(&run, 20.0, &|| clock.get());
        assert_eq!(iterations, 75);
        assert_eq!(median_ms, 0.5);
        assert_eq!(min_ms, 0.5);
    }

    #[test]
    fn a_clock_that_never_moves_cannot_stall_the_run() {
        let runs = Cell::new(0usize);
        let run = || runs.set(runs.get() + 1);
        let (iterations, median_ms, _) = time_runs(&run, 1.0, &|| 0.0);
        assert_eq!(iterations, MAX_SAMPLES * MAX_BATCH);
        assert_eq!(median_ms, 0.0);
    }

    #[test]
    fn every_workload_runs_against_a_real_clock() {
        let started = std::time::Instant::now();
        let report = time_workloads("native", 1.0, &|| started.elapsed().as_secs_f64() * 1e3).unwrap();
        assert_eq!(report.workloads.len(), workload_keys().len());
        for timing in &report.workloads {
            assert!(timing.iterations >= MIN_SAMPLES, "{}", timing.key);
            assert!(timing.median_ms > 0.0 && timing.median_ms.is_finite(), "{}", timing.key);
            assert!(timing.min_ms <= timing.median_ms, "{}", timing.key);
        }
    }

    #[test]
    fn a_budget_out_of_range_is_named() {
        let errors = time_workloads("test", 0.0, &|| 0.0).unwrap_err();
        assert_eq!(errors[0].field, "budget_ms");
    }

    #[test]
    fn median_of_odd_and_even_counts() {
        assert_eq!(median(&[1.0, 2.0, 9.0]), 2.0);
        assert_eq!(median(&[1.0, 2.0, 4.0, 9.0]), 3.0);
    }
}
