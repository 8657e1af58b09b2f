//! scenario.toml: the name, the calendar and the currency.

use std::path::Path;

use serde::Deserialize;
use toml::{Spanned, Value};

use crate::error::{Error, Location, Result};
use crate::model::{BucketKind, Calendar};

pub struct Settings {
    pub name: String,
    pub currency: Option<String>,
    pub calendar: Calendar,
    /// Release buckets at the start that take no new orders.
    pub frozen: usize,
}

/// The keys as written; values are checked by hand so that a wrong type or a
/// missing key gets a message a planner can act on, at the value's place.
#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct Raw {
    name: Option<String>,
    start: Option<Spanned<Value>>,
    bucket: Option<Spanned<Value>>,
    periods: Option<Spanned<Value>>,
    currency: Option<String>,
    frozen_periods: Option<Spanned<Value>>,
}

pub fn read(dir: &Path) -> Result<Settings> {
    let path = dir.join("scenario.toml");
    let bytes = std::fs::read(&path).map_err(|e| {
        let message = if e.kind() == std::io::ErrorKind::NotFound {
            "the file is missing; every scenario needs scenario.toml with start, bucket and periods"
                .to_string()
        } else {
            format!("cannot read the file: {e}")
        };
        Error::input(Location::file(&path), message)
    })?;
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(&bytes);
    let text = std::str::from_utf8(bytes).map_err(|e| {
        let good = &bytes[..e.valid_up_to()];
        let line = good.iter().filter(|&&b| b == b'\n').count() as u64 + 1;
        let column = good.iter().rev().take_while(|&&b| b != b'\n').count() + 1;
        Error::input(
            Location {
                file: path.clone(),
                line: Some(line),
                column: Some((column, String::new())),
            },
            "the file is not valid UTF-8 text; save it as UTF-8 and try again",
        )
    })?;
    let raw: Raw = toml::from_str(text).map_err(|e| {
        let (line, column) = e
            .span()
            .map(|span| line_column(text, span.start))
            .unwrap_or((1, 1));
        Error::input(
            Location {
                file: path.clone(),
                line: Some(line),
                column: Some((column, String::new())),
            },
            e.message().to_string(),
        )
    })?;
    let at = |value: &Spanned<Value>, key: &str| {
        let (line, column) = line_column(text, value.span().start);
        Location {
            file: path.clone(),
            line: Some(line),
            column: Some((column, key.to_string())),
        }
    };
    let missing = |key: &str, example: &str| {
        Error::input(
            Location::file(&path),
            format!("the key {key} is missing; add a line such as {key} = {example}"),
        )
    };
    let start_value = raw
        .start
        .ok_or_else(|| missing("start", "\"2027-01-04\""))?;
    let start_text = match start_value.get_ref() {
        Value::String(text) => text.clone(),
        // A bare TOML date (start = 2027-01-04) means the same.
        Value::Datetime(d) if d.date.is_some() && d.time.is_none() => d.to_string(),
        other => {
            let message = match other {
                Value::Datetime(d) => format!("start = {d} carries a time or an offset"),
                _ => format!("start = {other} is not a date"),
            };
            return Err(Error::input(
                at(&start_value, "start"),
                format!("{message}; write it as start = \"YYYY-MM-DD\""),
            ));
        }
    };
    let start = chrono::NaiveDate::parse_from_str(&start_text, "%Y-%m-%d").map_err(|_| {
        Error::input(
            at(&start_value, "start"),
            format!("start = \"{start_text}\" is not a valid date; write it as YYYY-MM-DD"),
        )
    })?;
    let bucket_value = raw.bucket.ok_or_else(|| missing("bucket", "\"week\""))?;
    let kind = match bucket_value.get_ref() {
        Value::String(text) => BucketKind::parse(text),
        _ => None,
    }
    .ok_or_else(|| {
        Error::input(
            at(&bucket_value, "bucket"),
            format!(
                "bucket = {} is not known; use \"day\", \"week\" or \"month\"",
                bucket_value.get_ref()
            ),
        )
    })?;
    if kind == BucketKind::Month && chrono::Datelike::day(&start) != 1 {
        return Err(Error::input(
            at(&start_value, "start"),
            format!("monthly buckets follow calendar months, so start must be the 1st of a month (got {start})"),
        ));
    }
    let periods_value = raw.periods.ok_or_else(|| missing("periods", "13"))?;
    let periods = match periods_value.get_ref() {
        Value::Integer(n) if (1..=100_000).contains(n) => *n as usize,
        other => {
            return Err(Error::input(
                at(&periods_value, "periods"),
                format!(
                    "periods = {other} must be a whole number from 1 to 100000, without quotes"
                ),
            ))
        }
    };
    let calendar = Calendar {
        start,
        kind,
        periods,
    };
    // Dates past 9999 cannot be written as YYYY-MM-DD, so no file could name them.
    let last_day = chrono::NaiveDate::from_ymd_opt(9999, 12, 31).unwrap_or(chrono::NaiveDate::MAX);
    if calendar.end() > last_day {
        return Err(Error::input(
            at(&periods_value, "periods"),
            format!("the horizon of {periods} buckets from {start} runs past the year 9999; use fewer periods or an earlier start"),
        ));
    }
    let frozen = match &raw.frozen_periods {
        None => 0,
        Some(value) => match value.get_ref() {
            Value::Integer(n) if (0..periods as i64).contains(n) => *n as usize,
            other => {
                return Err(Error::input(
                    at(value, "frozen_periods"),
                    format!(
                        "frozen_periods = {other} must be a whole number from 0 to {} (fewer than the {periods} periods), without quotes",
                        periods - 1
                    ),
                ))
            }
        },
    };
    let name = raw.name.unwrap_or_else(|| {
        dir.file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "scenario".to_string())
    });
    Ok(Settings {
        name,
        currency: raw.currency,
        calendar,
        frozen,
    })
}

/// 1-based line and column of a byte offset.
fn line_column(text: &str, offset: usize) -> (u64, usize) {
    let before = &text[..offset.min(text.len())];
    let line = before.matches('\n').count() as u64 + 1;
    let column = before.rsplit('\n').next().map_or(0, |l| l.chars().count()) + 1;
    (line, column)
}
