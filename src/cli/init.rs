//! `lotwright init DIR`: a small starter scenario, every file present and
//! explained, that `plan` accepts as it is. The CSV reader takes no
//! comments, so the explanations live in README.txt and in `x_note`
//! columns. The folder is written whole or not at all.

use std::path::{Path, PathBuf};

use lotwright::error::{Error, Result};

const SCENARIO: &str = r#"# A starter scenario written by `lotwright init`. Every figure in these files
# is invented: replace them with your own. README.txt explains each file.

# Shown at the top of every report.
name = "Starter scenario"
# The first day of bucket 1, as an ISO date (for monthly buckets the 1st).
start = "2027-01-04"
# The length of a bucket: day, week (7 days from the start) or month.
bucket = "week"
# How many buckets the plan covers.
periods = 8
# A label for money in the reports; no conversion is done.
currency = "EUR"
"#;

const ITEMS: &str = "\
item,setup_cost,holding_cost,holding_rate,unit_cost,initial_stock,safety_stock,lead_time,min_lot,lot_multiple,fixed_lot,x_note
BOX-S,120,0.05,,2.40,300,100,0,,,800,small box - made on LINE-1 - the plant orders 800 at a time today
BOX-L,150,0.08,,3.10,200,50,0,200,50,600,large box - made on LINE-1 in multiples of 50 and at least 200
LID,60,,0.25,0.90,500,,1,,,1500,lid - bought in - one week lead time - holding is 25 % a year of the unit cost
";

const DEMAND: &str = "\
item,period,quantity,x_note
BOX-S,1,380,forecast
BOX-S,2,420,forecast
BOX-S,3,360,forecast
BOX-S,4,450,forecast
BOX-S,5,500,forecast
BOX-S,6,470,forecast
BOX-S,7,430,forecast
BOX-S,8,400,forecast
BOX-L,1,250,firm orders
BOX-L,2,280,firm orders
BOX-L,3,240,forecast
BOX-L,4,300,forecast
BOX-L,5,330,forecast
BOX-L,6,310,forecast
BOX-L,7,290,forecast
BOX-L,8,260,forecast
LID,1,600,forecast
LID,2,650,forecast
LID,3,580,forecast
LID,4,700,forecast
LID,5,760,forecast
LID,6,720,forecast
LID,7,680,forecast
LID,8,640,forecast
";

const RECEIPTS: &str = "\
item,period,quantity,x_note
LID,1,1000,purchase order already placed with the supplier
";

const COSTS: &str = "\
item,period,setup_cost,holding_cost,unit_cost,x_note
BOX-S,5,180,,,setup surcharge in a busy week
LID,6,,,0.95,supplier price rise from week 6
";

const RESOURCES: &str = "\
resource,capacity,overtime_capacity,overtime_cost,x_note
LINE-1,2400,480,0.75,minutes a week - 5 days of 480 minutes - a Saturday of overtime at 0.75 EUR a minute
";

const CAPACITY: &str = "\
resource,period,capacity,overtime_capacity,x_note
LINE-1,3,1920,,public holiday - four working days
";

const ROUTING: &str = "\
item,resource,per_unit,setup_time,x_note
BOX-S,LINE-1,1.2,45,minutes per box and per changeover
BOX-L,LINE-1,1.8,60,minutes per box and per changeover
";

const README: &str = "\
Starter scenario written by `lotwright init`
============================================

Every figure here is invented. Change the files to describe your own items,
demand and machines, then run:

    lotwright plan FOLDER               the plan and the comparison with the lot rules
    lotwright plan FOLDER --out NEW     the same, also written as CSV files, a
                                        spreadsheet (plan.xlsx) and a web page
                                        (report.html) in the new folder NEW

where FOLDER is this folder.

Columns are lower case. Empty cells take their default. A column whose name
starts with x_ is a note for people; lotwright ignores it. Numbers use a
decimal point and no thousands separators. Rows that belong to a bucket name
it by `period` (1 = the first bucket) or by `date` (an ISO date inside it).

scenario.toml  name, start (first day of bucket 1), bucket (day, week or
               month), periods (how many buckets), currency (a label).

items.csv      one row per item. Required: item, setup_cost (cost of one
               setup or order), and holding_cost (per unit per bucket) or
               holding_rate (per year, times unit_cost). Optional: unit_cost,
               initial_stock, safety_stock (a floor on end-of-bucket stock),
               lead_time (buckets from release to receipt), min_lot,
               lot_multiple (empty: whole units; 0: continuous, for bulk
               goods in kg or litres), max_lot, backlog_cost (per unit per
               bucket; empty means no backlog), fixed_lot (the lot size used
               today, for the comparison), ending_stock (stock wanted at the
               end).

demand.csv     item, period or date, quantity. Rows for one bucket add up.

receipts.csv   open orders already released: item, period or date (when
               they arrive), quantity.

costs.csv      per-bucket changes to an item's costs: item, period or date,
               and any of setup_cost, holding_cost, unit_cost. An empty cell
               keeps the item's value.

resources.csv  machines, lines or crews: resource, capacity (per bucket, in
               any unit: minutes here), overtime_capacity, overtime_cost (per
               unit of capacity).

capacity.csv   per-bucket changes to a resource's capacity (holidays,
               shutdowns): resource, period or date, capacity, and optionally
               overtime_capacity.

routing.csv    how much capacity an item uses: item, resource, per_unit (per
               unit made), setup_time (per setup). An item without a row here
               uses no capacity (LID is bought in).

A plan is decision support: overtime must respect local labour law and
agreements, and shelf life or quality rules can forbid building stock ahead.
";

/// The starter files, by name.
pub const FILES: [(&str, &str); 9] = [
    ("scenario.toml", SCENARIO),
    ("items.csv", ITEMS),
    ("demand.csv", DEMAND),
    ("receipts.csv", RECEIPTS),
    ("costs.csv", COSTS),
    ("resources.csv", RESOURCES),
    ("capacity.csv", CAPACITY),
    ("routing.csv", ROUTING),
    ("README.txt", README),
];

fn output_error(path: &Path, message: impl Into<String>) -> Error {
    Error::Output {
        path: path.to_path_buf(),
        message: message.into(),
    }
}

/// Writes the starter scenario into `dir`, which must not exist or be
/// empty. The files go into a temporary sibling first, renamed at the end.
pub fn write(dir: &Path) -> Result<()> {
    if dir.exists() {
        if !dir.is_dir() {
            return Err(output_error(dir, "it exists and is not a folder"));
        }
        let mut entries = std::fs::read_dir(dir).map_err(|e| output_error(dir, e.to_string()))?;
        if entries.next().is_some() {
            return Err(output_error(
                dir,
                "the folder is not empty; init writes only into a new or empty folder",
            ));
        }
    }
    let absolute = std::path::absolute(dir).unwrap_or_else(|_| dir.to_path_buf());
    let parent = match absolute.parent() {
        Some(parent) if parent.is_dir() => parent.to_path_buf(),
        _ => return Err(output_error(dir, "its parent folder does not exist")),
    };
    let name = absolute
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "scenario".into());
    let staging: PathBuf = parent.join(format!(".{name}.lotwright-init-{}", std::process::id()));
    let fail = |e: std::io::Error| output_error(dir, e.to_string());
    let _ = std::fs::remove_dir_all(&staging);
    std::fs::create_dir(&staging).map_err(fail)?;
    let written = (|| -> std::io::Result<()> {
        for (file, text) in FILES {
            std::fs::write(staging.join(file), text)?;
        }
        if absolute.exists() {
            // Empty, as checked above; rename cannot replace a folder.
            std::fs::remove_dir(&absolute)?;
        }
        std::fs::rename(&staging, &absolute)
    })();
    if let Err(e) = written {
        let _ = std::fs::remove_dir_all(&staging);
        return Err(fail(e));
    }
    Ok(())
}
