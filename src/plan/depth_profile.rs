//! Power density through the bed's depth: the product, its tray, the belt, an air gap and what
//! lies below, solved as a layered stack at normal incidence (physics::layers).
//!
//! The bed is taken as one homogeneous slab with the product's permittivity at a given state; a
//! granular bed's lower effective permittivity is not modelled (the library's data are for the
//! product as measured). The feed follows the scenario: from above, or both sides with half the
//! power from each (the layers module's incoherent two-sided model).

use crate::error::InputError;
use crate::physics::layers::{
    product_optics_with, solve_stack, Backing, Feed, Layer, ProductOptics, SolveBuffers, StackSolution,
};
use crate::physics::permittivity::ComplexPermittivity;
use crate::scenario::{BackingSpec, FeedSides, Scenario};

/// Depth samples per layer in a plan's profile: enough for a smooth plot and a data table.
pub const SAMPLES_PER_LAYER: usize = 41;

/// The layers below the product, top down, from the scenario's load stack.
fn support_layers(scenario: &Scenario) -> (Vec<Layer>, Backing) {
    let mut layers = Vec::new();
    let Some(stack) = &scenario.tunnel.load_stack else {
        return (layers, Backing::Air);
    };
    for (name, slab) in [("tray", &stack.tray), ("belt", &stack.belt)] {
        if let Some(slab) = slab {
            layers.push(Layer {
                name: name.to_string(),
                thickness_m: slab.thickness_m,
                permittivity: ComplexPermittivity::new(slab.eps_real, slab.eps_imag),
                is_product: false,
            });
        }
    }
    if stack.air_gap_m > 0.0 {
        layers.push(Layer {
            name: "air gap".into(),
            thickness_m: stack.air_gap_m,
            permittivity: ComplexPermittivity::VACUUM,
            is_product: false,
        });
    }
    let backing = match stack.backing {
        BackingSpec::Air => Backing::Air,
        BackingSpec::Metal => Backing::Metal,
    };
    (layers, backing)
}

/// The whole stack with the product on top, its backing and how it is fed.
fn stack(scenario: &Scenario, product_eps: ComplexPermittivity) -> (Vec<Layer>, Backing, Feed) {
    let (below, backing) = support_layers(scenario);
    let mut layers = vec![Layer {
        name: "product".into(),
        thickness_m: scenario.tunnel.bed_depth_m,
        permittivity: product_eps,
        is_product: true,
    }];
    layers.extend(below);
    let feed = match scenario.tunnel.feed {
        FeedSides::Top => Feed::Top,
        FeedSides::Both => Feed::BothSides,
    };
    (layers, backing, feed)
}

/// Solve the bed with the product at permittivity `product_eps`.
pub fn depth_profile(
    scenario: &Scenario,
    frequency_hz: f64,
    product_eps: ComplexPermittivity,
) -> Result<StackSolution, InputError> {
    let (layers, backing, feed) = stack(scenario, product_eps);
    solve_stack(frequency_hz, &layers, backing, feed, SAMPLES_PER_LAYER)
        .map_err(|error| error.within("tunnel.load_stack"))
}

/// The bed as a zone march solves it, zone after zone: the stack is built once from the scenario
/// and only the product's permittivity changes between solves.
pub struct Bed {
    /// Product first, then what lies below it.
    layers: Vec<Layer>,
    backing: Backing,
    feed: Feed,
    /// The solver's vectors, kept from one zone's solve to the next.
    buffers: SolveBuffers,
}

impl Bed {
    /// The scenario's bed (its product's permittivity is set by each solve).
    pub fn new(scenario: &Scenario) -> Self {
        let (layers, backing, feed) = stack(scenario, ComplexPermittivity::VACUUM);
        Bed { layers, backing, feed, buffers: SolveBuffers::default() }
    }

    /// The product's absorptance and peak power density at permittivity `product_eps`, with the
    /// same sampling as [`depth_profile`].
    pub fn optics(&mut self, frequency_hz: f64, product_eps: ComplexPermittivity) -> Result<ProductOptics, InputError> {
        if let Some(product) = self.layers.first_mut() {
            product.permittivity = product_eps;
        }
        product_optics_with(frequency_hz, &self.layers, self.backing, self.feed, SAMPLES_PER_LAYER, &mut self.buffers)
            .map_err(|error| error.within("tunnel.load_stack"))
    }
}
