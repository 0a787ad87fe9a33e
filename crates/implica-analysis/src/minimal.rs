//! Minimal two-level forms of a signal: the sum of products and the product
//! of sums, exact within the budget and heuristic beyond it, each checked
//! against the signal's function before it is returned.

use crate::functions::{Functions, Local, Unknown};
use crate::model::SignalId;
use implica_logic::{
    BoolExpr, Budget, Cover, Effort, Interrupted, Minimized, TruthTable, minimize_heuristic,
    minimize_pos_cancellable, minimize_sop_cancellable,
};

/// How a form was found.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Method {
    /// Prime implicants and a minimum cover.
    Exact,
    /// The expand, irredundant, reduce loop (for functions past the exact
    /// budget).
    Heuristic,
}

impl Method {
    /// The lower-case name used in output formats.
    pub fn as_str(self) -> &'static str {
        match self {
            Method::Exact => "exact",
            Method::Heuristic => "heuristic",
        }
    }
}

/// A two-level form over the signal's inputs (variable `i` is
/// `Local::inputs[i]`).
#[derive(Debug, Clone)]
pub struct Form {
    /// For a sum of products, its terms; for a product of sums, the terms of
    /// the complement whose negated literals make up each sum.
    pub cover: Cover,
    pub expression: BoolExpr,
    /// Product terms (sum of products) or sum terms (product of sums).
    pub terms: usize,
    pub literals: usize,
    pub proven_minimal: bool,
    /// Fewest terms any such form needs, as proven.
    pub lower_bound: usize,
    pub method: Method,
}

/// Why no form was found, with what is known of the function.
#[derive(Debug, Clone, PartialEq)]
pub struct NoForm {
    pub reason: String,
    /// The input combinations the form would have to cover (where the
    /// signal is 1 for a sum of products, 0 for a product of sums), when
    /// known.
    pub rows: Option<f64>,
    /// Fewest terms any such form needs, when known (rows with no
    /// neighbour in the function or its don't-cares).
    pub lower_bound: Option<f64>,
}

impl NoForm {
    fn because(reason: String) -> NoForm {
        NoForm {
            reason,
            rows: None,
            lower_bound: None,
        }
    }
}

/// The minimal forms of one signal.
#[derive(Debug, Clone)]
pub struct SignalForms {
    pub local: Local,
    pub sop: Option<Result<Form, NoForm>>,
    pub pos: Option<Result<Form, NoForm>>,
}

/// Inputs beyond which no cover is built (the cube width).
const MAX_COVER_INPUTS: usize = 64;
/// Cubes a BDD may turn into before the heuristic starts.
const MAX_START_CUBES: usize = 200_000;

/// The requested minimal forms of signal `s`. `effort` bounds the
/// heuristic and the conversions; `budget` the exact minimization.
pub fn minimal_forms(
    f: &mut Functions,
    s: SignalId,
    sop: bool,
    pos: bool,
    budget: &Budget,
    effort: &mut Effort,
) -> Result<Result<SignalForms, Unknown>, Interrupted> {
    let local = match f.local(s, effort)? {
        Ok(l) => l,
        Err(u) => return Ok(Err(u)),
    };
    forms_of(f, local, sop, pos, budget, effort).map(Ok)
}

/// The requested minimal forms of a function given by its on-set and
/// don't-cares (as [`Functions::local`] or
/// [`Functions::listed_over_header`] return them).
pub fn forms_of(
    f: &mut Functions,
    local: Local,
    sop: bool,
    pos: bool,
    budget: &Budget,
    effort: &mut Effort,
) -> Result<SignalForms, Interrupted> {
    let mut forms = SignalForms {
        local,
        sop: None,
        pos: None,
    };
    if sop {
        // With both forms asked for, the sum gets at most half the work,
        // so that a heuristic that uses all it is given leaves the product
        // its share.
        let mut part = effort.part(if pos {
            effort.remaining() / 2
        } else {
            effort.remaining()
        });
        let sum = form(f, &forms.local, false, budget, &mut part);
        effort.spend(part.used())?;
        forms.sop = Some(sum?);
    }
    if pos {
        forms.pos = Some(form(f, &forms.local, true, budget, effort)?);
    }
    Ok(forms)
}

fn form(
    f: &mut Functions,
    local: &Local,
    product_of_sums: bool,
    budget: &Budget,
    effort: &mut Effort,
) -> Result<Result<Form, NoForm>, Interrupted> {
    let k = local.inputs.len();
    // Fewest terms any form needs, when the exact minimization found it out
    // before giving up.
    let mut known_bound = None;
    if k <= budget.max_vars.min(implica_logic::MAX_VARS) {
        let on = f.bdd.to_truth_table(local.on, &local.inputs);
        let dc = f.bdd.to_truth_table(local.dc, &local.inputs);
        let stop = || effort.cancelled();
        let found = if product_of_sums {
            minimize_pos_cancellable(&on, &dc, budget, &stop)?
        } else {
            minimize_sop_cancellable(&on, &dc, budget, &stop)?
        };
        match found {
            Ok(m) => return Ok(check_exact(m, &on, &dc, product_of_sums)),
            Err(t) => known_bound = Some(t.lower_bound),
        }
    }
    if k > MAX_COVER_INPUTS {
        return Ok(Err(NoForm::because(format!(
            "it reads {k} inputs; two-level forms are found for at most {MAX_COVER_INPUTS}"
        ))));
    }
    // Past the exact limit: start the heuristic from the BDD's paths.
    let target = if product_of_sums {
        let care = f.bdd.or(local.on, local.dc, effort)?;
        f.bdd.not(care, effort)?
    } else {
        local.on
    };
    let start = f.bdd.to_cover_over(target, &local.inputs, MAX_START_CUBES);
    let dc = f
        .bdd
        .to_cover_over(local.dc, &local.inputs, MAX_START_CUBES);
    let (Ok(start), Ok(dc)) = (start, dc) else {
        // For a sum of products the target is the on-set, for a product of
        // sums the off-set; either way, what is known is its size and a
        // bound on the terms.
        let size = f.bdd.fraction_ones(target) * 2f64.powi(k as i32);
        let known = isolated(f, target, local, effort)?;
        let bound = match known {
            Some(n) => format!("; at least {n:.0} terms are needed"),
            None => String::new(),
        };
        let (what, value) = if product_of_sums {
            ("0", "sum terms")
        } else {
            ("1", "terms")
        };
        let bound = bound.replace("terms", value);
        return Ok(Err(NoForm {
            reason: format!(
                "too large: it reads {k} inputs and is {what} on {size:.0} of 2^{k} input \
                 combinations; its function has more than {MAX_START_CUBES} disjoint terms, \
                 past what the heuristic starts from{bound}"
            ),
            rows: Some(size),
            lower_bound: known,
        }));
    };
    let h = minimize_heuristic(&start, &dc, effort)?;
    let mut cover = h.cover;
    cover.sort_for_reading();
    // Rows with no neighbour in the function or its don't-cares are terms of
    // their own in every form; a cover with no more terms than that is
    // those rows alone, the only cover of that size, so it is minimal.
    let isolated_rows = match known_bound {
        Some(n) => n,
        None => isolated(f, target, local, effort)?.map_or(0, |n| n as usize),
    };
    let lower_bound = isolated_rows.max(usize::from(!cover.is_empty()));
    let proven_minimal = cover.is_empty() || (isolated_rows > 0 && cover.len() <= isolated_rows);
    Ok(Ok(Form {
        expression: expression(&cover, product_of_sums),
        terms: cover.len(),
        literals: cover.literals(),
        proven_minimal,
        lower_bound,
        method: Method::Heuristic,
        cover,
    }))
}

/// How many rows of `target` have no neighbour (one input flipped) in
/// `target` or the don't-cares: each such row is a prime implicant of its
/// own, which every two-level form must use, so their number is a lower
/// bound on the terms. `None` when the count is 0 or takes too much work.
fn isolated(
    f: &mut Functions,
    target: implica_logic::BddRef,
    local: &Local,
    effort: &mut Effort,
) -> Result<Option<f64>, Interrupted> {
    let bdd = &mut f.bdd;
    let Ok(care) = bdd.or(target, local.dc, effort) else {
        return Ok(None);
    };
    // Only the rows the form must cover count, not those free anyway.
    let start = (|| {
        let free = bdd.not(local.dc, effort)?;
        bdd.and(target, free, effort)
    })();
    let mut alone = match start {
        Ok(r) => r,
        Err(Interrupted::Cancelled) => return Err(Interrupted::Cancelled),
        Err(Interrupted::OutOfBudget) => return Ok(None),
    };
    for &i in &local.inputs {
        // care with input i flipped: x_i ? care|x_i=0 : care|x_i=1
        let step = (|| {
            let lo = bdd.restrict(care, i, false, effort)?;
            let hi = bdd.restrict(care, i, true, effort)?;
            let x = bdd.var(i)?;
            let nx = bdd.not(x, effort)?;
            let a = bdd.and(x, lo, effort)?;
            let b = bdd.and(nx, hi, effort)?;
            let flipped = bdd.or(a, b, effort)?;
            let none = bdd.not(flipped, effort)?;
            bdd.and(alone, none, effort)
        })();
        match step {
            Ok(r) => alone = r,
            Err(Interrupted::Cancelled) => return Err(Interrupted::Cancelled),
            Err(Interrupted::OutOfBudget) => return Ok(None),
        }
    }
    let n = bdd.fraction_ones(alone) * 2f64.powi(local.inputs.len() as i32);
    Ok((n >= 1.0).then_some(n))
}

fn expression(cover: &Cover, product_of_sums: bool) -> BoolExpr {
    if product_of_sums {
        BoolExpr::from_complement_cover(cover)
    } else {
        BoolExpr::from_cover(cover)
    }
}

/// The exact result, after a check by truth table that the expression
/// computes the function where it is specified.
fn check_exact(
    mut m: Minimized,
    on: &TruthTable,
    dc: &TruthTable,
    product_of_sums: bool,
) -> Result<Form, NoForm> {
    m.cover.sort_for_reading();
    let e = expression(&m.cover, product_of_sums);
    let t = e.truth_table(on.vars());
    if !t.and_not(dc).eq(&on.and_not(dc)) {
        return Err(NoForm::because(
            "internal error: the minimized form did not check out; please report this".to_string(),
        ));
    }
    Ok(Form {
        expression: e,
        terms: m.cover.len(),
        literals: m.cover.literals(),
        proven_minimal: m.proven_minimal,
        lower_bound: m.lower_bound,
        method: Method::Exact,
        cover: m.cover,
    })
}
