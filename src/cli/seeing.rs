//! Options shared by every command that judges colours as readers see
//! them: the background, the views and the simulation model.

use clap::{Args, ValueEnum};

use crate::vision::{self, CvdModel};

/// How the colours are seen.
#[derive(Debug, Args)]
pub struct SeeingArgs {
    /// Background the colours sit on (contrast, compositing).
    #[arg(long, default_value = "white", value_name = "COLOR")]
    pub background: String,
    /// Comma-separated views: normal, protanopia, deuteranopia, tritanopia,
    /// achromatopsia, protanomaly=S, deuteranomaly=S, tritanomaly=S.
    #[arg(long, default_value = vision::DEFAULT_VIEWS, value_name = "LIST")]
    pub views: String,
    /// Simulation model for the deficiency views (default: the documented
    /// choice per view).
    #[arg(long, value_enum, value_name = "MODEL")]
    pub cvd_model: Option<ModelArg>,
}

/// Model names on the command line.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum ModelArg {
    /// Machado, Oliveira & Fernandes 2009.
    Machado2009,
    /// Brettel, Viénot & Mollon 1997.
    Brettel1997,
    /// Viénot, Brettel & Mollon 1999 (protan, deutan).
    Vienot1999,
}

impl From<ModelArg> for CvdModel {
    fn from(m: ModelArg) -> Self {
        match m {
            ModelArg::Machado2009 => CvdModel::Machado2009,
            ModelArg::Brettel1997 => CvdModel::Brettel1997,
            ModelArg::Vienot1999 => CvdModel::Vienot1999,
        }
    }
}
