//! scenario.toml: the name, the calendar and the currency.

use std::path::Path;

use serde::Deserialize;

use crate::error::{Error, Location, Result};
use crate::model::{BucketKind, Calendar};

pub struct Settings {
    pub name: String,
    pub currency: Option<String>,
    pub calendar: Calendar,
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct Raw {
    name: Option<String>,
    start: String,
    bucket: String,
    periods: i64,
    currency: Option<String>,
}

pub fn read(dir: &Path) -> Result<Settings> {
    let path = dir.join("scenario.toml");
    let text = std::fs::read(&path).map_err(|e| {
        let message = if e.kind() == std::io::ErrorKind::NotFound {
            "the file is missing; every scenario needs scenario.toml with start, bucket and periods"
                .to_string()
        } else {
            format!("cannot read the file: {e}")
        };
        Error::input(Location::file(&path), message)
    })?;
    let text = String::from_utf8(text)
        .map_err(|_| Error::input(Location::file(&path), "the file is not valid UTF-8 text"))?;
    let text = text.strip_prefix('\u{feff}').unwrap_or(&text);
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
    let at = |key: &str| {
        let (line, column) = text
            .find(key)
            .map(|offset| line_column(text, offset))
            .unwrap_or((1, 1));
        Location {
            file: path.clone(),
            line: Some(line),
            column: Some((column, key.to_string())),
        }
    };
    let start = chrono::NaiveDate::parse_from_str(&raw.start, "%Y-%m-%d").map_err(|_| {
        Error::input(
            at("start"),
            format!(
                "start = \"{}\" is not a valid date; write it as YYYY-MM-DD",
                raw.start
            ),
        )
    })?;
    let kind = BucketKind::parse(&raw.bucket).ok_or_else(|| {
        Error::input(
            at("bucket"),
            format!(
                "bucket = \"{}\" is not known; use day, week or month",
                raw.bucket
            ),
        )
    })?;
    if kind == BucketKind::Month && chrono::Datelike::day(&start) != 1 {
        return Err(Error::input(
            at("start"),
            format!("monthly buckets follow calendar months, so start must be the 1st of a month (got {start})"),
        ));
    }
    if raw.periods < 1 || raw.periods > 100_000 {
        return Err(Error::input(
            at("periods"),
            format!(
                "periods = {} must be a whole number from 1 to 100000",
                raw.periods
            ),
        ));
    }
    let name = raw.name.unwrap_or_else(|| {
        dir.file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "scenario".to_string())
    });
    Ok(Settings {
        name,
        currency: raw.currency,
        calendar: Calendar {
            start,
            kind,
            periods: raw.periods as usize,
        },
    })
}

/// 1-based line and column of a byte offset.
fn line_column(text: &str, offset: usize) -> (u64, usize) {
    let before = &text[..offset.min(text.len())];
    let line = before.matches('\n').count() as u64 + 1;
    let column = before.rsplit('\n').next().map_or(0, |l| l.chars().count()) + 1;
    (line, column)
}
