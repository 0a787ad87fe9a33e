//! Reduced ordered binary decision diagrams, for functions of more inputs
//! than a truth table holds: equivalence with a counterexample, constants,
//! dependence and cofactors of expressions over 64 inputs and more, without
//! enumerating minterms.
//!
//! Variables are ordered by index (variable 0 at the root). One [`Bdd`]
//! manager owns the nodes of all the functions built in it; a function is a
//! [`BddRef`] into it. Two functions are equal exactly when their refs are
//! (canonical form), which makes equivalence a comparison.
//!
//! ```
//! use implica_logic::{Bdd, BoolExpr, Effort};
//! // Over 80 inputs: x0 & x79 | !x0 & x79 is just x79.
//! let (x0, x79) = (BoolExpr::Var(0), BoolExpr::Var(79));
//! let e = BoolExpr::Or(vec![
//!     BoolExpr::And(vec![x0.clone(), x79.clone()]),
//!     BoolExpr::And(vec![BoolExpr::negate(x0), x79.clone()]),
//! ]);
//! let mut bdd = Bdd::new(80);
//! let mut effort = Effort::new(1_000_000);
//! let f = bdd.from_expr(&e, &mut effort).unwrap();
//! let g = bdd.from_expr(&x79, &mut effort).unwrap();
//! assert_eq!(bdd.counterexample(f, g, &mut effort).unwrap(), None);
//! assert_eq!(bdd.support(f), vec![79]);
//! ```

use crate::{BoolExpr, Cover, Cube, Effort, Interrupted};

type HashMap<K, V> = crate::FastMap<K, V>;

/// A function in a [`Bdd`] manager.
#[derive(Clone, Copy, PartialEq, Eq, Hash, Debug)]
pub struct BddRef(u32);

impl BddRef {
    /// The constant 0.
    pub const FALSE: BddRef = BddRef(0);
    /// The constant 1.
    pub const TRUE: BddRef = BddRef(1);
}

#[derive(Clone, Copy, PartialEq, Eq, Hash)]
struct Node {
    var: u32,
    lo: u32,
    hi: u32,
}

#[derive(Clone, Copy, PartialEq, Eq, Hash)]
enum Op {
    And,
    Or,
    Xor,
}

/// A BDD manager over `vars` variables with a bound on its nodes.
pub struct Bdd {
    vars: usize,
    nodes: Vec<Node>,
    unique: HashMap<Node, u32>,
    cache: HashMap<(Op, u32, u32), u32>,
    max_nodes: usize,
}

/// Nodes a manager holds by default: with its unique table and its
/// operation cache (cleared at twice the nodes), about 270 MB when full
/// (docs/benchmarks.md).
pub const DEFAULT_MAX_NODES: usize = 1 << 21;

impl Bdd {
    /// A manager over `vars` variables holding at most
    /// [`DEFAULT_MAX_NODES`] nodes.
    pub fn new(vars: usize) -> Bdd {
        Bdd::with_max_nodes(vars, DEFAULT_MAX_NODES)
    }

    /// A manager holding at most `max_nodes` nodes; building past that
    /// fails with [`Interrupted::OutOfBudget`], so memory stays bounded.
    pub fn with_max_nodes(vars: usize, max_nodes: usize) -> Bdd {
        let terminal = |v| Node {
            var: u32::MAX,
            lo: v,
            hi: v,
        };
        Bdd {
            vars,
            nodes: vec![terminal(0), terminal(1)],
            unique: HashMap::default(),
            cache: HashMap::default(),
            max_nodes,
        }
    }

    /// Number of variables.
    pub fn vars(&self) -> usize {
        self.vars
    }

    /// Nodes held by the manager, terminals included.
    pub fn len(&self) -> usize {
        self.nodes.len()
    }

    /// Whether only the two terminals exist.
    pub fn is_empty(&self) -> bool {
        self.nodes.len() == 2
    }

    fn mk(&mut self, var: u32, lo: u32, hi: u32) -> Result<u32, Interrupted> {
        if lo == hi {
            return Ok(lo);
        }
        let node = Node { var, lo, hi };
        if let Some(&id) = self.unique.get(&node) {
            return Ok(id);
        }
        if self.nodes.len() >= self.max_nodes {
            return Err(Interrupted::OutOfBudget);
        }
        let id = self.nodes.len() as u32;
        self.nodes.push(node);
        self.unique.insert(node, id);
        Ok(id)
    }

    /// Variable `i` (panics when `i` is not below [`Bdd::vars`]).
    pub fn var(&mut self, i: usize) -> Result<BddRef, Interrupted> {
        assert!(i < self.vars, "variable {i} of {}", self.vars);
        Ok(BddRef(self.mk(i as u32, 0, 1)?))
    }

    fn apply(&mut self, op: Op, f: u32, g: u32, effort: &mut Effort) -> Result<u32, Interrupted> {
        match op {
            Op::And => {
                if f == 0 || g == 0 {
                    return Ok(0);
                }
                if f == 1 || f == g {
                    return Ok(g);
                }
                if g == 1 {
                    return Ok(f);
                }
            }
            Op::Or => {
                if f == 1 || g == 1 {
                    return Ok(1);
                }
                if f == 0 || f == g {
                    return Ok(g);
                }
                if g == 0 {
                    return Ok(f);
                }
            }
            Op::Xor => {
                if f == g {
                    return Ok(0);
                }
                if f == 0 {
                    return Ok(g);
                }
                if g == 0 {
                    return Ok(f);
                }
                if f <= 1 && g <= 1 {
                    return Ok(f ^ g);
                }
            }
        }
        let key = (op, f.min(g), f.max(g));
        if let Some(&r) = self.cache.get(&key) {
            return Ok(r);
        }
        effort.spend(1)?;
        let (nf, ng) = (self.nodes[f as usize], self.nodes[g as usize]);
        let var = nf.var.min(ng.var);
        let (f0, f1) = if nf.var == var {
            (nf.lo, nf.hi)
        } else {
            (f, f)
        };
        let (g0, g1) = if ng.var == var {
            (ng.lo, ng.hi)
        } else {
            (g, g)
        };
        let lo = self.apply(op, f0, g0, effort)?;
        let hi = self.apply(op, f1, g1, effort)?;
        let r = self.mk(var, lo, hi)?;
        // The cache only saves work; bound it with the nodes.
        if self.cache.len() >= 2 * self.max_nodes {
            self.cache.clear();
        }
        self.cache.insert(key, r);
        Ok(r)
    }

    /// `f & g`.
    pub fn and(
        &mut self,
        f: BddRef,
        g: BddRef,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        self.apply(Op::And, f.0, g.0, effort).map(BddRef)
    }

    /// `f | g`.
    pub fn or(&mut self, f: BddRef, g: BddRef, effort: &mut Effort) -> Result<BddRef, Interrupted> {
        self.apply(Op::Or, f.0, g.0, effort).map(BddRef)
    }

    /// `f ^ g`.
    pub fn xor(
        &mut self,
        f: BddRef,
        g: BddRef,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        self.apply(Op::Xor, f.0, g.0, effort).map(BddRef)
    }

    /// `!f`.
    pub fn not(&mut self, f: BddRef, effort: &mut Effort) -> Result<BddRef, Interrupted> {
        self.apply(Op::Xor, f.0, 1, effort).map(BddRef)
    }

    /// The function of an expression.
    ///
    /// # Panics
    ///
    /// When a variable of `e` is not below [`Bdd::vars`]. The recursion
    /// follows the nesting of `e` (see [`BoolExpr`]).
    pub fn from_expr(&mut self, e: &BoolExpr, effort: &mut Effort) -> Result<BddRef, Interrupted> {
        match e {
            BoolExpr::Const(b) => Ok(if *b { BddRef::TRUE } else { BddRef::FALSE }),
            BoolExpr::Var(i) => self.var(*i),
            BoolExpr::Not(x) => {
                let x = self.from_expr(x, effort)?;
                self.not(x, effort)
            }
            BoolExpr::And(es) | BoolExpr::Or(es) | BoolExpr::Xor(es) => {
                let (op, unit) = match e {
                    BoolExpr::And(_) => (Op::And, 1),
                    BoolExpr::Or(_) => (Op::Or, 0),
                    _ => (Op::Xor, 0),
                };
                let mut acc = unit;
                for x in es {
                    let x = self.from_expr(x, effort)?;
                    acc = self.apply(op, acc, x.0, effort)?;
                }
                Ok(BddRef(acc))
            }
        }
    }

    /// The function of a sum of products (over at most [`Bdd::vars`] inputs).
    pub fn from_cover(
        &mut self,
        cover: &Cover,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let mut acc = 0;
        for c in &cover.cubes {
            if c.is_empty(cover.vars) {
                continue;
            }
            // Build the cube bottom-up: one node per literal.
            let mut term = 1;
            for i in (0..cover.vars).rev() {
                term = match c.literal_of(i) {
                    Some(true) => self.mk(i as u32, 0, term)?,
                    Some(false) => self.mk(i as u32, term, 0)?,
                    None => term,
                };
            }
            acc = self.apply(Op::Or, acc, term, effort)?;
        }
        Ok(BddRef(acc))
    }

    /// The constant value, when `f` is constant.
    ///
    /// ```
    /// use implica_logic::{Bdd, Effort};
    /// // Over 70 inputs: x5 & x69 with x69 fixed to 0 is constant 0; with
    /// // x69 fixed to 1 it is x5, which is not constant.
    /// let mut bdd = Bdd::new(70);
    /// let mut effort = Effort::new(100_000);
    /// let (x5, x69) = (bdd.var(5).unwrap(), bdd.var(69).unwrap());
    /// let f = bdd.and(x5, x69, &mut effort).unwrap();
    /// let low = bdd.restrict(f, 69, false, &mut effort).unwrap();
    /// assert_eq!(bdd.constant(low), Some(false));
    /// let high = bdd.restrict(f, 69, true, &mut effort).unwrap();
    /// assert_eq!((bdd.constant(high), high), (None, x5));
    /// let mut inputs = vec![false; 70];
    /// inputs[5] = true;
    /// assert!(!bdd.eval(f, &inputs));
    /// inputs[69] = true;
    /// assert!(bdd.eval(f, &inputs));
    /// ```
    pub fn constant(&self, f: BddRef) -> Option<bool> {
        match f.0 {
            0 => Some(false),
            1 => Some(true),
            _ => None,
        }
    }

    /// The value for an input vector (`inputs[i]` is variable `i`).
    pub fn eval(&self, f: BddRef, inputs: &[bool]) -> bool {
        let mut n = f.0;
        while n > 1 {
            let node = self.nodes[n as usize];
            n = if inputs[node.var as usize] {
                node.hi
            } else {
                node.lo
            };
        }
        n == 1
    }

    /// An input vector where `f` is 1 (variables off the path at 0), or
    /// `None` when `f` is 0.
    pub fn any_one(&self, f: BddRef) -> Option<Vec<bool>> {
        if f.0 == 0 {
            return None;
        }
        let mut point = vec![false; self.vars];
        let mut n = f.0;
        while n > 1 {
            let node = self.nodes[n as usize];
            // Every non-terminal node has a path to 1 (reduced form).
            if node.lo != 0 {
                n = node.lo;
            } else {
                point[node.var as usize] = true;
                n = node.hi;
            }
        }
        Some(point)
    }

    /// Whether `f` and `g` are the same function; otherwise an input vector
    /// where they differ.
    pub fn counterexample(
        &mut self,
        f: BddRef,
        g: BddRef,
        effort: &mut Effort,
    ) -> Result<Option<Vec<bool>>, Interrupted> {
        if f == g {
            return Ok(None);
        }
        let d = self.xor(f, g, effort)?;
        Ok(self.any_one(d))
    }

    /// The cofactor with variable `i` fixed to `value`.
    pub fn restrict(
        &mut self,
        f: BddRef,
        i: usize,
        value: bool,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let mut memo = HashMap::default();
        self.restrict_rec(f.0, i as u32, value, &mut memo, effort)
            .map(BddRef)
    }

    fn restrict_rec(
        &mut self,
        n: u32,
        var: u32,
        value: bool,
        memo: &mut HashMap<u32, u32>,
        effort: &mut Effort,
    ) -> Result<u32, Interrupted> {
        let node = self.nodes[n as usize];
        if n <= 1 || node.var > var {
            return Ok(n);
        }
        if node.var == var {
            return Ok(if value { node.hi } else { node.lo });
        }
        if let Some(&r) = memo.get(&n) {
            return Ok(r);
        }
        effort.spend(1)?;
        let lo = self.restrict_rec(node.lo, var, value, memo, effort)?;
        let hi = self.restrict_rec(node.hi, var, value, memo, effort)?;
        let r = self.mk(node.var, lo, hi)?;
        memo.insert(n, r);
        Ok(r)
    }

    /// `f` with every variable from `first` on quantified existentially:
    /// 1 where some value of those variables makes `f` 1.
    pub fn exists_from(
        &mut self,
        f: BddRef,
        first: usize,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let mut memo = HashMap::default();
        let first = first as u32;
        self.exists_rec(f.0, &|v| v >= first, &mut memo, effort)
            .map(BddRef)
    }

    /// `f` with every variable from `first` on quantified universally: 1
    /// where every value of those variables makes `f` 1.
    pub fn forall_from(
        &mut self,
        f: BddRef,
        first: usize,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let nf = self.not(f, effort)?;
        let e = self.exists_from(nf, first, effort)?;
        self.not(e, effort)
    }

    /// `f` with the variables `v` where `quantified[v]` quantified
    /// existentially (variables past the slice are kept).
    pub fn exists(
        &mut self,
        f: BddRef,
        quantified: &[bool],
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let mut memo = HashMap::default();
        let q = |v: u32| quantified.get(v as usize).copied().unwrap_or(false);
        self.exists_rec(f.0, &q, &mut memo, effort).map(BddRef)
    }

    /// `f` with the variables `v` where `quantified[v]` quantified
    /// universally.
    pub fn forall(
        &mut self,
        f: BddRef,
        quantified: &[bool],
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let nf = self.not(f, effort)?;
        let e = self.exists(nf, quantified, effort)?;
        self.not(e, effort)
    }

    fn exists_rec(
        &mut self,
        n: u32,
        quantified: &dyn Fn(u32) -> bool,
        memo: &mut HashMap<u32, u32>,
        effort: &mut Effort,
    ) -> Result<u32, Interrupted> {
        if n <= 1 {
            return Ok(n);
        }
        if let Some(&r) = memo.get(&n) {
            return Ok(r);
        }
        effort.spend(1)?;
        let node = self.nodes[n as usize];
        let lo = self.exists_rec(node.lo, quantified, memo, effort)?;
        let hi = self.exists_rec(node.hi, quantified, memo, effort)?;
        let r = if quantified(node.var) {
            self.apply(Op::Or, lo, hi, effort)?
        } else {
            self.mk(node.var, lo, hi)?
        };
        memo.insert(n, r);
        Ok(r)
    }

    /// Copies function `f` of the manager `from` into this one, renaming
    /// variable `v` to `rename(v)`. `None` when `f` depends on a variable
    /// that has no new name. The renaming must keep the variable order
    /// (`v < w` implies `rename(v) < rename(w)`) so that the copy stays
    /// reduced and ordered.
    pub fn transfer(
        &mut self,
        from: &Bdd,
        f: BddRef,
        rename: &dyn Fn(usize) -> Option<usize>,
        effort: &mut Effort,
    ) -> Result<Option<BddRef>, Interrupted> {
        let mut memo: HashMap<u32, u32> = HashMap::default();
        // Depth-first, children before parents, without recursion.
        let mut stack = vec![(f.0, false)];
        while let Some((n, expanded)) = stack.pop() {
            if n <= 1 || memo.contains_key(&n) {
                continue;
            }
            let node = from.nodes[n as usize];
            if !expanded {
                stack.push((n, true));
                stack.push((node.lo, false));
                stack.push((node.hi, false));
                continue;
            }
            effort.spend(1)?;
            let Some(var) = rename(node.var as usize).filter(|&v| v < self.vars) else {
                return Ok(None);
            };
            let child = |c: u32, memo: &HashMap<u32, u32>| if c <= 1 { c } else { memo[&c] };
            let (lo, hi) = (child(node.lo, &memo), child(node.hi, &memo));
            let r = self.mk(var as u32, lo, hi)?;
            memo.insert(n, r);
        }
        Ok(Some(BddRef(if f.0 <= 1 { f.0 } else { memo[&f.0] })))
    }

    /// The function of a truth table, table variable `i` being diagram
    /// variable `i` (so at most [`Bdd::vars`] of them), built from the rows
    /// up, one level of nodes per variable.
    ///
    /// ```
    /// use implica_logic::{Bdd, Effort, TruthTable};
    /// let t = TruthTable::var(3, 0).xor(&TruthTable::var(3, 2));
    /// let mut bdd = Bdd::new(3);
    /// let f = bdd.from_truth_table(&t, &mut Effort::new(1_000)).unwrap();
    /// assert_eq!(bdd.to_truth_table(f, &[0, 1, 2]), t);
    /// assert_eq!(bdd.support(f), vec![0, 2]);
    /// ```
    ///
    /// # Panics
    ///
    /// When the table has more variables than the diagram.
    pub fn from_truth_table(
        &mut self,
        t: &crate::TruthTable,
        effort: &mut Effort,
    ) -> Result<BddRef, Interrupted> {
        let n = t.vars();
        assert!(
            n <= self.vars,
            "a table over {n} inputs, a diagram over {}",
            self.vars
        );
        // The nodes of the last level are the rows' values; each level up
        // joins pairs of neighbours across its variable.
        let mut level: Vec<u32> = (0..1usize << n).map(|m| u32::from(t.get(m))).collect();
        for v in (0..n).rev() {
            effort.spend(1 + level.len() as u64 / 8)?;
            let mut up = Vec::with_capacity(level.len() / 2);
            for pair in level.chunks_exact(2) {
                up.push(self.mk(v as u32, pair[0], pair[1])?);
            }
            level = up;
        }
        Ok(BddRef(level[0]))
    }

    /// The truth table of `f` over the variables `order` (at most
    /// [`crate::MAX_VARS`]; `order[0]` becomes the most significant), other
    /// variables at 0. Exact when `f` depends on no variable outside `order`.
    pub fn to_truth_table(&self, f: BddRef, order: &[usize]) -> crate::TruthTable {
        let k = order.len();
        let mut t = crate::TruthTable::zero(k);
        let mut point = vec![false; self.vars];
        for m in 0..1usize << k {
            for (j, &v) in order.iter().enumerate() {
                point[v] = (m >> (k - 1 - j)) & 1 == 1;
            }
            if self.eval(f, &point) {
                t.set(m, true);
            }
        }
        t
    }

    /// A sum of products of `f` over the variables `order` (at most 64;
    /// variable `order[j]` becomes cube variable `j`), one disjoint cube per
    /// path to 1; other variables are read as 0, as in
    /// [`Bdd::to_truth_table`]. Fails when the cover would exceed `max_cubes`.
    pub fn to_cover_over(
        &self,
        f: BddRef,
        order: &[usize],
        max_cubes: usize,
    ) -> Result<Cover, Interrupted> {
        let k = order.len();
        assert!(k <= 64, "a cover has at most 64 inputs");
        let mut local = HashMap::default();
        for (j, &v) in order.iter().enumerate() {
            local.insert(v as u32, j);
        }
        let mut cubes = Vec::new();
        let mut stack = vec![(f.0, Cube::universe(k))];
        while let Some((n, c)) = stack.pop() {
            if n == 0 {
                continue;
            }
            if n == 1 {
                if cubes.len() >= max_cubes {
                    return Err(Interrupted::OutOfBudget);
                }
                cubes.push(c);
                continue;
            }
            let node = self.nodes[n as usize];
            let Some(&j) = local.get(&node.var) else {
                stack.push((node.lo, c));
                continue;
            };
            stack.push((node.hi, c.and(&Cube::literal(k, j, true))));
            stack.push((node.lo, c.and(&Cube::literal(k, j, false))));
        }
        Ok(Cover { vars: k, cubes })
    }

    /// The variables `f` depends on, ascending. In a reduced diagram these
    /// are exactly the variables of its nodes.
    pub fn support(&self, f: BddRef) -> Vec<usize> {
        let mut seen = std::collections::HashSet::new();
        let mut vars = std::collections::BTreeSet::new();
        let mut stack = vec![f.0];
        while let Some(n) = stack.pop() {
            if n <= 1 || !seen.insert(n) {
                continue;
            }
            let node = self.nodes[n as usize];
            vars.insert(node.var as usize);
            stack.push(node.lo);
            stack.push(node.hi);
        }
        vars.into_iter().collect()
    }

    /// Number of input vectors where `f` is 1, over all [`Bdd::vars`] inputs
    /// (as a float: it may exceed every integer type for many inputs).
    pub fn count_ones(&self, f: BddRef) -> f64 {
        self.fraction_ones(f) * 2f64.powi(self.vars as i32)
    }

    /// The fraction of all input vectors where `f` is 1: multiplied by
    /// 2^k, the count over any k variables that include its support.
    pub fn fraction_ones(&self, f: BddRef) -> f64 {
        let mut memo: HashMap<u32, f64> = HashMap::default();
        // Fraction of the input space where the node is 1.
        fn frac(b: &Bdd, n: u32, memo: &mut HashMap<u32, f64>) -> f64 {
            if n <= 1 {
                return f64::from(n);
            }
            if let Some(&v) = memo.get(&n) {
                return v;
            }
            let node = b.nodes[n as usize];
            let v = 0.5 * (frac(b, node.lo, memo) + frac(b, node.hi, memo));
            memo.insert(n, v);
            v
        }
        frac(self, f.0, &mut memo)
    }

    /// A sum of products of `f` (disjoint cubes, one per path to 1), over
    /// at most 64 inputs; fails when it would exceed `max_cubes`.
    ///
    /// ```
    /// use implica_logic::{Bdd, Effort};
    /// // x0 | x1 over 2 inputs: two paths to 1, x0 and !x0 & x1.
    /// let mut bdd = Bdd::new(2);
    /// let mut effort = Effort::new(1_000);
    /// let (a, b) = (bdd.var(0).unwrap(), bdd.var(1).unwrap());
    /// let f = bdd.or(a, b, &mut effort).unwrap();
    /// let c = bdd.to_cover(f, 10).unwrap();
    /// assert_eq!((c.len(), c.literals()), (2, 3));
    /// assert_eq!(bdd.from_cover(&c, &mut effort).unwrap(), f);
    /// assert!(bdd.to_cover(f, 1).is_err());
    /// ```
    pub fn to_cover(&self, f: BddRef, max_cubes: usize) -> Result<Cover, Interrupted> {
        let order: Vec<usize> = (0..self.vars).collect();
        self.to_cover_over(f, &order, max_cubes)
    }

    /// Nodes reachable from `f`, terminals excluded: the size of its diagram.
    pub fn size(&self, f: BddRef) -> usize {
        let mut seen = std::collections::HashSet::new();
        let mut stack = vec![f.0];
        while let Some(n) = stack.pop() {
            if n <= 1 || !seen.insert(n) {
                continue;
            }
            let node = self.nodes[n as usize];
            stack.push(node.lo);
            stack.push(node.hi);
        }
        seen.len()
    }
}
