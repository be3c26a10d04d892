//! Batch runs: many inputs at once for `render` and `check`. Owns the
//! input list (paths and glob patterns, expanded here so a quoted pattern
//! works on any shell, sorted and de-duplicated), the thread pool
//! (`--jobs`), progress on standard error, the run's summary and its one
//! exit code, and interruption (SIGINT, SIGTERM). Knows nothing of what
//! is done to each input: the caller hands in one function per input.
//!
//! Results always come back in input order, never in the order the
//! threads finish, so a run's standard output and exports are the same
//! bytes for any number of jobs.
//!
//! The run's exit code is the most serious class any input ended in, in
//! the order: internal error (4), output not written (3), bad input (2),
//! findings (1), success (0); that is the highest code seen. An
//! interrupted run exits with 130 (128 + SIGINT, the shells' convention),
//! whatever the inputs that finished ended in.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};
use std::sync::Mutex;
use std::sync::atomic::{AtomicBool, Ordering};

use rayon::prelude::*;

use crate::error::{Error, ExitKind, Result};

/// Set once SIGINT or SIGTERM arrived (after [`catch_interrupts`]).
static INTERRUPTED: AtomicBool = AtomicBool::new(false);

/// Whether the run was interrupted. [`crate::output::write_atomic`] asks
/// before it renames a finished temporary file into place, and removes
/// the temporary file instead when the answer is yes.
pub fn interrupted() -> bool {
    INTERRUPTED.load(Ordering::SeqCst)
}

/// Mark the run as interrupted, as the signal handler does (also usable
/// from Rust to stop a batch from another thread).
pub fn interrupt() {
    INTERRUPTED.store(true, Ordering::SeqCst);
}

/// Catch SIGINT and SIGTERM for the rest of the process: the first one
/// marks the run as interrupted (no new input starts; inputs in flight
/// drop their temporary files at their next write), a second one ends
/// the process at once with code 130. Installing twice is harmless.
pub fn catch_interrupts() {
    static ONCE: std::sync::Once = std::sync::Once::new();
    ONCE.call_once(|| {
        // If a handler cannot be installed (another library owns the
        // signals), the default behaviour stays: the process ends, and
        // the atomic writes still leave no half-written output.
        let _ = ctrlc::set_handler(|| {
            if INTERRUPTED.swap(true, Ordering::SeqCst) {
                std::process::exit(i32::from(ExitKind::Interrupted.code()));
            }
        });
    });
}

fn usage(what: &str, message: String) -> Error {
    Error::Usage {
        what: what.into(),
        message,
    }
}

/// Whether `s` is a glob pattern rather than a plain path.
fn is_pattern(s: &str) -> bool {
    s.contains(['*', '?', '['])
}

/// Expand the command line's inputs: each is a path (kept as given, even
/// if it does not exist, so its own error names it later) or a glob
/// pattern (`*`, `?`, `[...]`, and `**` for any depth of folders). The
/// list is sorted and de-duplicated. A pattern that matches no file is a
/// bad-input error naming it.
pub fn expand(inputs: &[String]) -> Result<Vec<PathBuf>> {
    let mut out = Vec::new();
    for raw in inputs {
        if !is_pattern(raw) {
            out.push(PathBuf::from(raw));
            continue;
        }
        let paths = glob::glob(raw)
            .map_err(|e| usage("input", format!("'{raw}' is not a valid pattern: {e}")))?;
        let before = out.len();
        for p in paths {
            let p = p.map_err(|e| Error::Read {
                path: e.path().to_path_buf(),
                source: std::io::Error::new(e.error().kind(), e.error().to_string()),
            })?;
            if p.is_file() {
                out.push(p);
            }
        }
        if out.len() == before {
            return Err(usage(
                "input",
                format!(
                    "the pattern '{raw}' matches no file (quote it so the shell leaves it to hueproof, and check the folder)"
                ),
            ));
        }
    }
    out.sort();
    out.dedup();
    Ok(out)
}

/// The number of jobs: `asked`, else the number of cores. 0 is refused.
pub fn jobs(asked: Option<usize>) -> Result<usize> {
    match asked {
        Some(0) => Err(usage(
            "--jobs",
            "0: expected at least 1 (the number of figures worked on at once)".into(),
        )),
        Some(n) => Ok(n),
        None => Ok(std::thread::available_parallelism().map_or(1, |n| n.get())),
    }
}

/// How progress is shown on standard error.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Progress {
    /// A bar that redraws itself (a terminal, NO_COLOR unset).
    Bar,
    /// One plain line per finished input, `[3/12] maps/a.toml: passed`.
    Lines,
    /// Nothing (for use from Rust).
    Quiet,
}

impl Progress {
    /// A bar when standard error is a terminal and NO_COLOR is unset,
    /// plain lines otherwise.
    pub fn for_stderr() -> Progress {
        let no_color = std::env::var_os("NO_COLOR").is_some_and(|v| !v.is_empty());
        if std::io::stderr().is_terminal() && !no_color {
            Progress::Bar
        } else {
            Progress::Lines
        }
    }
}

/// What became of one input.
#[derive(Debug)]
pub struct Finished<T> {
    /// The input.
    pub input: PathBuf,
    /// Its result; None when the run was interrupted before it started.
    pub result: Option<Result<T>>,
}

/// Counts of a finished run, and its exit class.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct Summary {
    /// Inputs in the run.
    pub total: usize,
    /// Ended in success.
    pub ok: usize,
    /// Ended in findings.
    pub findings: usize,
    /// Ended in bad input.
    pub bad_input: usize,
    /// Ended with an output not written.
    pub not_written: usize,
    /// Ended in an internal error.
    pub internal: usize,
    /// Not started because the run was interrupted.
    pub not_started: usize,
    /// The run was interrupted.
    pub interrupted: bool,
}

impl Summary {
    /// Count `kinds` (None: not started).
    pub fn of(kinds: &[Option<ExitKind>], interrupted: bool) -> Summary {
        let mut s = Summary {
            total: kinds.len(),
            interrupted,
            ..Summary::default()
        };
        for k in kinds {
            match k {
                None => s.not_started += 1,
                Some(ExitKind::Success) => s.ok += 1,
                Some(ExitKind::Findings) => s.findings += 1,
                Some(ExitKind::BadInput) => s.bad_input += 1,
                Some(ExitKind::OutputFailed) => s.not_written += 1,
                Some(ExitKind::Internal) => s.internal += 1,
                Some(ExitKind::Interrupted) => s.not_started += 1,
            }
        }
        s
    }

    /// The run's exit class: interrupted, else the most serious class
    /// seen (internal > output not written > bad input > findings >
    /// success).
    pub fn exit_kind(&self) -> ExitKind {
        if self.interrupted {
            ExitKind::Interrupted
        } else if self.internal > 0 {
            ExitKind::Internal
        } else if self.not_written > 0 {
            ExitKind::OutputFailed
        } else if self.bad_input > 0 {
            ExitKind::BadInput
        } else if self.findings > 0 {
            ExitKind::Findings
        } else {
            ExitKind::Success
        }
    }

    /// One line, e.g. `12 inputs: 9 passed, 2 with findings, 1 bad input;
    /// exit code 2`. `ok` is the word for success (`passed`, `written`).
    pub fn line(&self, ok: &str) -> String {
        let mut parts = vec![format!("{} {ok}", self.ok)];
        for (n, what) in [
            (self.findings, "with findings"),
            (self.bad_input, "bad input"),
            (self.not_written, "not written"),
            (self.internal, "internal error"),
            (self.not_started, "not started"),
        ] {
            if n > 0 {
                parts.push(format!("{n} {what}"));
            }
        }
        format!(
            "{} input{}: {}{}; exit code {}\n",
            self.total,
            if self.total == 1 { "" } else { "s" },
            parts.join(", "),
            if self.interrupted {
                " (interrupted)"
            } else {
                ""
            },
            self.exit_kind().code()
        )
    }
}

/// Refuse a batch in which two inputs would write the same output:
/// `output_of` gives each input's output path (without extension).
pub fn refuse_shared_outputs(
    inputs: &[PathBuf],
    output_of: impl Fn(&Path) -> PathBuf,
) -> Result<()> {
    let mut seen: Vec<(PathBuf, &Path)> = Vec::with_capacity(inputs.len());
    for i in inputs {
        let o = output_of(i);
        if let Some((_, first)) = seen.iter().find(|(p, _)| *p == o) {
            return Err(usage(
                "output",
                format!(
                    "'{}' and '{}' would both write '{}.*'; give them different file names or run them apart",
                    first.display(),
                    i.display(),
                    o.display()
                ),
            ));
        }
        seen.push((o, i));
    }
    Ok(())
}

/// Run `work` on every input, `jobs` at a time, showing progress; `status`
/// gives the exit class and the one-word status of a result for the
/// progress line. Results come back in input order. After an interrupt
/// no new input starts.
pub fn run<T, W, S>(
    inputs: &[PathBuf],
    jobs: usize,
    progress: Progress,
    work: W,
    status: S,
) -> Result<Vec<Finished<T>>>
where
    T: Send,
    W: Fn(&Path) -> Result<T> + Sync,
    S: Fn(&Result<T>) -> String + Sync,
{
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(jobs)
        .build()
        .map_err(|e| Error::Internal(format!("starting {jobs} worker threads: {e}")))?;
    let total = inputs.len();
    let bar = match progress {
        Progress::Bar => {
            let b = indicatif::ProgressBar::new(total as u64);
            if let Ok(style) = indicatif::ProgressStyle::with_template(
                "{bar:30} {pos}/{len} figures, {elapsed} ({msg})",
            ) {
                b.set_style(style);
            }
            Some(b)
        }
        _ => None,
    };
    let done = Mutex::new(0usize);
    let report = |input: &Path, line: String| {
        let mut n = done.lock().unwrap_or_else(|e| e.into_inner());
        *n += 1;
        match (&bar, progress) {
            (Some(b), _) => {
                b.set_message(format!("{}: {line}", input.display()));
                b.inc(1);
            }
            (None, Progress::Lines) => {
                eprintln!("[{}/{total}] {}: {line}", *n, input.display());
            }
            _ => {}
        }
    };
    let results: Vec<Finished<T>> = pool.install(|| {
        inputs
            .par_iter()
            .map(|input| {
                if interrupted() {
                    return Finished {
                        input: input.clone(),
                        result: None,
                    };
                }
                let result = work(input);
                report(input, status(&result));
                Finished {
                    input: input.clone(),
                    result: Some(result),
                }
            })
            .collect()
    });
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    Ok(results)
}

/// A finished batch as one piece of text, in input order.
#[derive(Debug, Clone, PartialEq)]
pub struct Combined {
    /// Each input's text under a `== INPUT ==` heading; an input that
    /// failed gets `error: MESSAGE`, one not started says so.
    pub text: String,
    /// Each input's warnings, prefixed with the input.
    pub warnings: Vec<String>,
    /// The counts and the run's exit class.
    pub summary: Summary,
}

/// Put a finished batch together: `parts` splits a successful result
/// into its text, its warnings and its exit class.
pub fn combine<T>(
    done: Vec<Finished<T>>,
    parts: impl Fn(T) -> (String, Vec<String>, ExitKind),
) -> Combined {
    let mut text = String::new();
    let mut warnings = Vec::new();
    let mut kinds = Vec::with_capacity(done.len());
    for f in done {
        let name = f.input.display().to_string();
        text.push_str(&format!("== {name} ==\n"));
        match f.result {
            None => {
                text.push_str("not started: the run was interrupted\n");
                kinds.push(None);
            }
            Some(Err(e)) => {
                text.push_str(&format!("error: {e}\n"));
                kinds.push(Some(e.exit_kind()));
            }
            Some(Ok(t)) => {
                let (out, warns, kind) = parts(t);
                text.push_str(&out);
                if !out.is_empty() && !out.ends_with('\n') {
                    text.push('\n');
                }
                warnings.extend(warns.into_iter().map(|w| {
                    if w.contains(&name) {
                        w
                    } else {
                        format!("{name}: {w}")
                    }
                }));
                kinds.push(Some(kind));
            }
        }
    }
    Combined {
        text,
        warnings,
        summary: Summary::of(&kinds, interrupted()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exit_class_is_the_most_serious_seen() {
        use ExitKind::*;
        let s = Summary::of(&[Some(Success), Some(Findings), Some(BadInput)], false);
        assert_eq!(s.exit_kind(), BadInput);
        assert_eq!(
            s.line("passed"),
            "3 inputs: 1 passed, 1 with findings, 1 bad input; exit code 2\n"
        );
        let s = Summary::of(&[Some(OutputFailed), Some(BadInput)], false);
        assert_eq!(s.exit_kind(), OutputFailed);
        let s = Summary::of(&[Some(Internal), Some(OutputFailed)], false);
        assert_eq!(s.exit_kind(), Internal);
        let s = Summary::of(&[Some(Success), None], true);
        assert_eq!(s.exit_kind(), Interrupted);
        assert_eq!(Summary::of(&[Some(Success)], false).exit_kind(), Success);
    }

    #[test]
    fn jobs_zero_is_refused() {
        let e = jobs(Some(0)).unwrap_err();
        assert_eq!(e.exit_kind(), ExitKind::BadInput);
        assert!(e.to_string().contains("--jobs"), "{e}");
        assert_eq!(jobs(Some(3)).unwrap(), 3);
        assert!(jobs(None).unwrap() >= 1);
    }

    #[test]
    fn results_come_back_in_input_order() {
        let inputs: Vec<PathBuf> = (0..40).map(|i| PathBuf::from(format!("{i:02}"))).collect();
        let out = run(
            &inputs,
            4,
            Progress::Quiet,
            |p| {
                // Later inputs finish first.
                let i: u64 = p.to_string_lossy().parse().unwrap();
                std::thread::sleep(std::time::Duration::from_millis(40 - i));
                Ok(i)
            },
            |_| String::new(),
        )
        .unwrap();
        let got: Vec<u64> = out
            .into_iter()
            .map(|f| f.result.unwrap().unwrap())
            .collect();
        assert_eq!(got, (0..40).collect::<Vec<u64>>());
    }

    #[test]
    fn shared_outputs_are_refused() {
        let inputs = [PathBuf::from("a/x.toml"), PathBuf::from("b/x.toml")];
        let e = refuse_shared_outputs(&inputs, |p| Path::new("out").join(p.file_stem().unwrap()))
            .unwrap_err();
        assert!(e.to_string().contains("a/x.toml") && e.to_string().contains("b/x.toml"));
        assert!(refuse_shared_outputs(&inputs, |p| p.with_extension("")).is_ok());
    }
}
