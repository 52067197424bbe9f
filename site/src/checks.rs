//! A ```` ```modebench-checks ```` block becomes the table of published checks: every case of
//! `tests/data/published.json`, evaluated by the same function the native tests use
//! (`modebench_tests::published`), while the site is built. Nothing in the table is typed by
//! hand, and the page cannot show a value the tests do not check.

use anyhow::{bail, Result};
use modebench_tests::published::{self, Case};
use modebench_ui::render::escape;

/// The HTML table. The block's body must be empty, so that a page cannot quietly carry
/// hand-typed rows.
pub(crate) fn render(block: &str) -> Result<String> {
    if !block.trim().is_empty() {
        bail!("the modebench-checks block takes no content; its rows come from tests/data/published.json");
    }
    let cases = published::cases();
    let mut rows = String::new();
    for case in &cases {
        let got = match published::evaluate(case) {
            Ok(got) => got,
            Err(error) => bail!("tests/data/published.json: case {}: {error}", case.id),
        };
        rows.push_str(&row(case, got));
    }
    Ok(format!(
        "<div class=\"table-scroll\" tabindex=\"0\" role=\"region\" aria-label=\"Published checks (the table \
         scrolls sideways)\"><table class=\"checks\">\
         <caption>{count} published {cases}, computed by Modebench when this page was built</caption>\
         <thead><tr><th scope=\"col\">Case</th><th scope=\"col\">Source</th>\
         <th scope=\"col\" class=\"num\">Published</th><th scope=\"col\" class=\"num\">Modebench</th>\
         <th scope=\"col\" class=\"num\">Difference <span class=\"allowed\">(allowed)</span></th></tr></thead>\
         <tbody>{rows}</tbody></table></div>",
        count = cases.len(),
        cases = if cases.len() == 1 { "case" } else { "cases" },
    ))
}

/// One row; a difference beyond the case's tolerance is marked, not hidden.
fn row(case: &Case, got: f64) -> String {
    let difference = modebench_tests::relative_difference(case.expected, got);
    let digits = significant_digits(&format!("{}", case.expected));
    let outside = difference.abs() > case.tolerance;
    format!(
        "<tr{class}><th scope=\"row\">{name}</th><td>{source}</td><td class=\"num\">{expected}</td>\
         <td class=\"num\">{got}</td><td class=\"num\">{difference}{flag}<br><span class=\"allowed\">({tolerance})</span></td></tr>",
        class = if outside { " class=\"outside\"" } else { "" },
        name = escape(&case.case),
        source = escape(&case.source),
        expected = case.expected,
        got = with_digits(got, digits),
        difference = relative(difference),
        flag = if outside { " <strong>outside</strong>" } else { "" },
        tolerance = relative(case.tolerance),
    )
}

/// Significant digits in a decimal number as written ("0.0120" has 3).
fn significant_digits(text: &str) -> usize {
    let digits: String =
        text.chars().take_while(|c| *c != 'e' && *c != 'E').filter(char::is_ascii_digit).collect();
    digits.trim_start_matches('0').len().max(1)
}

/// `value` rounded to `digits` significant digits, in plain decimal notation.
fn with_digits(value: f64, digits: usize) -> String {
    if value == 0.0 {
        return "0".to_string();
    }
    let magnitude = value.abs().log10().floor() as i64;
    let decimals = (digits as i64 - 1 - magnitude).clamp(0, 17) as usize;
    format!("{value:.decimals$}")
}

/// A relative difference as engineers read it: percent when it is large enough to matter,
/// powers of ten when it is round-off.
fn relative(value: f64) -> String {
    if value == 0.0 {
        return "0".to_string();
    }
    if value.abs() >= 1e-4 {
        return format!("{:.2} %", value * 100.0).replace('-', "−");
    }
    let text = format!("{value:.1e}");
    let (mantissa, exponent) = text.split_once('e').unwrap_or((&text, "0"));
    let exponent: String = exponent
        .chars()
        .map(|c| match c {
            '-' => '⁻',
            d => ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'][d.to_digit(10).unwrap_or(0) as usize],
        })
        .collect();
    format!("{} × 10{exponent}", mantissa.replace('-', "−"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_shown_to_the_published_precision() {
        assert_eq!(significant_digits("1.87510406871196"), 15);
        assert_eq!(significant_digits("0.0120"), 3);
        assert_eq!(with_digits(1.875104068712, 4), "1.875");
        assert_eq!(with_digits(22.373285, 5), "22.373");
        assert_eq!(with_digits(1234.5, 2), "1234");
    }

    #[test]
    fn differences_read_as_percent_or_powers_of_ten() {
        assert_eq!(relative(0.0034), "0.34 %");
        assert_eq!(relative(-2.1e-10), "−2.1 × 10⁻¹⁰");
        assert_eq!(relative(0.0), "0");
    }

    #[test]
    fn the_table_has_a_row_for_every_published_case() {
        let html = render("").unwrap();
        assert_eq!(
            html.matches("<tr><th scope=\"row\">").count() + html.matches("<tr class=\"outside\">").count(),
            published::cases().len()
        );
        assert!(html.contains("Clamped–free"), "{html}");
        assert!(render("| typed | row |").is_err());
    }
}
