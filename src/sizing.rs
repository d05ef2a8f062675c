//! Sizing a continuous line: energy balance, efficiency chain, generators, tunnel, utilities.

pub mod efficiency_chain;
pub mod energy_balance;
pub mod generators;
pub mod tunnel;
pub mod utilities;
