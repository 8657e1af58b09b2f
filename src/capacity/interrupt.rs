//! Stopping a HiGHS solve from another thread.
//!
//! The fix-and-optimize search beside the MILP (`beside`) solves small
//! programs on HiGHS while the MILP runs; when the MILP returns, the search
//! must stop at once, not when its current subproblem reaches its own time
//! limit (a proven run would otherwise wait up to that limit for nothing).
//! HiGHS asks a callback, during simplex, interior point and branch and
//! bound, whether to stop; the callback reads a shared flag. The bindings
//! used for the models do not expose callbacks, so this goes through the C
//! interface of the same HiGHS (`highs-sys`).

use std::ffi::{c_char, c_int, c_void};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;

use highs_sys::{
    kHighsCallbackIpmInterrupt, kHighsCallbackMipInterrupt, kHighsCallbackSimplexInterrupt,
    HighsCallbackDataIn, HighsCallbackDataOut, Highs_setCallback, Highs_startCallback,
};

/// The callback: asks HiGHS to stop once the flag is set.
///
/// # Safety
/// `flag` is the `AtomicBool` that `watch` registered; the caller of
/// `watch` keeps it alive for as long as the model can be solved.
unsafe extern "C" fn check(
    _kind: c_int,
    _message: *const c_char,
    _out: *const HighsCallbackDataOut,
    data_in: *mut HighsCallbackDataIn,
    flag: *mut c_void,
) {
    // SAFETY: `flag` points to the AtomicBool held by an Arc that outlives
    // the solve (see `watch`); `data_in` is HiGHS's own, checked for null.
    unsafe {
        let stop = &*(flag as *const AtomicBool);
        if stop.load(Ordering::Relaxed) && !data_in.is_null() {
            (*data_in).user_interrupt = 1;
        }
    }
}

/// Makes `model` stop (with status "interrupted", keeping any plan found)
/// as soon as `flag` is set. `flag` must live as long as the model: the
/// options that carry it are held by the caller for the whole solve.
pub(crate) fn watch(model: &mut highs::Model, flag: &Arc<AtomicBool>) {
    let pointer = model.as_mut_ptr();
    // SAFETY: `pointer` is the live HiGHS instance of `model`; the data
    // pointer is the Arc's AtomicBool, which outlives the solve.
    unsafe {
        Highs_setCallback(pointer, Some(check), Arc::as_ptr(flag) as *mut c_void);
        for kind in [
            kHighsCallbackSimplexInterrupt,
            kHighsCallbackIpmInterrupt,
            kHighsCallbackMipInterrupt,
        ] {
            Highs_startCallback(pointer, kind);
        }
    }
}
