//! Reference-table tests, one module per published source (see each module's header).

mod ashrae_frozen_enthalpy;
mod behaviour;
mod iapws_saturation;
mod jha_2011_table4;
mod robustness;
mod sen_goode_1992;
mod tabulated_points;
mod water_models;
