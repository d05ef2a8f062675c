//! Interpolation in tabulated permittivities over frequency, moisture and temperature.
//!
//! The points of a table are grouped by frequency; the request is bracketed by the two nearest
//! frequencies and interpolated linearly in ln(f) (dielectric spectra are smooth on a log scale;
//! common practice). Within each frequency the points are grouped by moisture (linear), and within
//! each moisture by temperature (linear). Each point's final weight is the product of its three
//! weights; the weights sum to 1 and are reported with the points.
//! Outside the data on an axis the nearest data value is held (never extrapolated, so eps'' can never
//! turn negative) and the request is flagged: the flag names the axis, the requested value and the
//! range of the data where the flag arose. A flagged result is never silent.

use crate::materials::library::TablePoint;

/// Relative tolerance for two frequencies, temperatures or moistures to count as the same level.
const LEVEL_TOLERANCE: f64 = 1e-9;

/// One table point and the weight it received.
#[derive(Debug, Clone, PartialEq)]
pub struct WeightedPoint {
    /// Index of the point in the table.
    pub index: usize,
    /// Its weight in the result (the weights sum to 1).
    pub weight: f64,
}

/// The result of an interpolation.
#[derive(Debug, Clone, PartialEq)]
pub struct Interpolated {
    /// eps'.
    pub eps_real: f64,
    /// eps''.
    pub eps_imag: f64,
    /// The points used and their weights.
    pub points: Vec<WeightedPoint>,
    /// One message per axis and place where the request was outside the data.
    pub out_of_range: Vec<String>,
}

fn same(a: f64, b: f64) -> bool {
    (a - b).abs() <= LEVEL_TOLERANCE * a.abs().max(b.abs()).max(1.0)
}

/// Distinct sorted values.
fn levels(values: impl Iterator<Item = f64>) -> Vec<f64> {
    let mut sorted: Vec<f64> = values.filter(|v| v.is_finite()).collect();
    sorted.sort_by(f64::total_cmp);
    sorted.dedup_by(|a, b| same(*a, *b));
    sorted
}

/// Bracket `x` among sorted `levels`: one or two (level, weight) pairs, and whether it was outside.
/// With `logarithmic` the weights are linear in ln(x).
fn bracket(levels: &[f64], x: f64, logarithmic: bool) -> (Vec<(f64, f64)>, bool) {
    let (Some(&first), Some(&last)) = (levels.first(), levels.last()) else {
        return (Vec::new(), true);
    };
    if !x.is_finite() {
        return (vec![(first, 1.0)], true);
    }
    if levels.iter().any(|&level| same(level, x)) {
        let level = levels.iter().copied().find(|&level| same(level, x)).unwrap_or(x);
        return (vec![(level, 1.0)], false);
    }
    if x < first {
        return (vec![(first, 1.0)], true);
    }
    if x > last {
        return (vec![(last, 1.0)], true);
    }
    let upper_index = levels.iter().position(|&level| level > x).unwrap_or(0);
    let (low, high) = (levels[upper_index.saturating_sub(1)], levels[upper_index]);
    let map = |v: f64| if logarithmic { v.ln() } else { v };
    let fraction = (map(x) - map(low)) / (map(high) - map(low));
    (vec![(low, 1.0 - fraction), (high, fraction)], false)
}

fn range_note(levels: &[f64]) -> String {
    match (levels.first(), levels.last()) {
        (Some(first), Some(last)) if same(*first, *last) => format!("only {first}"),
        (Some(first), Some(last)) => format!("{first} to {last}"),
        _ => "none".to_string(),
    }
}

/// Where a request fell outside the data, with the levels it was bracketed among (the text is
/// written only by [`interpolate`], so that [`interpolate_eps`] allocates none).
enum Outside<'a> {
    Frequency { levels: &'a [f64] },
    Moisture { requested: f64, freq: f64, levels: &'a [f64] },
    Temperature { freq: f64, moisture: Option<f64>, levels: &'a [f64] },
}

/// Each point's weight at the request; `outside` hears of every axis outside the data.
fn weights(
    points: &[TablePoint],
    freq_mhz: f64,
    temp_c: f64,
    moisture_wb: Option<f64>,
    outside: &mut dyn FnMut(Outside),
) -> Vec<f64> {
    let mut weights = vec![0.0; points.len()];
    let freq_levels = levels(points.iter().map(|p| p.freq_mhz));
    let (freq_bracket, freq_outside) = bracket(&freq_levels, freq_mhz, true);
    if freq_outside {
        outside(Outside::Frequency { levels: &freq_levels });
    }
    for (freq, freq_weight) in freq_bracket {
        let at_freq: Vec<usize> = (0..points.len()).filter(|&i| same(points[i].freq_mhz, freq)).collect();
        let has_moisture = at_freq.iter().any(|&i| points[i].moisture_wb.is_some());
        let moisture_groups: Vec<(Option<f64>, f64)> = if has_moisture {
            let moisture_levels = levels(at_freq.iter().filter_map(|&i| points[i].moisture_wb));
            let requested = moisture_wb.unwrap_or(f64::NAN);
            let (moisture_bracket, is_outside) = bracket(&moisture_levels, requested, false);
            if is_outside {
                outside(Outside::Moisture { requested, freq, levels: &moisture_levels });
            }
            moisture_bracket.into_iter().map(|(m, w)| (Some(m), w)).collect()
        } else {
            vec![(None, 1.0)]
        };
        for (moisture, moisture_weight) in moisture_groups {
            let group: Vec<usize> = at_freq
                .iter()
                .copied()
                .filter(|&i| match (moisture, points[i].moisture_wb) {
                    (Some(m), Some(pm)) => same(m, pm),
                    (None, _) => true,
                    _ => false,
                })
                .collect();
            let temp_levels = levels(group.iter().map(|&i| points[i].temp_c));
            let (temp_bracket, is_outside) = bracket(&temp_levels, temp_c, false);
            if is_outside {
                outside(Outside::Temperature { freq, moisture, levels: &temp_levels });
            }
            for (temp, temp_weight) in temp_bracket {
                // Several points at the same (f, m, T) would be duplicates; they share the weight.
                let matching: Vec<usize> = group.iter().copied().filter(|&i| same(points[i].temp_c, temp)).collect();
                let share = 1.0 / matching.len().max(1) as f64;
                for i in matching {
                    weights[i] += freq_weight * moisture_weight * temp_weight * share;
                }
            }
        }
    }
    weights
}

/// The weighted sums (eps', eps'') over the points that received a weight.
fn weighted_eps(points: &[TablePoint], weights: &[f64]) -> (f64, f64) {
    let mut eps_real = 0.0;
    let mut eps_imag = 0.0;
    for (point, &weight) in points.iter().zip(weights) {
        if weight > 0.0 {
            eps_real += weight * point.eps_real;
            eps_imag += weight * point.eps_imag;
        }
    }
    (eps_real, eps_imag)
}

/// Interpolate `points` at (`freq_mhz`, `temp_c`, `moisture_wb`). `moisture_wb` is used only when
/// the points carry moisture; it must then be given (the caller supplies the nominal value).
pub fn interpolate(points: &[TablePoint], freq_mhz: f64, temp_c: f64, moisture_wb: Option<f64>) -> Interpolated {
    let mut out_of_range = Vec::new();
    let weights = weights(points, freq_mhz, temp_c, moisture_wb, &mut |outside| {
        out_of_range.push(match outside {
            Outside::Frequency { levels } => format!(
                "freq_mhz = {freq_mhz} is outside the data ({} MHz); the nearest frequency's data is used",
                range_note(levels)
            ),
            Outside::Moisture { requested, freq, levels } => format!(
                "moisture_wb = {requested} is outside the data at {freq} MHz ({}); the nearest moisture's data is used",
                range_note(levels)
            ),
            Outside::Temperature { freq, moisture, levels } => {
                let place = match moisture {
                    Some(m) => format!("{freq} MHz, moisture {m}"),
                    None => format!("{freq} MHz"),
                };
                format!(
                    "temp_c = {temp_c} is outside the data at {place} ({} degC); the nearest temperature's data is used",
                    range_note(levels)
                )
            }
        })
    });
    let (eps_real, eps_imag) = weighted_eps(points, &weights);
    let used = weights
        .iter()
        .enumerate()
        .filter(|(_, &weight)| weight > 0.0)
        .map(|(index, &weight)| WeightedPoint { index, weight })
        .collect();
    out_of_range.dedup();
    Interpolated { eps_real, eps_imag, points: used, out_of_range }
}

/// (eps', eps'') as [`interpolate`] gives them, without the points and flags.
pub fn interpolate_eps(points: &[TablePoint], freq_mhz: f64, temp_c: f64, moisture_wb: Option<f64>) -> (f64, f64) {
    weighted_eps(points, &weights(points, freq_mhz, temp_c, moisture_wb, &mut |_| {}))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn point(freq_mhz: f64, temp_c: f64, moisture: Option<f64>, re: f64, im: f64) -> TablePoint {
        TablePoint { freq_mhz, temp_c, moisture_wb: moisture, eps_real: re, eps_imag: im, source: "s".into() }
    }

    fn grid() -> Vec<TablePoint> {
        vec![
            point(915.0, 20.0, None, 60.0, 20.0),
            point(915.0, 60.0, None, 56.0, 28.0),
            point(2450.0, 20.0, None, 58.0, 16.0),
            point(2450.0, 60.0, None, 54.0, 20.0),
        ]
    }

    #[test]
    fn reproduces_every_point_exactly() {
        let table = grid();
        for p in &table {
            let result = interpolate(&table, p.freq_mhz, p.temp_c, None);
            assert_eq!(result.eps_real, p.eps_real);
            assert_eq!(result.eps_imag, p.eps_imag);
            assert_eq!(result.points.len(), 1);
            assert!(result.out_of_range.is_empty());
        }
    }

    #[test]
    fn linear_in_temperature_and_log_frequency() {
        let table = grid();
        let result = interpolate(&table, 915.0, 40.0, None);
        assert_relative_eq!(result.eps_imag, 24.0, max_relative = 1e-12);
        let geometric_mean = (915.0_f64 * 2450.0).sqrt();
        let result = interpolate(&table, geometric_mean, 20.0, None);
        assert_relative_eq!(result.eps_real, 59.0, max_relative = 1e-12);
        let total: f64 = result.points.iter().map(|p| p.weight).sum();
        assert_relative_eq!(total, 1.0, max_relative = 1e-12);
    }

    #[test]
    fn outside_is_flagged_and_held_not_extrapolated() {
        let table = grid();
        let result = interpolate(&table, 915.0, 100.0, None);
        assert_eq!(result.eps_imag, 28.0);
        assert_eq!(result.out_of_range.len(), 1);
        assert!(result.out_of_range[0].starts_with("temp_c = 100"));
        let result = interpolate(&table, 27.12, 20.0, None);
        assert_eq!(result.eps_real, 60.0);
        assert!(result.out_of_range[0].starts_with("freq_mhz = 27.12"));
    }

    #[test]
    fn moisture_axis() {
        let table = vec![point(2450.0, 20.0, Some(0.0), 2.0, 0.1), point(2450.0, 20.0, Some(0.2), 4.0, 1.1)];
        let result = interpolate(&table, 2450.0, 20.0, Some(0.1));
        assert_relative_eq!(result.eps_real, 3.0, max_relative = 1e-12);
        assert_relative_eq!(result.eps_imag, 0.6, max_relative = 1e-12);
        let result = interpolate(&table, 2450.0, 20.0, Some(0.5));
        assert_eq!(result.eps_real, 4.0);
        assert!(result.out_of_range[0].starts_with("moisture_wb = 0.5"));
    }
}
