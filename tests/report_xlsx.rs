//! plan.xlsx read back as a spreadsheet program would: the sheets, numbers
//! stored as numbers that agree with the JSON, dates stored as dates, and
//! frozen header rows.

mod report_fixture;

use std::io::{Cursor, Read};

use calamine::{open_workbook_from_rs, Data, DataType, Range, Reader, Xlsx};
use chrono::NaiveDate;
use report_fixture::{folder, plan_out, MARKUP_ID};
use serde_json::Value;

struct Book {
    bytes: Vec<u8>,
    json: Value,
}

fn book() -> Book {
    let dir = folder();
    let parent = tempfile::tempdir().unwrap();
    let out = parent.path().join("out");
    let json = plan_out(dir.path(), &out);
    let bytes = std::fs::read(out.join("plan.xlsx")).expect("plan.xlsx written");
    Book { bytes, json }
}

fn sheet(book: &Book, name: &str) -> Range<Data> {
    let mut workbook: Xlsx<_> =
        open_workbook_from_rs(Cursor::new(book.bytes.clone())).expect("calamine opens plan.xlsx");
    workbook
        .worksheet_range(name)
        .unwrap_or_else(|e| panic!("sheet {name}: {e}"))
}

/// The number beside a label in column A of the summary.
fn summary_value(range: &Range<Data>, label: &str) -> f64 {
    let row = range
        .rows()
        .find(|row| row.first().and_then(|c| c.get_string()) == Some(label))
        .unwrap_or_else(|| panic!("a summary row {label:?}"));
    match row.get(1) {
        Some(Data::Float(v)) => *v,
        other => panic!("{label}: a number cell, got {other:?}"),
    }
}

/// A header row's column index.
fn column(range: &Range<Data>, header: &str) -> usize {
    let first = range.rows().next().expect("a header row");
    first
        .iter()
        .position(|c| c.get_string() == Some(header))
        .unwrap_or_else(|| panic!("a column {header:?} in {first:?}"))
}

fn excel_serial(date: NaiveDate) -> f64 {
    let epoch = NaiveDate::from_ymd_opt(1899, 12, 30).unwrap();
    (date - epoch).num_days() as f64
}

#[test]
fn the_sheets_are_there_in_order() {
    let book = book();
    let workbook: Xlsx<_> = open_workbook_from_rs(Cursor::new(book.bytes.clone())).unwrap();
    assert_eq!(
        workbook.sheet_names(),
        [
            "Summary",
            "Orders",
            "Stock records",
            "Capacity",
            "Comparison"
        ]
    );
}

#[test]
fn costs_are_numbers_equal_to_the_json() {
    let book = book();
    let summary = sheet(&book, "Summary");
    let total = summary_value(&summary, "Total cost (EUR)");
    let expected = book.json["total_cost"].as_f64().unwrap();
    assert!((total - expected).abs() < 1e-6, "{total} vs {expected}");
    let setup = summary_value(&summary, "Setup cost (EUR)");
    assert!((setup - book.json["costs"]["setup"].as_f64().unwrap()).abs() < 1e-6);

    let comparison = sheet(&book, "Comparison");
    let method = column(&comparison, "Method");
    let cost = column(&comparison, "Total cost (EUR)");
    for row in book.json["comparison"].as_array().unwrap() {
        let name = row["method"].as_str().unwrap();
        let cells = comparison
            .rows()
            .find(|r| r[method].get_string() == Some(name))
            .unwrap_or_else(|| panic!("a comparison row for {name}"));
        match &cells[cost] {
            Data::Float(v) => {
                let json = row["total_cost"].as_f64().unwrap();
                assert!((v - json).abs() < 1e-6, "{name}: {v} vs {json}");
            }
            other => panic!("{name}: total cost stored as {other:?}"),
        }
    }
}

#[test]
fn order_dates_are_dates_and_quantities_match() {
    let book = book();
    let orders = sheet(&book, "Orders");
    let json_orders = book.json["orders"].as_array().unwrap();
    assert_eq!(orders.height(), 1 + json_orders.len());
    let date = column(&orders, "Receipt date");
    let quantity = column(&orders, "Quantity");
    for (row, order) in orders.rows().skip(1).zip(json_orders) {
        assert_eq!(row[0].get_string(), order["item"].as_str());
        match &row[date] {
            Data::DateTime(d) => {
                assert!(d.is_datetime(), "a date, not a duration");
                let expected: NaiveDate = order["date"].as_str().unwrap().parse().unwrap();
                assert_eq!(d.as_f64(), excel_serial(expected));
            }
            other => panic!("receipt date stored as {other:?}"),
        }
        match &row[quantity] {
            Data::Float(q) => {
                assert!((q - order["quantity"].as_f64().unwrap()).abs() < 1e-6);
            }
            other => panic!("quantity stored as {other:?}"),
        }
    }
    // The item id with markup is kept as it is: a spreadsheet is not HTML.
    assert!(orders.rows().any(|r| r[0].get_string() == Some(MARKUP_ID)));
}

#[test]
fn capacity_sheet_marks_the_reduced_week() {
    let book = book();
    let capacity = sheet(&book, "Capacity");
    let period = column(&capacity, "Period");
    let regular = column(&capacity, "Regular capacity");
    let reduced = column(&capacity, "Reduced capacity");
    let rows: Vec<&[Data]> = capacity.rows().skip(1).collect();
    assert_eq!(rows.len(), 8);
    for row in rows {
        let week = match row[period] {
            Data::Float(p) => p as usize,
            ref other => panic!("period stored as {other:?}"),
        };
        let marked = row[reduced].get_string() == Some("yes");
        assert_eq!(marked, week == 3, "week {week}");
        if week == 3 {
            assert_eq!(row[regular], Data::Float(500.0));
        }
    }
}

#[test]
fn table_headers_are_frozen() {
    // calamine does not read panes, so the sheet XML is read directly.
    let book = book();
    let mut archive = zip::ZipArchive::new(Cursor::new(book.bytes.clone())).unwrap();
    for (k, name) in ["Orders", "Stock records", "Capacity", "Comparison"]
        .iter()
        .enumerate()
    {
        let mut xml = String::new();
        archive
            .by_name(&format!("xl/worksheets/sheet{}.xml", k + 2))
            .unwrap()
            .read_to_string(&mut xml)
            .unwrap();
        assert!(
            xml.contains("ySplit=\"1\"") && xml.contains("state=\"frozen\""),
            "{name}: the header row is frozen"
        );
        assert!(
            xml.contains("<autoFilter"),
            "{name}: a filter on the header"
        );
        assert!(xml.contains("<col "), "{name}: column widths are set");
    }
}
