//! Integration tests: one binary, one module per subject (links once instead of once per file).

mod cli_dielectric;
mod cli_layers;
mod cli_material;
mod cli_plan;
mod cli_properties;
mod cli_timing;
mod demo_loads;
mod physics_properties;
mod plan_energy_balance;
mod plan_zones;
mod scenario_properties;
mod search;
mod support;
