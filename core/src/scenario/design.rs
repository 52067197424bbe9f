//! The design requests of a scenario as written: tolerances on inputs, measured frequencies,
//! the inputs to calibrate and the input to resize, and an excitation's orders. Which keys each
//! object allows comes from the schema; the inputs' paths, kinds and ranges are checked against
//! the scenario by `design::inputs`, where the scenario's values are known.

use super::json::Node;
use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::schema;
use crate::units::{self, Quantity};

/// How far one input may stray: ± a fraction, or anywhere from one value to another.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ToleranceInput {
    /// The input, as a path into the scenario (`segments[0].section.wall`, or `left` for an end).
    pub field: FieldPath,
    /// ± this ratio of the value (0.05 or "5 %").
    #[serde(skip_serializing_if = "Option::is_none")]
    pub plus_minus: Option<Quantity>,
    /// The low end of a range (with `to`): a quantity, or an end's kind.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub from: Option<Quantity>,
    /// The high end of a range (with `from`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub to: Option<Quantity>,
}

/// A frequency measured on the part.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct MeasuredInput {
    /// The mode's number as the results list it (rigid-body modes first).
    pub mode: usize,
    /// The frequency measured.
    pub frequency: Quantity,
}

/// An input and the range it may take.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct RangeInput {
    /// The input, as a path into the scenario.
    pub field: FieldPath,
    /// The low end.
    pub from: Quantity,
    /// The high end.
    pub to: Quantity,
}

/// A design input to resize over its range.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ResizeInput {
    /// The input and its range.
    #[serde(flatten)]
    pub range: RangeInput,
    /// Values solved across the range.
    pub points: usize,
}

/// The path a `field` names, read from its text.
fn field(n: &Node<'_>) -> Result<FieldPath> {
    let node = n.require(schema::INPUT_FIELD.name, schema::INPUT_FIELD.what)?;
    let text = node.text("a path such as \"segments[0].section.wall\"")?;
    FieldPath::parse(text.trim()).filter(|p| !p.is_empty()).ok_or_else(|| {
        Error::new(
            ErrorKind::Syntax,
            "write the input as a path such as \"segments[0].section.wall\", \"left.rotational\" or \
             \"attachments[1].mass\"",
        )
        .at(node.path())
        .with_value(text)
    })
}

pub(crate) fn tolerance(n: &Node<'_>) -> Result<ToleranceInput> {
    n.fields("a tolerance", &schema::keys(&[&schema::TOLERANCE_FIELDS]))?;
    let t = ToleranceInput {
        field: field(n)?,
        plus_minus: n.quantity_at("plus_minus")?,
        from: n.quantity_at(schema::FROM.name)?,
        to: n.quantity_at(schema::TO.name)?,
    };
    match (&t.plus_minus, &t.from, &t.to) {
        (Some(_), None, None) | (None, Some(_), Some(_)) => Ok(t),
        (Some(_), _, _) => {
            Err(Error::new(ErrorKind::Conflict, "give either plus_minus or from and to, not both")
                .at(n.path().key("plus_minus")))
        }
        (None, None, None) => Err(Error::new(
            ErrorKind::Missing,
            "a tolerance needs plus_minus (\"5 %\") or a range from … to …",
        )
        .at(n.path().key("plus_minus"))),
        (None, from, _) => {
            let missing = if from.is_none() { schema::FROM.name } else { schema::TO.name };
            Err(Error::new(ErrorKind::Missing, "a range needs both from and to").at(n.path().key(missing)))
        }
    }
}

pub(crate) fn measured(n: &Node<'_>) -> Result<MeasuredInput> {
    n.fields("a measured frequency", &schema::keys(&[&schema::MEASURED_FIELDS]))?;
    let [mode, frequency] = &schema::MEASURED_FIELDS;
    Ok(MeasuredInput {
        mode: n.require(mode.name, mode.what)?.whole(mode)?,
        frequency: n.require_quantity(frequency.name, frequency.what)?,
    })
}

pub(crate) fn range(n: &Node<'_>) -> Result<RangeInput> {
    n.fields("an input to calibrate", &schema::keys(&[&schema::CALIBRATE_FIELDS]))?;
    Ok(RangeInput {
        field: field(n)?,
        from: n.require_quantity(schema::FROM.name, schema::FROM.what)?,
        to: n.require_quantity(schema::TO.name, schema::TO.what)?,
    })
}

pub(crate) fn resize(n: &Node<'_>) -> Result<ResizeInput> {
    n.fields("a resizing request", &schema::keys(&[&schema::RESIZE_FIELDS]))?;
    let points = &schema::RESIZE_FIELDS[3];
    Ok(ResizeInput {
        range: RangeInput {
            field: field(n)?,
            from: n.require_quantity(schema::FROM.name, schema::FROM.what)?,
            to: n.require_quantity(schema::TO.name, schema::TO.what)?,
        },
        points: n.get(points.name).map(|p| p.whole(points)).transpose()?.unwrap_or(schema::DEFAULT_POINTS),
    })
}

/// An excitation's orders: a list of numbers, or a text listing them ("1, 2, 6", "1×, 2×").
pub(crate) fn orders(n: &Node<'_>) -> Result<Vec<f64>> {
    let what = "orders as a list [1, 2, 6] or a text \"1, 2, 6\"";
    let bad = |value: &str| {
        Error::new(ErrorKind::Syntax, format!("write the {what}")).at(n.path()).with_value(value)
    };
    let one = |text: &str| -> Result<f64> {
        let t = text.trim().trim_end_matches(['×', 'x', 'X']).trim();
        units::decimal(t).ok_or_else(|| bad(text))
    };
    let values: Vec<f64> = if n.is_text() {
        let text = n.text(what)?;
        text.split([',', ';']).filter(|p| !p.trim().is_empty()).map(one).collect::<Result<_>>()?
    } else {
        n.items(what)?
            .iter()
            .map(|item| match item.quantity()? {
                Quantity::Number(v) => Ok(v),
                Quantity::Text(t) => one(&t),
            })
            .collect::<Result<_>>()?
    };
    let allowed = schema::ORDERS.range.words("", false);
    if values.is_empty() || values.len() > schema::MAX_ORDERS {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!("list from 1 to {} orders, each {allowed}", schema::MAX_ORDERS),
        )
        .at(n.path())
        .with_value(values.len()));
    }
    if let Some(v) = values.iter().find(|v| !(v.is_finite() && **v > 0.0 && **v <= schema::MAX_ORDER)) {
        return Err(Error::new(ErrorKind::OutOfRange, format!("each order must be {allowed}"))
            .at(n.path())
            .with_number(*v));
    }
    Ok(values)
}
