//! The scenario form: product, process, throughput and temperatures, moisture, band and
//! generator, efficiency chain, tunnel, carrier, losses, site and tariff, project fields.
//! The sections are data: a title and the fields it holds, each drawn by the same `FormField`.

use crate::demo_picker::DemoPicker;
use crate::error_summary::ErrorSummary;
use crate::fields::Key;
use crate::form_field::form_fields;
use crate::product_picker::ProductPicker;
use crate::saved_scenarios::SavedScenarios;
use crate::scenario_file::ScenarioFile;
use crate::scenario_transfer::ScenarioTransfer;
use crate::state::AppState;
use leptos::prelude::*;

/// One section of the form.
struct Section {
    /// Element id (the section links and the tests use it).
    id: &'static str,
    /// Heading.
    title: &'static str,
    /// A line under the heading ("" for none).
    note: &'static str,
    /// The fields, in order.
    keys: &'static [Key],
    /// Shut when the page opens.
    folded: bool,
}

use Key as K;

const SECTIONS: [Section; 9] = [
    Section {
        id: "process",
        title: "Process and throughput",
        note: "",
        keys: &[K::Process, K::Throughput, K::InletTemp, K::OutletTemp],
        folded: false,
    },
    Section {
        id: "moisture",
        title: "Moisture and evaporation",
        note: "",
        keys: &[K::InletMoisture, K::OutletMoisture, K::Pressure, K::EvaporationTemp],
        folded: false,
    },
    Section {
        id: "band",
        title: "Band and generators",
        note: "",
        keys: &[K::Frequency, K::Redundancy, K::GeneratorClass],
        folded: false,
    },
    Section {
        id: "efficiency",
        title: "Efficiency chain",
        note: "Mains \u{2192} supply \u{2192} generator \u{2192} waveguide or feeder \u{2192} applicator \u{2192} product.",
        keys: &[K::EffPowerSupply, K::EffGenerator, K::EffTransmission, K::EffApplicator],
        folded: false,
    },
    Section {
        id: "tunnel",
        title: "Tunnel",
        note: "",
        keys: &[
            K::BeltWidth,
            K::BedDepth,
            K::BulkDensity,
            K::Zones,
            K::ResidenceRule,
            K::TunnelLength,
            K::ResidenceTime,
            K::HeatingRate,
            K::Feed,
        ],
        folded: false,
    },
    Section {
        id: "carrier",
        title: "Carrier under the product",
        note: "For the depth profile: a tray base, the belt, an air gap and what lies below. A blank thickness leaves the layer out.",
        keys: &[
            K::TrayThickness,
            K::TrayEpsReal,
            K::TrayEpsImag,
            K::CarrierBeltThickness,
            K::CarrierBeltEpsReal,
            K::CarrierBeltEpsImag,
            K::AirGap,
            K::Backing,
        ],
        folded: true,
    },
    Section {
        id: "losses",
        title: "Loss allowances",
        note: "",
        keys: &[K::SurfaceLoss, K::BeltLoss, K::VapourLoss],
        folded: false,
    },
    Section {
        id: "site",
        title: "Site and tariff",
        note: "",
        keys: &[K::Tariff, K::Currency, K::OperatingHours, K::PowerFactor, K::CoolingRise, K::AuxiliaryPower],
        folded: false,
    },
    Section {
        id: "project",
        title: "Project",
        note: "Free text for the quote; the plan echoes it.",
        keys: &[K::Name, K::Description, K::Customer, K::Site, K::Author, K::Date, K::Reference, K::Notes],
        folded: true,
    },
];

/// The form.
#[component]
pub fn ScenarioEditor(
    /// The page state.
    state: AppState,
    /// The demo the page opened with.
    opened: &'static str,
) -> impl IntoView {
    let sections = SECTIONS
        .iter()
        .map(|section| {
            let legend_id = format!("{}-legend", section.id);
            view! {
                <details class="scenario-editor-section" id=section.id open=!section.folded>
                    <summary class="scenario-editor-legend" id=legend_id.clone()>
                        {section.title}
                    </summary>
                    <fieldset class="scenario-editor-fieldset" aria-labelledby=legend_id>
                        <p class="scenario-editor-note" hidden=section.note.is_empty()>
                            {section.note}
                        </p>
                        <div class="scenario-editor-grid">{form_fields(state, section.keys)}</div>
                    </fieldset>
                </details>
            }
        })
        .collect_view();
    view! {
        <form class="scenario-editor" aria-labelledby="scenario-editor-title" novalidate on:submit=|event| event.prevent_default()>
            <h2 class="scenario-editor-title" id="scenario-editor-title">
                "Scenario"
            </h2>
            <DemoPicker state=state opened=opened />
            <SavedScenarios state=state />
            <ScenarioTransfer state=state />
            <ErrorSummary state=state />
            <ProductPicker state=state />
            {sections}
            <ScenarioFile state=state />
        </form>
    }
}
