//! The line under the page title that follows every edit: the plan's headline numbers, or why
//! the plan on screen is out of date. A polite live region, so screen readers hear it change.

use crate::format::qty;
use crate::state::AppState;
use leptos::prelude::*;

/// Headline of the plan, or the stale notice.
#[component]
pub fn PlanStatus(state: AppState) -> impl IntoView {
    let text = move || {
        let problems = state.problems.with(Vec::len);
        let headline = state.shown.with(|shown| {
            shown.as_ref().map(|shown| {
                let plan = &shown.plan;
                format!(
                    "{} \u{d7} {} generators \u{b7} {} from the mains \u{b7} {} heated length",
                    plan.generator_count,
                    qty(plan.generator_rating_kw, 3, "kW"),
                    qty(plan.mains_power_kw, 3, "kW"),
                    qty(plan.tunnel_length_m, 3, "m"),
                )
            })
        });
        match (problems, headline) {
            (0, Some(headline)) => headline,
            (0, None) => "No plan yet.".to_string(),
            (count, Some(_)) => format!(
                "Out of date: {count} problem{} in the scenario. The plan shown is the last valid one.",
                if count == 1 { "" } else { "s" }
            ),
            (count, None) => format!("No plan: {count} problem{} in the scenario.", if count == 1 { "" } else { "s" }),
        }
    };
    view! {
        <p class="plan-status" class:plan-status-stale=move || state.is_stale() role="status" data-testid="plan-status">
            {text}
        </p>
    }
}
