//! The demo loads, embedded in the wasm so the page opens one with no request and no server.

use doubleprime::error::InputError;
use doubleprime::scenario::{parse_scenario, Scenario};

/// One demo load: its file name without `.json`, and the file's text.
#[derive(Debug, Clone, Copy)]
pub struct Demo {
    /// `demo-loads/NAME.json`, as in `?demo=NAME`.
    pub name: &'static str,
    /// The scenario JSON.
    pub text: &'static str,
}

macro_rules! demo {
    ($name:literal) => {
        Demo { name: $name, text: include_str!(concat!("../../demo-loads/", $name, ".json")) }
    };
}

/// Every demo load, in the order the selector lists them.
pub const DEMOS: [Demo; 6] = [
    demo!("tempering-beef-blocks"),
    demo!("pasteurising-potato-trays"),
    demo!("layered-meal-trays"),
    demo!("drying-sand-cores"),
    demo!("rf-drying-cotton-packages"),
    demo!("curing-rubber-profile"),
];

/// The demo the page opens with when the address names none.
pub const DEFAULT_DEMO: &str = "tempering-beef-blocks";

/// The demo called `name`, if there is one.
pub fn demo(name: &str) -> Option<Demo> {
    DEMOS.iter().copied().find(|demo| demo.name == name)
}

impl Demo {
    /// The demo's scenario.
    pub fn scenario(&self) -> Result<Scenario, Vec<InputError>> {
        parse_scenario(self.text)
    }

    /// The scenario's title, or the file name if it has none.
    pub fn title(&self) -> String {
        self.scenario().ok().map(|s| s.name).filter(|name| !name.is_empty()).unwrap_or_else(|| self.name.to_string())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_demo_file_is_embedded_and_plans() {
        let mut on_disk: Vec<String> = std::fs::read_dir(concat!(env!("CARGO_MANIFEST_DIR"), "/demo-loads"))
            .unwrap()
            .filter_map(|entry| {
                let name = entry.unwrap().file_name().into_string().unwrap();
                name.strip_suffix(".json").map(str::to_string)
            })
            .collect();
        on_disk.sort();
        let mut embedded: Vec<String> = DEMOS.iter().map(|demo| demo.name.to_string()).collect();
        embedded.sort();
        assert_eq!(embedded, on_disk);
        for demo in DEMOS {
            let scenario = demo.scenario().unwrap();
            assert!(doubleprime::plan::plan(&scenario).is_ok(), "{} does not plan", demo.name);
        }
        assert!(demo(DEFAULT_DEMO).is_some());
    }
}
