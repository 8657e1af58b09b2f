//! A series of figures by bucket, shared rather than copied: the
//! evaluations of many plans of one scenario hold the same demand, receipts
//! and zero rows, and a plan's releases are its receipts when there is no
//! lead time. Reads as a slice.

use std::ops::Deref;
use std::sync::Arc;

use serde::{Serialize, Serializer};

/// Figures by bucket; cloning shares them.
#[derive(Clone, PartialEq, Default)]
pub struct Series(Arc<[f64]>);

impl Series {
    /// Whether every figure is a plain zero (`+0.0`), so that a shared row
    /// of zeros can stand in for it.
    pub fn is_zero(values: &[f64]) -> bool {
        values.iter().all(|q| q.to_bits() == 0)
    }

    /// Whether both hold the same storage (not merely equal figures).
    pub fn shares(&self, other: &Series) -> bool {
        Arc::ptr_eq(&self.0, &other.0)
    }
}

impl Deref for Series {
    type Target = [f64];

    fn deref(&self) -> &[f64] {
        &self.0
    }
}

impl<'a> IntoIterator for &'a Series {
    type Item = &'a f64;
    type IntoIter = std::slice::Iter<'a, f64>;

    fn into_iter(self) -> Self::IntoIter {
        self.0.iter()
    }
}

impl From<Vec<f64>> for Series {
    fn from(values: Vec<f64>) -> Series {
        Series(values.into())
    }
}

impl From<&[f64]> for Series {
    fn from(values: &[f64]) -> Series {
        Series(values.into())
    }
}

impl PartialEq<Vec<f64>> for Series {
    fn eq(&self, other: &Vec<f64>) -> bool {
        *self.0 == **other
    }
}

impl PartialEq<[f64]> for Series {
    fn eq(&self, other: &[f64]) -> bool {
        *self.0 == *other
    }
}

impl std::fmt::Debug for Series {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_list().entries(self.0.iter()).finish()
    }
}

impl Serialize for Series {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_seq(self.0.iter())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn clones_share_and_compare_by_figures() {
        let a = Series::from(vec![1.0, 0.0, 2.5]);
        let b = a.clone();
        assert!(a.shares(&b));
        let c = Series::from(&[1.0, 0.0, 2.5][..]);
        assert!(!a.shares(&c));
        assert_eq!(a, c);
        assert_eq!(a, vec![1.0, 0.0, 2.5]);
        assert_eq!(a.iter().sum::<f64>(), 3.5);
        assert_eq!(format!("{a:?}"), "[1.0, 0.0, 2.5]");
        assert_eq!(serde_json::to_string(&a).unwrap(), "[1.0,0.0,2.5]");
    }

    #[test]
    fn only_plain_zeros_are_zero() {
        assert!(Series::is_zero(&[0.0, 0.0]));
        assert!(Series::is_zero(&[]));
        assert!(!Series::is_zero(&[0.0, -0.0]));
        assert!(!Series::is_zero(&[0.0, 1e-300]));
    }
}
