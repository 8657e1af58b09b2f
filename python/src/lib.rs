//! The Python module `lotwright._lotwright`: glue between Python and the
//! lotwright library, as `cli/` is for the command line. Each command reads
//! the scenario folder with the library's own reader, runs the library,
//! and hands back the very JSON (and CSV files) the command line writes, so
//! Python sees the same figures to the cent. The Python package
//! (`python/lotwright/`) turns those into result objects and DataFrames.
//!
//! This file holds the module, the conversion of library errors into the
//! package's exception classes, the checked solver limits and the wait for
//! a solve that keeps Ctrl-C working; `commands.rs` the commands.

mod commands;

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::mpsc::{self, RecvTimeoutError};
use std::sync::Arc;
use std::time::Duration;

use lotwright::capacity::milp::MilpOptions;
use lotwright::capacity::GroupSolver;
use lotwright::error::Error;
use pyo3::prelude::*;

/// The library's error as the exception class of the same kind from
/// `lotwright.errors`: `InputError` carries the file, line and column.
fn to_py(error: Error) -> PyErr {
    Python::with_gil(|py| match raise(py, &error) {
        Ok(err) | Err(err) => err,
    })
}

fn raise(py: Python<'_>, error: &Error) -> PyResult<PyErr> {
    let errors = py.import("lotwright.errors")?;
    let instance = match error {
        Error::Input { location, message } => {
            let (column, column_name) = match &location.column {
                Some((number, name)) => (Some(*number), Some(name.clone())),
                None => (None, None),
            };
            errors.getattr("InputError")?.call1((
                message.clone(),
                location.file.display().to_string(),
                location.line,
                column,
                column_name,
            ))?
        }
        Error::Usage(message) => errors.getattr("UsageError")?.call1((message.clone(),))?,
        Error::Output { path, message } => errors
            .getattr("OutputError")?
            .call1((message.clone(), path.display().to_string()))?,
        Error::Internal(message) => errors.getattr("InternalError")?.call1((message.clone(),))?,
    };
    Ok(PyErr::from_value(instance))
}

/// How long Ctrl-C waits for a stopped solve's thread to end.
const WIND_DOWN: Duration = Duration::from_secs(10);

/// A usage error (a bad argument) as the package's exception.
fn usage(message: impl Into<String>) -> PyErr {
    to_py(Error::usage(message))
}

/// Runs `work` on its own thread with the GIL released, and waits for it
/// while Python's signal handlers still run: Ctrl-C raises
/// KeyboardInterrupt here within a tenth of a second. `cancel` (the MILP
/// options' interrupt flag) is then set, so HiGHS stops at its next check
/// and the thread ends soon after; its result is dropped.
fn wait_for<T, F>(py: Python<'_>, cancel: Option<Arc<AtomicBool>>, work: F) -> PyResult<T>
where
    T: Send + 'static,
    F: FnOnce() -> T + Send + 'static,
{
    let (sender, receiver) = mpsc::channel();
    std::thread::Builder::new()
        .name("lotwright-solve".into())
        .spawn(move || {
            // The receiver is gone only after a KeyboardInterrupt.
            let _ = sender.send(work());
        })
        .map_err(|e| {
            to_py(Error::Internal(format!(
                "cannot start the solve thread: {e}"
            )))
        })?;
    let mut receiver = receiver;
    loop {
        // The receiver moves in and out: it may cross threads but not be
        // shared between them.
        let (back, waited) = py.allow_threads(move || {
            let waited = receiver.recv_timeout(Duration::from_millis(100));
            (receiver, waited)
        });
        receiver = back;
        match waited {
            Ok(value) => return Ok(value),
            Err(RecvTimeoutError::Timeout) => {
                if let Err(interrupted) = py.check_signals() {
                    if let Some(flag) = &cancel {
                        flag.store(true, Ordering::SeqCst);
                        // HiGHS stops at its next check: let the thread
                        // wind down, so that it is not still inside HiGHS
                        // if the interpreter exits right after this (a
                        // measured crash at exit otherwise).
                        let _ = py.allow_threads(move || receiver.recv_timeout(WIND_DOWN));
                    }
                    return Err(interrupted);
                }
            }
            Err(RecvTimeoutError::Disconnected) => {
                return Err(to_py(Error::Internal(
                    "the solve stopped without a result".into(),
                )))
            }
        }
    }
}

/// The limits of the MILP, checked as the command line checks its options.
fn milp_options(
    time_limit: Option<f64>,
    gap: Option<f64>,
    threads: Option<u32>,
    solver: &str,
) -> PyResult<MilpOptions> {
    let mut options = MilpOptions {
        // Set by `wait_for` on Ctrl-C.
        interrupt: Some(Arc::new(AtomicBool::new(false))),
        ..MilpOptions::default()
    };
    if let Some(seconds) = time_limit {
        if !(seconds.is_finite() && seconds > 0.0) {
            return Err(usage(format!(
                "time_limit must be a positive number of seconds, got {seconds}"
            )));
        }
        options.time_limit = seconds;
    }
    if let Some(gap) = gap {
        if !(gap.is_finite() && (0.0..1.0).contains(&gap)) {
            return Err(usage(format!(
                "gap must be a fraction from 0 up to 1 (0.01 = 1 %), got {gap}"
            )));
        }
        options.gap = Some(gap);
    }
    if let Some(threads) = threads {
        if threads == 0 {
            return Err(usage("threads must be at least 1"));
        }
        options.threads = Some(threads);
    }
    options.solver = GroupSolver::parse(solver).ok_or_else(|| {
        usage(format!(
            "unknown solver `{solver}`; choose one of {}",
            GroupSolver::NAMES.join(", ")
        ))
    })?;
    Ok(options)
}

/// Reads the scenario folder, applies a freeze given as an argument (over
/// scenario.toml's `frozen_periods`), then `sets` (changes in the syntax
/// of `compare --set`, in order).
fn read_scenario(
    dir: &str,
    sets: &[String],
    frozen: Option<usize>,
) -> PyResult<lotwright::model::Scenario> {
    use lotwright::compare::{apply, parse_override};
    let mut scenario = lotwright::input::read_scenario(std::path::Path::new(dir)).map_err(to_py)?;
    if let Some(frozen) = frozen {
        if frozen >= scenario.periods() {
            return Err(usage(format!(
                "frozen={frozen} leaves nothing to plan: the horizon has {} periods, so freeze at most {}",
                scenario.periods(),
                scenario.periods() - 1
            )));
        }
        scenario.frozen = frozen;
    }
    // After the freeze, as `compare` applies its changes.
    for text in sets {
        let change = parse_override(text).map_err(to_py)?;
        apply(&mut scenario, &change).map_err(to_py)?;
    }
    Ok(scenario)
}

/// JSON text of a value (the library builds `serde_json::Value`s).
fn json_text(value: &serde_json::Value) -> PyResult<String> {
    serde_json::to_string(value).map_err(|e| to_py(Error::Internal(e.to_string())))
}

#[pymodule]
fn _lotwright(module: &Bound<'_, PyModule>) -> PyResult<()> {
    module.add_function(wrap_pyfunction!(commands::plan, module)?)?;
    module.add_function(wrap_pyfunction!(commands::check, module)?)?;
    module.add_function(wrap_pyfunction!(commands::compare, module)?)?;
    module.add_function(wrap_pyfunction!(commands::roll, module)?)?;
    module.add_function(wrap_pyfunction!(commands::eoq, module)?)?;
    module.add("METHOD_NAMES", lotwright::solve::METHOD_NAMES.to_vec())?;
    Ok(())
}
