//! The one CSV reader every scenario file goes through: header checks,
//! byte-order mark and CRLF tolerance, a clear word on semicolons, and cell
//! parsing that reports file, line and column.

use std::path::{Path, PathBuf};

use crate::error::{Error, Location, Result};

/// The columns a file may carry.
pub struct Schema {
    pub known: &'static [&'static str],
    pub required: &'static [&'static str],
}

/// One data row: its 1-based line number and where its trimmed cells lie
/// in the file's one buffer (so a large file costs no allocation a row).
pub struct Record {
    pub line: u64,
    /// Index of its first cell in `CsvFile::bounds`, and how many cells.
    first: usize,
    cells: usize,
}

/// A CSV file read whole and checked against its schema.
pub struct CsvFile {
    pub path: PathBuf,
    columns: Vec<String>,
    pub records: Vec<Record>,
    /// Every trimmed cell of the file, one after the other.
    text: String,
    /// Cell `k` of the file is `text[bounds[k]..bounds[k + 1]]`.
    bounds: Vec<usize>,
}

/// The longest unit of measure accepted (it heads table columns).
pub const MAX_UNIT_CHARS: usize = 24;

/// A cell with its place, ready to be parsed. The place is written out
/// only for an error, so that reading millions of good cells costs no
/// copies of the file's path and the column's name.
pub struct Cell<'a> {
    pub text: &'a str,
    path: &'a Path,
    line: u64,
    /// 1-based column number and name.
    column: usize,
    name: &'a str,
}

impl CsvFile {
    /// Reads `dir/name`. Returns `Ok(None)` when the file is absent and not required.
    pub fn open(
        dir: &Path,
        name: &str,
        schema: &Schema,
        required: bool,
    ) -> Result<Option<CsvFile>> {
        let path = dir.join(name);
        if !path.exists() {
            if required {
                return Err(Error::input(
                    Location::file(&path),
                    format!("the file is missing; every scenario needs {name}"),
                ));
            }
            return Ok(None);
        }
        let bytes = std::fs::read(&path).map_err(|e| {
            Error::input(Location::file(&path), format!("cannot read the file: {e}"))
        })?;
        CsvFile::parse(&path, &bytes, schema).map(Some)
    }

    /// Parses the bytes of a file (exposed for tests and for plan files).
    pub fn parse(path: &Path, bytes: &[u8], schema: &Schema) -> Result<CsvFile> {
        let source = decode(path, bytes)?;
        let mut reader = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .from_reader(source.as_bytes());
        let mut text = String::new();
        let mut bounds = vec![0];
        let mut rows = Vec::new();
        let mut row = csv::ByteRecord::new();
        loop {
            let more = reader.read_byte_record(&mut row).map_err(|e| {
                let line = e.position().map(|p| p.line()).unwrap_or(0);
                Error::input(
                    Location::line(path, line),
                    format!("cannot read this CSV row: {e}"),
                )
            })?;
            if !more {
                break;
            }
            let line = row.position().map(|p| p.line()).unwrap_or(0);
            let first = bounds.len() - 1;
            for field in &row {
                // The source is UTF-8 and cells end at ASCII commas, so
                // every cell is UTF-8 too.
                let cell = std::str::from_utf8(field).map_err(|_| {
                    Error::input(Location::line(path, line), "the row is not valid UTF-8")
                })?;
                text.push_str(cell.trim());
                bounds.push(text.len());
            }
            if bounds[first] == text.len() {
                bounds.truncate(first + 1); // blank lines are harmless
                continue;
            }
            rows.push(Record {
                line,
                first,
                cells: row.len(),
            });
        }
        let mut file = CsvFile {
            path: path.to_path_buf(),
            columns: Vec::new(),
            records: Vec::new(),
            text,
            bounds,
        };
        let mut rows = rows.into_iter();
        let header = rows.next().ok_or_else(|| {
            Error::input(
                Location::file(path),
                format!(
                    "the file is empty; it needs a header row with the columns {}",
                    schema.required.join(", ")
                ),
            )
        })?;
        let names: Vec<String> = file.cells(&header).map(str::to_string).collect();
        file.columns = check_header(path, header.line, names, schema)?;
        file.records = rows.collect();
        for record in &file.records {
            if record.cells != file.columns.len() {
                let what = if record.cells < file.columns.len() {
                    "too few"
                } else {
                    "too many"
                };
                return Err(Error::input(
                    Location::line(path, record.line),
                    format!(
                        "this row has {} cells but the header has {} columns ({what} cells)",
                        record.cells,
                        file.columns.len()
                    ),
                ));
            }
        }
        Ok(file)
    }

    /// The trimmed cells of a row, in order.
    fn cells<'a>(&'a self, record: &Record) -> impl Iterator<Item = &'a str> + 'a {
        let range = record.first..record.first + record.cells;
        range.map(|k| &self.text[self.bounds[k]..self.bounds[k + 1]])
    }

    /// The column called `name`. A file has a handful of columns, so a
    /// look along them is quicker than hashing the name for every cell.
    fn column(&self, name: &str) -> Option<usize> {
        self.columns.iter().position(|c| c == name)
    }

    pub fn has_column(&self, name: &str) -> bool {
        self.column(name).is_some()
    }

    /// The cell of `record` in column `name`; `None` when the column is absent
    /// or the cell is empty (empty cells take the default).
    pub fn cell<'a>(&'a self, record: &'a Record, name: &str) -> Option<Cell<'a>> {
        let column = self.column(name)?;
        let k = record.first + column;
        let text = if column < record.cells {
            &self.text[self.bounds[k]..self.bounds[k + 1]]
        } else {
            ""
        };
        if text.is_empty() {
            return None;
        }
        Some(Cell {
            text,
            path: &self.path,
            line: record.line,
            column: column + 1,
            name: &self.columns[column],
        })
    }

    /// The cell of a required column, or an error saying it is empty.
    pub fn required<'a>(&'a self, record: &'a Record, name: &str) -> Result<Cell<'a>> {
        self.cell(record, name).ok_or_else(|| {
            let column = self.column(name).unwrap_or(0);
            Error::input(
                Location::cell(&self.path, record.line, column + 1, name),
                format!("the {name} cell is empty; it needs a value"),
            )
        })
    }

    /// The location of a whole row, for errors about the row as a whole.
    pub fn row_location(&self, record: &Record) -> Location {
        Location::line(&self.path, record.line)
    }
}

impl<'a> Cell<'a> {
    pub fn location(&self) -> Location {
        Location::cell(self.path, self.line, self.column, self.name)
    }

    pub fn error(&self, message: impl Into<String>) -> Error {
        Error::input(self.location(), message)
    }

    /// A finite decimal number, with a helpful word for the usual mistakes.
    pub fn number(&self) -> Result<f64> {
        let text = self.text;
        match text.parse::<f64>() {
            Ok(value) if value.is_finite() => {
                if value.abs() > 1e12 {
                    Err(self.error(format!(
                        "{text} is too large; numbers must lie within +-1e12"
                    )))
                } else {
                    Ok(value)
                }
            }
            Ok(_) => Err(self.error(format!("{text} is not a finite number"))),
            Err(_) => Err(self.error(not_a_number(text))),
        }
    }

    /// A unit of measure (kegs, cartons, kg, hours): it names what is
    /// counted, so it starts with a letter (a number here is a value in the
    /// wrong column), holds no control characters and stays short enough
    /// for a table header.
    pub fn unit(&self) -> Result<String> {
        let text = self.text;
        if !text.chars().next().is_some_and(char::is_alphabetic) {
            return Err(self.error(format!(
                "{text} is not a unit; a unit names what is counted and starts with a letter, such as pieces, kegs, cartons, kg or hours"
            )));
        }
        if text.chars().any(char::is_control) {
            return Err(self.error(
                "the unit holds a control character (a tab or line break); write it on one line, such as cartons",
            ));
        }
        if text.chars().count() > MAX_UNIT_CHARS {
            return Err(self.error(format!(
                "the unit {text} is longer than {MAX_UNIT_CHARS} characters; use a short name, such as kg or cartons, and put notes in an x_ column"
            )));
        }
        Ok(text.to_string())
    }

    /// A number that is zero or more.
    pub fn non_negative(&self) -> Result<f64> {
        let value = self.number()?;
        if value < 0.0 {
            return Err(self.error(format!("{} must not be negative", self.text)));
        }
        Ok(value)
    }

    /// A number that is more than zero.
    pub fn positive(&self) -> Result<f64> {
        let value = self.number()?;
        if value <= 0.0 {
            return Err(self.error(format!("{} must be more than zero", self.text)));
        }
        Ok(value)
    }

    /// A whole number zero or more (counts of buckets, periods).
    pub fn whole(&self) -> Result<usize> {
        let value = self.number()?;
        if value < 0.0 || value.fract() != 0.0 {
            return Err(self.error(format!("{} must be a whole number of 0 or more", self.text)));
        }
        if value > 1e9 {
            return Err(self.error(format!("{} is too large", self.text)));
        }
        Ok(value as usize)
    }

    /// An ISO date.
    pub fn date(&self) -> Result<chrono::NaiveDate> {
        chrono::NaiveDate::parse_from_str(self.text, "%Y-%m-%d").map_err(|_| {
            self.error(format!(
                "{} is not a valid date; write dates as YYYY-MM-DD (for example 2027-01-04)",
                self.text
            ))
        })
    }
}

fn not_a_number(text: &str) -> String {
    if let Some(c) = text.chars().find(|c| c.is_control()) {
        return format!(
            "{} holds an invisible control character (U+{:04X}); remove it, or export the file again as plain CSV",
            text.escape_debug(),
            c as u32
        );
    }
    if chrono::NaiveDate::parse_from_str(text, "%Y-%m-%d").is_ok() {
        return format!(
            "{text} is a date, not a number; give dates in a date column instead of period"
        );
    }
    let digits_then_text = text
        .trim_start_matches(|c: char| c.is_ascii_digit() || c == '.' || c == '-')
        .trim();
    if text.contains(',') && text.replace(',', "").parse::<f64>().is_ok() {
        format!("{text} is not a number; write numbers without thousands separators or decimal commas (for example 1234.5)")
    } else if digits_then_text.len() < text.len() && !digits_then_text.is_empty() {
        format!(
            "{text} is not a number; write the number alone, without a unit ({digits_then_text})"
        )
    } else {
        format!("{text} is not a number")
    }
}

fn decode<'a>(path: &Path, bytes: &'a [u8]) -> Result<&'a str> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    match std::str::from_utf8(bytes) {
        Ok(text) => Ok(text),
        Err(e) => {
            let good = &bytes[..e.valid_up_to()];
            let line = good.iter().filter(|&&b| b == b'\n').count() as u64 + 1;
            let column = good.iter().rev().take_while(|&&b| b != b'\n').count() + 1;
            Err(Error::input(
                Location {
                    file: path.to_path_buf(),
                    line: Some(line),
                    column: Some((column, String::new())),
                },
                "the file is not valid UTF-8 text; save it as UTF-8 (CSV UTF-8) and try again",
            ))
        }
    }
}

fn check_header(
    path: &Path,
    line: u64,
    columns: Vec<String>,
    schema: &Schema,
) -> Result<Vec<String>> {
    if columns.len() == 1 && columns[0].contains(';') {
        return Err(Error::input(
            Location::line(path, line),
            "the file looks semicolon-delimited; lotwright reads comma-separated files: export with commas as the delimiter",
        ));
    }
    if columns.len() == 1 && columns[0].contains('\t') {
        return Err(Error::input(
            Location::line(path, line),
            "the file looks tab-delimited; lotwright reads comma-separated files: export with commas as the delimiter",
        ));
    }
    for (i, name) in columns.iter().enumerate() {
        let location = Location::cell(path, line, i + 1, name);
        if name.is_empty() {
            return Err(Error::input(
                location,
                "this column has no name in the header",
            ));
        }
        if columns[..i].contains(name) {
            return Err(Error::input(
                location,
                format!("the column {name} appears twice"),
            ));
        }
        if name.starts_with("x_") || schema.known.contains(&name.as_str()) {
            continue;
        }
        let lower = name.to_lowercase();
        let message = if schema.known.contains(&lower.as_str()) {
            format!("unknown column {name}; column names are lower case: write {lower}")
        } else {
            match closest(name, schema.known) {
                Some(near) => format!("unknown column {name}; did you mean {near}? (columns for notes start with x_)"),
                None => format!(
                    "unknown column {name}; the known columns are {} (columns for notes start with x_)",
                    schema.known.join(", ")
                ),
            }
        };
        return Err(Error::input(location, message));
    }
    for required in schema.required {
        if !columns.iter().any(|c| c == required) {
            return Err(Error::input(
                Location::line(path, line),
                format!("the required column {required} is missing from the header"),
            ));
        }
    }
    Ok(columns)
}

/// The known name nearest to `name` by edit distance, when it is near enough.
fn closest(name: &str, known: &[&'static str]) -> Option<&'static str> {
    let name = name.to_lowercase();
    known
        .iter()
        .map(|k| (edit_distance(&name, k), *k))
        .filter(|(d, k)| *d <= 2.max(k.len() / 3))
        .min_by_key(|(d, _)| *d)
        .map(|(_, k)| k)
}

fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let mut previous: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.iter().enumerate() {
        let mut current = vec![i + 1; b.len() + 1];
        for (j, cb) in b.iter().enumerate() {
            let substitution = previous[j] + usize::from(ca != cb);
            current[j + 1] = substitution.min(previous[j + 1] + 1).min(current[j] + 1);
        }
        previous = current;
    }
    previous[b.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    const SCHEMA: Schema = Schema {
        known: &["item", "setup_cost", "holding_cost"],
        required: &["item"],
    };

    fn parse(text: &[u8]) -> Result<CsvFile> {
        CsvFile::parse(Path::new("items.csv"), text, &SCHEMA)
    }

    #[test]
    fn accepts_bom_and_crlf() {
        let file = parse(b"\xEF\xBB\xBFitem,setup_cost\r\nA,10\r\n").unwrap();
        assert_eq!(file.records.len(), 1);
        let cell = file.cell(&file.records[0], "setup_cost").unwrap();
        assert_eq!(cell.number().unwrap(), 10.0);
    }

    #[test]
    fn cells_are_trimmed_and_blank_rows_skipped() {
        let text = "item,setup_cost\n  A , 10 \n , \n\"B \",\u{a0}5\u{a0}\nC\n";
        let file = parse(text.as_bytes());
        let err = file.err().unwrap().to_string();
        assert!(err.contains("line 5") && err.contains("too few"), "{err}");
        let file = parse(&text.as_bytes()[..text.len() - 2]).unwrap();
        let rows: Vec<(u64, &str, f64)> = file
            .records
            .iter()
            .map(|r| {
                let id = file.cell(r, "item").unwrap().text;
                (
                    r.line,
                    id,
                    file.cell(r, "setup_cost").unwrap().number().unwrap(),
                )
            })
            .collect();
        assert_eq!(rows, vec![(2, "A", 10.0), (4, "B", 5.0)]);
    }

    #[test]
    fn suggests_the_closest_column() {
        let err = parse(b"item,setup_cots\nA,1\n").err().unwrap().to_string();
        assert!(err.contains("did you mean setup_cost"), "{err}");
        assert!(err.contains("items.csv, line 1, column 2"), "{err}");
    }

    #[test]
    fn says_when_the_file_uses_semicolons() {
        let err = parse(b"item;setup_cost\nA;1\n").err().unwrap().to_string();
        assert!(err.contains("semicolon"), "{err}");
    }

    #[test]
    fn numbers_with_units_are_explained() {
        let file = parse(b"item,setup_cost\nA,12 pcs\n").unwrap();
        let err = file.cell(&file.records[0], "setup_cost").unwrap().number();
        let err = err.err().unwrap().to_string();
        assert!(err.contains("without a unit"), "{err}");
        assert!(err.contains("line 2, column 2 (setup_cost)"), "{err}");
    }

    #[test]
    fn short_rows_are_refused() {
        let err = parse(b"item,setup_cost\nA\n").err().unwrap().to_string();
        assert!(err.contains("line 2") && err.contains("too few"), "{err}");
    }

    #[test]
    fn bad_utf8_is_located() {
        let err = parse(b"item,setup_cost\nA\xff,1\n")
            .err()
            .unwrap()
            .to_string();
        assert!(
            err.contains("line 2, column 2") && err.contains("UTF-8"),
            "{err}"
        );
    }
}
