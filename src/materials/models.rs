//! Evaluation of each dielectric model of a material at one state.
//!
//! Moist model (porous solid + water + air), per unit bulk volume, no shrinkage:
//!   v_s = rho_dry / rho_solid,  v_w = rho_dry x / ((1 - x) rho_w),  v_air = 1 - v_s - v_w
//! (if v_s + v_w > 1 the pores are full and the bulk swells: v_air = 0, v_s and v_w renormalized);
//! eps = mix({v_s: eps_solid, v_w: eps_brine(f, T, w), v_air: 1}) with the entry's rule, the salt
//! dissolved in the water, w = salt / (salt + water).
//! Frozen model (air-free food, mass fractions of the product):
//!   ice x_ice from [`crate::materials::freezing`]; liquid x_l = x_w - x_ice carrying the dissolved
//!   salt (brine w = salt/(salt + x_l), at most the eutectic 23.3 %, the excess crystallizes);
//!   phases ice (Maetzler 2006), brine (Ellison 2007 + saline model), fat (2.6 - j0.2, milk fat at
//!   2.45 GHz, Datta & Ramaswamy 2001, published) and the other solids (the entry's value), volume
//!   fractions from the Choi-Okos densities, mixed by the entry's rule. Bound water x_b (ASHRAE,
//!   0.4 x_protein) does not freeze; below t_f it is taken as immobile in the share in which the
//!   freezable water has frozen, 1 - t_f/t, and then counted with the ice phase (non-relaxing),
//!   the rest of it stays liquid brine. This is a Doubleprime modelling choice, not a published
//!   model: it keeps eps continuous at t_f (all water liquid there) and brings the deep-frozen values
//!   to the published ones (Bengtsson & Risman 1971 via Jha et al. 2011, Table 4).
//!   Below 0 degC the brine's permittivity and conductivity are extrapolations (water.rs, saline.rs).

use crate::materials::composition::{self, Composition};
use crate::materials::freezing;
use crate::materials::ice;
use crate::materials::library::{DielectricModel, Material, ThermalModel};
use crate::materials::mixing::{mix, mix_phases, mixing_term, MixingRule, Phase};
use crate::materials::saline;
use crate::materials::water;
use crate::physics::complex::Complex;

/// The result of evaluating a model (before it is packed into a lookup).
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct ModelValue {
    pub eps: Complex,
    pub model: String,
    pub out_of_range: Vec<String>,
    pub notes: Vec<String>,
}

/// Fat phase permittivity: milk fat (solid, 0 % moisture) at 2.45 GHz, eps 2.6 - j0.2 (Datta &
/// Ramaswamy 2001, as reproduced in Table 1.2 of Introduction to Advanced Food Process Engineering;
/// published). Fats hardly disperse in frequency, so it is used at all frequencies (common practice).
pub(crate) const FAT_EPS: Complex = Complex { re: 2.6, im: -0.2 };

/// Flag `value` of `axis` outside [min, max].
pub(crate) fn flag_range(flags: &mut Vec<String>, axis: &str, value: f64, range: [f64; 2], what: &str) {
    if value < range[0] || value > range[1] {
        flags.push(format!(
            "{axis} = {value} is outside the range of {what} ({} to {}); the value is an extrapolation",
            range[0], range[1]
        ));
    }
}

const WATER_MODEL: &str = "Ellison (2007) pure water, J. Phys. Chem. Ref. Data 36:1-18";
const SALINE_MODEL: &str = "NaCl: Sen & Goode (1992) conductivity with the Stogryn (1971) temperature ratio below 25 degC, Stogryn (1971) dipolar factors";

pub(crate) fn water_value(
    frequency_hz: f64,
    temp_c: f64,
    salt_fraction: f64,
    conductivity_s_per_m: Option<f64>,
) -> ModelValue {
    let mut out_of_range = Vec::new();
    flag_range(
        &mut out_of_range,
        "temp_c",
        temp_c,
        [water::FIT_TEMP_MIN_C, water::FIT_TEMP_MAX_C],
        "the Ellison (2007) water model",
    );
    let brine = saline::permittivity(frequency_hz, temp_c, salt_fraction, conductivity_s_per_m);
    let mut notes = Vec::new();
    if brine.dipolar_held {
        out_of_range.push(format!(
            "salt: {:.1} % NaCl is above N = 3 mol/L, the range of the Stogryn (1971) dipolar factors; they are held at N = 3",
            100.0 * salt_fraction
        ));
    }
    let model = if salt_fraction > 0.0 || conductivity_s_per_m.is_some() {
        let conduction = match conductivity_s_per_m {
            Some(sigma) => format!("user-given conductivity {sigma} S/m"),
            None => format!("conductivity {:.4} S/m from {SALINE_MODEL}", brine.conductivity_s_per_m),
        };
        notes.push(format!("ionic conductivity {:.4} S/m", brine.conductivity_s_per_m));
        format!("{WATER_MODEL}; {conduction}")
    } else {
        WATER_MODEL.to_string()
    };
    ModelValue { eps: brine.eps, model, out_of_range, notes }
}

pub(crate) fn ice_value(frequency_hz: f64, temp_c: f64) -> ModelValue {
    let mut out_of_range = Vec::new();
    flag_range(
        &mut out_of_range,
        "temp_c",
        temp_c,
        [ice::MODEL_TEMP_MIN_C, ice::MODEL_TEMP_MAX_C],
        "the Maetzler (2006) ice model (above 0 degC ice melts)",
    );
    flag_range(&mut out_of_range, "freq_mhz", frequency_hz / 1e6, [10.0, 300_000.0], "the Maetzler (2006) ice model");
    ModelValue {
        eps: ice::permittivity(frequency_hz, temp_c.min(0.0)),
        model: "Maetzler (2006) pure ice, Thermal Microwave Radiation (IET) pp. 456-461".into(),
        out_of_range,
        notes: Vec::new(),
    }
}

/// Moist porous solid: volume fractions (solid, water, air) and bulk density at `moisture_wb`.
pub(crate) fn moist_fractions(
    dry_bulk_density: f64,
    solid_density: f64,
    moisture_wb: f64,
    temp_c: f64,
) -> (f64, f64, f64, f64) {
    let water_per_dry = moisture_wb / (1.0 - moisture_wb);
    let v_solid = dry_bulk_density / solid_density;
    let v_water = dry_bulk_density * water_per_dry / composition::water_density_kg_per_m3(temp_c.max(0.0));
    let filled = v_solid + v_water;
    let swell = filled.max(1.0);
    let bulk_density = dry_bulk_density * (1.0 + water_per_dry) / swell;
    (v_solid / swell, v_water / swell, (1.0 - filled).max(0.0), bulk_density)
}

/// The numbers of the moist model at one state, before any text is written.
struct MoistParts {
    moisture_wb: f64,
    volume_fractions: (f64, f64, f64),
    salt_fraction: f64,
    saturated: bool,
    eps: Complex,
}

fn moist_parts(
    model: &DielectricModel,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
    conductivity_s_per_m: Option<f64>,
) -> Option<MoistParts> {
    let DielectricModel::Moist {
        solid_eps_real,
        solid_eps_imag,
        solid_density_kg_per_m3,
        dry_bulk_density_kg_per_m3,
        mixing_rule,
        moisture_wb: nominal,
        salt_pct: default_salt,
        ..
    } = model
    else {
        return None;
    };
    let x = moisture_wb.unwrap_or(*nominal);
    let (v_solid, v_water, v_air, _) =
        moist_fractions(*dry_bulk_density_kg_per_m3, *solid_density_kg_per_m3, x, temp_c);
    let salt = salt_pct.unwrap_or(*default_salt) / 100.0;
    let brine_fraction = if x + salt > 0.0 { salt / (x + salt) } else { 0.0 };
    let brine = saline::permittivity(
        frequency_hz,
        temp_c,
        brine_fraction.min(saline::SATURATION_MASS_FRACTION),
        conductivity_s_per_m,
    );
    let solid = Complex::new(*solid_eps_real, -solid_eps_imag);
    let eps = mix(&[(v_solid, solid), (v_water, brine.eps), (v_air, Complex::ONE)], *mixing_rule);
    Some(MoistParts {
        moisture_wb: x,
        volume_fractions: (v_solid, v_water, v_air),
        salt_fraction: salt,
        saturated: brine_fraction > saline::SATURATION_MASS_FRACTION,
        eps,
    })
}

/// The moist model's permittivity alone (see [`moist_value`]).
pub(crate) fn moist_eps(
    model: &DielectricModel,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
    conductivity_s_per_m: Option<f64>,
) -> Option<Complex> {
    moist_parts(model, frequency_hz, temp_c, moisture_wb, salt_pct, conductivity_s_per_m).map(|parts| parts.eps)
}

pub(crate) fn moist_value(
    model: &DielectricModel,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
    conductivity_s_per_m: Option<f64>,
) -> Option<ModelValue> {
    let parts = moist_parts(model, frequency_hz, temp_c, moisture_wb, salt_pct, conductivity_s_per_m)?;
    let DielectricModel::Moist {
        solid_eps_real,
        solid_eps_imag,
        mixing_rule,
        moisture_range_wb,
        temp_range_c,
        freq_range_mhz,
        ..
    } = model
    else {
        return None;
    };
    let mut out_of_range = Vec::new();
    let x = parts.moisture_wb;
    flag_range(&mut out_of_range, "moisture_wb", x, *moisture_range_wb, "this material's moisture model");
    flag_range(&mut out_of_range, "temp_c", temp_c, *temp_range_c, "this material's moisture model");
    flag_range(&mut out_of_range, "freq_mhz", frequency_hz / 1e6, *freq_range_mhz, "this material's moisture model");
    let (v_solid, v_water, v_air) = parts.volume_fractions;
    let mut notes = vec![format!("volume fractions: solid {v_solid:.3}, water {v_water:.3}, air {v_air:.3}")];
    if parts.saturated {
        notes.push("the water is saturated with salt; the excess is taken as undissolved".into());
    }
    Some(ModelValue {
        eps: parts.eps,
        model: format!(
            "moist mixture: solid eps {solid_eps_real} - j{solid_eps_imag}, water by {WATER_MODEL}{}, air; {}",
            if parts.salt_fraction > 0.0 || conductivity_s_per_m.is_some() {
                format!(" with {SALINE_MODEL}")
            } else {
                String::new()
            },
            mixing_rule.citation()
        ),
        out_of_range,
        notes,
    })
}

/// The composition and freezing point of a food at `moisture_wb` (nominal if `None`).
pub(crate) fn food_state(material: &Material, moisture_wb: Option<f64>) -> Option<(Composition, Option<f64>)> {
    let ThermalModel::Composition { composition, initial_freezing_point_c, .. } = &material.thermal else {
        return None;
    };
    match moisture_wb {
        None => Some((*composition, *initial_freezing_point_c)),
        Some(x) => {
            let adjusted = composition.at_moisture(x);
            let tf = initial_freezing_point_c
                .and_then(|tf0| freezing::freezing_point_at_moisture(tf0, composition.water, x));
            Some((adjusted, tf))
        }
    }
}

pub(crate) struct FrozenPhases {
    pub ice: f64,
    pub brine: f64,
    pub fat: f64,
    pub solids: f64,
    pub brine_mass_fraction: f64,
}

/// Volume fractions of the phases of a freezing food, and the brine concentration.
pub(crate) fn frozen_phases(food: &Composition, tf_c: Option<f64>, temp_c: f64, salt_fraction: f64) -> FrozenPhases {
    let ice_mass = tf_c.map_or(0.0, |tf| freezing::ice_mass_fraction(food, tf, temp_c));
    // Bound water loses its mobility as the food freezes, in step with the freezable water:
    // mobile share Tf/T below Tf, all of it at and above Tf (a modelling choice, see module text).
    let immobile = match tf_c {
        Some(tf) if temp_c < tf => freezing::bound_water(food) * (1.0 - tf / temp_c),
        _ => 0.0,
    };
    let liquid = (food.water - ice_mass - immobile).max(0.0);
    // The salt is part of the ash as far as it goes; salt beyond the ash is added mass.
    let ash_rest = (food.ash - salt_fraction).max(0.0);
    let dissolved_capacity = if liquid > 0.0 {
        saline::EUTECTIC_MASS_FRACTION / (1.0 - saline::EUTECTIC_MASS_FRACTION) * liquid
    } else {
        0.0
    };
    let dissolved = salt_fraction.min(dissolved_capacity);
    let undissolved = salt_fraction - dissolved;
    let brine_mass_fraction = if liquid + dissolved > 0.0 { dissolved / (liquid + dissolved) } else { 0.0 };
    let t = temp_c;
    let ice_volume =
        ice_mass / composition::ice_density_kg_per_m3(t) + immobile / composition::water_density_kg_per_m3(t);
    let brine_volume =
        (liquid + dissolved) / (composition::water_density_kg_per_m3(t) * (1.0 + 0.7 * brine_mass_fraction));
    let fat_volume = food.fat / composition::polynomial(composition::FAT_DENSITY, t);
    let solids_volume = food.protein / composition::polynomial(composition::PROTEIN_DENSITY, t)
        + food.carbohydrate / composition::polynomial(composition::CARBOHYDRATE_DENSITY, t)
        + food.fiber / composition::polynomial(composition::FIBER_DENSITY, t)
        + (ash_rest + undissolved) / composition::polynomial(composition::ASH_DENSITY, t);
    let total = ice_volume + brine_volume + fat_volume + solids_volume;
    let total = if total > 0.0 { total } else { 1.0 };
    FrozenPhases {
        ice: ice_volume / total,
        brine: brine_volume / total,
        fat: fat_volume / total,
        solids: solids_volume / total,
        brine_mass_fraction,
    }
}

/// The numbers of the frozen-food model at one state, before any text is written.
struct FrozenParts {
    food: Composition,
    freezing_point_c: Option<f64>,
    phases: FrozenPhases,
    brine_conductivity_s_per_m: f64,
    eps: Complex,
}

fn frozen_parts(
    material: &Material,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
) -> Option<FrozenParts> {
    FrozenCurve::new(material, moisture_wb, salt_pct).map(|curve| curve.parts(frequency_hz, temp_c))
}

/// The frozen-food model at one moisture and salt, for many temperatures: the food's state, its
/// freezing point and the mixing terms of the phases whose permittivity is constant (fat and the
/// solids) are worked out once. Every number is the one a lookup from scratch gives, bit for bit:
/// [`frozen_parts`] goes through this too.
#[derive(Debug, Clone)]
pub(crate) struct FrozenCurve {
    food: Composition,
    freezing_point_c: Option<f64>,
    salt_fraction: f64,
    mixing_rule: MixingRule,
    fat_term: Complex,
    solids_term: Complex,
}

impl FrozenCurve {
    /// `None` unless the material is a frozen-food model with a composition.
    pub(crate) fn new(material: &Material, moisture_wb: Option<f64>, salt_pct: Option<f64>) -> Option<Self> {
        let DielectricModel::Frozen { solids_eps_real, solids_eps_imag, salt_pct: default_salt, mixing_rule, .. } =
            &material.dielectric
        else {
            return None;
        };
        let (food, freezing_point_c) = food_state(material, moisture_wb)?;
        let solids = Complex::new(*solids_eps_real, -solids_eps_imag);
        Some(FrozenCurve {
            food,
            freezing_point_c,
            salt_fraction: salt_pct.unwrap_or(*default_salt) / 100.0,
            mixing_rule: *mixing_rule,
            fat_term: mixing_term(FAT_EPS, *mixing_rule),
            solids_term: mixing_term(solids, *mixing_rule),
        })
    }

    fn parts(&self, frequency_hz: f64, temp_c: f64) -> FrozenParts {
        let phases = frozen_phases(&self.food, self.freezing_point_c, temp_c, self.salt_fraction);
        let brine = saline::permittivity(frequency_hz, temp_c, phases.brine_mass_fraction, None);
        let ice_eps = ice::permittivity(frequency_hz, temp_c.min(0.0));
        let eps = mix_phases(
            &[
                (phases.ice, Phase::Permittivity(ice_eps)),
                (phases.brine, Phase::Permittivity(brine.eps)),
                (phases.fat, Phase::Term(self.fat_term)),
                (phases.solids, Phase::Term(self.solids_term)),
            ],
            self.mixing_rule,
        );
        FrozenParts {
            food: self.food,
            freezing_point_c: self.freezing_point_c,
            phases,
            brine_conductivity_s_per_m: brine.conductivity_s_per_m,
            eps,
        }
    }

    /// The permittivity at `temp_c`, as [`frozen_eps`] gives it.
    pub(crate) fn eps(&self, frequency_hz: f64, temp_c: f64) -> Complex {
        self.parts(frequency_hz, temp_c).eps
    }
}

/// The frozen-food model's permittivity alone (see [`frozen_value`]).
pub(crate) fn frozen_eps(
    material: &Material,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
) -> Option<Complex> {
    frozen_parts(material, frequency_hz, temp_c, moisture_wb, salt_pct).map(|parts| parts.eps)
}

pub(crate) fn frozen_value(
    material: &Material,
    frequency_hz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    salt_pct: Option<f64>,
) -> Option<ModelValue> {
    let FrozenParts { food, freezing_point_c: tf, phases, brine_conductivity_s_per_m, eps } =
        frozen_parts(material, frequency_hz, temp_c, moisture_wb, salt_pct)?;
    let DielectricModel::Frozen {
        solids_eps_real,
        solids_eps_imag,
        mixing_rule,
        temp_range_c,
        freq_range_mhz,
        moisture_range_wb,
        ..
    } = &material.dielectric
    else {
        return None;
    };
    let mut out_of_range = Vec::new();
    flag_range(&mut out_of_range, "temp_c", temp_c, *temp_range_c, "this food's freezing model");
    flag_range(&mut out_of_range, "freq_mhz", frequency_hz / 1e6, *freq_range_mhz, "this food's freezing model");
    flag_range(&mut out_of_range, "moisture_wb", food.water, *moisture_range_wb, "this food's freezing model");
    let frozen = tf.map_or(0.0, |tf| freezing::frozen_fraction_of_water(&food, tf, temp_c));
    let notes = vec![
        format!(
            "volume fractions: ice {:.3}, brine {:.3}, fat {:.3}, other solids {:.3}",
            phases.ice, phases.brine, phases.fat, phases.solids
        ),
        format!(
            "frozen fraction of the water {frozen:.3}; unfrozen brine {:.2} % NaCl-equivalent, conductivity {:.3} S/m",
            100.0 * phases.brine_mass_fraction,
            brine_conductivity_s_per_m
        ),
    ];
    Some(ModelValue {
        eps,
        model: format!(
            "freezing food: ice fraction ASHRAE/Schwartzberg (t_f {}), ice by Maetzler (2006), unfrozen brine by {WATER_MODEL} with {SALINE_MODEL}, fat 2.6 - j0.2, solids {solids_eps_real} - j{solids_eps_imag}; {}",
            tf.map_or("none".to_string(), |t| format!("{t:.2} degC")),
            mixing_rule.citation()
        ),
        out_of_range,
        notes,
    })
}
