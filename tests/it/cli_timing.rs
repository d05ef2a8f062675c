//! `doubleprime timing`: the native side of the browser timing harness. Only the report's shape
//! and sanity are checked here; what the times are is reported, never asserted.

use crate::support::{number, run_json, run_refused};

#[test]
fn the_report_names_every_workload_with_finite_times() {
    let report = run_json(&["timing", "--budget-ms", "1"]);
    assert_eq!(report["runtime"], "native");
    assert_eq!(number(&report, "budget_ms_per_workload"), 1.0);
    let keys: Vec<&str> = report["workloads"].as_array().unwrap().iter().map(|w| w["key"].as_str().unwrap()).collect();
    assert_eq!(keys, doubleprime::timing::workload_keys());
    for workload in report["workloads"].as_array().unwrap() {
        let median = number(workload, "median_ms");
        assert!(median > 0.0 && median.is_finite(), "{workload}");
        assert!(number(workload, "min_ms") <= median, "{workload}");
        assert!(number(workload, "iterations") >= 5.0, "{workload}");
    }
}

#[test]
fn a_budget_out_of_range_is_refused_by_name() {
    assert_eq!(
        run_refused(&["timing", "--budget-ms", "0"]),
        "doubleprime: --budget-ms = 0 is not accepted: valid is 1 to 600000"
    );
    assert!(run_refused(&["timing", "extra"]).contains("unexpected argument `extra`"));
}
