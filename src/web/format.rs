//! Numbers for people: significant figures, a real minus sign, thousands set apart, units after a
//! no-break space. Plain `format!` underneath, so the wasm carries no formatting library.

use crate::fields::group_thousands;

/// No-break space between a number and its unit.
pub const NBSP: char = '\u{a0}';

/// `value` to `digits` significant figures (all integer digits are kept: 12 346, not 12 300),
/// with "−" for negatives and an em dash for a value that is not a finite number.
pub fn sig(value: f64, digits: u32) -> String {
    if !value.is_finite() {
        return "\u{2014}".to_string();
    }
    if value == 0.0 {
        return "0".to_string();
    }
    let digits = digits.max(1) as i32;
    let magnitude = value.abs().log10().floor() as i32;
    let mut decimals = (digits - 1 - magnitude).max(0) as usize;
    // Rounding can carry into a new digit (9.996 -> 10.00): drop the extra decimal.
    let rounded = format!("{:.*}", decimals, value.abs());
    let integer_digits = rounded.split('.').next().map_or(0, str::len) as i32;
    if decimals > 0 && integer_digits > magnitude.max(0) + 1 {
        decimals -= 1;
    }
    fixed(value, decimals)
}

/// `value` with exactly `decimals` decimals, "−" for a negative that does not round to zero, and
/// thousands set apart above four integer digits (chart ticks use it as it is).
pub fn fixed(value: f64, decimals: usize) -> String {
    let text = format!("{:.*}", decimals, value.abs());
    let rounds_to_zero = text.chars().all(|c| c == '0' || c == '.');
    let sign = if value < 0.0 && !rounds_to_zero { "\u{2212}" } else { "" };
    let (integer, fraction) = text.split_once('.').map_or((text.as_str(), ""), |(i, f)| (i, f));
    let integer = if integer.len() > 4 { group_thousands(integer) } else { integer.to_string() };
    if fraction.is_empty() {
        format!("{sign}{integer}")
    } else {
        format!("{sign}{integer}.{fraction}")
    }
}

/// `value` to `digits` significant figures with its unit: `12.3 kW`.
pub fn qty(value: f64, digits: u32, unit: &str) -> String {
    format!("{}{NBSP}{unit}", sig(value, digits))
}

/// A fraction as a percentage to `digits` significant figures: `0.853` -> `85.3 %`.
pub fn percent(fraction: f64, digits: u32) -> String {
    qty(fraction * 100.0, digits, "%")
}

/// A signed change: `+12.3 kW`, `−4 kW`, `0 kW`.
pub fn signed_qty(value: f64, digits: u32, unit: &str) -> String {
    let text = qty(value, digits, unit);
    if value > 0.0 && !text.starts_with('0') {
        format!("+{text}")
    } else {
        text
    }
}

/// A length in metres shown in mm below 1 m and in m from there: `38.7 mm`, `2.50 m`.
pub fn length(value_m: f64) -> String {
    if value_m.abs() < 1.0 {
        qty(value_m * 1000.0, 3, "mm")
    } else {
        qty(value_m, 3, "m")
    }
}

/// A duration in seconds with minutes or hours beside it from a minute up: `300 s (5.00 min)`.
pub fn duration(seconds: f64) -> String {
    if seconds >= 7200.0 {
        format!("{} ({})", qty(seconds, 3, "s"), qty(seconds / 3600.0, 3, "h"))
    } else if seconds >= 60.0 {
        format!("{} ({})", qty(seconds, 3, "s"), qty(seconds / 60.0, 3, "min"))
    } else {
        qty(seconds, 3, "s")
    }
}

/// The full-precision text of a number for `data-value` attributes (tests read them).
pub fn exact(value: f64) -> String {
    format!("{value}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn significant_figures() {
        assert_eq!(sig(12.345, 3), "12.3");
        assert_eq!(sig(0.0012345, 3), "0.00123");
        assert_eq!(sig(2.5, 3), "2.50");
        assert_eq!(sig(9.996, 3), "10.0");
        assert_eq!(sig(999.6, 3), "1000");
        assert_eq!(sig(12345.6, 3), "12\u{202f}346");
        assert_eq!(sig(4000.0, 3), "4000");
        assert_eq!(sig(0.0, 3), "0");
    }

    #[test]
    fn signs_and_non_numbers() {
        assert_eq!(sig(-18.0, 3), "\u{2212}18.0");
        assert_eq!(sig(-0.0001, 2), "\u{2212}0.00010");
        assert_eq!(sig(-0.00001, 1), "\u{2212}0.00001");
        assert_eq!(sig(f64::NAN, 3), "\u{2014}");
        assert_eq!(sig(f64::INFINITY, 3), "\u{2014}");
        assert_eq!(signed_qty(4.26, 2, "kW"), "+4.3\u{a0}kW");
        assert_eq!(signed_qty(-4.26, 2, "kW"), "\u{2212}4.3\u{a0}kW");
    }

    #[test]
    fn units_follow_magnitude() {
        assert_eq!(length(0.0387), "38.7\u{a0}mm");
        assert_eq!(length(2.5), "2.50\u{a0}m");
        assert_eq!(duration(300.0), "300\u{a0}s (5.00\u{a0}min)");
        assert_eq!(duration(30.0), "30.0\u{a0}s");
        assert_eq!(duration(10800.0), "10\u{202f}800\u{a0}s (3.00\u{a0}h)");
        assert_eq!(percent(0.853, 3), "85.3\u{a0}%");
    }
}
