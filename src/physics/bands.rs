//! Frequency bands designated for industrial, scientific and medical (ISM) use, as the ITU Radio
//! Regulations (RR) name them: by frequency range and centre frequency, in footnotes 5.138 and 5.150.
//!
//! Ranges from RR 5.150 and 5.138 as quoted in shared/sources.md section 6.1. The 896 MHz band is
//! a national industrial allocation (894-898 MHz in the UK, from memory), not an ITU ISM band.

use serde::Serialize;

/// Which part of the spectrum a band heats in: RF (capacitive applicators) or microwave (cavities).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum HeatingKind {
    /// Radio frequency, below about 300 MHz: electrode (capacitor) applicators.
    Rf,
    /// Microwave: waveguide-fed cavities and tunnels.
    Microwave,
}

/// One band.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct IsmBand {
    /// Name as the RR writes it: the centre frequency ("13 560 kHz").
    pub name: &'static str,
    /// Centre frequency, MHz.
    pub centre_mhz: f64,
    /// Lower edge, MHz.
    pub low_mhz: f64,
    /// Upper edge, MHz.
    pub high_mhz: f64,
    /// Where the designation is made ("RR 5.150").
    pub designation: &'static str,
    /// Where it applies.
    pub regions: &'static str,
    /// RF or microwave.
    pub heating_kind: HeatingKind,
}

/// Every band Doubleprime knows, lowest first.
pub const ISM_BANDS: &[IsmBand] = &[
    IsmBand {
        name: "6 780 kHz",
        centre_mhz: 6.78,
        low_mhz: 6.765,
        high_mhz: 6.795,
        designation: "RR 5.138 (subject to special authorization)",
        regions: "all Regions",
        heating_kind: HeatingKind::Rf,
    },
    IsmBand {
        name: "13 560 kHz",
        centre_mhz: 13.56,
        low_mhz: 13.553,
        high_mhz: 13.567,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Rf,
    },
    IsmBand {
        name: "27 120 kHz",
        centre_mhz: 27.12,
        low_mhz: 26.957,
        high_mhz: 27.283,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Rf,
    },
    IsmBand {
        name: "40.68 MHz",
        centre_mhz: 40.68,
        low_mhz: 40.66,
        high_mhz: 40.70,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Rf,
    },
    IsmBand {
        name: "433.92 MHz",
        centre_mhz: 433.92,
        low_mhz: 433.05,
        high_mhz: 434.79,
        designation: "RR 5.138 (subject to special authorization)",
        regions: "Region 1, with exceptions",
        heating_kind: HeatingKind::Microwave,
    },
    IsmBand {
        name: "896 MHz",
        centre_mhz: 896.0,
        low_mhz: 894.0,
        high_mhz: 898.0,
        designation: "national industrial heating allocation, not an RR ISM band (from memory)",
        regions: "United Kingdom and some European countries",
        heating_kind: HeatingKind::Microwave,
    },
    IsmBand {
        name: "915 MHz",
        centre_mhz: 915.0,
        low_mhz: 902.0,
        high_mhz: 928.0,
        designation: "RR 5.150",
        regions: "Region 2 (the Americas)",
        heating_kind: HeatingKind::Microwave,
    },
    IsmBand {
        name: "2 450 MHz",
        centre_mhz: 2450.0,
        low_mhz: 2400.0,
        high_mhz: 2500.0,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Microwave,
    },
    IsmBand {
        name: "5 800 MHz",
        centre_mhz: 5800.0,
        low_mhz: 5725.0,
        high_mhz: 5875.0,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Microwave,
    },
    IsmBand {
        name: "24.125 GHz",
        centre_mhz: 24125.0,
        low_mhz: 24000.0,
        high_mhz: 24250.0,
        designation: "RR 5.150",
        regions: "all Regions",
        heating_kind: HeatingKind::Microwave,
    },
];

/// The band containing `freq_mhz`, if any (edges included).
pub fn band_containing(freq_mhz: f64) -> Option<&'static IsmBand> {
    ISM_BANDS.iter().find(|band| freq_mhz >= band.low_mhz && freq_mhz <= band.high_mhz)
}

/// The band nearest to `freq_mhz` by centre frequency on a log scale (for suggestions).
pub fn nearest_band(freq_mhz: f64) -> &'static IsmBand {
    let distance = |band: &IsmBand| (freq_mhz.max(1e-9) / band.centre_mhz).ln().abs();
    let mut best = &ISM_BANDS[0];
    for band in ISM_BANDS {
        if distance(band) < distance(best) {
            best = band;
        }
    }
    best
}

/// A warning text when `freq_mhz` lies outside every band, naming the nearest band.
pub fn out_of_band_warning(freq_mhz: f64) -> Option<String> {
    if band_containing(freq_mhz).is_some() {
        return None;
    }
    let nearest = nearest_band(freq_mhz);
    Some(format!(
        "{freq_mhz} MHz lies outside every ISM band: a heating generator there needs a radio licence and full shielding. The nearest band is {} ({} to {} MHz, {}).",
        nearest.name, nearest.low_mhz, nearest.high_mhz, nearest.designation
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn centres_lie_inside_their_ranges_and_bands_do_not_overlap() {
        for pair in ISM_BANDS.windows(2) {
            assert!(pair[0].high_mhz < pair[1].low_mhz, "{} overlaps {}", pair[0].name, pair[1].name);
        }
        for band in ISM_BANDS {
            assert!(band.low_mhz < band.centre_mhz && band.centre_mhz < band.high_mhz, "{}", band.name);
        }
    }

    #[test]
    fn rr_5_150_ranges() {
        // RR 5.150 as quoted in shared/sources.md 6.1: 26 957-27 283 kHz; 902-928 MHz; 2 400-2 500 MHz.
        assert_eq!(band_containing(27.12).map(|b| b.name), Some("27 120 kHz"));
        assert_eq!(band_containing(26.957).map(|b| b.name), Some("27 120 kHz"));
        assert_eq!(band_containing(928.0).map(|b| b.name), Some("915 MHz"));
        assert_eq!(band_containing(2450.0).map(|b| b.name), Some("2 450 MHz"));
        assert!(band_containing(1000.0).is_none());
    }

    #[test]
    fn warning_names_the_nearest_band() {
        assert!(out_of_band_warning(915.0).is_none());
        let text = out_of_band_warning(2600.0).unwrap();
        assert!(text.contains("2 450 MHz"), "{text}");
    }
}
