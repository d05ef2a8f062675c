//! Integration tests: one binary, one module per subject (links once instead of once per file).

mod cli_dielectric;
mod cli_layers;
mod physics_properties;
mod support;
