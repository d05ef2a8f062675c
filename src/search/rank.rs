//! Ranking the feasible configurations: the objective, the order, the best few and the trade-off
//! frontier of tunnel length against generator count.
//!
//! Objectives (smaller is better): `generator_count` (units installed, standby included),
//! `mains_kw` (mains power with auxiliaries), `energy_cost_per_tonne` (the plan's utilities),
//! `tunnel_length_m` (heated length), or `{"weighted": {name: weight, ...}}` over those four
//! names, value = sum of weight x figure (weights 0 or more, at least one above 0; the figures
//! keep their units, so the weights carry the exchange rate: `{"generator_count": 1,
//! "mains_kw": 0.01}` prices a unit like 100 kW of mains power).
//!
//! Order: the objective value, then the generator count, then the mains power, then the tunnel
//! length, then the configuration's place in the space; every comparison is `f64::total_cmp` on
//! finite numbers, so the order is total and the same on every run.
//!
//! Frontier: the configurations no other beats on both tunnel length and generator count (fewer
//! or equal units and shorter or equal tunnel, one of them strictly). For each generator count
//! the shortest tunnel is kept (ties by the order above); sweeping the counts upwards, a count
//! stays on the frontier when its tunnel is strictly shorter than every smaller count's.

use super::evaluate::Candidate;
use crate::error::{require_in, InputError};
use serde::{Deserialize, Serialize};
use std::cmp::Ordering;
use std::collections::BTreeMap;

/// Largest weight accepted in a weighted objective.
pub const WEIGHT_MAX: f64 = 1e9;

/// What ranks the feasible configurations; smaller is better.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Objective {
    /// Generators installed, standby included.
    GeneratorCount,
    /// Mains power with auxiliaries, kW.
    MainsKw,
    /// Energy cost per tonne of product in.
    EnergyCostPerTonne,
    /// Heated tunnel length, m.
    TunnelLengthM,
    /// A weighted sum of the four figures.
    Weighted(Weights),
}

/// Weights of a weighted objective (each 0 or more; absent is 0).
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct Weights {
    /// Per generator installed.
    pub generator_count: f64,
    /// Per kW of mains power.
    pub mains_kw: f64,
    /// Per unit of energy cost per tonne.
    pub energy_cost_per_tonne: f64,
    /// Per metre of heated length.
    pub tunnel_length_m: f64,
}

/// The figures an objective reads.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Figures {
    /// Generators installed.
    pub generator_count: u32,
    /// Mains power, kW.
    pub mains_kw: f64,
    /// Energy cost per tonne.
    pub energy_cost_per_tonne: f64,
    /// Heated length, m.
    pub tunnel_length_m: f64,
}

impl Objective {
    /// The objective's value for a configuration's figures.
    pub fn value(&self, figures: &Figures) -> f64 {
        let count = f64::from(figures.generator_count);
        match self {
            Objective::GeneratorCount => count,
            Objective::MainsKw => figures.mains_kw,
            Objective::EnergyCostPerTonne => figures.energy_cost_per_tonne,
            Objective::TunnelLengthM => figures.tunnel_length_m,
            Objective::Weighted(w) => {
                w.generator_count * count
                    + w.mains_kw * figures.mains_kw
                    + w.energy_cost_per_tonne * figures.energy_cost_per_tonne
                    + w.tunnel_length_m * figures.tunnel_length_m
            }
        }
    }

    /// Check the weights of a weighted objective (`space.objective.weighted.mains_kw`).
    pub fn validate(&self) -> Vec<InputError> {
        let Objective::Weighted(w) = self else {
            return Vec::new();
        };
        let entries = [
            ("generator_count", w.generator_count),
            ("mains_kw", w.mains_kw),
            ("energy_cost_per_tonne", w.energy_cost_per_tonne),
            ("tunnel_length_m", w.tunnel_length_m),
        ];
        let mut problems: Vec<InputError> = entries
            .iter()
            .filter_map(|(name, weight)| {
                require_in(&format!("space.objective.weighted.{name}"), *weight, 0.0, WEIGHT_MAX).err()
            })
            .collect();
        if problems.is_empty() && entries.iter().all(|(_, weight)| *weight == 0.0) {
            problems.push(InputError::new("space.objective.weighted", "all weights 0", "at least one weight above 0"));
        }
        problems
    }
}

/// The ranking order of two feasible configurations (see the module documentation).
pub fn order(a: &Candidate, b: &Candidate) -> Ordering {
    a.objective_value
        .total_cmp(&b.objective_value)
        .then(a.generator_count.cmp(&b.generator_count))
        .then(a.mains_power_kw.total_cmp(&b.mains_power_kw))
        .then(a.tunnel_length_m.total_cmp(&b.tunnel_length_m))
        .then(a.index.cmp(&b.index))
}

/// The best few configurations seen so far, in order.
#[derive(Debug, Clone, PartialEq)]
pub struct BestList {
    capacity: usize,
    items: Vec<Candidate>,
}

impl BestList {
    /// An empty list keeping at most `capacity` configurations.
    pub fn new(capacity: usize) -> Self {
        Self { capacity, items: Vec::with_capacity(capacity.min(64)) }
    }

    /// Offer a configuration; it is kept (copied) only if it ranks among the best.
    pub fn offer(&mut self, candidate: &Candidate) {
        if self.capacity == 0 {
            return;
        }
        if self.items.len() == self.capacity
            && self.items.last().is_some_and(|last| order(candidate, last) != Ordering::Less)
        {
            return;
        }
        let place = self.items.partition_point(|kept| order(kept, candidate) == Ordering::Less);
        self.items.insert(place, candidate.clone());
        self.items.truncate(self.capacity);
    }

    /// The configurations kept, best first.
    pub fn items(&self) -> &[Candidate] {
        &self.items
    }
}

/// The shortest tunnel for each generator count, from which the frontier is read.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Frontier {
    by_count: BTreeMap<u32, Candidate>,
}

impl Frontier {
    /// An empty frontier.
    pub fn new() -> Self {
        Self::default()
    }

    /// Offer a configuration; it is kept (copied) only if it has the shortest tunnel for its count.
    pub fn offer(&mut self, candidate: &Candidate) {
        match self.by_count.get_mut(&candidate.generator_count) {
            None => {
                self.by_count.insert(candidate.generator_count, candidate.clone());
            }
            Some(kept) => {
                let shorter =
                    candidate.tunnel_length_m.total_cmp(&kept.tunnel_length_m).then_with(|| order(candidate, kept))
                        == Ordering::Less;
                if shorter {
                    *kept = candidate.clone();
                }
            }
        }
    }

    /// The non-dominated configurations, fewest generators first (so tunnels shortening).
    pub fn points(&self) -> Vec<Candidate> {
        let mut points: Vec<Candidate> = Vec::new();
        for candidate in self.by_count.values() {
            if points.last().is_none_or(|last| candidate.tunnel_length_m < last.tunnel_length_m) {
                points.push(candidate.clone());
            }
        }
        points
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::search::evaluate::tests::candidate;

    #[test]
    fn objective_values_by_hand() {
        let figures =
            Figures { generator_count: 3, mains_kw: 250.0, energy_cost_per_tonne: 12.5, tunnel_length_m: 6.0 };
        assert_eq!(Objective::GeneratorCount.value(&figures), 3.0);
        assert_eq!(Objective::MainsKw.value(&figures), 250.0);
        assert_eq!(Objective::EnergyCostPerTonne.value(&figures), 12.5);
        assert_eq!(Objective::TunnelLengthM.value(&figures), 6.0);
        // 1 x 3 + 0.01 x 250 + 0.5 x 6 = 8.5 (by hand).
        let weighted = Objective::Weighted(Weights {
            generator_count: 1.0,
            mains_kw: 0.01,
            energy_cost_per_tonne: 0.0,
            tunnel_length_m: 0.5,
        });
        assert!((weighted.value(&figures) - 8.5).abs() < 1e-12);
    }

    #[test]
    fn weights_are_checked_by_name() {
        let bad = Objective::Weighted(Weights { mains_kw: -1.0, ..Weights::default() });
        let fields: Vec<String> = bad.validate().into_iter().map(|e| e.field).collect();
        assert_eq!(fields, ["space.objective.weighted.mains_kw"]);
        let none = Objective::Weighted(Weights::default());
        assert_eq!(none.validate()[0].field, "space.objective.weighted");
        assert!(Objective::MainsKw.validate().is_empty());
    }

    #[test]
    fn the_best_list_keeps_the_few_best_in_order_with_ties_by_place() {
        let mut best = BestList::new(3);
        // (index, generator count, tunnel m, mains kW, objective)
        for (index, count, tunnel, mains) in
            [(0, 4, 2.0, 100.0), (1, 3, 5.0, 120.0), (2, 3, 5.0, 110.0), (3, 5, 1.0, 90.0), (4, 3, 5.0, 110.0)]
        {
            best.offer(&candidate(index, count, tunnel, mains, f64::from(count)));
        }
        // By count: 3, 3, 3 then 4, 5; among the threes mains 110 (index 2, then 4) before 120.
        let order: Vec<usize> = best.items().iter().map(|c| c.index).collect();
        assert_eq!(order, [2, 4, 1]);
        let mut one = BestList::new(1);
        one.offer(&candidate(7, 2, 1.0, 50.0, 2.0));
        one.offer(&candidate(8, 2, 1.0, 50.0, 2.0));
        assert_eq!(one.items().iter().map(|c| c.index).collect::<Vec<_>>(), [7], "a tie keeps the earlier");
    }

    #[test]
    fn the_frontier_by_hand() {
        let mut frontier = Frontier::new();
        // (count, tunnel): (3, 2), (2, 5), (4, 2), (5, 1), (2, 6), (3, 2 again, later).
        for (index, (count, tunnel)) in [(3, 2.0), (2, 5.0), (4, 2.0), (5, 1.0), (2, 6.0), (3, 2.0)].iter().enumerate()
        {
            frontier.offer(&candidate(index, *count, *tunnel, 100.0, f64::from(*count)));
        }
        // Fewest units with the shortest tunnel each: 2 -> 5 m, 3 -> 2 m, 4 -> 2 m (dominated by
        // 3 units at 2 m), 5 -> 1 m. So the frontier is (2, 5), (3, 2), (5, 1), and the 3-unit
        // point is the earlier of the two equal ones.
        let points: Vec<(u32, f64, usize)> =
            frontier.points().iter().map(|c| (c.generator_count, c.tunnel_length_m, c.index)).collect();
        assert_eq!(points, [(2, 5.0, 1), (3, 2.0, 0), (5, 1.0, 3)]);
        assert!(Frontier::new().points().is_empty());
    }
}
