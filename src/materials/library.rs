//! The material library: types of `library.json`, loaded once and checked.
//!
//! The data file `src/materials/library.json` is compiled into the binary with `include_str!` and
//! parsed on first use through a `OnceLock`. Its format is documented in `src/materials/README.md`.
//! A malformed or inconsistent file is a programming error caught by this module's unit tests
//! (`library_file_is_valid`), never by a user: at run time a file that failed to parse yields an
//! empty library rather than a panic.

use crate::error::InputError;
use crate::materials::composition::Composition;
use crate::materials::mixing::MixingRule;
use serde::{Deserialize, Serialize};
use std::sync::OnceLock;

const LIBRARY_JSON: &str = include_str!("library.json");

/// How sure a value is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum Confidence {
    /// Read in the named publication (or public code implementing it).
    #[serde(rename = "published")]
    Published,
    /// A rule of thumb or a modelling choice, not a measurement.
    #[serde(rename = "common practice")]
    CommonPractice,
    /// Recalled from the named source without re-reading it; use with wide tolerances.
    #[serde(rename = "from memory")]
    FromMemory,
    /// Entered by the user of a user-defined material.
    #[serde(rename = "user-given")]
    UserGiven,
}

impl Confidence {
    /// The marker as written in the data file.
    pub fn as_str(self) -> &'static str {
        match self {
            Confidence::Published => "published",
            Confidence::CommonPractice => "common practice",
            Confidence::FromMemory => "from memory",
            Confidence::UserGiven => "user-given",
        }
    }
}

/// A source of data: the publication, where in it, and how sure the value is.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Source {
    /// Short key used by data points (`jha-2011-t4`).
    pub id: String,
    /// Author(s), title, journal or publisher, year.
    pub citation: String,
    /// Table, figure or equation (`Table 4`), or what was done (`midpoint of a range`).
    pub locator: String,
    /// How sure the value is.
    pub confidence: Confidence,
}

impl Source {
    /// `citation, locator (confidence)`.
    pub fn summary(&self) -> String {
        format!("{}, {} ({})", self.citation, self.locator, self.confidence.as_str())
    }
}

/// What kind of material this is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Category {
    /// Water, ice, brine.
    Water,
    /// Meat, fish, poultry, ready meals.
    Meat,
    /// Bread, dough, pasta, grain.
    Bakery,
    /// Fruit and vegetables.
    Produce,
    /// Cheese and milk products.
    Dairy,
    /// Solid wood and engineered wood.
    Wood,
    /// Paper and board.
    Paper,
    /// Textiles and fibres.
    Textile,
    /// Rubber compounds.
    Rubber,
    /// Ceramics, refractories and glasses.
    Ceramic,
    /// Foundry sand and cores.
    Foundry,
    /// Polymers and belt materials.
    Polymer,
    /// Defined by the user.
    UserDefined,
}

impl Category {
    /// The category as written in the data file.
    pub fn as_str(self) -> &'static str {
        match self {
            Category::Water => "water",
            Category::Meat => "meat",
            Category::Bakery => "bakery",
            Category::Produce => "produce",
            Category::Dairy => "dairy",
            Category::Wood => "wood",
            Category::Paper => "paper",
            Category::Textile => "textile",
            Category::Rubber => "rubber",
            Category::Ceramic => "ceramic",
            Category::Foundry => "foundry",
            Category::Polymer => "polymer",
            Category::UserDefined => "user-defined",
        }
    }
}

/// One measured or recalled permittivity.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TablePoint {
    /// Frequency, MHz.
    pub freq_mhz: f64,
    /// Temperature, degC.
    pub temp_c: f64,
    /// Moisture content, wet basis (kg water per kg moist material), if the data has that axis.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub moisture_wb: Option<f64>,
    /// Dielectric constant eps'.
    pub eps_real: f64,
    /// Loss factor eps''.
    pub eps_imag: f64,
    /// Key of the point's entry in the material's `sources`.
    pub source: String,
}

/// A tabulated specific heat.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SpecificHeatPoint {
    /// Temperature, degC.
    pub temp_c: f64,
    /// Specific heat, J/(kg K).
    pub specific_heat_j_per_kg_k: f64,
}

/// How the material stores and releases heat.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "model", rename_all = "snake_case", deny_unknown_fields)]
pub enum ThermalModel {
    /// Liquid water (IAPWS saturation-line enthalpy).
    Water {
        /// Source key.
        source: String,
    },
    /// Ice Ih below 0 degC, melting to liquid water at 0 degC.
    Ice {
        /// Source key.
        source: String,
    },
    /// A food by composition: Choi-Okos specific heat, ASHRAE freezing if it has a freezing point.
    Composition {
        /// Mass fractions at the nominal moisture.
        composition: Composition,
        /// Initial freezing point at the nominal moisture, degC (< 0), if the food is to freeze.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        initial_freezing_point_c: Option<f64>,
        /// Source key of the composition and freezing point.
        source: String,
    },
    /// One specific heat at every temperature.
    Constant {
        /// Specific heat, J/(kg K).
        specific_heat_j_per_kg_k: f64,
        /// Source key.
        source: String,
    },
    /// Specific heat tabulated against temperature, linear between points, held beyond them.
    Table {
        /// Points in rising temperature.
        points: Vec<SpecificHeatPoint>,
        /// Source key.
        source: String,
    },
    /// Dry matter of constant specific heat plus liquid water: c_p = x c_p,water + (1 - x) c_p,dry.
    DryPlusWater {
        /// Specific heat of the dry matter, J/(kg K).
        dry_specific_heat_j_per_kg_k: f64,
        /// Nominal moisture, wet basis.
        moisture_wb: f64,
        /// Source key.
        source: String,
    },
}

/// How the material's permittivity is obtained.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "model", rename_all = "snake_case", deny_unknown_fields)]
pub enum DielectricModel {
    /// Liquid water and NaCl solutions: Ellison (2007) plus the saline model.
    Water {
        /// Source key.
        source: String,
    },
    /// Pure ice: Maetzler (2006).
    Ice {
        /// Source key.
        source: String,
    },
    /// One permittivity, declared valid over frequency and temperature ranges.
    Constant {
        /// Dielectric constant eps'.
        eps_real: f64,
        /// Loss factor eps''.
        eps_imag: f64,
        /// Frequencies the value is declared for, MHz [min, max].
        freq_range_mhz: [f64; 2],
        /// Temperatures the value is declared for, degC [min, max].
        temp_range_c: [f64; 2],
        /// Source key.
        source: String,
    },
    /// Data points, interpolated in ln(frequency), moisture and temperature.
    Table {
        /// The data points.
        points: Vec<TablePoint>,
        /// Moisture used when a request gives none (needed when points have moisture).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        nominal_moisture_wb: Option<f64>,
    },
    /// A porous moist solid: solid matrix + water (brine) + air, mixed by a named rule.
    Moist {
        /// eps' of the solid substance (pore-free).
        solid_eps_real: f64,
        /// eps'' of the solid substance.
        solid_eps_imag: f64,
        /// Density of the solid substance (pore-free), kg/m^3.
        solid_density_kg_per_m3: f64,
        /// Dry bulk density (solids per unit bulk volume), kg/m^3; assumed not to shrink.
        dry_bulk_density_kg_per_m3: f64,
        /// The mixing rule.
        mixing_rule: MixingRule,
        /// Nominal moisture, wet basis.
        moisture_wb: f64,
        /// Moisture range the model is declared for, wet basis [min, max].
        moisture_range_wb: [f64; 2],
        /// Dissolved salt, % of the moist material's mass (NaCl-equivalent), when not given.
        #[serde(default)]
        salt_pct: f64,
        /// Temperatures declared, degC [min, max].
        temp_range_c: [f64; 2],
        /// Frequencies declared, MHz [min, max].
        freq_range_mhz: [f64; 2],
        /// Source key.
        source: String,
    },
    /// A food that freezes: ice + unfrozen brine + solids (fat separately) through the ice fraction.
    Frozen {
        /// eps' of the non-fat dry solids.
        solids_eps_real: f64,
        /// eps'' of the non-fat dry solids.
        solids_eps_imag: f64,
        /// Dissolved salts, % of the product mass (NaCl-equivalent), when not given.
        salt_pct: f64,
        /// The mixing rule.
        mixing_rule: MixingRule,
        /// Temperatures declared, degC [min, max].
        temp_range_c: [f64; 2],
        /// Frequencies declared, MHz [min, max].
        freq_range_mhz: [f64; 2],
        /// Moisture range declared, wet basis [min, max].
        moisture_range_wb: [f64; 2],
        /// Source key.
        source: String,
    },
}

/// Published measurements kept beside a model-based entry, to test the model against.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ReferencePoint {
    /// Frequency, MHz.
    pub freq_mhz: f64,
    /// Temperature, degC.
    pub temp_c: f64,
    /// Moisture, wet basis, if stated.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub moisture_wb: Option<f64>,
    /// Measured eps'.
    pub eps_real: f64,
    /// Measured eps'' (absent when the published value is unusable).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub eps_imag: Option<f64>,
    /// Source key.
    pub source: String,
}

/// One material of the library (or defined by the user).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Material {
    /// Identifier, lower-case with hyphens (`beef-lean`).
    pub name: String,
    /// Display label (`Beef, lean`).
    pub label: String,
    /// Category.
    pub category: Category,
    /// Bulk density at the nominal state, kg/m^3.
    pub density_kg_per_m3: f64,
    /// Heat storage model.
    pub thermal: ThermalModel,
    /// Permittivity model.
    pub dielectric: DielectricModel,
    /// Every source the entry cites.
    pub sources: Vec<Source>,
    /// Remarks: what the data is and is not.
    #[serde(default)]
    pub notes: String,
    /// Published measurements to test a model-based entry against.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub reference_points: Vec<ReferencePoint>,
    /// All sources in one line (filled on load).
    #[serde(skip_deserializing, default)]
    pub source: String,
}

impl Material {
    /// The source entry with key `id`.
    pub fn source_by_id(&self, id: &str) -> Option<&Source> {
        self.sources.iter().find(|source| source.id == id)
    }

    /// A one-line summary of the sources, `;`-separated.
    pub fn source_summary(&self) -> String {
        let parts: Vec<String> = self.sources.iter().map(Source::summary).collect();
        parts.join("; ")
    }
}

/// The library of materials.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Library {
    materials: Vec<Material>,
}

impl Library {
    /// The material named `name` (its identifier), if any.
    pub fn get(&self, name: &str) -> Option<&Material> {
        self.materials.iter().find(|material| material.name == name)
    }

    /// All materials, in file order.
    pub fn iter(&self) -> std::slice::Iter<'_, Material> {
        self.materials.iter()
    }

    /// Number of materials.
    pub fn len(&self) -> usize {
        self.materials.len()
    }

    /// True if the library is empty (only if the data file failed to load).
    pub fn is_empty(&self) -> bool {
        self.materials.is_empty()
    }

    /// All identifiers, in file order.
    pub fn names(&self) -> Vec<&str> {
        self.materials.iter().map(|m| m.name.as_str()).collect()
    }
}

impl<'a> IntoIterator for &'a Library {
    type Item = &'a Material;
    type IntoIter = std::slice::Iter<'a, Material>;
    fn into_iter(self) -> Self::IntoIter {
        self.materials.iter()
    }
}

#[derive(Deserialize)]
struct LibraryFile {
    materials: Vec<Material>,
}

/// Parse and check a library document; every problem is reported.
pub fn parse_library(text: &str) -> Result<Library, Vec<String>> {
    // Through a Value, as scenarios are read: the module then carries one JSON reader, not a
    // second one specialised for the library's types (with the catalogue read the same way, 11 KB raw, 3.4 KB gzipped).
    let file: LibraryFile = serde_json::from_str::<serde_json::Value>(text)
        .and_then(serde_json::from_value)
        .map_err(|error| vec![format!("library.json: {error}")])?;
    let mut problems = Vec::new();
    let mut materials = Vec::with_capacity(file.materials.len());
    for (index, mut material) in file.materials.into_iter().enumerate() {
        for error in crate::materials::custom::material_problems(&material) {
            problems.push(format!("materials[{index}] ({}): {error}", material.name));
        }
        if materials.iter().any(|m: &Material| m.name == material.name) {
            problems.push(format!("materials[{index}]: duplicate name {}", material.name));
        }
        material.source = material.source_summary();
        materials.push(material);
    }
    if problems.is_empty() {
        Ok(Library { materials })
    } else {
        Err(problems)
    }
}

/// The built-in library, parsed once. If the embedded file were malformed (which the unit tests
/// rule out) this is an empty library, never a panic.
pub fn library() -> &'static Library {
    static LIBRARY: OnceLock<Library> = OnceLock::new();
    LIBRARY.get_or_init(|| parse_library(LIBRARY_JSON).unwrap_or_default())
}

/// An error for an unknown material name, listing what exists.
pub fn unknown_material(name: &str) -> InputError {
    InputError::new("material", crate::error::quoted(name), format!("one of: {}", library().names().join(", ")))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn library_file_is_valid() {
        match parse_library(LIBRARY_JSON) {
            Ok(library) => assert!(library.len() >= 30, "only {} materials", library.len()),
            Err(problems) => panic!("library.json problems:\n{}", problems.join("\n")),
        }
    }

    #[test]
    fn water_and_ice_exist() {
        assert!(library().get("water").is_some());
        assert!(library().get("ice").is_some());
    }

    #[test]
    fn names_are_lower_case_with_hyphens_and_labels_are_set() {
        for material in library() {
            assert!(
                material.name.chars().all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-'),
                "{}",
                material.name
            );
            assert!(!material.label.is_empty());
            assert!(!material.source.is_empty());
        }
    }

    #[test]
    fn malformed_documents_are_refused_with_reasons() {
        assert!(parse_library("{").is_err());
        assert!(parse_library(r#"{"materials": [{"name": "x"}]}"#).is_err());
        // A well-formed entry that cites a source it does not list.
        let bad = r#"{"materials": [{
            "name": "slab", "label": "Slab", "category": "polymer", "density_kg_per_m3": 900,
            "thermal": {"model": "constant", "specific_heat_j_per_kg_k": 1900, "source": "s"},
            "dielectric": {"model": "constant", "eps_real": 2.2, "eps_imag": 0.001,
                "freq_range_mhz": [1, 10000], "temp_range_c": [0, 80], "source": "missing"},
            "sources": [{"id": "s", "citation": "c", "locator": "l", "confidence": "from memory"}]
        }]}"#;
        let problems = parse_library(bad).unwrap_err();
        assert!(problems.iter().any(|p| p.contains("missing")), "{problems:?}");
    }

    #[test]
    fn categories_cover_the_issue_list() {
        use std::collections::BTreeSet;
        let present: BTreeSet<&str> = library().iter().map(|m| m.category.as_str()).collect();
        for needed in [
            "water", "meat", "bakery", "produce", "dairy", "wood", "paper", "textile", "rubber", "ceramic", "foundry",
            "polymer",
        ] {
            assert!(present.contains(needed), "no {needed} material");
        }
    }
}
