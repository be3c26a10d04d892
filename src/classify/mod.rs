//! Classification: which values fall into which colour class.
//!
//! This stage owns the class breaks of a classed (choropleth) map and the
//! numbers a cartographer checks about them. It takes a [`Sample`] (the
//! finite values of one data column plus the count of missing values) and a
//! [`Method`], and returns a [`Classification`]:
//!
//! - **class upper bounds**, upper-inclusive: class 0 is (-inf, b0], class
//!   j is (b_{j-1}, b_j]. A value equal to a bound belongs to the *lower*
//!   class. Values below the minimum are not clipped, so class 0 can be
//!   empty (standard-deviation classes and manual breaks can give empty
//!   leading classes);
//! - the minimum and maximum of the data, the count per class;
//! - SDAM (sum of squared deviations from the array mean), SDCM (sum of
//!   squared deviations from the class means) and the goodness of variance
//!   fit GVF = 1 - SDCM / SDAM (Jenks 1977; common practice);
//! - an equal-width histogram of the values for legends;
//! - the number of missing values, which never enter a class.
//!
//! Methods, one file each: [`equal_interval`], [`quantile`],
//! [`fisher_jenks`] (exact optimal natural breaks; on large inputs first
//! through the grid-bounded pruning of `jenks_pruning`), [`std_dev`],
//! [`head_tail`] and [`manual`]. On top of any result, [`rounding`] rounds
//! the breaks to readable values and counts the observations that changed
//! class, and [`diverging`] arranges classes around a midpoint. Unclassed
//! (continuous) colouring of ordered data is [`unclassed`]. Reading one
//! numeric column from a CSV file is [`column`]; the text rendering for
//! people is [`text`].

pub mod column;
pub mod diverging;
pub mod equal_interval;
pub mod fisher_jenks;
pub mod head_tail;
mod jenks_pruning;
pub mod manual;
pub mod quantile;
pub mod rounding;
pub mod std_dev;
pub mod text;
pub mod unclassed;

use serde::Serialize;

use crate::error::Error;

/// The number of histogram bins used when none is asked for.
pub const DEFAULT_HISTOGRAM_BINS: usize = 20;

/// The finite values of one variable, sorted ascending, and how many
/// observations were missing.
#[derive(Debug, Clone, PartialEq)]
pub struct Sample {
    sorted: Vec<f64>,
    missing: usize,
}

/// Samples at least this long are sorted in parallel.
const PARALLEL_SORT: usize = 1 << 16;

impl Sample {
    /// Build a sample from values (any order) and a count of missing ones.
    ///
    /// Every value must be finite; `-0.0` is stored as `0.0`. Fails when a
    /// value is NaN or infinite (read missing values as missing instead).
    pub fn new(mut values: Vec<f64>, missing: usize) -> Result<Sample, Error> {
        if let Some(pos) = values.iter().position(|v| !v.is_finite()) {
            return Err(Error::Usage {
                what: "values".into(),
                message: format!(
                    "value number {} is {}; expected a finite number (mark missing values as missing)",
                    pos + 1,
                    values[pos]
                ),
            });
        }
        for v in &mut values {
            if *v == 0.0 {
                *v = 0.0;
            }
        }
        // Large samples are sorted on all threads of the pool (the order is
        // the same: equal keys are equal bits, since -0.0 is gone).
        if values.len() >= PARALLEL_SORT {
            use rayon::slice::ParallelSliceMut;
            values.par_sort_unstable_by(f64::total_cmp);
        } else {
            values.sort_unstable_by(f64::total_cmp);
        }
        Ok(Sample {
            sorted: values,
            missing,
        })
    }

    /// Build a sample from optional values: `None` counts as missing, and so
    /// does NaN.
    pub fn from_options<I: IntoIterator<Item = Option<f64>>>(items: I) -> Result<Sample, Error> {
        let mut values = Vec::new();
        let mut missing = 0;
        for item in items {
            match item {
                Some(v) if !v.is_nan() => values.push(v),
                _ => missing += 1,
            }
        }
        Sample::new(values, missing)
    }

    /// The values, sorted ascending.
    pub fn sorted(&self) -> &[f64] {
        &self.sorted
    }

    /// How many values there are (missing ones excluded).
    pub fn len(&self) -> usize {
        self.sorted.len()
    }

    /// True when there is no value at all.
    pub fn is_empty(&self) -> bool {
        self.sorted.is_empty()
    }

    /// How many observations were missing.
    pub fn missing(&self) -> usize {
        self.missing
    }

    /// The smallest value (None for an empty sample).
    pub fn min(&self) -> Option<f64> {
        self.sorted.first().copied()
    }

    /// The largest value (None for an empty sample).
    pub fn max(&self) -> Option<f64> {
        self.sorted.last().copied()
    }

    /// The arithmetic mean (None for an empty sample).
    pub fn mean(&self) -> Option<f64> {
        if self.sorted.is_empty() {
            None
        } else {
            Some(mean(&self.sorted))
        }
    }
}

/// How to pick class breaks.
#[derive(Debug, Clone, PartialEq)]
pub enum Method {
    /// Classes of equal width between the minimum and the maximum.
    EqualInterval {
        /// The number of classes.
        classes: usize,
    },
    /// Classes with (as nearly as ties allow) equal counts.
    Quantile {
        /// The number of classes asked for (ties can give fewer).
        classes: usize,
    },
    /// Exact optimal natural breaks (Fisher 1958, Jenks 1977).
    NaturalBreaks {
        /// The number of classes asked for (fewer distinct values give fewer).
        classes: usize,
    },
    /// Mean plus multiples of the standard deviation.
    StdDev(std_dev::Multiples),
    /// Head/tail breaks for heavy-tailed data (Jiang 2013).
    HeadTail(head_tail::StopRule),
    /// Upper bounds given by the user.
    Manual {
        /// Class upper bounds, strictly increasing.
        bounds: Vec<f64>,
    },
}

impl Method {
    /// The short name used on the command line and in JSON.
    pub fn name(&self) -> &'static str {
        match self {
            Method::EqualInterval { .. } => "equal",
            Method::Quantile { .. } => "quantile",
            Method::NaturalBreaks { .. } => "natural",
            Method::StdDev(_) => "stddev",
            Method::HeadTail(_) => "headtail",
            Method::Manual { .. } => "manual",
        }
    }
}

/// Upper bounds chosen by a method, with the warnings it raised.
#[derive(Debug, Clone, PartialEq)]
pub struct Bounds {
    /// Class upper bounds, strictly increasing, last one >= the maximum.
    pub upper: Vec<f64>,
    /// Things the user should know (collapsed classes and the like).
    pub warnings: Vec<String>,
}

/// An equal-width histogram of the values, for legends.
///
/// `edges` has one more entry than `counts`. Bin i holds values in
/// [edges[i], edges[i+1]) and the last bin also holds the maximum
/// (half-open bins, the usual histogram convention; unlike the classes).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Histogram {
    /// Bin edges, ascending.
    pub edges: Vec<f64>,
    /// Number of values in each bin.
    pub counts: Vec<usize>,
}

/// The result of classifying a sample.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Classification {
    /// The method's short name (`equal`, `quantile`, `natural`, `stddev`,
    /// `headtail`, `manual`).
    pub method: String,
    /// The number of classes actually produced (= `breaks.len()`).
    pub classes: usize,
    /// The smallest value.
    pub min: f64,
    /// The largest value.
    pub max: f64,
    /// Class upper bounds (upper-inclusive).
    pub breaks: Vec<f64>,
    /// Number of values in each class.
    pub counts: Vec<usize>,
    /// Goodness of variance fit, 1 - SDCM/SDAM; `None` when all values are
    /// equal (SDAM = 0).
    pub gvf: Option<f64>,
    /// Sum of squared deviations from the array mean.
    pub sdam: f64,
    /// Sum of squared deviations from the class means.
    pub sdcm: f64,
    /// Number of values classified.
    pub n: usize,
    /// Number of missing values (never in a class).
    pub missing: usize,
    /// Equal-width histogram of the values.
    pub histogram: Histogram,
    /// Rounding applied to the breaks, if any.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rounding: Option<rounding::RoundingReport>,
    /// Diverging arrangement, if any.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub midpoint: Option<diverging::MidpointReport>,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

/// Classify `sample` with `method`, with a histogram of `histogram_bins`
/// equal-width bins.
pub fn classify(
    sample: &Sample,
    method: &Method,
    histogram_bins: usize,
) -> Result<Classification, Error> {
    let bounds = method_bounds(sample, method)?;
    finish(sample, method.name(), bounds, histogram_bins)
}

/// Only the upper bounds a method gives for `sample`.
pub fn method_bounds(sample: &Sample, method: &Method) -> Result<Bounds, Error> {
    require_values(sample)?;
    let x = sample.sorted();
    match method {
        Method::EqualInterval { classes } => equal_interval::bounds(x, *classes),
        Method::Quantile { classes } => quantile::bounds(x, *classes),
        Method::NaturalBreaks { classes } => fisher_jenks::bounds(x, *classes),
        Method::StdDev(m) => std_dev::bounds(x, m),
        Method::HeadTail(rule) => head_tail::bounds(x, rule),
        Method::Manual { bounds } => manual::bounds(x, bounds),
    }
}

/// Build the full result from chosen bounds: counts, fit and histogram.
pub fn finish(
    sample: &Sample,
    method: &str,
    bounds: Bounds,
    histogram_bins: usize,
) -> Result<Classification, Error> {
    require_values(sample)?;
    let x = sample.sorted();
    let upper = bounds.upper;
    if upper.is_empty() || upper.windows(2).any(|w| w[0] >= w[1]) {
        return Err(Error::Internal(format!(
            "class bounds are not strictly increasing: {upper:?}"
        )));
    }
    let counts = counts(x, &upper);
    let (sdam, sdcm) = fit(x, &counts);
    let gvf = if sdam > 0.0 {
        Some(1.0 - sdcm / sdam)
    } else {
        None
    };
    Ok(Classification {
        method: method.to_string(),
        classes: upper.len(),
        min: x[0],
        max: x[x.len() - 1],
        breaks: upper,
        counts,
        gvf,
        sdam,
        sdcm,
        n: x.len(),
        missing: sample.missing(),
        histogram: histogram(x, histogram_bins),
        rounding: None,
        midpoint: None,
        warnings: bounds.warnings,
    })
}

fn require_values(sample: &Sample) -> Result<(), Error> {
    if sample.is_empty() {
        Err(Error::Usage {
            what: "values".into(),
            message: format!(
                "there is no value to classify ({} missing)",
                sample.missing()
            ),
        })
    } else {
        Ok(())
    }
}

/// The class of `value` under upper-inclusive `upper` bounds: the number of
/// bounds strictly below the value, capped at the last class.
pub fn class_of(value: f64, upper: &[f64]) -> usize {
    upper
        .partition_point(|&b| b < value)
        .min(upper.len().saturating_sub(1))
}

/// Counts per class of sorted values `x` under upper-inclusive bounds. A
/// value above the last bound is counted in the last class.
pub fn counts(x: &[f64], upper: &[f64]) -> Vec<usize> {
    let mut out = Vec::with_capacity(upper.len());
    let mut start = 0;
    for (j, &b) in upper.iter().enumerate() {
        let end = if j + 1 == upper.len() {
            x.len()
        } else {
            x.partition_point(|&v| v <= b)
        };
        let end = end.max(start);
        out.push(end - start);
        start = end;
    }
    out
}

/// SDAM and SDCM of sorted values `x` split into consecutive classes of
/// sizes `counts`. Empty classes contribute 0.
pub fn fit(x: &[f64], counts: &[usize]) -> (f64, f64) {
    let sdam = sum_sq_dev(x);
    let mut sdcm = 0.0;
    let mut start = 0;
    for &c in counts {
        sdcm += sum_sq_dev(&x[start..start + c]);
        start += c;
    }
    (sdam, sdcm)
}

/// The arithmetic mean of a non-empty slice.
pub(crate) fn mean(x: &[f64]) -> f64 {
    x.iter().sum::<f64>() / x.len() as f64
}

/// Sum of squared deviations from the mean (two-pass; 0 for an empty slice).
pub(crate) fn sum_sq_dev(x: &[f64]) -> f64 {
    if x.is_empty() {
        return 0.0;
    }
    let m = mean(x);
    x.iter().map(|v| (v - m) * (v - m)).sum()
}

/// Equal-width histogram of sorted values with `bins` bins over [min, max].
pub fn histogram(x: &[f64], bins: usize) -> Histogram {
    let bins = bins.max(1);
    let (lo, hi) = (x[0], x[x.len() - 1]);
    if lo == hi {
        return Histogram {
            edges: vec![lo, hi],
            counts: vec![x.len()],
        };
    }
    let w = (hi - lo) / bins as f64;
    let mut edges: Vec<f64> = (0..bins).map(|i| lo + w * i as f64).collect();
    edges.push(hi);
    let mut counts = Vec::with_capacity(bins);
    let mut start = 0;
    for i in 0..bins {
        let end = if i + 1 == bins {
            x.len()
        } else {
            x.partition_point(|&v| v < edges[i + 1])
        };
        counts.push(end - start);
        start = end;
    }
    Histogram { edges, counts }
}

/// Check a class-count parameter: at least 1.
pub(crate) fn check_classes(classes: usize) -> Result<(), Error> {
    if classes == 0 {
        Err(Error::Usage {
            what: "--classes".into(),
            message: "expected at least 1 class, got 0".into(),
        })
    } else {
        Ok(())
    }
}
