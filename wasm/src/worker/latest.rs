//! Which scenario the solving worker works on, which one waits, and which answers still count:
//! the newest edit wins.
//!
//! One scenario is with the worker at a time. An edit made meanwhile waits; a later edit takes
//! its place, so at most one waits, whatever the reader types. An answer that an edit made after
//! it has overtaken is not drawn. A solve that runs past the budget is given up (the page stops
//! the worker and starts a fresh one) and the waiting edit, if any, goes next. When the newest
//! edit is refused, the edit before it, if its answer was never drawn (it was replaced while it
//! waited, or overtaken), is solved again, so that the results greyed under the refusal are
//! those of the input just before it however fast it was typed, not of some keystroke further
//! back. Pure logic with the clock passed in, so that it is tested natively.

/// Why a scenario is sent to be solved; the calculator acts on its answer accordingly.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Purpose {
    /// The page's own example, to confirm the results it was built with.
    Confirm,
    /// The reader's saved case, tried once the page shows its example.
    Restore,
    /// An edit, or a case the reader chose to open.
    Edit,
    /// The edit before a refused one, solved again for the results shown greyed under the
    /// refusal ([`Latest::earlier`]).
    Earlier,
}

/// A scenario to hand to the worker.
#[derive(Clone, Debug, PartialEq)]
pub struct Job {
    /// Its number; the worker's answer carries it back.
    pub id: u32,
    /// Why it is solved.
    pub purpose: Purpose,
    /// The scenario as JSON text.
    pub text: String,
}

/// What an answer is worth.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Verdict {
    /// The answer to the newest scenario submitted: draw it.
    Current(Purpose),
    /// A newer scenario was submitted after this one: do not draw it over what is coming.
    Overtaken(Purpose),
    /// Not the scenario with the worker (it was given up): ignore it.
    Unknown,
}

/// A solve given up because it ran past the budget.
#[derive(Clone, Debug, PartialEq)]
pub struct Expiry {
    /// Why it was being solved.
    pub purpose: Purpose,
    /// Whether a newer scenario was waiting (it is in `next`): the one given up no longer
    /// matters to the reader.
    pub overtaken: bool,
    /// The waiting scenario, to send to the fresh worker.
    pub next: Option<Job>,
}

/// The scenario with the worker, and when it was sent.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Running {
    id: u32,
    purpose: Purpose,
    since_ms: f64,
}

/// An edit submitted (its job's number and scenario), kept until two more have been, and whether
/// its answer was drawn.
#[derive(Debug)]
struct Submitted {
    id: u32,
    text: String,
    drawn: bool,
}

/// The queue of one calculator's solves.
#[derive(Debug)]
pub struct Latest {
    budget_ms: f64,
    next_id: u32,
    running: Option<Running>,
    waiting: Option<Job>,
    /// The newest edit submitted, and the one before it.
    edits: [Option<Submitted>; 2],
}

impl Latest {
    /// An empty queue whose solves may each take `budget_ms`.
    pub fn new(budget_ms: f64) -> Latest {
        Latest { budget_ms, next_id: 1, running: None, waiting: None, edits: [None, None] }
    }

    /// How long a solve may take, ms.
    pub fn budget_ms(&self) -> f64 {
        self.budget_ms
    }

    /// Submits a scenario at time `now_ms`. Returns the job to send to the worker at once, or
    /// `None` when the worker is busy (the scenario waits, in place of any that waited).
    pub fn submit(&mut self, purpose: Purpose, text: String, now_ms: f64) -> Option<Job> {
        let id = self.next_id;
        self.next_id = self.next_id.wrapping_add(1);
        let job = Job { id, purpose, text };
        match purpose {
            Purpose::Edit => {
                let newest = Some(Submitted { id, text: job.text.clone(), drawn: false });
                self.edits = [newest, self.edits[0].take()];
            }
            // The edit before a refused one is solved again for the greyed results only.
            Purpose::Earlier => {}
            // A whole case replaces what was typed before it.
            Purpose::Confirm | Purpose::Restore => self.edits = [None, None],
        }
        if self.running.is_some() {
            self.waiting = Some(job);
            return None;
        }
        self.running = Some(Running { id, purpose, since_ms: now_ms });
        Some(job)
    }

    /// Takes the worker's answer to job `id` at time `now_ms`: what it is worth, and the job to
    /// send next, if one waits.
    pub fn answered(&mut self, id: u32, now_ms: f64) -> (Verdict, Option<Job>) {
        let Some(running) = self.running.filter(|r| r.id == id) else { return (Verdict::Unknown, None) };
        self.running = None;
        let next = self.start_waiting(now_ms);
        let verdict = if next.is_some() {
            Verdict::Overtaken(running.purpose)
        } else {
            Verdict::Current(running.purpose)
        };
        if verdict == Verdict::Current(Purpose::Edit) {
            for edit in self.edits.iter_mut().flatten().filter(|e| e.id == id) {
                edit.drawn = true;
            }
        }
        (verdict, next)
    }

    /// Called when the newest edit was refused: the text of the edit submitted before it, if
    /// that one's answer was never drawn, to be solved again as [`Purpose::Earlier`]. Each is
    /// given once.
    pub fn earlier(&mut self) -> Option<String> {
        self.edits[1].take().filter(|e| !e.drawn).map(|e| e.text)
    }

    /// Gives up the solve under way if it has run for the budget by `now_ms`. The caller stops
    /// the worker, starts a fresh one and sends it [`Expiry::next`].
    pub fn expire(&mut self, now_ms: f64) -> Option<Expiry> {
        let running = self.running.filter(|r| now_ms - r.since_ms >= self.budget_ms)?;
        Some(self.give_up(running, now_ms))
    }

    /// Gives up the solve under way at once (the worker failed); as [`Latest::expire`].
    pub fn fail(&mut self, now_ms: f64) -> Option<Expiry> {
        let running = self.running?;
        Some(self.give_up(running, now_ms))
    }

    fn give_up(&mut self, running: Running, now_ms: f64) -> Expiry {
        self.running = None;
        let next = self.start_waiting(now_ms);
        Expiry { purpose: running.purpose, overtaken: next.is_some(), next }
    }

    /// Why the solve under way was asked for and how long it has run by `now_ms`, if there is
    /// one.
    pub fn running(&self, now_ms: f64) -> Option<(Purpose, f64)> {
        self.running.map(|r| (r.purpose, now_ms - r.since_ms))
    }

    /// Whether a scenario is with the worker or waiting for it.
    pub fn busy(&self) -> bool {
        self.running.is_some() || self.waiting.is_some()
    }

    fn start_waiting(&mut self, now_ms: f64) -> Option<Job> {
        let job = self.waiting.take()?;
        self.running = Some(Running { id: job.id, purpose: job.purpose, since_ms: now_ms });
        Some(job)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const BUDGET: f64 = 3000.0;

    fn text(job: &Option<Job>) -> Option<&str> {
        job.as_ref().map(|j| j.text.as_str())
    }

    #[test]
    fn an_idle_worker_gets_the_edit_at_once_and_its_answer_is_drawn() {
        let mut q = Latest::new(BUDGET);
        let job = q.submit(Purpose::Edit, "a".into(), 0.0);
        assert_eq!(text(&job), Some("a"));
        let id = job.map_or(0, |j| j.id);
        assert!(q.busy());
        assert_eq!(q.answered(id, 10.0), (Verdict::Current(Purpose::Edit), None));
        assert!(!q.busy());
    }

    #[test]
    fn edits_made_while_the_worker_is_busy_replace_each_other_and_only_the_last_is_sent() {
        let mut q = Latest::new(BUDGET);
        let first = q.submit(Purpose::Edit, "a".into(), 0.0).map_or(0, |j| j.id);
        assert_eq!(q.submit(Purpose::Edit, "ab".into(), 1.0), None);
        assert_eq!(q.submit(Purpose::Edit, "abc".into(), 2.0), None);
        let (verdict, next) = q.answered(first, 50.0);
        // The first answer belongs to an input the reader has already changed.
        assert_eq!(verdict, Verdict::Overtaken(Purpose::Edit));
        assert_eq!(text(&next), Some("abc"));
        let last = next.map_or(0, |j| j.id);
        assert_eq!(q.answered(last, 60.0), (Verdict::Current(Purpose::Edit), None));
        assert!(!q.busy());
    }

    #[test]
    fn a_refused_edit_brings_back_the_one_before_it_only_if_that_was_never_drawn() {
        // Typed fast: "12 lb" waits, then "12 lbf" takes its place and is refused; the results
        // greyed under the refusal must be those of "12 lb", not of "12" solved before it.
        let mut q = Latest::new(BUDGET);
        let first = q.submit(Purpose::Edit, "12".into(), 0.0).map_or(0, |j| j.id);
        q.submit(Purpose::Edit, "12 lb".into(), 1.0);
        q.submit(Purpose::Edit, "12 lbf".into(), 2.0);
        let (_, next) = q.answered(first, 10.0);
        let refused = next.map_or(0, |j| j.id);
        assert_eq!(q.answered(refused, 20.0), (Verdict::Current(Purpose::Edit), None));
        assert_eq!(q.earlier().as_deref(), Some("12 lb"));
        assert_eq!(q.earlier(), None, "given once");
        let again = q.submit(Purpose::Earlier, "12 lb".into(), 21.0).map_or(0, |j| j.id);
        assert_eq!(q.answered(again, 30.0), (Verdict::Current(Purpose::Earlier), None));

        // Typed slowly: the edit before the refused one was drawn, so nothing is solved again.
        let mut q = Latest::new(BUDGET);
        for (t, text) in [(0.0, "12 lb"), (100.0, "12 lbf")] {
            let id = q.submit(Purpose::Edit, text.into(), t).map_or(0, |j| j.id);
            assert_eq!(q.answered(id, t + 10.0), (Verdict::Current(Purpose::Edit), None));
        }
        assert_eq!(q.earlier(), None);

        // A case opened in between: what was typed before it is not brought back.
        let mut q = Latest::new(BUDGET);
        q.submit(Purpose::Edit, "typed".into(), 0.0);
        q.submit(Purpose::Restore, "saved".into(), 1.0);
        assert_eq!(q.earlier(), None);
    }

    #[test]
    fn an_answer_to_a_solve_given_up_is_ignored() {
        let mut q = Latest::new(BUDGET);
        let slow = q.submit(Purpose::Edit, "slow".into(), 0.0).map_or(0, |j| j.id);
        assert_eq!(q.expire(BUDGET - 1.0), None, "not yet over the budget");
        let expiry = q.expire(BUDGET);
        assert_eq!(expiry, Some(Expiry { purpose: Purpose::Edit, overtaken: false, next: None }));
        assert_eq!(q.answered(slow, BUDGET + 1.0), (Verdict::Unknown, None));
        assert_eq!(q.expire(2.0 * BUDGET), None, "nothing left to give up");
    }

    #[test]
    fn a_solve_given_up_hands_the_worker_to_the_waiting_edit_with_a_budget_of_its_own() {
        let mut q = Latest::new(BUDGET);
        q.submit(Purpose::Restore, "saved".into(), 0.0);
        q.submit(Purpose::Edit, "typed".into(), 100.0);
        let Some(expiry) = q.expire(BUDGET) else { panic!("over the budget") };
        assert_eq!((expiry.purpose, expiry.overtaken), (Purpose::Restore, true));
        assert_eq!(text(&expiry.next), Some("typed"));
        // Its budget counts from when it reached the worker.
        assert_eq!(q.expire(2.0 * BUDGET - 1.0), None);
        assert_eq!(q.running(2.0 * BUDGET - 1.0), Some((Purpose::Edit, BUDGET - 1.0)));
        assert!(q.expire(2.0 * BUDGET).is_some());
    }

    #[test]
    fn a_failed_worker_gives_up_its_solve_at_once() {
        let mut q = Latest::new(BUDGET);
        assert_eq!(q.fail(0.0), None);
        let id = q.submit(Purpose::Confirm, "example".into(), 0.0).map_or(0, |j| j.id);
        let Some(expiry) = q.fail(5.0) else { panic!("a solve was under way") };
        assert_eq!((expiry.purpose, expiry.next), (Purpose::Confirm, None));
        assert_eq!(q.answered(id, 6.0), (Verdict::Unknown, None));
    }

    #[test]
    fn every_job_has_a_number_of_its_own() {
        let mut q = Latest::new(BUDGET);
        let ids: Vec<u32> = (0..5)
            .filter_map(|i| {
                let job = q.submit(Purpose::Edit, i.to_string(), 0.0);
                let _ = q.fail(0.0);
                job.map(|j| j.id)
            })
            .collect();
        assert_eq!(ids.len(), 5);
        assert!(ids.windows(2).all(|w| w[0] < w[1]), "{ids:?}");
    }
}
