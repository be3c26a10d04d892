//! How common each view's kind of colour vision is, as the one-line note
//! under each panel's title. Figures for men and women of European
//! descent: red-green overall from Birch (2012, JOSA A 29(3):313-320);
//! by type from the tables attributed to Sharpe et al. (1999, "Color
//! Vision: From Genes to Perception"); tritan defects are very rare and
//! the published figures disagree (order 0.001-0.01 %, both sexes alike).
//! The README names the sources; the notes are rounded.

use crate::vision::{Deficiency, View};

/// The note for `view` (named `name` by the user).
pub fn note(name: &str, view: View) -> &'static str {
    match view {
        View::Normal => "the figure as drawn; about 92% of men and 99.5% of women",
        View::Dichromacy(Deficiency::Protan) => "about 1% of men, 0.02% of women",
        View::Dichromacy(Deficiency::Deutan) => "about 1% of men, 0.01% of women",
        View::Dichromacy(Deficiency::Tritan) => "very rare (0.001-0.01%), women and men alike",
        View::Anomaly(Deficiency::Protan, _) => {
            "about 1.3% of men, 0.02% of women (all severities)"
        }
        View::Anomaly(Deficiency::Deutan, _) => "about 5% of men, 0.35% of women (all severities)",
        View::Anomaly(Deficiency::Tritan, _) => "very rare, women and men alike",
        View::Achromatopsia if name == "grayscale" => "grayscale print or photocopy",
        View::Achromatopsia => "very rare; the same as grayscale print",
    }
}
