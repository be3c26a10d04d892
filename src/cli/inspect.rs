//! `hueproof inspect COLOR...`: measure colours and their simulated views.

use clap::{Args, ValueEnum};

use crate::error::Error;
use crate::inspect::{Request, inspect};
use crate::report::inspect_text;
use crate::vision::{self, CvdModel};

use super::Outcome;

/// Arguments of `inspect`.
#[derive(Debug, Args)]
pub struct InspectArgs {
    /// Colours in any CSS Color 4 notation (hex, rgb(), hsl(), hwb(), lab(),
    /// lch(), oklab(), oklch(), names, transparent).
    #[arg(required = true, value_name = "COLOR")]
    pub colors: Vec<String>,
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
    /// Print one JSON object instead of text.
    #[arg(long)]
    pub json: bool,
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

/// Run `inspect`.
pub fn run(args: InspectArgs) -> Result<Outcome, Error> {
    let req = Request {
        colors: args.colors,
        background: args.background,
        views: vision::parse_views(&args.views)?,
        model: args.cvd_model.map(Into::into),
    };
    let ins = inspect(&req)?;
    let mut outcome = if args.json {
        let mut s = serde_json::to_string_pretty(&ins)
            .map_err(|e| Error::Internal(format!("serialising the inspection: {e}")))?;
        s.push('\n');
        Outcome::success(s)
    } else {
        Outcome::success(inspect_text::render(&ins))
    };
    for c in ins.colors.iter().chain(std::iter::once(&ins.background)) {
        if c.gamut_mapped {
            outcome.warnings.push(format!(
                "'{}' lies outside sRGB and was gamut-mapped to {}",
                c.input, c.hex
            ));
        }
    }
    Ok(outcome)
}
