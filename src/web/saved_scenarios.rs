//! The scenarios saved in this browser: save, open, rename, duplicate, delete, and the stored
//! texts that could not be read, kept aside with the reason and downloadable whole.

use crate::download::{download, file_stem};
use crate::form::FormValues;
use crate::state::AppState;
use crate::storage::{new_id, now_iso, Shelf};
use crate::storage_records::{
    classify, date_shown, saved_text, scenario_key, set_aside, set_aside_key, set_aside_text, unused_name,
    SavedScenario, SetAside, Stored,
};
use leptos::prelude::*;

/// What storage held when the page opened: the saved scenarios (newest change first), the
/// set-aside texts, and what happened on the way (migrations, texts set aside, failed writes).
fn load(shelf: Shelf) -> (Vec<SavedScenario>, Vec<SetAside>, Vec<String>) {
    let now = now_iso();
    let (mut saved, mut aside, mut messages) = (Vec::new(), Vec::new(), Vec::new());
    for (key, text) in shelf.read_all() {
        match classify(&key, &text, &now) {
            Stored::Saved(record) => saved.push(record),
            Stored::Migrated(record) => {
                match shelf.write(&key, &saved_text(&record)) {
                    Ok(()) => messages.push(format!("\u{201c}{}\u{201d} was saved by an older version and has been brought up to date.", record.name)),
                    Err(why) => messages.push(format!("\u{201c}{}\u{201d} was saved by an older version; it could not be rewritten ({why}), so it is read as it is.", record.name)),
                }
                saved.push(record);
            }
            Stored::SetAside(reason) => {
                let record = set_aside(&new_id(), &key, &text, &reason, &now);
                // The original is removed only once its copy is stored: nothing is ever dropped.
                if shelf.write(&set_aside_key(&record.id), &set_aside_text(&record)).is_ok() {
                    let _ = shelf.remove(&key);
                }
                messages.push(format!("A stored record ({key}) was set aside: {reason}"));
                aside.push(record);
            }
            Stored::Quarantined(record) => aside.push(record),
            Stored::Foreign => {}
        }
    }
    saved.sort_by(|a, b| b.changed.cmp(&a.changed));
    (saved, aside, messages)
}

/// The saved scenarios panel.
#[component]
pub fn SavedScenarios(state: AppState) -> impl IntoView {
    let (shelf, shelf_notice) = Shelf::open();
    let (saved_at_open, aside_at_open, messages) = load(shelf);
    let saved = RwSignal::new(saved_at_open);
    let aside = RwSignal::new(aside_at_open);
    let message = RwSignal::new((!messages.is_empty()).then(|| messages.join(" ")));
    let current = RwSignal::new(None::<String>);
    let name = RwSignal::new(String::new());

    // Store one record; a refusal keeps it in memory and says so.
    let store = move |record: &SavedScenario, done: String| {
        message.set(Some(match shelf.write(&scenario_key(&record.id), &saved_text(record)) {
            Ok(()) => done,
            Err(why) => format!("{done} It is not stored ({why}): it stays in this page until it closes. Export it as a file to keep it."),
        }));
    };
    let save_new = move |_| {
        let Ok(scenario) = state.scenario.get_untracked() else {
            message.set(Some("The form holds problems: fix them before saving.".to_string()));
            return;
        };
        let typed = name.get_untracked().trim().to_string();
        let wanted = if typed.is_empty() { scenario.name.trim().to_string() } else { typed };
        let wanted = if wanted.is_empty() { "Untitled scenario".to_string() } else { wanted };
        let now = now_iso();
        let record = SavedScenario {
            id: new_id(),
            name: saved.with_untracked(|list| unused_name(&wanted, list)),
            created: now.clone(),
            changed: now,
            scenario: (*scenario).clone(),
        };
        store(&record, format!("Saved \u{201c}{}\u{201d}.", record.name));
        current.set(Some(record.id.clone()));
        name.set(record.name.clone());
        saved.update(|list| list.insert(0, record));
    };
    let save_changes = move |_| {
        let Some(id) = current.get_untracked() else { return };
        let Ok(scenario) = state.scenario.get_untracked() else {
            message.set(Some("The form holds problems: fix them before saving.".to_string()));
            return;
        };
        let mut changed = None;
        saved.update(|list| {
            if let Some(record) = list.iter_mut().find(|r| r.id == id) {
                record.scenario = (*scenario).clone();
                record.changed = now_iso();
                changed = Some(record.clone());
            }
        });
        if let Some(record) = changed {
            store(&record, format!("Saved the changes to \u{201c}{}\u{201d}.", record.name));
        }
    };
    let open = move |id: String| {
        if let Some(record) = saved.with_untracked(|list| list.iter().find(|r| r.id == id).cloned()) {
            state.form.load(&FormValues::from_scenario(&record.scenario));
            current.set(Some(id));
            name.set(record.name.clone());
            message.set(Some(format!("Opened \u{201c}{}\u{201d}.", record.name)));
        }
    };
    let rename = move |id: String| {
        let wanted = name.get_untracked().trim().to_string();
        if wanted.is_empty() {
            message.set(Some("Type the new name in the name box first.".to_string()));
            return;
        }
        let mut renamed = None;
        saved.update(|list| {
            let others: Vec<SavedScenario> = list.iter().filter(|r| r.id != id).cloned().collect();
            if let Some(record) = list.iter_mut().find(|r| r.id == id) {
                record.name = unused_name(&wanted, &others);
                record.changed = now_iso();
                renamed = Some(record.clone());
            }
        });
        if let Some(record) = renamed {
            store(&record, format!("Renamed to \u{201c}{}\u{201d}.", record.name));
        }
    };
    let duplicate = move |id: String| {
        let Some(original) = saved.with_untracked(|list| list.iter().find(|r| r.id == id).cloned()) else { return };
        let now = now_iso();
        let record = SavedScenario {
            id: new_id(),
            name: saved.with_untracked(|list| unused_name(&original.name, list)),
            created: now.clone(),
            changed: now,
            scenario: original.scenario,
        };
        store(&record, format!("Duplicated as \u{201c}{}\u{201d}.", record.name));
        saved.update(|list| list.insert(0, record));
    };
    let delete = move |id: String| {
        let Some(record) = saved.with_untracked(|list| list.iter().find(|r| r.id == id).cloned()) else { return };
        message.set(Some(match shelf.remove(&scenario_key(&id)) {
            Ok(()) => format!("Deleted \u{201c}{}\u{201d}.", record.name),
            Err(why) => format!("\u{201c}{}\u{201d} could not be deleted from storage ({why}).", record.name),
        }));
        saved.update(|list| list.retain(|r| r.id != id));
        if current.get_untracked().as_deref() == Some(id.as_str()) {
            current.set(None);
        }
    };
    let download_aside = move |id: String| {
        if let Some(record) = aside.with_untracked(|list| list.iter().find(|r| r.id == id).cloned()) {
            if let Err(why) = download(&format!("set-aside-{}.txt", file_stem(&record.id)), "text/plain", &record.text)
            {
                message.set(Some(why));
            }
        }
    };
    let delete_aside = move |id: String| {
        let _ = shelf.remove(&set_aside_key(&id));
        aside.update(|list| list.retain(|r| r.id != id));
        message.set(Some("Deleted the set-aside text.".to_string()));
    };

    let rows = move || {
        saved
            .get()
            .into_iter()
            .map(|record| {
                let is_current = current.with(|c| c.as_deref() == Some(record.id.as_str()));
                let (id1, id2, id3, id4) = (record.id.clone(), record.id.clone(), record.id.clone(), record.id.clone());
                view! {
                    <li class="saved-scenarios-item" class:saved-scenarios-current=is_current data-testid="saved-item" data-id=record.id.clone()>
                        <span class="saved-scenarios-name" data-testid="saved-name">{record.name.clone()}</span>
                        <span class="saved-scenarios-dates">
                            {format!("created {} \u{b7} changed {}", date_shown(&record.created), date_shown(&record.changed))}
                        </span>
                        <span class="saved-scenarios-actions">
                            <button type="button" data-testid="saved-open" on:click=move |_| open(id1.clone())>"Open"</button>
                            <button type="button" data-testid="saved-rename" on:click=move |_| rename(id2.clone())>"Rename"</button>
                            <button type="button" data-testid="saved-duplicate" on:click=move |_| duplicate(id3.clone())>"Duplicate"</button>
                            <button type="button" data-testid="saved-delete" on:click=move |_| delete(id4.clone())>"Delete"</button>
                        </span>
                    </li>
                }
            })
            .collect_view()
    };
    let aside_rows = move || {
        aside
            .get()
            .into_iter()
            .map(|record| {
                let (id1, id2) = (record.id.clone(), record.id.clone());
                view! {
                    <li class="saved-scenarios-item saved-scenarios-aside" data-testid="aside-item">
                        <span class="saved-scenarios-name">{record.key.clone()}</span>
                        <span class="saved-scenarios-dates" data-testid="aside-reason">
                            {format!("{} (set aside {})", record.reason, date_shown(&record.set_aside))}
                        </span>
                        <span class="saved-scenarios-actions">
                            <button type="button" data-testid="aside-download" on:click=move |_| download_aside(id1.clone())>
                                "Download the text"
                            </button>
                            <button type="button" data-testid="aside-delete" on:click=move |_| delete_aside(id2.clone())>
                                "Delete"
                            </button>
                        </span>
                    </li>
                }
            })
            .collect_view()
    };
    view! {
        <details class="saved-scenarios scenario-editor-section" open>
            <summary class="scenario-editor-legend">"Saved in this browser"</summary>
            {shelf_notice.map(|text| view! { <p class="saved-scenarios-notice" role="alert" data-testid="storage-notice">{text}</p> })}
            <label class="text-field-label" for="saved-scenarios-name">
                "Name"
            </label>
            <input
                id="saved-scenarios-name"
                class="text-field-input"
                type="text"
                data-testid="saved-name-input"
                prop:value=move || name.get()
                on:input=move |event| name.set(event_target_value(&event))
            />
            <div class="saved-scenarios-buttons">
                <button type="button" data-testid="save-new" on:click=save_new>"Save as new"</button>
                <button type="button" data-testid="save-changes" disabled=move || current.with(Option::is_none) on:click=save_changes>
                    "Save changes"
                </button>
            </div>
            <p class="saved-scenarios-message" role="status" data-testid="saved-message">{move || message.get()}</p>
            <ul class="saved-scenarios-list" data-testid="saved-list">{rows}</ul>
            <Show when=move || aside.with(|list| !list.is_empty())>
                <h3 class="saved-scenarios-subtitle">"Set aside: stored texts this version cannot open"</h3>
                <ul class="saved-scenarios-list" data-testid="aside-list">{aside_rows}</ul>
            </Show>
        </details>
    }
}
