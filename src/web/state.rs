//! The one scenario state of the page and what is derived from it.
//!
//! Each field's text is its own signal, kept as typed. From them, in a chain of memos:
//! the scenario (or every field problem), the plan (or the core's problems), and the plan shown,
//! which is the newest valid plan: while a field is invalid the last valid plan stays on screen,
//! marked stale. The band comparison follows the plan shown. No effect writes a signal; the only
//! writes are the person's edits and the demo loader.

use crate::fields::{FieldSpec, Key};
use crate::form::FormValues;
use doubleprime::error::InputError;
use doubleprime::plan::band_comparison::{compare, BandComparison};
use doubleprime::plan::{plan, Plan};
use doubleprime::scenario::Scenario;
use doubleprime::sizing::generators::builtin_catalogue;
use leptos::prelude::*;
use std::sync::Arc;

/// The text signals of every field.
#[derive(Clone, Copy)]
pub struct FormState {
    texts: StoredValue<Vec<RwSignal<String>>>,
}

impl FormState {
    fn new(values: &FormValues) -> Self {
        let texts = Key::all().map(|key| RwSignal::new(values.get(key).to_string())).collect();
        Self { texts: StoredValue::new(texts) }
    }

    /// The signal holding one field's text.
    pub fn text(&self, key: Key) -> RwSignal<String> {
        // The vector holds one signal per key by construction.
        self.texts.with_value(|texts| texts[key as usize])
    }

    /// Every field's text (tracked: a memo reading this reruns on any edit).
    pub fn values(&self) -> FormValues {
        self.texts.with_value(|texts| FormValues::from_fn(|key| texts[key as usize].get()))
    }

    /// Replace every field's text, as when a demo load or a pasted scenario is opened.
    pub fn load(&self, values: &FormValues) {
        self.texts.with_value(|texts| {
            for key in Key::all() {
                texts[key as usize].set(values.get(key).to_string());
            }
        });
    }

    /// Set one field as the person chose it, with the one rule between fields the form keeps:
    /// a new band clears a generator class that does not serve it (back to automatic).
    pub fn choose(&self, key: Key, value: String) {
        if key == Key::Frequency {
            let class_text = self.text(Key::GeneratorClass);
            let frequency = crate::decimal_field::parse_decimal(&value);
            let class_serves = class_text.with_untracked(|id| {
                id.is_empty()
                    || builtin_catalogue()
                        .iter()
                        .any(|class| &class.id == id && frequency.is_some_and(|f| class.serves_frequency(f)))
            });
            if !class_serves {
                class_text.set(String::new());
            }
        }
        self.text(key).set(value);
    }
}

/// A valid scenario and its plan.
#[derive(Debug, Clone)]
pub struct Planned {
    /// The scenario as read from the form.
    pub scenario: Arc<Scenario>,
    /// Its plan.
    pub plan: Arc<Plan>,
}

/// Two are the same when they hold the same computation: every new plan is a new allocation, and
/// comparing pointers spares the wasm a deep comparison of two plans (the scenario memo already
/// skips edits that leave the scenario as it was).
impl PartialEq for Planned {
    fn eq(&self, other: &Self) -> bool {
        Arc::ptr_eq(&self.scenario, &other.scenario) && Arc::ptr_eq(&self.plan, &other.plan)
    }
}

/// The page's state: the form and everything derived from it. Copied into every component.
#[derive(Clone, Copy)]
pub struct AppState {
    /// The field texts.
    pub form: FormState,
    /// The scenario the form describes, or the problems reading it.
    pub scenario: Memo<Result<Arc<Scenario>, Vec<InputError>>>,
    /// The plan of the form as it is now, or the problems.
    pub planned: Memo<Result<Planned, Vec<InputError>>>,
    /// The newest valid plan: the one on screen.
    pub shown: Memo<Option<Planned>>,
    /// False until the page has shown its first plan: the band comparison (a plan per band)
    /// waits for it, so it does not delay the first plan on screen.
    pub first_plan_shown: RwSignal<bool>,
    /// The shown scenario in every band, once the first plan is on screen.
    pub comparison: Memo<Option<Arc<BandComparison>>>,
    /// Every problem with the form as it is now.
    pub problems: Memo<Vec<InputError>>,
    /// A message about loading (an unknown demo name, a pasted scenario that did not read).
    pub notice: RwSignal<Option<String>>,
}

impl AppState {
    /// The state of a page opening on `values`.
    pub fn new(values: &FormValues, notice: Option<String>) -> Self {
        let form = FormState::new(values);
        let scenario = Memo::new(move |_| form.values().to_scenario().map(Arc::new));
        let planned = Memo::new(move |_| {
            scenario.with(|scenario| match scenario {
                Ok(scenario) => plan(scenario).map(|plan| Planned { scenario: scenario.clone(), plan: Arc::new(plan) }),
                Err(problems) => Err(problems.clone()),
            })
        });
        let shown = Memo::new(move |previous: Option<&Option<Planned>>| {
            planned.with(|planned| match planned {
                Ok(planned) => Some(planned.clone()),
                Err(_) => previous.cloned().flatten(),
            })
        });
        let first_plan_shown = RwSignal::new(false);
        let comparison = Memo::new(move |_| {
            if !first_plan_shown.get() {
                return None;
            }
            shown.with(|shown| shown.as_ref().and_then(|shown| compare(&shown.scenario).ok().map(Arc::new)))
        });
        let problems = Memo::new(move |_| planned.with(|planned| planned.as_ref().err().cloned().unwrap_or_default()));
        Self { form, scenario, planned, shown, first_plan_shown, comparison, problems, notice: RwSignal::new(notice) }
    }

    /// True while the form holds a problem and the plan on screen is an older one.
    pub fn is_stale(&self) -> bool {
        self.planned.with(Result::is_err)
    }

    /// Why `key`'s value is refused, in words for the person at the form, if it is.
    pub fn field_error(&self, key: Key) -> Option<String> {
        self.problems.with(|problems| {
            let messages: Vec<String> = problems
                .iter()
                .filter(|problem| Key::for_error_field(&problem.field) == Some(key))
                .map(|problem| field_message(problem, key.spec()))
                .collect();
            (!messages.is_empty()).then(|| messages.join(" "))
        })
    }
}

/// A problem as shown beside its field: `0 is not accepted: valid is 0.02 to 10 m.` A range
/// problem is worded with the field's own range (the same numbers as the core's, as a unit test
/// checks, but written as people write them: 0.0005, not 5e-4).
pub fn field_message(problem: &InputError, spec: &FieldSpec) -> String {
    let is_range =
        problem.valid.starts_with(|c: char| c.is_ascii_digit() || c == '-') || problem.valid.starts_with("more than");
    let valid = match spec.range_words() {
        Some(words) if is_range => words,
        _ => problem.valid.clone(),
    };
    if problem.value == "\u{201c}\u{201d}" {
        format!("Needed: {valid}.")
    } else {
        format!("{} is not accepted: valid is {valid}.", problem.value)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn messages_read_as_sentences_with_units() {
        let problem = InputError::new("tunnel.belt_width_m", 0, "0.02 to 10");
        assert_eq!(field_message(&problem, Key::BeltWidth.spec()), "0 is not accepted: valid is 0.02 to 10 m.");
        let tiny = InputError::new("tunnel.bed_depth_m", 5, "5e-4 to 2");
        assert_eq!(field_message(&tiny, Key::BedDepth.spec()), "5 is not accepted: valid is 0.0005 to 2 m.");
        let blank = InputError::new("throughput_kg_per_h", "\u{201c}\u{201d}", "a number (this field is needed)");
        assert_eq!(field_message(&blank, Key::Throughput.spec()), "Needed: a number (this field is needed).");
        let unreadable = InputError::new("tunnel.bed_depth_m", "\u{201c}abc\u{201d}", "a number such as 12.5 or 12,5");
        assert!(field_message(&unreadable, Key::BedDepth.spec()).ends_with("12,5."));
    }
}
