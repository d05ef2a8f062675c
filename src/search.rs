//! The design search: which band, how many generators of which class, what belt width and bed
//! depth give the cheapest line for a scenario, within limits of tunnel length, bed depth against
//! penetration depth, field strength and product temperature.
//!
//! # Method
//!
//! Every configuration of a search space (bands x generator classes x redundancies x zone counts
//! x bed depths x belt widths) is evaluated, the ones that fail a constraint are counted by the
//! first constraint they fail, and the feasible ones are ranked by the objective (search::rank).
//! The evaluation is factorized (search::evaluate): the plan core runs once per (band, class,
//! redundancy) for the sizing and once per (band, bed depth, zone count) for the depth profiles
//! and the zone march; the tunnel is laid out per configuration. Nothing is a second model of the
//! plan: the figures are the plan core's, and the peak field is rescaled by an identity of the
//! zone march. At the end the best few are planned again in full with `plan::plan` and that
//! plan's figures are reported beside the search's (`plan_check`, agreeing within
//! [`CHECK_RELATIVE_TOLERANCE`]).
//!
//! # The search space (JSON; every field optional)
//!
//! | field | meaning | default (the space around the scenario) |
//! |---|---|---|
//! | `bands_mhz` | frequencies to try, MHz, each served by a catalogue class | the scenario's own and the centres of the other compared bands (13.56, 27.12, 40.68, 896, 915, 2450) |
//! | `generator_classes` | `"auto"` (the plan's automatic pick), `"all"` (every class serving the band) or class ids | `["all"]` |
//! | `belt_width_m` | a list, or `{"from": A, "to": B, "steps": N}` (N values, ends included) | the scenario's x 0.5, 0.75, ..., 2 (7 values, those in 0.02 to 10 m) |
//! | `bed_depth_m` | the same | the scenario's x 0.5 ... 2 (those in 0.0005 to 2 m) |
//! | `zones` | zone counts, 1 to 1000 | the scenario's |
//! | `redundancy` | `"n"` and/or `"n_plus_1"` | the scenario's |
//! | `constraints.max_tunnel_length_m` | longest heated length, m | 40 (the plan's `long_tunnel`) |
//! | `constraints.max_bed_over_penetration_depth` | bed depth over the smallest penetration depth, per fed face | 1 (the plan's `bed_deeper_than_penetration`; 2 when fed from both sides) |
//! | `constraints.max_peak_field_v_per_m` | highest RMS field in the product, V/m | 3e5 (the plan's `arcing_risk`) |
//! | `constraints.max_product_temp_c` | highest hot-spot temperature, degC | none |
//! | `constraints.min_core_to_surface_ratio` | lowest core-to-surface power density through the bed | none |
//! | `objective` | `"generator_count"`, `"mains_kw"`, `"energy_cost_per_tonne"`, `"tunnel_length_m"` or `{"weighted": {name: weight}}` | `"generator_count"` |
//! | `best` | how many of the best to show and re-plan, 1 to 50 | 5 |
//!
//! A constraint set to `null` is switched off. Unknown fields are refused. At most
//! [`space::CONFIGURATIONS_MAX`] configurations. Each configuration is the scenario moved to the
//! band (outside its own band the scenario's generator and supply efficiency overrides give way
//! to the class's, as in the band comparison) with the class, redundancy, belt width, bed depth
//! and zone count set; the residence rule, the load stack, the feed and everything else are the
//! scenario's. With a fixed `tunnel_length_m` residence the length is the same everywhere and the
//! belt width and bed depth move the residence time instead (the result warns).
//!
//! # Constraints, in the order they are checked
//!
//! `not_planned` (the plan core refused the configuration), `generator_selection` (the class
//! would need more than 1000 units, or its units would run below their stable minimum),
//! `max_tunnel_length_m`, `max_bed_over_penetration_depth`, `max_peak_field_v_per_m` (the zone
//! march's peak field: zone power density times the layered profile's peak-to-mean ratio),
//! `max_product_temp_c` (the hot-spot estimate of search::evaluate), `min_core_to_surface_ratio`.
//! `rejected_by` counts each rejected configuration once, under the first check it fails, so
//! `evaluated = feasible + sum of rejected_by`.
//!
//! # The result
//!
//! [`SearchResult`]: `configurations`, `evaluated`, `feasible`, `complete`, `objective`; `best`
//! (best first, each the configuration, `ism_band`, the resolved `generator_class`, its rating,
//! count and operating fraction, belt speed, residence time, tunnel length, mains power, energy
//! cost per tonne and per kg, bed over penetration depth, peak field, the hot-spot energy factor
//! and temperature, the core-to-surface ratio, whether the material data cover the states, the
//! `objective_value`, and `plan_check`: the full plan's class, count, mains, cost, length, peak
//! field, bed over penetration depth and warning codes, with `agrees`); `frontier` (tunnel length
//! against generator count, fewest generators first); `rejected_by` (counts by constraint name);
//! `space` (every default filled in); `warnings` (`code` and `message`); `method`.
//!
//! # Running it in slices
//!
//! [`Search::new`] validates and sets up; [`Search::step`] evaluates up to `budget`
//! configurations and returns the [`Progress`]; [`Search::best`] and [`Search::frontier`] read
//! the ranking so far; [`Search::finish`] re-plans the best and assembles the [`SearchResult`]
//! (also before the end, marked incomplete). Dropping a `Search` cancels it: it holds no thread,
//! timer or global. A step that meets a new (band, bed depth, zone count) runs one zone march,
//! so steps are not all equally long. [`search`] runs one to the end.

pub mod evaluate;
pub mod rank;
pub mod space;

use crate::error::InputError;
use crate::plan::product::Product;
use crate::plan::warnings::Warning;
use crate::plan::{catalogue_for, plan, plan_parts};
use crate::scenario::{self, Scenario};
use crate::sizing::tunnel::ResidenceRule;
use evaluate::{configured_scenario, Candidate, Configuration, Evaluator, Outcome, Point, Rejection, RejectionCounts};
use rank::{BestList, Frontier, Objective};
use serde::Serialize;
use space::{ResolvedSpace, SearchSpace};
use std::collections::BTreeMap;

/// The best configurations' search figures and their full plans agree when every figure is within
/// this relative difference (the figures come from the same functions on the same inputs; the
/// rescaled peak field differs by rounding only, some 1e-15).
pub const CHECK_RELATIVE_TOLERANCE: f64 = 1e-9;
/// Configurations a [`search`] evaluates per step on its way to the end.
const RUN_STEP: usize = 4096;
/// Distinct reasons for `not_planned` kept for the warnings.
const REASONS_MAX: usize = 10;

/// How far a search has got.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Progress {
    /// Configurations evaluated so far.
    pub evaluated: usize,
    /// Configurations in the space.
    pub total: usize,
    /// Feasible configurations so far.
    pub feasible: usize,
    /// Whether every configuration has been evaluated.
    pub done: bool,
}

impl Progress {
    /// Share evaluated, 0 to 1 (1 for an empty space).
    pub fn fraction(&self) -> f64 {
        if self.total == 0 {
            1.0
        } else {
            self.evaluated as f64 / self.total as f64
        }
    }
}

/// A full plan's figures for a best configuration, beside the search's.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PlanCheck {
    /// Whether the full plan succeeded.
    pub planned: bool,
    /// Whether every figure below matches the search's within [`CHECK_RELATIVE_TOLERANCE`].
    pub agrees: bool,
    /// Class id the plan chose.
    pub generator_class: Option<String>,
    /// Generators installed.
    pub generator_count: Option<u32>,
    /// Mains power, kW.
    pub mains_power_kw: Option<f64>,
    /// Energy cost per tonne.
    pub energy_cost_per_tonne: Option<f64>,
    /// Heated length, m.
    pub tunnel_length_m: Option<f64>,
    /// Peak field over the zones, V/m.
    pub peak_field_v_per_m: Option<f64>,
    /// Bed depth over the smallest penetration depth.
    pub bed_over_penetration_depth: Option<f64>,
    /// The full plan's warning codes.
    pub warning_codes: Vec<&'static str>,
    /// Why the plan failed, if it did.
    pub error: Option<String>,
}

/// One of the best configurations with its full plan's check.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BestConfiguration {
    /// Place in the ranking, 1 = best.
    pub rank: u32,
    /// The search's figures.
    #[serde(flatten)]
    pub candidate: Candidate,
    /// The full plan of this configuration.
    pub plan_check: PlanCheck,
}

/// What a search found.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SearchResult {
    /// Scenario title.
    pub name: String,
    /// Whether every configuration was evaluated.
    pub complete: bool,
    /// Configurations in the space.
    pub configurations: usize,
    /// Configurations evaluated.
    pub evaluated: usize,
    /// Configurations meeting every constraint.
    pub feasible: usize,
    /// The objective the ranking used.
    pub objective: Objective,
    /// The best feasible configurations, best first, each with its full plan's figures.
    pub best: Vec<BestConfiguration>,
    /// Tunnel length against generator count: the non-dominated configurations, fewest generators
    /// first.
    pub frontier: Vec<Candidate>,
    /// Rejected configurations by the first constraint they failed.
    pub rejected_by: RejectionCounts,
    /// The space searched, every default filled in.
    pub space: ResolvedSpace,
    /// Where the search is weak or what to know about it.
    pub warnings: Vec<Warning>,
    /// How the figures were computed.
    pub method: Vec<&'static str>,
    /// Doubleprime version.
    pub version: &'static str,
}

/// A design search in progress. See the module documentation for slicing and cancelling.
pub struct Search {
    evaluator: Evaluator,
    cursor: Option<Point>,
    evaluated: usize,
    feasible: usize,
    rejected_by: RejectionCounts,
    best: BestList,
    frontier: Frontier,
    /// Reasons for `not_planned`, with how many configurations gave each.
    reasons: BTreeMap<String, usize>,
    /// `not_planned` configurations whose reason was not kept (beyond [`REASONS_MAX`]).
    other_reasons: usize,
}

impl Search {
    /// Check the scenario and the space (every problem at once) and set the search up; nothing is
    /// evaluated yet.
    pub fn new(scenario: &Scenario, space: &SearchSpace) -> Result<Search, Vec<InputError>> {
        let mut problems = scenario::validate(scenario);
        let product = Product::from_scenario(scenario).map_err(|errors| problems.extend(errors)).ok();
        let resolved =
            space::resolve(space, scenario, &catalogue_for(scenario)).map_err(|errors| problems.extend(errors)).ok();
        let (Some(product), Some(resolved), true) = (product, resolved, problems.is_empty()) else {
            return Err(problems);
        };
        // The job itself must be plannable (a state that needs heat, the material at its states):
        // tried at the scenario's own band with the automatic pick; a band or class the scenario
        // names that has no generator is for the space to replace, not an error here.
        let mut probe = scenario.clone();
        probe.generator.class = None;
        if let Err(errors) = plan_parts(&probe, &product, false) {
            let job: Vec<InputError> = errors
                .into_iter()
                .filter(|error| !(error.field.starts_with("generator_class") || error.field == "frequency_mhz"))
                .collect();
            if !job.is_empty() {
                return Err(job);
            }
        }
        let best = BestList::new(resolved.best as usize);
        let evaluator = Evaluator::new(scenario.clone(), product, resolved);
        Ok(Search {
            cursor: Point::first(evaluator.space()),
            evaluator,
            evaluated: 0,
            feasible: 0,
            rejected_by: RejectionCounts::default(),
            best,
            frontier: Frontier::new(),
            reasons: BTreeMap::new(),
            other_reasons: 0,
        })
    }

    /// The space being searched, every default filled in.
    pub fn space(&self) -> &ResolvedSpace {
        self.evaluator.space()
    }

    /// How far the search has got.
    pub fn progress(&self) -> Progress {
        Progress {
            evaluated: self.evaluated,
            total: self.evaluator.space().configurations,
            feasible: self.feasible,
            done: self.cursor.is_none(),
        }
    }

    /// Evaluate up to `budget` more configurations.
    pub fn step(&mut self, budget: usize) -> Progress {
        for _ in 0..budget {
            let Some(point) = self.cursor else {
                break;
            };
            match self.evaluator.evaluate(&point, self.evaluated) {
                Outcome::Feasible(candidate) => {
                    self.feasible += 1;
                    self.best.offer(&candidate);
                    self.frontier.offer(&candidate);
                }
                Outcome::Rejected(rejection, reason) => {
                    self.rejected_by.add(rejection);
                    if let (Rejection::NotPlanned, Some(reason)) = (rejection, reason) {
                        self.note_reason(&point, reason);
                    }
                }
            }
            self.evaluated += 1;
            self.cursor = point.next(self.evaluator.space());
        }
        self.progress()
    }

    fn note_reason(&mut self, point: &Point, reason: String) {
        let configuration = self.evaluator.configuration(point);
        let key = format!("at {} MHz: {reason}", configuration.frequency_mhz);
        if let Some(count) = self.reasons.get_mut(&key) {
            *count += 1;
        } else if self.reasons.len() < REASONS_MAX {
            self.reasons.insert(key, 1);
        } else {
            self.other_reasons += 1;
        }
    }

    /// The best feasible configurations so far, best first (the search's figures, not re-planned).
    pub fn best(&self) -> &[Candidate] {
        self.best.items()
    }

    /// The frontier of tunnel length against generator count so far.
    pub fn frontier(&self) -> Vec<Candidate> {
        self.frontier.points()
    }

    /// The scenario a configuration stands for (plan it with `plan::plan` for the full plan).
    pub fn scenario_for(&self, configuration: &Configuration) -> Scenario {
        configured_scenario(self.evaluator.base(), configuration)
    }

    /// Evaluate whatever is left and assemble the result.
    pub fn run_to_end(mut self) -> SearchResult {
        while !self.step(RUN_STEP).done {}
        self.finish()
    }

    /// Re-plan the best configurations in full and assemble the result (at any point; before the
    /// end it is marked incomplete). Costs one full plan per best configuration.
    pub fn finish(&self) -> SearchResult {
        let progress = self.progress();
        let best: Vec<BestConfiguration> = self
            .best
            .items()
            .iter()
            .enumerate()
            .map(|(place, candidate)| BestConfiguration {
                rank: place as u32 + 1,
                candidate: candidate.clone(),
                plan_check: plan_check(&self.scenario_for(&candidate.configuration), candidate),
            })
            .collect();
        let warnings = self.warnings(&progress, &best);
        let space = self.evaluator.space().clone();
        SearchResult {
            name: self.evaluator.base().name.clone(),
            complete: progress.done,
            configurations: progress.total,
            evaluated: progress.evaluated,
            feasible: progress.feasible,
            objective: space.objective,
            best,
            frontier: self.frontier.points(),
            rejected_by: self.rejected_by,
            space,
            warnings,
            method: METHOD.to_vec(),
            version: env!("CARGO_PKG_VERSION"),
        }
    }

    fn warnings(&self, progress: &Progress, best: &[BestConfiguration]) -> Vec<Warning> {
        let mut list = Vec::new();
        if !progress.done {
            list.push(Warning::new(
                "search_incomplete",
                format!(
                    "Only {} of {} configurations were evaluated: the best and the frontier are those of the part searched.",
                    progress.evaluated, progress.total
                ),
            ));
        }
        if progress.feasible == 0 && progress.evaluated > 0 {
            let (name, count) =
                self.rejected_by.entries().into_iter().max_by_key(|(_, count)| *count).unwrap_or(("none", 0));
            list.push(Warning::new(
                "no_feasible_configuration",
                format!("None of the {} configurations evaluated meets the constraints; {name} rejected the most ({count}). Relax that constraint or widen the space.", progress.evaluated),
            ));
        }
        if let ResidenceRule::TunnelLengthM(length) = self.evaluator.base().tunnel.residence {
            list.push(Warning::new(
                "fixed_tunnel_length",
                format!("The scenario fixes the heated length at {length} m, so the belt width and bed depth change the residence time, not the length: the frontier has a single length. Give a residence time or a heating rate to let the length follow the belt."),
            ));
        }
        for (reason, count) in &self.reasons {
            list.push(Warning::new(
                "configurations_not_planned",
                format!("{count} configuration{} could not be planned {reason}", if *count == 1 { "" } else { "s" }),
            ));
        }
        if self.other_reasons > 0 {
            list.push(Warning::new(
                "configurations_not_planned",
                format!("{} more configurations could not be planned for other reasons.", self.other_reasons),
            ));
        }
        let extrapolated: Vec<String> = best
            .iter()
            .filter(|entry| !entry.candidate.material_data_in_range)
            .map(|entry| format!("{} ({} MHz)", entry.rank, entry.candidate.configuration.frequency_mhz))
            .collect();
        if !extrapolated.is_empty() {
            list.push(Warning::new(
                "best_on_extrapolated_data",
                format!("Best configuration{} {} rel{} on permittivity extrapolated outside the material's data at the inlet or outlet state: check the product's permittivity in that band before quoting.", if extrapolated.len() == 1 { "" } else { "s" }, extrapolated.join(", "), if extrapolated.len() == 1 { "ies" } else { "y" }),
            ));
        }
        for entry in best.iter().filter(|entry| !entry.plan_check.agrees) {
            list.push(Warning::new(
                "plan_check_differs",
                format!(
                    "The full plan of best configuration {} does not reproduce the search's figures{}: trust the full plan.",
                    entry.rank,
                    entry.plan_check.error.as_ref().map(|e| format!(" ({e})")).unwrap_or_default()
                ),
            ));
        }
        list
    }
}

/// How the figures were computed, for the result's record.
const METHOD: [&str; 5] = [
    "every configuration of the space evaluated; the plan core run once per (band, generator class, redundancy) for the sizing and once per (band, bed depth, zone count) for the depth profiles and the zone march; the tunnel laid out per configuration",
    "peak field: the zone march's, rescaled to each belt width and tunnel length by 1/sqrt(bed volume under power) (an identity of the march)",
    "hot-spot temperature: the product receiving sum over zones of share x peak-to-mean power density through the bed (layered solution) times the balance's net heat per kg, placed on the balance's path; no conduction; an upper bound on any one depth; at RF the field is taken as even, so it is the outlet temperature",
    "constraints checked in order: not_planned, generator_selection (over 1000 units or below the stable minimum), max_tunnel_length_m, max_bed_over_penetration_depth (per fed face), max_peak_field_v_per_m, max_product_temp_c, min_core_to_surface_ratio; each rejection counted once, under the first it fails",
    "ranking: the objective, then generator count, mains power, tunnel length and place in the space; the best re-planned in full (plan_check)",
];

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= CHECK_RELATIVE_TOLERANCE * a.abs().max(b.abs()).max(f64::MIN_POSITIVE)
}

fn close_option(a: Option<f64>, b: Option<f64>) -> bool {
    match (a, b) {
        (Some(a), Some(b)) => close(a, b),
        (None, None) => true,
        _ => false,
    }
}

/// Plan a configuration in full and compare its figures with the search's.
fn plan_check(scenario: &Scenario, candidate: &Candidate) -> PlanCheck {
    match plan(scenario) {
        Ok(plan) => PlanCheck {
            planned: true,
            agrees: plan.generator_class == candidate.generator_class
                && plan.generator_count == candidate.generator_count
                && close(plan.mains_power_kw, candidate.mains_power_kw)
                && close(plan.utilities.energy_cost_per_tonne, candidate.energy_cost_per_tonne)
                && close(plan.tunnel_length_m, candidate.tunnel_length_m)
                && close_option(plan.peak_field_v_per_m, candidate.peak_field_v_per_m)
                && close_option(plan.bed_over_penetration_depth, candidate.bed_over_penetration_depth),
            generator_class: Some(plan.generator_class.clone()),
            generator_count: Some(plan.generator_count),
            mains_power_kw: Some(plan.mains_power_kw),
            energy_cost_per_tonne: Some(plan.utilities.energy_cost_per_tonne),
            tunnel_length_m: Some(plan.tunnel_length_m),
            peak_field_v_per_m: plan.peak_field_v_per_m,
            bed_over_penetration_depth: plan.bed_over_penetration_depth,
            warning_codes: plan.warnings.iter().map(|warning| warning.code).collect(),
            error: None,
        },
        Err(errors) => PlanCheck {
            planned: false,
            agrees: false,
            generator_class: None,
            generator_count: None,
            mains_power_kw: None,
            energy_cost_per_tonne: None,
            tunnel_length_m: None,
            peak_field_v_per_m: None,
            bed_over_penetration_depth: None,
            warning_codes: Vec::new(),
            error: Some(errors.iter().map(ToString::to_string).collect::<Vec<_>>().join("; ")),
        },
    }
}

/// Search a scenario's space to the end.
pub fn search(scenario: &Scenario, space: &SearchSpace) -> Result<SearchResult, Vec<InputError>> {
    Ok(Search::new(scenario, space)?.run_to_end())
}
