//! plan.xlsx written by `plan --out`: the summary, the orders, the stock
//! records, the capacity load and the comparison of methods, as a
//! spreadsheet a manager can sort and filter. Numbers are stored as
//! numbers and dates as dates; each table's header row is frozen.

use chrono::{Datelike, NaiveDate};
use rust_xlsxwriter::{
    Color, DocProperties, ExcelDateTime, Format, FormatAlign, FormatBorder, Workbook, Worksheet,
    XlsxError,
};

use crate::error::{Error, Result};
use crate::model::Scenario;
use crate::solve::Outcome;

mod sheets;

/// One cell of a table, typed so that the spreadsheet stores it as it is.
enum Cell {
    Text(String),
    Money(f64),
    Quantity(f64),
    Count(usize),
    /// A bucket number that may lie before bucket 1 (0 or less).
    Period(i64),
    /// A fraction shown as a percentage.
    Percent(f64),
    /// A small fraction shown with two decimals (a gap).
    FinePercent(f64),
    /// A figure with one decimal (weeks of cover).
    Decimal(f64),
    Date(NaiveDate),
    /// A date in a list of labels and values, aligned with the text.
    DateLeft(NaiveDate),
    /// A yes/no column, centred so it reads apart from the numbers.
    Flag(&'static str),
    Empty,
}

struct Formats {
    title: Format,
    header: Format,
    label: Format,
    money: Format,
    whole: Format,
    fraction: Format,
    percent: Format,
    fine_percent: Format,
    decimal: Format,
    date: Format,
    date_left: Format,
    note: Format,
    flag: Format,
}

impl Formats {
    fn new() -> Formats {
        let number = |pattern: &str| Format::new().set_num_format(pattern);
        Formats {
            title: Format::new().set_bold().set_font_size(14),
            header: Format::new()
                .set_bold()
                .set_text_wrap()
                .set_align(FormatAlign::Top)
                .set_background_color(Color::RGB(0xE8EEF4))
                .set_border_bottom(FormatBorder::Thin),
            label: Format::new().set_bold(),
            money: number("#,##0.00"),
            whole: number("#,##0"),
            // At least one decimal, at most three: 1,199.2 and 1,264.722.
            fraction: number("#,##0.0##"),
            percent: number("0.0%"),
            fine_percent: number("0.00%"),
            decimal: number("0.0"),
            date: number("yyyy-mm-dd").set_align(FormatAlign::Center),
            date_left: number("yyyy-mm-dd").set_align(FormatAlign::Left),
            flag: Format::new().set_align(FormatAlign::Center),
            note: Format::new()
                .set_italic()
                .set_text_wrap()
                .set_align(FormatAlign::Top),
        }
    }
}

fn xlsx_error(e: XlsxError) -> Error {
    Error::Internal(format!("writing plan.xlsx: {e}"))
}

fn excel_date(date: NaiveDate) -> Option<ExcelDateTime> {
    let year = u16::try_from(date.year()).ok()?;
    ExcelDateTime::from_ymd(year, date.month() as u8, date.day() as u8).ok()
}

fn write_cell(
    sheet: &mut Worksheet,
    row: u32,
    col: u16,
    cell: &Cell,
    f: &Formats,
) -> std::result::Result<(), XlsxError> {
    match cell {
        Cell::Text(text) => sheet.write_string(row, col, text).map(drop),
        Cell::Money(v) => sheet
            .write_number_with_format(row, col, super::clean(*v), &f.money)
            .map(drop),
        Cell::Quantity(v) => {
            // Solver noise (1e-8 left of a whole stock) must not read -0.
            let v = super::clean(*v);
            let v = if v.abs() < 1e-6 { 0.0 } else { v };
            let format = if (v - v.round()).abs() < 5e-4 {
                &f.whole
            } else {
                &f.fraction
            };
            sheet
                .write_number_with_format(row, col, v, format)
                .map(drop)
        }
        Cell::Count(n) => sheet.write_number(row, col, *n as f64).map(drop),
        Cell::Period(n) => sheet.write_number(row, col, *n as f64).map(drop),
        Cell::FinePercent(v) => sheet
            .write_number_with_format(row, col, super::clean(*v), &f.fine_percent)
            .map(drop),
        Cell::Percent(v) => sheet
            .write_number_with_format(row, col, super::clean(*v), &f.percent)
            .map(drop),
        Cell::Decimal(v) => sheet
            .write_number_with_format(row, col, super::clean(*v), &f.decimal)
            .map(drop),
        Cell::Date(date) | Cell::DateLeft(date) => match excel_date(*date) {
            Some(d) => {
                let format = match cell {
                    Cell::DateLeft(_) => &f.date_left,
                    _ => &f.date,
                };
                sheet
                    .write_datetime_with_format(row, col, &d, format)
                    .map(drop)
            }
            None => sheet
                .write_string(row, col, date.format("%Y-%m-%d").to_string())
                .map(drop),
        },
        Cell::Flag(text) => sheet
            .write_string_with_format(row, col, *text, &f.flag)
            .map(drop),
        Cell::Empty => Ok(()),
    }
}

/// Writes a table from `top`: a frozen, filterable header row and the rows.
fn table(
    sheet: &mut Worksheet,
    top: u32,
    columns: &[(&str, f64)],
    rows: &[Vec<Cell>],
    f: &Formats,
) -> std::result::Result<(), XlsxError> {
    for (c, (header, width)) in columns.iter().enumerate() {
        let c = c as u16;
        sheet.write_string_with_format(top, c, *header, &f.header)?;
        sheet.set_column_width(c, *width)?;
    }
    // Headers wrap: room for the longest one at about one character per
    // unit of column width.
    let lines = columns
        .iter()
        .map(|(header, width)| (header.chars().count() as f64 / (width - 1.0).max(1.0)).ceil())
        .fold(1.0, f64::max);
    sheet.set_row_height(top, 15.0 * lines + 2.0)?;
    for (r, row) in rows.iter().enumerate() {
        for (c, cell) in row.iter().enumerate() {
            write_cell(sheet, top + 1 + r as u32, c as u16, cell, f)?;
        }
    }
    Ok(())
}

/// A sheet that is one table: header frozen, filter on, header repeated on
/// printed pages.
fn table_sheet(
    name: &str,
    columns: &[(&str, f64)],
    rows: &[Vec<Cell>],
    frozen_columns: u16,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let mut sheet = Worksheet::new();
    sheet.set_name(name)?;
    table(&mut sheet, 0, columns, rows, f)?;
    sheet.set_freeze_panes(1, frozen_columns)?;
    let last_row = rows.len() as u32;
    sheet.autofilter(0, 0, last_row, columns.len() as u16 - 1)?;
    sheet.set_repeat_rows(0, 0)?;
    sheet.set_landscape();
    sheet.set_print_fit_to_pages(1, 0);
    Ok(sheet)
}

/// The unit of money for headers: ` (EUR)`, or nothing.
fn in_currency(scenario: &Scenario) -> String {
    scenario
        .currency
        .as_ref()
        .map(|c| format!(" ({c})"))
        .unwrap_or_default()
}

fn yes_no(value: bool) -> &'static str {
    if value {
        "yes"
    } else {
        "no"
    }
}

/// The whole workbook as bytes. The same input gives the same bytes: the
/// file's creation date is the scenario's start date, not the clock.
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Result<Vec<u8>> {
    let f = Formats::new();
    let mut workbook = Workbook::new();
    // A date before 1900 has no spreadsheet date; a fixed one keeps the
    // bytes stable all the same.
    let created =
        excel_date(scenario.calendar.start).or_else(|| ExcelDateTime::from_ymd(2000, 1, 1).ok());
    if let Some(start) = created {
        workbook.set_properties(
            &DocProperties::new()
                .set_title(format!("Plan: {}", scenario.name))
                .set_creation_datetime(&start),
        );
    }
    let sheets = [
        sheets::summary(scenario, outcome, &f),
        sheets::orders(scenario, outcome, &f),
        sheets::stock_records(scenario, outcome, &f),
        sheets::capacity(scenario, outcome, &f),
        sheets::comparison(scenario, outcome, &f),
    ];
    for sheet in sheets {
        workbook.push_worksheet(sheet.map_err(xlsx_error)?);
    }
    workbook.save_to_buffer().map_err(xlsx_error)
}
