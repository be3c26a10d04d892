//! `hueproof inspect COLOR...`: measure colours and their simulated views.

use clap::Args;

use crate::error::Error;
use crate::inspect::{Request, inspect};
use crate::report::inspect_text;
use crate::vision;

use super::Outcome;
use super::seeing::SeeingArgs;

/// Arguments of `inspect`.
#[derive(Debug, Args)]
pub struct InspectArgs {
    /// Colours in any CSS Color 4 notation (hex, rgb(), hsl(), hwb(), lab(),
    /// lch(), oklab(), oklch(), names, transparent).
    #[arg(required = true, value_name = "COLOR")]
    pub colors: Vec<String>,
    #[command(flatten)]
    pub seeing: SeeingArgs,
    /// Print one JSON object instead of text.
    #[arg(long)]
    pub json: bool,
}

/// Run `inspect`.
pub fn run(args: InspectArgs) -> Result<Outcome, Error> {
    let req = Request {
        colors: args.colors,
        background: args.seeing.background,
        views: vision::parse_views(&args.seeing.views)?,
        model: args.seeing.cvd_model.map(Into::into),
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
