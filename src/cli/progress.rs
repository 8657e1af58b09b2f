//! Progress of a long solve on stderr: a spinner while HiGHS works on a
//! group of items, and a line for each group done with its status, cost and
//! gap. Hidden when stderr is not a terminal and with `--json`.

use std::io::IsTerminal;
use std::time::Duration;

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

use lotwright::report::money;
use lotwright::solve::{Progress, Status};

pub struct Spinner {
    bar: ProgressBar,
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
        Spinner { bar }
    }

    pub fn finish(&self) {
        self.bar.finish_and_clear();
    }
}

impl Progress for Spinner {
    fn milp_started(&self, index: usize, total: usize, items: usize) {
        self.bar.set_message(format!(
            "group {index} of {total} sharing capacity ({items} items): HiGHS is searching"
        ));
        self.bar.enable_steady_tick(Duration::from_millis(200));
    }

    fn milp_finished(
        &self,
        index: usize,
        total: usize,
        status: Status,
        cost: f64,
        gap: Option<f64>,
    ) {
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
