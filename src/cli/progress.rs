//! Progress of a long solve on stderr: a spinner while HiGHS works on a
//! group of items, following HiGHS's own log (best plan, bound and gap as
//! the search goes), and a line for each group done with its status, cost
//! and gap. Hidden when stderr is not a terminal and with `--json`.

use std::io::IsTerminal;
use std::path::PathBuf;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex};
use std::time::Duration;

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

use lotwright::report::money;
use lotwright::solve::{Progress, Status};

pub struct Spinner {
    bar: ProgressBar,
    /// HiGHS's log while a group is solved (only when the spinner shows).
    log: Option<PathBuf>,
    /// Stops the thread that follows the log.
    watching: Mutex<Option<(Arc<AtomicBool>, std::thread::JoinHandle<()>)>>,
}

impl Spinner {
    /// A spinner on stderr, or a hidden one.
    pub fn new(show: bool) -> Spinner {
        let show = show && std::io::stderr().is_terminal();
        let bar = if show {
            ProgressBar::with_draw_target(None, ProgressDrawTarget::stderr())
        } else {
            ProgressBar::hidden()
        };
        if let Ok(style) = ProgressStyle::with_template("{spinner} {msg} ({elapsed})") {
            bar.set_style(style);
        }
        let log = show.then(|| {
            std::env::temp_dir().join(format!("lotwright-highs-{}.log", std::process::id()))
        });
        Spinner {
            bar,
            log,
            watching: Mutex::new(None),
        }
    }

    pub fn finish(&self) {
        self.stop_watching();
        self.bar.finish_and_clear();
    }

    fn stop_watching(&self) {
        let taken = self.watching.lock().ok().and_then(|mut w| w.take());
        if let Some((stop, handle)) = taken {
            stop.store(true, Ordering::Relaxed);
            let _ = handle.join();
        }
        if let Some(log) = &self.log {
            let _ = std::fs::remove_file(log);
        }
    }
}

/// The best plan, bound and gap of the last progress row of a HiGHS MIP
/// log: the row's first token with a % is the explored share, the next
/// three are the bound, the best plan and the gap.
fn last_progress(log: &str) -> Option<(String, String, String)> {
    log.lines().rev().find_map(|line| {
        let tokens: Vec<&str> = line.split_whitespace().collect();
        let at = tokens.iter().position(|t| t.ends_with('%'))?;
        let (bound, best, gap) = (
            tokens.get(at + 1)?,
            tokens.get(at + 2)?,
            tokens.get(at + 3)?,
        );
        let number = |t: &str| t.parse::<f64>().ok();
        let bound = number(bound).filter(|b| b.is_finite())?;
        let best = number(best).map_or("none yet".to_string(), money);
        Some((best, money(bound), gap.to_string()))
    })
}

impl Progress for Spinner {
    fn solver_log(&self) -> Option<PathBuf> {
        self.log.clone()
    }

    fn milp_started(&self, index: usize, total: usize, items: usize) {
        let head = format!("group {index} of {total} sharing capacity ({items} items)");
        self.bar.set_message(format!("{head}: HiGHS is searching"));
        self.bar.enable_steady_tick(Duration::from_millis(200));
        let Some(log) = self.log.clone() else { return };
        let _ = std::fs::remove_file(&log);
        let stop = Arc::new(AtomicBool::new(false));
        let (bar, flag) = (self.bar.clone(), stop.clone());
        let handle = std::thread::spawn(move || {
            while !flag.load(Ordering::Relaxed) {
                if let Some((best, bound, gap)) = std::fs::read_to_string(&log)
                    .ok()
                    .as_deref()
                    .and_then(last_progress)
                {
                    bar.set_message(format!(
                        "{head}: best plan so far {best}, bound {bound}, gap {gap}"
                    ));
                }
                std::thread::sleep(Duration::from_millis(500));
            }
        });
        if let Ok(mut watching) = self.watching.lock() {
            *watching = Some((stop, handle));
        }
    }

    fn milp_finished(
        &self,
        index: usize,
        total: usize,
        status: Status,
        cost: f64,
        gap: Option<f64>,
    ) {
        self.stop_watching();
        let gap = match (status, gap) {
            (Status::Feasible, Some(gap)) => format!(", gap {:.2} %", 100.0 * gap),
            _ => String::new(),
        };
        let cost = if cost.is_finite() {
            format!(", cost {}", money(cost))
        } else {
            String::new()
        };
        self.bar.println(format!(
            "group {index} of {total}: {}{cost}{gap}",
            status.name()
        ));
    }
}

/// One line on stderr, rewritten as each week of a rolling run is planned
/// (only on a terminal, and not with `--json`).
/// One line on stderr for a rolling run: each method running and the
/// week it has reached (several methods run at once).
pub struct RollLine {
    show: bool,
    running: Mutex<Vec<(String, usize, usize)>>,
}

impl RollLine {
    pub fn new(show: bool) -> RollLine {
        RollLine {
            show: show && std::io::stderr().is_terminal(),
            running: Mutex::new(Vec::new()),
        }
    }

    pub fn finish(&self) {
        if self.show {
            eprint!("\r{:100}\r", "");
        }
    }
}

impl lotwright::roll::RollProgress for RollLine {
    fn week_done(&self, label: &str, week: usize, weeks: usize, _status: Status) {
        if !self.show {
            return;
        }
        let Ok(mut running) = self.running.lock() else {
            return;
        };
        match running.iter_mut().find(|(l, _, _)| l == label) {
            Some(entry) => *entry = (label.to_string(), week, weeks),
            None => running.push((label.to_string(), week, weeks)),
        }
        running.retain(|(_, week, weeks)| week < weeks);
        let line: Vec<String> = running
            .iter()
            .map(|(label, week, weeks)| format!("{label}: week {week} of {weeks}"))
            .collect();
        eprint!("\r{:100}\r{}", "", line.join("; "));
    }
}

#[cfg(test)]
mod tests {
    use super::last_progress;

    #[test]
    fn reads_the_last_progress_row_of_a_log() {
        let log = "Src  Proc. InQueue |  Leaves   Expl. | BestBound       BestSol              Gap |   Cuts\n \
                   J       0       0         0   0.00%   -inf            346084.573095      Large        0\n \
                   L       0       0         0   0.00%   321032.169321   321713.469492      0.21%     1508\n\
                   Solving report\n";
        let (best, bound, gap) = last_progress(log).unwrap();
        assert_eq!(
            (best.as_str(), bound.as_str(), gap.as_str()),
            ("321,713.47", "321,032.17", "0.21%")
        );
    }
}
