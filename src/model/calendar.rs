//! The planning calendar: buckets of a day, a week or a calendar month from a
//! start date, and the mapping between dates and bucket numbers.

use chrono::{Datelike, Months, NaiveDate};
use serde::Serialize;

/// The length of one planning bucket.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum BucketKind {
    Day,
    Week,
    Month,
}

impl BucketKind {
    pub fn parse(text: &str) -> Option<BucketKind> {
        match text {
            "day" => Some(BucketKind::Day),
            "week" => Some(BucketKind::Week),
            "month" => Some(BucketKind::Month),
            _ => None,
        }
    }

    pub fn name(self) -> &'static str {
        match self {
            BucketKind::Day => "day",
            BucketKind::Week => "week",
            BucketKind::Month => "month",
        }
    }

    /// Buckets per year, used to turn a yearly holding rate into a cost per
    /// bucket (365 days, 52 weeks, 12 months: common practice).
    pub fn per_year(self) -> f64 {
        match self {
            BucketKind::Day => 365.0,
            BucketKind::Week => 52.0,
            BucketKind::Month => 12.0,
        }
    }
}

/// Where a date falls relative to the horizon.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DatePlace {
    Before,
    Inside(usize),
    After,
}

/// Buckets 0..periods (shown to people as periods 1..=periods).
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct Calendar {
    pub start: NaiveDate,
    pub kind: BucketKind,
    pub periods: usize,
}

impl Calendar {
    /// The first day of bucket `index` (0-based). Callers keep `index` within
    /// a sane range; the calendar saturates rather than panicking.
    pub fn bucket_start(&self, index: usize) -> NaiveDate {
        let n = index as u64;
        let date = match self.kind {
            BucketKind::Day => self.start.checked_add_days(chrono::Days::new(n)),
            BucketKind::Week => self.start.checked_add_days(chrono::Days::new(n * 7)),
            BucketKind::Month => u32::try_from(index)
                .ok()
                .and_then(|m| self.start.checked_add_months(Months::new(m))),
        };
        date.unwrap_or(NaiveDate::MAX)
    }

    /// The first day of a bucket given by a signed index, so that buckets
    /// before the horizon (a release that lead time pushes before bucket 1)
    /// have a date too.
    pub fn signed_bucket_start(&self, index: i64) -> NaiveDate {
        if index >= 0 {
            return self.bucket_start(index as usize);
        }
        let back = index.unsigned_abs();
        let date = match self.kind {
            BucketKind::Day => self.start.checked_sub_days(chrono::Days::new(back)),
            BucketKind::Week => self.start.checked_sub_days(chrono::Days::new(back * 7)),
            BucketKind::Month => u32::try_from(back)
                .ok()
                .and_then(|m| self.start.checked_sub_months(Months::new(m))),
        };
        date.unwrap_or(NaiveDate::MIN)
    }

    /// The day after the horizon's last bucket.
    pub fn end(&self) -> NaiveDate {
        self.bucket_start(self.periods)
    }

    /// The bucket a date falls in.
    pub fn place(&self, date: NaiveDate) -> DatePlace {
        if date < self.start {
            return DatePlace::Before;
        }
        let index = match self.kind {
            BucketKind::Day => (date - self.start).num_days() as usize,
            BucketKind::Week => (date - self.start).num_days() as usize / 7,
            BucketKind::Month => {
                let months = (date.year() - self.start.year()) * 12 + date.month0() as i32
                    - self.start.month0() as i32;
                months.max(0) as usize
            }
        };
        if index < self.periods {
            DatePlace::Inside(index)
        } else {
            DatePlace::After
        }
    }

    /// The ISO date label of a bucket.
    pub fn label(&self, index: usize) -> String {
        self.bucket_start(index).format("%Y-%m-%d").to_string()
    }

    /// A short label for narrow tables: `01-04` for days and weeks, `2027-01` for months.
    pub fn short_label(&self, index: usize) -> String {
        let date = self.bucket_start(index);
        match self.kind {
            BucketKind::Month => date.format("%Y-%m").to_string(),
            _ => date.format("%m-%d").to_string(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn date(y: i32, m: u32, d: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, d).unwrap()
    }

    #[test]
    fn weeks_start_on_the_start_date() {
        let calendar = Calendar {
            start: date(2027, 1, 6),
            kind: BucketKind::Week,
            periods: 4,
        };
        assert_eq!(calendar.place(date(2027, 1, 5)), DatePlace::Before);
        assert_eq!(calendar.place(date(2027, 1, 6)), DatePlace::Inside(0));
        assert_eq!(calendar.place(date(2027, 1, 12)), DatePlace::Inside(0));
        assert_eq!(calendar.place(date(2027, 1, 13)), DatePlace::Inside(1));
        assert_eq!(calendar.place(date(2027, 2, 2)), DatePlace::Inside(3));
        assert_eq!(calendar.place(date(2027, 2, 3)), DatePlace::After);
        assert_eq!(calendar.label(1), "2027-01-13");
    }

    #[test]
    fn months_follow_the_calendar() {
        let calendar = Calendar {
            start: date(2027, 11, 1),
            kind: BucketKind::Month,
            periods: 3,
        };
        assert_eq!(calendar.place(date(2027, 11, 30)), DatePlace::Inside(0));
        assert_eq!(calendar.place(date(2027, 12, 31)), DatePlace::Inside(1));
        assert_eq!(calendar.place(date(2028, 1, 1)), DatePlace::Inside(2));
        assert_eq!(calendar.place(date(2028, 2, 1)), DatePlace::After);
        assert_eq!(calendar.label(2), "2028-01-01");
        assert_eq!(calendar.end(), date(2028, 2, 1));
    }

    #[test]
    fn days_are_one_bucket_each() {
        let calendar = Calendar {
            start: date(2027, 2, 27),
            kind: BucketKind::Day,
            periods: 3,
        };
        assert_eq!(calendar.place(date(2027, 3, 1)), DatePlace::Inside(2));
        assert_eq!(calendar.place(date(2027, 3, 2)), DatePlace::After);
    }
}
