//! What to compute for a model: how many modes, how many finite elements, and where to give
//! mode 1's equivalent system; checked against the schema's ranges before any solver runs.

use super::{check, Model};
use crate::error::Result;
use crate::schema;

/// What to compute.
#[derive(Clone, Debug, PartialEq)]
pub struct Options {
    /// Elastic modes to report, 1 to [`schema::MAX_MODES`].
    pub modes: usize,
    /// Finite elements in all; `None` picks enough for about 1e-4 on the last mode.
    pub elements: Option<usize>,
    /// Point for the equivalent single-degree-of-freedom system of mode 1, m from the left end;
    /// `None` uses the point of largest deflection.
    pub report_point: Option<f64>,
}

impl Options {
    /// Options for `modes` elastic modes, other settings at their defaults.
    pub fn with_modes(modes: usize) -> Options {
        Options { modes, ..Options::default() }
    }

    /// Sets the total number of finite elements.
    #[must_use]
    pub fn elements(mut self, elements: usize) -> Options {
        self.elements = Some(elements);
        self
    }

    /// Sets the point for the equivalent single-degree-of-freedom system, m from the left end.
    #[must_use]
    pub fn report_point(mut self, position: f64) -> Options {
        self.report_point = Some(position);
        self
    }

    /// The options checked for `model`: the counts in their ranges and the report point on the
    /// beam (moved onto an end when within a trillionth of the length of it).
    pub fn checked(&self, model: &Model) -> Result<Options> {
        check::whole(&schema::MODES, self.modes)?;
        if let Some(n) = self.elements {
            check::whole(&schema::ELEMENTS, n)?;
        }
        let report_point = match self.report_point {
            Some(x) => Some(check::on_the_beam(&schema::REPORT_POINT, x, model.length())?),
            None => None,
        };
        Ok(Options { report_point, ..self.clone() })
    }
}

impl Default for Options {
    fn default() -> Self {
        Options { modes: schema::DEFAULT_MODES, elements: None, report_point: None }
    }
}
