//! The audit's thresholds: their names, defaults, sources and valid
//! ranges. A figure spec sets them in its `[audit]` table and `hueproof
//! check` by `--threshold NAME=VALUE`; both go through [`Thresholds::set`],
//! so the names and the checks are the same everywhere.

/// The thresholds of the audit.
#[derive(Debug, Clone, PartialEq)]
pub struct Thresholds {
    /// Probability level of Stone et al. (2014) for classes that touch on
    /// the figure (0.8: "reliably told apart", the model's conservative
    /// level).
    pub p_touching: f64,
    /// Probability level for classes that meet only through the legend
    /// (0.5: noticed by half the observers).
    pub p_apart: f64,
    /// Non-text contrast a mark's boundary needs against the background
    /// (3:1, WCAG 2.x SC 1.4.11).
    pub boundary_contrast: f64,
    /// Text contrast (4.5:1, WCAG 2.x SC 1.4.3).
    pub text_contrast: f64,
    /// Large text contrast (3:1, WCAG 2.x SC 1.4.3; large: at least 18 pt,
    /// or 14 pt bold).
    pub large_text_contrast: f64,
    /// Glare: how far (CIELAB L*) a class's lightness difference to the
    /// background may exceed the others' median (hueproof's own choice).
    pub glare_lightness: f64,
    /// Midpoint: the largest CIELAB chroma of a near-neutral midpoint
    /// (hueproof's own choice).
    pub midpoint_chroma: f64,
    /// Midpoint: the largest ratio between its differences to the two
    /// arms' first classes (hueproof's own choice).
    pub midpoint_lean: f64,
    /// Midpoint: the largest L* difference between the arms at equal
    /// distance from the midpoint (hueproof's own choice).
    pub arm_lightness: f64,
}

impl Default for Thresholds {
    fn default() -> Self {
        Thresholds {
            p_touching: 0.8,
            p_apart: 0.5,
            boundary_contrast: 3.0,
            text_contrast: 4.5,
            large_text_contrast: 3.0,
            glare_lightness: 20.0,
            midpoint_chroma: 10.0,
            midpoint_lean: 2.0,
            arm_lightness: 10.0,
        }
    }
}

/// One settable threshold: its name (in the spec's `[audit]` table and
/// for `--threshold`), the values it accepts and what it means.
pub struct Setting {
    /// The name, e.g. `blend_p_touching`.
    pub name: &'static str,
    /// The smallest accepted value.
    pub min: f64,
    /// The largest accepted value.
    pub max: f64,
    /// What it sets, for people.
    pub meaning: &'static str,
    field: fn(&mut Thresholds) -> &mut f64,
}

/// Every settable threshold.
pub const SETTINGS: [Setting; 9] = [
    Setting {
        name: "blend_p_touching",
        min: 0.05,
        max: 0.99,
        meaning: "probability level of Stone et al. 2014 for classes that touch",
        field: |t| &mut t.p_touching,
    },
    Setting {
        name: "blend_p_apart",
        min: 0.05,
        max: 0.99,
        meaning: "probability level for classes that meet only through the legend",
        field: |t| &mut t.p_apart,
    },
    Setting {
        name: "boundary_contrast",
        min: 1.0,
        max: 21.0,
        meaning: "contrast ratio a mark's boundary needs against the background",
        field: |t| &mut t.boundary_contrast,
    },
    Setting {
        name: "text_contrast",
        min: 1.0,
        max: 21.0,
        meaning: "contrast ratio text needs against what is behind it",
        field: |t| &mut t.text_contrast,
    },
    Setting {
        name: "large_text_contrast",
        min: 1.0,
        max: 21.0,
        meaning: "contrast ratio large text needs",
        field: |t| &mut t.large_text_contrast,
    },
    Setting {
        name: "glare_lightness",
        min: 0.0,
        max: 100.0,
        meaning: "L* by which a class may stand out from the others",
        field: |t| &mut t.glare_lightness,
    },
    Setting {
        name: "midpoint_chroma",
        min: 0.0,
        max: 150.0,
        meaning: "largest CIELAB chroma of a diverging scheme's middle",
        field: |t| &mut t.midpoint_chroma,
    },
    Setting {
        name: "midpoint_lean",
        min: 1.0,
        max: 100.0,
        meaning: "largest ratio of the middle's differences to the two arms",
        field: |t| &mut t.midpoint_lean,
    },
    Setting {
        name: "arm_lightness",
        min: 0.0,
        max: 100.0,
        meaning: "largest L* difference of the arms at equal distance from the middle",
        field: |t| &mut t.arm_lightness,
    },
];

impl Thresholds {
    /// Set threshold `name` to `value`. The error says what was expected.
    pub fn set(&mut self, name: &str, value: f64) -> Result<(), String> {
        let Some(s) = SETTINGS.iter().find(|s| s.name == name) else {
            let names: Vec<&str> = SETTINGS.iter().map(|s| s.name).collect();
            let hint = crate::spec::suggest::closest(name, &names)
                .map(|c| format!("did you mean '{c}'? "))
                .unwrap_or_default();
            return Err(format!(
                "unknown threshold '{name}'; {hint}expected one of {}",
                names.join(", ")
            ));
        };
        if !(value.is_finite() && (s.min..=s.max).contains(&value)) {
            return Err(format!(
                "threshold {name} = {value}: expected a number from {} to {} ({})",
                s.min, s.max, s.meaning
            ));
        }
        *(s.field)(self) = value;
        Ok(())
    }

    /// The value of threshold `name`, if there is one by that name.
    pub fn get(&self, name: &str) -> Option<f64> {
        let mut t = self.clone();
        SETTINGS
            .iter()
            .find(|s| s.name == name)
            .map(|s| *(s.field)(&mut t))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_setting_reaches_its_own_field() {
        for (i, s) in SETTINGS.iter().enumerate() {
            let mut t = Thresholds::default();
            let v = (s.min + s.max) / 2.0 + 0.001 * i as f64;
            t.set(s.name, v).unwrap();
            assert_eq!(t.get(s.name), Some(v));
            let changed = SETTINGS
                .iter()
                .filter(|o| t.get(o.name) != Thresholds::default().get(o.name))
                .count();
            assert_eq!(changed, 1, "{}", s.name);
        }
    }

    #[test]
    fn bad_names_and_values_are_explained() {
        let mut t = Thresholds::default();
        let e = t.set("text_contrst", 4.5).unwrap_err();
        assert!(e.contains("did you mean 'text_contrast'"), "{e}");
        let e = t.set("text_contrast", 30.0).unwrap_err();
        assert!(e.contains("from 1 to 21"), "{e}");
        assert!(t.set("text_contrast", f64::NAN).is_err());
    }
}
