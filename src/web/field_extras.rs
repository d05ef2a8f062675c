//! What the form shows around some fields: the choices of a select, a live remark under a field
//! (from the plan shown or from what is typed), whether a field is hidden, and text-area rows.
//! One function per concern, matched on the field's key, so every field is drawn by the same
//! code (see `form_field`).

use crate::decimal_field::parse_decimal;
use crate::fields::Key;
use crate::form::{parse_process, PROCESSES, RULE_LENGTH, RULE_RATE, RULE_TIME, SOURCE_CUSTOM};
use crate::format::{percent, qty, sig};
use crate::state::AppState;
use doubleprime::physics::bands::band_containing;
use doubleprime::plan::band_comparison::COMPARED_BANDS_MHZ;
use doubleprime::plan::Plan;
use doubleprime::scenario::ProcessKind;
use doubleprime::sizing::generators::builtin_catalogue;
use leptos::prelude::*;

fn process_label(process: ProcessKind) -> &'static str {
    match process {
        ProcessKind::Heating => "Heating",
        ProcessKind::Pasteurising => "Pasteurising",
        ProcessKind::Tempering => "Tempering (frozen, to just below thawing)",
        ProcessKind::Thawing => "Thawing (through the freezing point)",
        ProcessKind::Drying => "Drying",
        ProcessKind::Curing => "Curing",
    }
}

fn band_label(freq_mhz: f64) -> String {
    let kind = if freq_mhz < 300.0 { "RF" } else { "microwave" };
    format!("{freq_mhz} MHz, {kind}")
}

fn pairs(list: &[(&str, &str)]) -> Vec<(String, String)> {
    list.iter().map(|(value, label)| (value.to_string(), label.to_string())).collect()
}

/// The (value, label) choices of a select field.
pub fn choice_options(state: AppState, key: Key) -> Signal<Vec<(String, String)>> {
    let frequency = state.form.text(Key::Frequency);
    match key {
        Key::Process => {
            Signal::stored(PROCESSES.iter().map(|p| (p.as_str().to_string(), process_label(*p).to_string())).collect())
        }
        Key::Frequency => Signal::derive(move || {
            let mut list: Vec<(String, String)> =
                COMPARED_BANDS_MHZ.iter().map(|f| (format!("{f}"), band_label(*f))).collect();
            let current = frequency.get();
            if !list.iter().any(|(value, _)| *value == current) {
                let label = parse_decimal(&current)
                    .map_or_else(|| current.clone(), |f| format!("{} MHz (from the scenario)", sig(f, 5)));
                list.push((current, label));
            }
            list
        }),
        Key::GeneratorClass => Signal::derive(move || {
            let freq = parse_decimal(&frequency.get());
            let mut list = vec![(String::new(), "Automatic: fewest units, then the smallest rating".to_string())];
            list.extend(
                builtin_catalogue()
                    .iter()
                    .filter(|class| freq.is_some_and(|f| class.serves_frequency(f)))
                    .map(|class| (class.id.clone(), class.label.clone())),
            );
            list
        }),
        Key::Redundancy => Signal::stored(pairs(&[
            ("n", "None: as many units as the load needs"),
            ("n_plus_1", "One standby unit (N+1)"),
        ])),
        Key::ResidenceRule => Signal::stored(pairs(&[
            (RULE_LENGTH, "the heated length"),
            (RULE_TIME, "the residence time"),
            (RULE_RATE, "the highest heating rate"),
        ])),
        Key::Feed => Signal::stored(pairs(&[("top", "above only"), ("both", "above and below (through the belt)")])),
        Key::Backing => Signal::stored(pairs(&[("air", "open: air"), ("metal", "a metal floor")])),
        _ => Signal::stored(Vec::new()),
    }
}

/// A remark computed from the plan shown (empty before there is one).
fn from_plan(state: AppState, remark: fn(&Plan) -> String) -> Option<Signal<String>> {
    Some(Signal::derive(move || state.shown.with(|s| s.as_ref().map(|s| remark(&s.plan)).unwrap_or_default())))
}

/// The dry-basis value of a typed wet-basis moisture, or the plan's when the field is blank.
fn dry_basis_note(state: AppState, key: Key) -> Option<Signal<String>> {
    let text = state.form.text(key);
    let inlet = key == Key::InletMoisture;
    Some(Signal::derive(move || {
        let typed = text.get();
        if typed.trim().is_empty() {
            return state
                .shown
                .with(|s| {
                    s.as_ref().map(|s| {
                        let balance = &s.plan.energy_balance;
                        let (wb, db) = if inlet {
                            (s.plan.assumptions.inlet_moisture_wb, balance.inlet_moisture_db)
                        } else {
                            (s.plan.assumptions.outlet_moisture_wb, balance.outlet_moisture_db)
                        };
                        format!("In use: {} wet basis, {} kg/kg dry basis.", sig(wb, 3), sig(db, 3))
                    })
                })
                .unwrap_or_default();
        }
        match parse_decimal(&typed) {
            // Wet basis w is kg water per kg product; dry basis is per kg dry solids, w / (1 - w).
            Some(w) if (0.0..1.0).contains(&w) => format!("Dry basis: {} kg/kg.", sig(w / (1.0 - w), 3)),
            _ => String::new(),
        }
    }))
}

fn frozen_note(fraction: f64) -> String {
    if fraction > 0.0 {
        format!("In the plan: {} of the water frozen here.", percent(fraction, 2))
    } else {
        String::new()
    }
}

/// A live remark under the field, if it has one.
pub fn field_note(state: AppState, key: Key) -> Option<Signal<String>> {
    match key {
        Key::InletTemp => from_plan(state, |plan| frozen_note(plan.dielectric_inlet.frozen_fraction)),
        Key::OutletTemp => from_plan(state, |plan| frozen_note(plan.dielectric_outlet.frozen_fraction)),
        Key::InletMoisture | Key::OutletMoisture => dry_basis_note(state, key),
        Key::EvaporationTemp => {
            from_plan(state, |plan| format!("In use: {}.", qty(plan.assumptions.evaporation_temp_c, 4, "\u{b0}C")))
        }
        Key::Frequency => {
            let frequency = state.form.text(Key::Frequency);
            Some(Signal::derive(move || {
                parse_decimal(&frequency.get())
                    .and_then(band_containing)
                    .map(|band| format!("ISM band {}: {}, {}.", band.name, band.designation, band.regions))
                    .unwrap_or_else(|| "Outside the ISM bands.".to_string())
            }))
        }
        Key::GeneratorClass => from_plan(state, |plan| {
            let g = &plan.generators;
            format!(
                "In the plan: {} \u{d7} {}, each at {} of its rating.",
                g.running_count + g.standby_count,
                g.class.label,
                percent(g.operating_fraction, 2)
            )
        }),
        Key::EffPowerSupply => {
            from_plan(state, |plan| format!("In use: {}.", sig(plan.assumptions.efficiency.power_supply, 3)))
        }
        Key::EffGenerator => {
            from_plan(state, |plan| format!("In use: {}.", sig(plan.assumptions.efficiency.generator, 3)))
        }
        Key::BedDepth => from_plan(state, |plan| {
            plan.bed_over_penetration_depth.map_or_else(String::new, |ratio| {
                format!("In the plan: {} \u{d7} the smallest penetration depth.", sig(ratio, 2))
            })
        }),
        Key::BulkDensity => from_plan(state, |plan| {
            format!("In use: {}.", qty(plan.assumptions.tunnel.bulk_density_kg_per_m3, 4, "kg/m\u{b3}"))
        }),
        Key::Process => {
            let process = state.form.text(Key::Process);
            Some(Signal::derive(move || {
                if process.with(|p| parse_process(p) == Some(ProcessKind::Drying)) {
                    "Drying: give both moistures, the outlet below the inlet.".to_string()
                } else {
                    "Not drying: the moisture stays as it is (leave the outlet moisture blank).".to_string()
                }
            }))
        }
        _ => None,
    }
}

/// When the field is hidden (a residence rule not chosen, custom fields of a library product).
pub fn field_hidden(state: AppState, key: Key) -> Option<Signal<bool>> {
    let rule = state.form.text(Key::ResidenceRule);
    let source = state.form.text(Key::ProductSource);
    let shown_for_rule = |wanted: &'static str| Some(Signal::derive(move || rule.with(|r| r != wanted)));
    match key {
        Key::TunnelLength => shown_for_rule(RULE_LENGTH),
        Key::ResidenceTime => shown_for_rule(RULE_TIME),
        Key::HeatingRate => shown_for_rule(RULE_RATE),
        Key::CustomName
        | Key::CustomEpsReal
        | Key::CustomEpsImag
        | Key::CustomDensity
        | Key::CustomSpecificHeat
        | Key::CustomSource => Some(Signal::derive(move || source.with(|s| s != SOURCE_CUSTOM))),
        _ => None,
    }
}

/// Rows of a text area; 0 for a one-line field.
pub fn text_rows(key: Key) -> u32 {
    match key {
        Key::Description | Key::Notes => 3,
        _ => 0,
    }
}
