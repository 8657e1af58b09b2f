//! lotwright: least-cost lot sizing for production and purchase plans.
//!
//! A scenario folder (see docs/format.md) is read and validated by
//! [`input::read_scenario`]; every method returns a [`model::Plan`]; the one
//! [`eval::evaluate`] computes stock, feasibility and cost of any plan;
//! [`solve::plan_scenario`] runs the exact method and the lot rules side by
//! side; [`report`] renders the results. The library never prints or exits.

// No unsafe code, but for the one HiGHS callback of
// `capacity::interrupt`, which the bindings do not wrap.
#![deny(unsafe_code)]

pub mod actions;
pub mod capacity;
pub mod check;
pub mod compare;
pub mod error;
pub mod eval;
pub mod infeasibility;
pub mod input;
pub mod model;
pub mod multilevel;
pub mod replan;
pub mod report;
pub mod roll;
pub mod single;
pub mod solve;

pub use error::{Error, Result};
