//! Work budgets and cancellation for the operations whose cost can grow
//! exponentially with the number of inputs (covers and BDDs).

/// How much work an operation may do, and a way for the caller to stop it.
///
/// Work is counted in abstract units (roughly one per cube or BDD node
/// visited), so the same inputs and budget always stop at the same place,
/// whatever the machine. The cancellation check is polled every few hundred
/// units; it is how an editor abandons an analysis of a document that has
/// changed since.
///
/// ```
/// use implica_logic::{Effort, Interrupted};
/// let mut effort = Effort::new(10);
/// assert_eq!(effort.spend(20), Err(Interrupted::OutOfBudget));
/// assert_eq!(effort.used(), 10); // used up, not overdrawn
///
/// let stop = || true;
/// let mut effort = Effort::unlimited().with_cancel(&stop);
/// assert_eq!(effort.spend(1_000), Err(Interrupted::Cancelled));
/// ```
pub struct Effort<'a> {
    limit: u64,
    used: u64,
    next_poll: u64,
    cancel: Option<&'a dyn Fn() -> bool>,
}

/// Why an operation stopped before its answer.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Interrupted {
    /// The work budget ran out.
    OutOfBudget,
    /// The caller's cancellation check said stop.
    Cancelled,
}

impl std::fmt::Display for Interrupted {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            Interrupted::OutOfBudget => "the work budget ran out",
            Interrupted::Cancelled => "cancelled",
        })
    }
}

impl std::error::Error for Interrupted {}

/// Units between two polls of the cancellation check.
const POLL_EVERY: u64 = 256;

impl<'a> Effort<'a> {
    /// A budget of `limit` units.
    pub fn new(limit: u64) -> Effort<'a> {
        Effort {
            limit,
            used: 0,
            next_poll: POLL_EVERY,
            cancel: None,
        }
    }

    /// No budget (only cancellation, if set, stops the work).
    pub fn unlimited() -> Effort<'a> {
        Effort::new(u64::MAX)
    }

    /// The same budget, also stopped when `cancel` returns true.
    pub fn with_cancel(mut self, cancel: &'a dyn Fn() -> bool) -> Effort<'a> {
        self.cancel = Some(cancel);
        self
    }

    /// Whether the caller's cancellation check says stop (polled now),
    /// for work that is bounded otherwise but should still stop early.
    pub fn cancelled(&self) -> bool {
        self.cancel.is_some_and(|c| c())
    }

    /// Units spent so far.
    pub fn used(&self) -> u64 {
        self.used
    }

    /// Units left.
    pub fn remaining(&self) -> u64 {
        self.limit.saturating_sub(self.used)
    }

    /// A budget of at most `limit` of the units left, with the same
    /// cancellation check; charge its use back with [`Effort::spend`],
    /// which then never fails for want of budget (a part is used up, not
    /// overdrawn, when it runs out).
    ///
    /// ```
    /// use implica_logic::Effort;
    /// let mut whole = Effort::new(100);
    /// let mut half = whole.part(50);
    /// assert!(half.spend(80).is_err());
    /// assert!(whole.spend(half.used()).is_ok());
    /// assert_eq!(whole.remaining(), 50);
    /// ```
    pub fn part(&self, limit: u64) -> Effort<'a> {
        Effort {
            limit: limit.min(self.remaining()),
            used: 0,
            next_poll: POLL_EVERY,
            cancel: self.cancel,
        }
    }

    /// Spends `units`, failing when the budget is gone or the caller cancelled.
    /// A spend the budget refuses leaves it used up, not overdrawn: the work
    /// it was for is not done, and a part charged back to its parent then
    /// never costs the parent more than the part was given.
    pub fn spend(&mut self, units: u64) -> Result<(), Interrupted> {
        self.used = self.used.saturating_add(units);
        if self.used > self.limit {
            self.used = self.limit;
            return Err(Interrupted::OutOfBudget);
        }
        if self.used >= self.next_poll {
            self.next_poll = self.used.saturating_add(POLL_EVERY);
            if self.cancel.is_some_and(|c| c()) {
                return Err(Interrupted::Cancelled);
            }
        }
        Ok(())
    }
}
