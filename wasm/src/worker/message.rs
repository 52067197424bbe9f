//! The messages between a page and its solving worker, as JSON text: the scenario goes out as
//! the editor holds it, and the report or the error comes back; and what the page says when no
//! answer comes.

use crate::doc::{self, text};
use crate::render::View;
use modebench::report::{report_from_json, FromJson};
use modebench::{Error, ErrorKind, Report};
use serde::Serialize;
use std::cell::RefCell;

/// The worker's answer, as JSON text: `{"report": {…}}` or `{"error": {…}}`.
#[derive(Debug, Serialize)]
#[serde(rename_all = "kebab-case")]
enum Answer {
    Report(Box<Report>),
    Error(Error),
}

thread_local! {
    /// The frequencies (Hz) of the last report this engine sent. A worker serves one
    /// calculator, so they are the case's before the edit now being solved, and the search
    /// starts from them; the count still certifies every frequency. The page's own copy (the
    /// site's `solve-here.js`) serves every calculator on its page, so there they may be another
    /// calculator's: a poorer start, never a missed mode. A worker stopped for running past its
    /// budget takes them with it, and its replacement starts cold.
    static LAST: RefCell<Vec<f64>> = const { RefCell::new(Vec::new()) };
}

/// Solves a scenario given as JSON text and writes the answer as JSON text: the whole answer,
/// for integrators (the page's worker calls [`solve_for_page`]).
pub fn solve(scenario: &str) -> String {
    write(&answer(scenario))
}

/// What the worker sends the page for one scenario ([`solve_for_page`]).
#[derive(Debug)]
pub struct ForPage {
    /// The whole answer, `{"report": …}` or `{"error": …}`: for the results file and the
    /// tap-test panel.
    pub whole: String,
    /// For a report, the answer as the page reads it: every mode's shape cut to the samples its
    /// plot needs ([`crate::render::thin_shapes`]). `None` for an error, which is read as it is.
    pub thinned: Option<String>,
    /// For a report that is not long ([`drawn_here`]), the results and the one-line summary as
    /// the page draws them for the reader's `View` (the mode plotted, the sections left open):
    /// the same markup the page would write from `thinned`, written here while the page draws the
    /// frame of the keystroke.
    pub drawn: Option<Drawn>,
}

/// The results and the one-line summary of a report, as the page draws them for one view.
#[derive(Debug, Clone, PartialEq)]
pub struct Drawn {
    /// The inside of the results element ([`crate::render::results_inner`]).
    pub results: String,
    /// The inside of the one-line summary ([`crate::render::summary_inner`]).
    pub summary: String,
}

/// Solves a scenario given as JSON text for the page, drawn for `view` ([`ForPage`]), or not
/// drawn at all without one (the worker's warm-up while the reader types: the solve's own code
/// made hot, the drawing's left for a pause). This is the worker's whole job, and that of the
/// page's own copy for a quick model's edits (the site's `solve-here.js`); the page's engine
/// never calls it. The page reads only the thinned answer: a long model's whole answer is over a
/// megabyte, most of it shapes that the plot draws to the same tenth of a unit with a few dozen
/// samples each.
pub fn solve_for_page(scenario: &str, view: Option<&View>) -> ForPage {
    let mut answer = answer(scenario);
    let whole = write(&answer);
    match &mut answer {
        Answer::Report(report) => {
            crate::render::thin_shapes(report);
            let drawn = view.filter(|_| drawn_here(report)).map(|view| Drawn {
                results: crate::render::results_inner(Some(report), false, view),
                summary: crate::render::summary_inner(Some(report), false),
            });
            ForPage { whole, thinned: Some(write(&answer)), drawn }
        }
        Answer::Error(_) => ForPage { whole, thinned: None, drawn: None },
    }
}

/// The reader's view as the page sends it to the worker, and the worker back with the results it
/// drew: the mode plotted, and the `data-part` names of the sections left open (names without
/// spaces) with one space between them.
pub fn view_to_message(view: &View) -> (f64, String) {
    (view.mode as f64, view.open.join(" "))
}

/// The reader's view from its message form ([`view_to_message`]).
pub fn view_from_message(mode: f64, open: &str) -> View {
    View { mode: mode as usize, open: open.split_whitespace().map(str::to_string).collect() }
}

/// Whether the worker draws a report's results for the page: unless the report is long (its
/// modes times attachments past [`LONG_ANSWER`]). Writing the results takes the page's engine,
/// built for size, about as long as reading the answer, and the worker does it while the page
/// is still drawing the frame of the keystroke, so an edit's answer is drawn sooner. A long
/// answer's results are hundreds of rows, which the page draws in a task of its own after
/// reading it; the worker does not hold its answer back to write them.
pub fn drawn_here(report: &Report) -> bool {
    report.modes.len() * report.beam.attachments.len() <= LONG_ANSWER
}

/// Past this many modes times attachments, an answer is long: its results have rows for every
/// attachment, and the answer read is large even with its shapes cut to what the plot draws
/// (324 KB for 20 modes of an 800-attachment model, 1.17 MB whole). Reading and drawing such a
/// model take up to some 10 ms each on a loaded two-core machine, and together they would be a
/// long task, so the page draws it in a task after the one that read it. A documented
/// scenario's answer (the camera boom's: 4 modes, 1 attachment, 14 KB read) is drawn at once, as
/// quickly as it came.
pub const LONG_ANSWER: usize = 2_000;

/// The report or the error a scenario draws, its search started from the frequencies of the
/// last report this worker sent (which a report then replaces).
fn answer(scenario: &str) -> Answer {
    let hints = LAST.with(|last| last.borrow().clone());
    match doc::read(scenario).and_then(|d| doc::solve_with_hints(&d, &hints)) {
        Ok(report) => {
            let hz = report.modes.iter().filter(|m| !m.rigid_body).map(|m| m.frequency_hz).collect();
            LAST.with(|last| *last.borrow_mut() = hz);
            Answer::Report(Box::new(report))
        }
        Err(error) => Answer::Error(error),
    }
}

/// The answer as JSON text. A report holds only finite numbers and strings, so writing it cannot
/// fail; were it to, the empty text would reach the page as an answer it cannot read, which it
/// says is a defect to report.
fn write(answer: &Answer) -> String {
    serde_json::to_string(answer).unwrap_or_default()
}

/// Reads the worker's answer: the report, or the error that the scenario drew.
///
/// The text is read into a `serde_json::Value` by the editor's own reader, numbers to the
/// nearest `f64`, and the answer taken from that value by the core's hand-written reader:
/// reading the text directly with `serde_json::from_str` would add its parser, about 40 KB, to
/// the page's engine, and serde's derived readers of the report about 75 KB more.
pub fn read(answer: &str) -> Result<Report, Error> {
    let value = text::read_exact(answer).map_err(|e| unreadable(&e))?;
    if let Some(report) = value.get("report") {
        return report_from_json(report).ok_or_else(|| unreadable("the report is not in the form written"));
    }
    match value.get("error").and_then(Error::from_json) {
        Some(error) => Err(error),
        None => Err(unreadable("neither a report nor an error")),
    }
}

fn unreadable(detail: &str) -> Error {
    Error::new(
        ErrorKind::NoConvergence,
        format!("the solver's answer could not be read ({detail}); please report this with the scenario"),
    )
}

/// What the calculator says when a solve ran past its budget and was stopped.
pub fn too_slow(budget_ms: f64) -> Error {
    Error::new(
        ErrorKind::Model,
        format!(
            "Solving this model took longer than {}, so it was stopped; the page stays ready for your next \
             edit. Check the orders of magnitude of what you typed (units and exponents: 2.5e6 N/m, not \
             2.5e16), springs or masses far out of scale with the beam, and how many modes, segments, \
             attachments and finite elements the model asks for.",
            duration(budget_ms)
        ),
    )
}

/// What the calculator says when the solver could not run at all (it failed to load or stopped
/// on an internal error).
pub fn failed() -> Error {
    Error::new(
        ErrorKind::NoConvergence,
        "The solver stopped without an answer: it could not load in this browser, or it met an internal \
         error. Reload the page to try again; if this persists, please report it with the scenario.",
    )
}

/// A budget in words: "3 s", "1.5 s", "200 ms".
fn duration(ms: f64) -> String {
    if ms >= 1000.0 {
        format!("{} s", (ms / 100.0).round() / 10.0)
    } else {
        format!("{} ms", ms.round())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const BOOM: &str = include_str!("../../../docs/scenarios/sensor-boom.json");

    /// What the page reads back is what the engine computed, bit for bit.
    #[test]
    fn a_report_crosses_unchanged() {
        let Ok(direct) = modebench::solve_json(BOOM) else { panic!("the example solves") };
        assert_eq!(read(&solve(BOOM)), Ok(direct));
    }

    /// The answer the page draws differs from the whole one only in its shapes, each cut to
    /// samples of the whole one (the ends kept), and only where the cut loses nothing the plot
    /// shows (the bound itself is checked in the plot's own tests).
    #[test]
    fn the_drawn_answer_is_the_whole_one_with_fewer_samples() {
        let page = solve_for_page(BOOM, Some(&View::default()));
        let (Ok(whole), Some(Ok(drawn))) = (read(&page.whole), page.thinned.as_deref().map(read)) else {
            panic!("the example solves")
        };
        assert_eq!(whole.modes.len(), drawn.modes.len());
        let mut fewer = 0;
        for (a, b) in whole.modes.iter().zip(&drawn.modes) {
            let (ax, bx) = (&a.shape.x, &b.shape.x);
            assert!(bx.len() >= 2 && bx.len() <= ax.len());
            assert_eq!((bx[0], bx[bx.len() - 1]), (ax[0], ax[ax.len() - 1]), "mode {}'s ends", a.number);
            for (x, w) in bx.iter().zip(&b.shape.w) {
                let i = ax.iter().position(|v| v == x).expect("a sample of the whole shape");
                assert_eq!(*w, a.shape.w[i]);
            }
            fewer += ax.len() - bx.len();
            let mut a = a.clone();
            a.shape = b.shape.clone();
            assert_eq!(&a, b, "mode {} differs in more than its shape", a.number);
        }
        assert!(fewer > 0, "nothing was cut");
        let mut same = whole.clone();
        same.modes = drawn.modes.clone();
        assert_eq!(same, drawn);
        // An error is read as it comes, and drawn by the page.
        let error = solve_for_page("{\"left\": ", Some(&View::default()));
        assert_eq!((error.thinned, error.drawn), (None, None));
    }

    /// What the worker draws is, character for character, what the page would draw from the
    /// answer it reads, for the views a reader can choose: another mode plotted, sections open.
    #[test]
    fn the_worker_draws_what_the_page_would() {
        let scenarios = [
            BOOM,
            include_str!("../../../docs/scenarios/fan-floor-beam-us.json"),
            include_str!("../../../docs/scenarios/boom-root-calibration.json"),
            include_str!("../../../docs/scenarios/hot-line-between-anchors.json"),
        ];
        let views = [
            View::default(),
            View { mode: 2, open: vec!["model".to_string()] },
            View { mode: 3, open: vec!["model".to_string(), "conversions".to_string()] },
        ];
        for scenario in scenarios {
            for view in &views {
                let (mode, open) = view_to_message(view);
                assert_eq!(&view_from_message(mode, &open), view, "the view crosses unchanged");
                let page = solve_for_page(scenario, Some(view));
                let (Some(Ok(report)), Some(drawn)) = (page.thinned.as_deref().map(read), page.drawn) else {
                    panic!("the example solves, and is drawn by the worker")
                };
                assert_eq!(drawn.results, crate::render::results_inner(Some(&report), false, view));
                assert_eq!(drawn.summary, crate::render::summary_inner(Some(&report), false));
            }
        }
    }

    /// Without a view (the warm-up while the reader types) nothing is drawn, and the answer is
    /// a drawn solve's: the same modes, to the engine's accuracy (the second solve starts from
    /// the first's frequencies, so the last digits may differ).
    #[test]
    fn a_solve_without_a_view_draws_nothing() {
        let drawn = solve_for_page(BOOM, Some(&View::default()));
        let bare = solve_for_page(BOOM, None);
        assert!(drawn.drawn.is_some());
        assert_eq!(bare.drawn, None);
        let hz = |text: Option<String>| match text.as_deref().map(read) {
            Some(Ok(report)) => report.modes.iter().map(|m| m.frequency_hz).collect::<Vec<_>>(),
            _ => panic!("the example solves"),
        };
        let (a, b) = (hz(drawn.thinned), hz(bare.thinned));
        assert_eq!(a.len(), b.len());
        for (a, b) in a.iter().zip(&b) {
            assert!((a - b).abs() <= 1e-12 * a, "{a} Hz drawn, {b} Hz bare");
        }
    }

    /// A long answer is left to the page to draw, in a task of its own.
    #[test]
    fn a_long_answer_is_not_drawn_by_the_worker() {
        let Ok(mut report) = modebench::solve_json(BOOM) else { panic!("the example solves") };
        assert!(drawn_here(&report));
        let one = report.beam.attachments[0].clone();
        let modes = report.modes.len();
        report.beam.attachments = vec![one; LONG_ANSWER / modes + 1];
        assert!(!drawn_here(&report));
    }

    #[test]
    fn an_input_error_crosses_with_its_path_and_value() {
        let text = BOOM.replace("\"2.8 kg\"", "\"2.8 kgs\"");
        let Err(error) = read(&solve(&text)) else { panic!("a misspelt unit is refused") };
        assert_eq!(
            (error.kind, error.path.to_string().as_str()),
            (ErrorKind::UnknownUnit, "attachments[0].mass")
        );
        assert_eq!(error.value.as_deref(), Some("2.8 kgs"));
        let Err(error) = read(&solve("{\"left\": ")) else { panic!("broken JSON is refused") };
        assert_eq!(error.kind, ErrorKind::Syntax);
    }

    #[test]
    fn an_unreadable_answer_is_an_error_not_a_panic() {
        let Err(error) = read("{\"report\": 3}") else { panic!("not a report") };
        assert!(error.message.contains("could not be read"), "{}", error.message);
        // What the worker sends should a report ever fail to be written.
        let Err(error) = read("") else { panic!("no answer") };
        assert!(error.message.contains("please report this"), "{}", error.message);
    }

    #[test]
    fn budgets_are_written_plainly() {
        assert!(too_slow(3000.0).message.contains("longer than 3 s,"));
        assert!(too_slow(1500.0).message.contains("longer than 1.5 s,"));
        assert!(too_slow(200.0).message.contains("longer than 200 ms,"));
    }
}
