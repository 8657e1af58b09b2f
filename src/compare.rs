//! Two scenarios side by side: "what if capacity rises, or the promotion
//! doubles". The second scenario is another folder, or the first with
//! overrides (`--set capacity.LINE-1=120%`). Both are planned by the same
//! method; the comparison lines up their cost by kind, setups, stock, load
//! and status, item by item and resource by resource.

use crate::error::{Error, Result};
use crate::model::Scenario;
use crate::solve::{MethodResult, Status};

/// What an override changes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Field {
    Capacity,
    Overtime,
    Demand,
    SetupCost,
    HoldingCost,
    UnitCost,
    FrozenPeriods,
}

impl Field {
    const ALL: [(&'static str, Field); 7] = [
        ("capacity", Field::Capacity),
        ("overtime", Field::Overtime),
        ("demand", Field::Demand),
        ("setup_cost", Field::SetupCost),
        ("holding_cost", Field::HoldingCost),
        ("unit_cost", Field::UnitCost),
        ("frozen_periods", Field::FrozenPeriods),
    ];

    fn of_resource(self) -> bool {
        matches!(self, Field::Capacity | Field::Overtime)
    }
}

/// The new value: a number for every bucket, a percentage of the value
/// there is, or (written with a sign) an addition to it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Change {
    /// `N`: every bucket becomes N.
    Set(f64),
    /// `N%`: every bucket becomes N percent of its value.
    Percent(f64),
    /// `+N` or `-N`: N is added to every bucket (a negative N subtracts).
    Add(f64),
    /// `+N%` or `-N%`: every bucket rises (falls) by N percent.
    AddPercent(f64),
}

impl Change {
    /// The new value of a bucket whose value is `value`.
    pub fn of(self, value: f64) -> f64 {
        match self {
            Change::Set(n) => n,
            Change::Percent(p) => value * p / 100.0,
            Change::Add(n) => value + n,
            Change::AddPercent(p) => value * (100.0 + p) / 100.0,
        }
    }
}

/// One `--set KEY=VALUE`: `capacity`, `overtime` (of a resource, or all),
/// `demand`, `setup_cost`, `holding_cost`, `unit_cost` (of an item, or
/// all) or `frozen_periods`; the value `N`, `N%`, or with a sign `+N`,
/// `-N`, `+N%`, `-N%` (added to the value there is).
#[derive(Debug, Clone, PartialEq)]
pub struct Override {
    pub text: String,
    pub field: Field,
    /// A resource or item id; `None` for all of them.
    pub target: Option<String>,
    pub change: Change,
}

/// Reads `KEY[.ID]=N`, `KEY[.ID]=N%`, or the same with a sign in front
/// (an addition).
pub fn parse_override(text: &str) -> Result<Override> {
    let usage = |why: String| Error::usage(format!("--set {text}: {why}"));
    let (key, value) = text
        .split_once('=')
        .ok_or_else(|| usage("write it as KEY=VALUE, for example capacity.LINE-1=120%".into()))?;
    let (name, target) = match key.split_once('.') {
        Some((name, id)) if !id.is_empty() => (name, Some(id.to_string())),
        Some(_) => return Err(usage("an id is missing after the dot".into())),
        None => (key, None),
    };
    let names: Vec<&str> = Field::ALL.iter().map(|(n, _)| *n).collect();
    let field = Field::ALL
        .iter()
        .find(|(n, _)| *n == name)
        .map(|(_, f)| *f)
        .ok_or_else(|| {
            usage(format!(
                "{name} is not known; use one of {}",
                names.join(", ")
            ))
        })?;
    if field == Field::FrozenPeriods && target.is_some() {
        return Err(usage(
            "frozen_periods applies to the whole scenario; drop the id".into(),
        ));
    }
    let value = value.trim();
    // A sign in front makes the value an addition to what is there.
    let (sign, unsigned) = match value.strip_prefix('+') {
        Some(rest) => (Some(1.0), rest.trim_start()),
        None => match value.strip_prefix('-') {
            Some(rest) => (Some(-1.0), rest.trim_start()),
            None => (None, value),
        },
    };
    let (number, percent) = match unsigned.strip_suffix('%') {
        Some(number) => (number.trim(), true),
        None => (unsigned, false),
    };
    let number: f64 = number
        .parse()
        .ok()
        .filter(|n: &f64| n.is_finite() && *n >= 0.0)
        .ok_or_else(|| {
            usage(format!(
                "{value} is not a number of 0 or more, a percentage such as 120%, or an addition such as +10, -10, +5% or -5%"
            ))
        })?;
    if field == Field::FrozenPeriods && (percent || number.fract() != 0.0) {
        return Err(usage(
            "frozen_periods takes a whole number of periods (or +N, -N to add or take some away)"
                .into(),
        ));
    }
    let change = match (sign, percent) {
        (None, false) => Change::Set(number),
        (None, true) => Change::Percent(number),
        (Some(sign), false) => Change::Add(sign * number),
        (Some(sign), true) => Change::AddPercent(sign * number),
    };
    Ok(Override {
        text: text.to_string(),
        field,
        target,
        change,
    })
}

/// Applies an override to `scenario`.
pub fn apply(scenario: &mut Scenario, o: &Override) -> Result<()> {
    let usage = |why: String| Error::usage(format!("--set {}: {why}", o.text));
    // Every bucket's new value, refused where a subtraction takes it below 0.
    let update = |values: &mut Vec<f64>, what: &str| -> Result<()> {
        for (t, v) in values.iter_mut().enumerate() {
            let new = o.change.of(*v);
            if new < 0.0 {
                return Err(usage(format!(
                    "this takes {what} below 0 in period {} ({} becomes {}); lower it by less, or to a share such as 50%",
                    t + 1,
                    crate::report::quantity(*v),
                    crate::report::quantity(new)
                )));
            }
            *v = new;
        }
        Ok(())
    };
    if o.field == Field::FrozenPeriods {
        let n = match o.change {
            Change::Set(n) => n,
            Change::Add(n) => scenario.frozen as f64 + n,
            _ => {
                return Err(usage(
                    "frozen_periods takes a whole number of periods".into(),
                ))
            }
        };
        if n < 0.0 {
            return Err(usage(format!(
                "this takes the frozen horizon below 0 periods (it is {})",
                scenario.frozen
            )));
        }
        let frozen = n as usize;
        if frozen >= scenario.periods() {
            return Err(usage(format!(
                "the horizon has {} periods, so freeze at most {}",
                scenario.periods(),
                scenario.periods() - 1
            )));
        }
        scenario.frozen = frozen;
        return Ok(());
    }
    if o.field.of_resource() {
        let mut found = false;
        for resource in &mut scenario.resources {
            if o.target.as_ref().is_some_and(|id| *id != resource.id) {
                continue;
            }
            found = true;
            let what = format!("resource {}'s", resource.id);
            match o.field {
                Field::Capacity => update(&mut resource.capacity, &format!("{what} capacity"))?,
                _ => update(
                    &mut resource.overtime_capacity,
                    &format!("{what} overtime capacity"),
                )?,
            }
        }
        if !found {
            return Err(usage(match &o.target {
                Some(id) => format!("no resource {id} in resources.csv"),
                None => "the scenario has no resources".to_string(),
            }));
        }
        return Ok(());
    }
    let mut found = false;
    for item in &mut scenario.items {
        if o.target.as_ref().is_some_and(|id| *id != item.id) {
            continue;
        }
        found = true;
        let what = format!("item {}'s", item.id);
        match o.field {
            Field::Demand => update(&mut item.demand, &format!("{what} demand"))?,
            Field::SetupCost => {
                update(&mut item.setup_cost, &format!("{what} setup cost"))?;
                item.nominal_setup_cost = o.change.of(item.nominal_setup_cost).max(0.0);
            }
            Field::HoldingCost => {
                update(&mut item.holding_cost, &format!("{what} holding cost"))?;
                item.nominal_holding_cost = o.change.of(item.nominal_holding_cost).max(0.0);
            }
            _ => update(&mut item.unit_cost, &format!("{what} unit cost"))?,
        }
    }
    if !found {
        return Err(usage(match &o.target {
            Some(id) => format!("no item {id} in items.csv"),
            None => "the scenario has no items".to_string(),
        }));
    }
    Ok(())
}

/// One item's figures under one plan.
#[derive(Debug, Clone, PartialEq)]
pub struct ItemFigures {
    pub cost: f64,
    pub setups: usize,
    pub average_stock: f64,
    pub ending_stock: f64,
    pub fill_rate: f64,
    pub demand: f64,
}

/// One resource's figures under one plan.
#[derive(Debug, Clone, PartialEq)]
pub struct ResourceFigures {
    /// Production plus setup time over the horizon.
    pub load: f64,
    pub capacity: f64,
    pub overtime: f64,
    /// The busiest bucket (0-based) and its load over regular capacity.
    pub peak: Option<(usize, f64)>,
}

/// A row of the comparison: the figures on either side (`None` where the
/// item or resource is not in that scenario).
#[derive(Debug, Clone, PartialEq)]
pub struct Row<T> {
    pub id: String,
    pub a: Option<T>,
    pub b: Option<T>,
}

/// One side: its name, scenario and plan.
#[derive(Debug, Clone)]
pub struct Side {
    /// The folder, or the folder with the overrides.
    pub name: String,
    pub scenario: Scenario,
    pub result: MethodResult,
}

#[derive(Debug, Clone)]
pub struct Comparison {
    pub a: Side,
    pub b: Side,
    pub items: Vec<Row<ItemFigures>>,
    pub resources: Vec<Row<ResourceFigures>>,
}

impl Row<ItemFigures> {
    /// B's cost less A's (a side without the item counts 0).
    pub fn cost_change(&self) -> f64 {
        let cost = |f: &Option<ItemFigures>| f.as_ref().map_or(0.0, |f| f.cost);
        cost(&self.b) - cost(&self.a)
    }
}

/// Regular capacity B has beyond A's on a resource both sides have, summed
/// over the buckets where B's is higher, with the price of a unit of it
/// where resources.csv gives one (`capacity_cost`, B's else A's).
#[derive(Debug, Clone, PartialEq)]
pub struct AddedCapacity {
    pub resource: String,
    pub added: f64,
    pub price: Option<f64>,
}

impl AddedCapacity {
    /// What the added capacity costs at its price.
    pub fn cost(&self) -> Option<f64> {
        self.price.map(|p| p * self.added)
    }
}

impl Side {
    /// Whether the side has a plan of its method. The exact method has none
    /// when the scenario is infeasible or the time ran out before a plan
    /// was found; the orders it shows then (lot-for-lot) are for reference
    /// only. A rule always has its plan, feasible or not.
    pub fn has_plan(&self) -> bool {
        self.result.is_rule()
            || matches!(
                self.result.status,
                crate::solve::Status::Optimal | crate::solve::Status::Feasible
            )
    }
}

impl Comparison {
    /// The range in which B's least possible cost less A's lies, from the
    /// plans and the proven lower bounds of both sides: [B's bound - A's
    /// cost, B's cost - A's bound]. `None` unless both sides have a plan
    /// with a bound (a proven plan is its own bound).
    pub fn difference_range(&self) -> Option<(f64, f64)> {
        let known = |r: &MethodResult| -> Option<(f64, f64)> {
            if !r.evaluation.feasible {
                return None;
            }
            match r.status {
                Status::Optimal => Some((r.total_cost(), r.total_cost())),
                Status::Feasible => r
                    .lower_bound
                    .map(|b| (b.min(r.total_cost()), r.total_cost())),
                _ => None,
            }
        };
        let (a_bound, a_cost) = known(&self.a.result)?;
        let (b_bound, b_cost) = known(&self.b.result)?;
        Some((b_bound - a_cost, b_cost - a_bound))
    }

    /// True when the gaps of the two solves leave open which scenario can
    /// be planned for less: the difference range holds both signs.
    pub fn within_gaps(&self) -> bool {
        let scale = 1e-9 * (1.0 + self.a.result.total_cost().abs());
        self.difference_range()
            .is_some_and(|(low, high)| low < -scale && high > scale)
    }

    /// The regular capacity B adds over A, resource by resource (only
    /// resources where it adds any).
    pub fn added_capacity(&self) -> Vec<AddedCapacity> {
        let mut added = Vec::new();
        for rb in &self.b.scenario.resources {
            let Some(ra) = self.a.scenario.resources.iter().find(|r| r.id == rb.id) else {
                continue;
            };
            let more: f64 = rb
                .capacity
                .iter()
                .zip(&ra.capacity)
                .map(|(b, a)| (b - a).max(0.0))
                .sum();
            if more > 1e-9 {
                added.push(AddedCapacity {
                    resource: rb.id.clone(),
                    added: more,
                    price: rb.capacity_cost.or(ra.capacity_cost),
                });
            }
        }
        added
    }

    /// Whether the items can be compared plan against plan: both sides
    /// have one.
    pub fn items_compared(&self) -> bool {
        self.a.has_plan() && self.b.has_plan()
    }

    /// The items, the largest change in cost first.
    pub fn items_by_change(&self) -> Vec<&Row<ItemFigures>> {
        let mut items: Vec<&Row<ItemFigures>> = self.items.iter().collect();
        items.sort_by(|x, y| y.cost_change().abs().total_cmp(&x.cost_change().abs()));
        items
    }

    pub fn new(a: Side, b: Side) -> Comparison {
        let items = rows(
            a.scenario.items.iter().map(|i| i.id.as_str()),
            b.scenario.items.iter().map(|i| i.id.as_str()),
            |side: &Side, id| item_figures(side, id),
            &a,
            &b,
        );
        let resources = rows(
            a.scenario.resources.iter().map(|r| r.id.as_str()),
            b.scenario.resources.iter().map(|r| r.id.as_str()),
            |side: &Side, id| resource_figures(side, id),
            &a,
            &b,
        );
        Comparison {
            a,
            b,
            items,
            resources,
        }
    }
}

/// The ids of A in order, then those only in B.
fn rows<'a, T>(
    in_a: impl Iterator<Item = &'a str>,
    in_b: impl Iterator<Item = &'a str>,
    figures: impl Fn(&Side, &str) -> Option<T>,
    a: &Side,
    b: &Side,
) -> Vec<Row<T>> {
    let mut ids: Vec<&str> = in_a.collect();
    for id in in_b {
        if !ids.contains(&id) {
            ids.push(id);
        }
    }
    ids.into_iter()
        .map(|id| Row {
            id: id.to_string(),
            a: figures(a, id),
            b: figures(b, id),
        })
        .collect()
}

fn item_figures(side: &Side, id: &str) -> Option<ItemFigures> {
    let i = side.scenario.item_index(id)?;
    let record = &side.result.evaluation.items[i];
    Some(ItemFigures {
        cost: record.costs.total(),
        setups: record.setups,
        average_stock: record.average_stock,
        ending_stock: record.ending_stock,
        fill_rate: record.fill_rate,
        demand: record.gross_requirement.iter().sum(),
    })
}

fn resource_figures(side: &Side, id: &str) -> Option<ResourceFigures> {
    let r = side.scenario.resources.iter().position(|r| r.id == id)?;
    let load = &side.result.evaluation.resources[r];
    let periods = load.capacity.len();
    let peak = (0..periods)
        .filter(|&t| load.capacity[t] > 0.0)
        .map(|t| (t, load.load(t) / load.capacity[t]))
        .fold(None, |best: Option<(usize, f64)>, (t, u)| match best {
            Some((_, b)) if b >= u => best,
            _ => Some((t, u)),
        });
    Some(ResourceFigures {
        load: (0..periods).map(|t| load.load(t)).sum(),
        capacity: load.capacity.iter().sum(),
        overtime: load.overtime.iter().sum(),
        peak,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn overrides_read_a_key_an_id_and_a_value_or_a_percentage() {
        let o = parse_override("capacity.LINE-1=120%").expect("valid");
        assert_eq!(o.field, Field::Capacity);
        assert_eq!(o.target.as_deref(), Some("LINE-1"));
        assert_eq!(o.change, Change::Percent(120.0));
        let o = parse_override("demand=200%").expect("valid");
        assert_eq!((o.field, o.target), (Field::Demand, None));
        let o = parse_override("frozen_periods=2").expect("valid");
        assert_eq!(o.change, Change::Set(2.0));
        // A sign makes an addition, of units or of a percentage.
        let o = parse_override("capacity.LINE-1=+10").expect("valid");
        assert_eq!(o.change, Change::Add(10.0));
        assert_eq!(o.change.of(100.0), 110.0);
        let o = parse_override("demand=-5").expect("valid");
        assert_eq!(o.change, Change::Add(-5.0));
        let o = parse_override("overtime=-20%").expect("valid");
        assert_eq!(o.change, Change::AddPercent(-20.0));
        assert_eq!(o.change.of(50.0), 40.0);
        assert_eq!(
            parse_override("frozen_periods=+1").expect("valid").change,
            Change::Add(1.0)
        );
        for bad in [
            "capacity",
            "speed=3",
            "capacity.=3",
            "demand=+-5",
            "demand=--5",
            "frozen_periods=+1%",
            "demand=lots",
            "frozen_periods=50%",
            "frozen_periods.A=1",
        ] {
            assert!(parse_override(bad).is_err(), "{bad} is refused");
        }
    }
}
