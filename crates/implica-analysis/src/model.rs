//! The semantic model of one document: its signals, their definitions, what
//! each definition reads, and the dependency graph with its cycles.
//!
//! The model is built from a syntax tree with errors in it as well: error
//! nodes simply define or read nothing. It borrows the tree, so it is cheap
//! to rebuild after each edit.

use implica_syntax::Span;
use implica_syntax::ast::{
    Expr, ExprKind, ItemKind, Name, Rhs, SmolStr, SourceFile, Table, TermList,
};

/// Index of a signal in [`Model::signals`].
pub type SignalId = usize;

/// Index of a definition in [`Model::definitions`].
pub type DefId = usize;

/// What a name is, by its declaration.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum SignalKind {
    /// Declared by `input`.
    Input,
    /// Declared by `output`.
    Output,
    /// Introduced by `let` (or a `let table` column).
    Intermediate,
    /// Neither declared nor introduced by `let`: assigned without `let`, or
    /// only ever read.
    Undeclared,
}

/// A named signal.
#[derive(Debug, Clone)]
pub struct Signal {
    pub name: SmolStr,
    pub kind: SignalKind,
    /// The names in `input` and `output` statements that declare it.
    pub declarations: Vec<Span>,
    /// Its definitions, in source order (more than one is a fault).
    pub definitions: Vec<DefId>,
    /// Every place it is read.
    pub references: Vec<Span>,
    /// Its position among the primary inputs, for an input.
    pub input_index: Option<usize>,
}

/// The right-hand side of a definition.
#[derive(Debug, Clone, Copy)]
pub enum Body<'f> {
    Expr(&'f Expr),
    Terms(&'f TermList),
    /// Column `column` of the table's outputs.
    Column {
        table: &'f Table,
        column: usize,
    },
}

impl<'f> Body<'f> {
    /// The signals a term list (`over (...)`) or a table column (the
    /// table's input columns) is stated over; `None` for an expression.
    pub fn header(&self) -> Option<&'f [Name]> {
        match *self {
            Body::Expr(_) => None,
            Body::Terms(t) => Some(&t.over),
            Body::Column { table, .. } => Some(&table.inputs),
        }
    }
}

/// One definition of one signal.
#[derive(Debug, Clone)]
pub struct Definition<'f> {
    pub signal: SignalId,
    /// Index of the statement in [`SourceFile::items`].
    pub item: usize,
    /// The defined name as written (the target, or the table's column header).
    pub target: Span,
    /// Whether it was written with `let`.
    pub is_let: bool,
    pub body: Body<'f>,
    /// The signals it reads, each once, in order of first appearance.
    pub reads: Vec<SignalId>,
}

/// A `never`, `assert` or `expect` statement's expression or table.
#[derive(Debug, Clone, Copy)]
pub struct Statement<'f, T> {
    pub item: usize,
    pub span: Span,
    pub body: &'f T,
}

/// The semantic model of one document.
#[derive(Debug)]
pub struct Model<'f> {
    pub file: &'f SourceFile,
    pub signals: Vec<Signal>,
    pub definitions: Vec<Definition<'f>>,
    /// The primary inputs, in declaration order.
    pub inputs: Vec<SignalId>,
    pub never: Vec<Statement<'f, Expr>>,
    pub asserts: Vec<Statement<'f, Expr>>,
    pub expects: Vec<Statement<'f, Table>>,
    /// Each set of signals that depend on each other in a loop (a strongly
    /// connected component of the graph with a cycle), members in source
    /// order.
    pub cycles: Vec<Vec<SignalId>>,
    /// The signals, each after every signal its definition reads; signals
    /// on a cycle are left out.
    pub order: Vec<SignalId>,
    by_name: implica_logic::FastMap<SmolStr, SignalId>,
}

impl<'f> Model<'f> {
    /// Builds the model of a parsed document.
    pub fn build(file: &'f SourceFile) -> Model<'f> {
        let mut m = Model {
            file,
            signals: Vec::new(),
            definitions: Vec::new(),
            inputs: Vec::new(),
            never: Vec::new(),
            asserts: Vec::new(),
            expects: Vec::new(),
            cycles: Vec::new(),
            order: Vec::new(),
            by_name: Default::default(),
        };
        // Declarations first, so that a use before the declaration resolves.
        for item in &file.items {
            match &item.kind {
                ItemKind::Input(d) => {
                    for n in &d.names {
                        let id = m.intern(&n.text);
                        let s = &mut m.signals[id];
                        s.declarations.push(n.span);
                        if s.kind == SignalKind::Undeclared {
                            s.kind = SignalKind::Input;
                            s.input_index = Some(m.inputs.len());
                            m.inputs.push(id);
                        }
                    }
                }
                ItemKind::Output(d) => {
                    for n in &d.names {
                        let id = m.intern(&n.text);
                        let s = &mut m.signals[id];
                        s.declarations.push(n.span);
                        if s.kind == SignalKind::Undeclared {
                            s.kind = SignalKind::Output;
                        }
                    }
                }
                _ => {}
            }
        }
        for (index, item) in file.items.iter().enumerate() {
            match &item.kind {
                ItemKind::Define(d) => {
                    let body = match &d.rhs {
                        Rhs::Expr(e) => Body::Expr(e),
                        Rhs::Terms(t) => Body::Terms(t),
                    };
                    m.define(index, &d.target, d.let_span.is_some(), body);
                }
                ItemKind::Table(t) => {
                    for (column, out) in t.outputs.iter().enumerate() {
                        m.define(
                            index,
                            out,
                            t.let_span.is_some(),
                            Body::Column { table: t, column },
                        );
                    }
                }
                ItemKind::Never(e) => {
                    m.read_expr(e, &mut Vec::new());
                    m.never.push(Statement {
                        item: index,
                        span: item.span,
                        body: e,
                    });
                }
                ItemKind::Assert(e) => {
                    m.read_expr(e, &mut Vec::new());
                    m.asserts.push(Statement {
                        item: index,
                        span: item.span,
                        body: e,
                    });
                }
                ItemKind::Expect(t) => {
                    for n in t.inputs.iter().chain(&t.outputs) {
                        m.read_name(n, &mut Vec::new());
                    }
                    m.expects.push(Statement {
                        item: index,
                        span: item.span,
                        body: t,
                    });
                }
                ItemKind::Input(_) | ItemKind::Output(_) | ItemKind::Error => {}
            }
        }
        m.order_and_cycles();
        m
    }

    /// The signal of a name, if the document mentions it.
    pub fn signal(&self, name: &str) -> Option<SignalId> {
        self.by_name.get(name).copied()
    }

    /// The definition that counts for a signal: its first one.
    pub fn definition_of(&self, s: SignalId) -> Option<&Definition<'f>> {
        self.signals[s]
            .definitions
            .first()
            .map(|&d| &self.definitions[d])
    }

    fn intern(&mut self, name: &SmolStr) -> SignalId {
        if let Some(&id) = self.by_name.get(name) {
            return id;
        }
        let id = self.signals.len();
        self.signals.push(Signal {
            name: name.clone(),
            kind: SignalKind::Undeclared,
            declarations: Vec::new(),
            definitions: Vec::new(),
            references: Vec::new(),
            input_index: None,
        });
        self.by_name.insert(name.clone(), id);
        id
    }

    fn define(&mut self, item: usize, target: &Name, is_let: bool, body: Body<'f>) {
        let signal = self.intern(&target.text);
        if is_let && self.signals[signal].kind == SignalKind::Undeclared {
            self.signals[signal].kind = SignalKind::Intermediate;
        }
        let mut reads = Vec::new();
        match body {
            Body::Expr(e) => self.read_expr(e, &mut reads),
            Body::Terms(t) => {
                for n in &t.over {
                    self.read_name(n, &mut reads);
                }
            }
            Body::Column { table, column } => {
                // Every column reads the table's inputs; the header is read
                // once, with the first column.
                for n in &table.inputs {
                    if column == 0 {
                        self.read_name(n, &mut reads);
                    } else {
                        let id = self.intern(&n.text);
                        if !reads.contains(&id) {
                            reads.push(id);
                        }
                    }
                }
            }
        }
        let id = self.definitions.len();
        self.definitions.push(Definition {
            signal,
            item,
            target: target.span,
            is_let,
            body,
            reads,
        });
        self.signals[signal].definitions.push(id);
    }

    fn read_name(&mut self, n: &Name, reads: &mut Vec<SignalId>) {
        let id = self.intern(&n.text);
        self.signals[id].references.push(n.span);
        if !reads.contains(&id) {
            reads.push(id);
        }
    }

    fn read_expr(&mut self, e: &Expr, reads: &mut Vec<SignalId>) {
        for n in name_uses(e) {
            self.read_name(n, reads);
        }
    }

    /// Tarjan's strongly connected components, without recursion (a chain of
    /// a million definitions must not overflow the stack). Components come
    /// out dependencies first, which is the evaluation order.
    fn order_and_cycles(&mut self) {
        let n = self.signals.len();
        let edges: Vec<&[SignalId]> = (0..n)
            .map(|s| match self.signals[s].kind {
                // An input's value is given, whatever a definition says.
                SignalKind::Input => &[][..],
                _ => self.definition_of(s).map_or(&[][..], |d| &d.reads[..]),
            })
            .collect();
        const NONE: usize = usize::MAX;
        let (mut index, mut low) = (vec![NONE; n], vec![0usize; n]);
        let mut on_stack = vec![false; n];
        let (mut stack, mut next) = (Vec::new(), 0usize);
        let mut components: Vec<Vec<SignalId>> = Vec::new();
        for root in 0..n {
            if index[root] != NONE {
                continue;
            }
            // (node, next edge to look at)
            let mut call = vec![(root, 0usize)];
            index[root] = next;
            low[root] = next;
            next += 1;
            stack.push(root);
            on_stack[root] = true;
            while let Some(top) = call.last_mut() {
                let v = top.0;
                if let Some(&w) = edges[v].get(top.1) {
                    top.1 += 1;
                    if index[w] == NONE {
                        index[w] = next;
                        low[w] = next;
                        next += 1;
                        stack.push(w);
                        on_stack[w] = true;
                        call.push((w, 0));
                    } else if on_stack[w] {
                        low[v] = low[v].min(index[w]);
                    }
                    continue;
                }
                call.pop();
                if let Some(&(parent, _)) = call.last() {
                    low[parent] = low[parent].min(low[v]);
                }
                if low[v] == index[v] {
                    let mut comp = Vec::new();
                    while let Some(w) = stack.pop() {
                        on_stack[w] = false;
                        comp.push(w);
                        if w == v {
                            break;
                        }
                    }
                    components.push(comp);
                }
            }
        }
        let (mut cycles, mut order) = (Vec::new(), Vec::new());
        for mut comp in components {
            let cyclic = comp.len() > 1 || edges[comp[0]].contains(&comp[0]);
            if cyclic {
                comp.sort_by_key(|&s| self.first_position(s));
                cycles.push(comp);
            } else {
                order.push(comp[0]);
            }
        }
        cycles.sort_by_key(|c: &Vec<SignalId>| self.first_position(c[0]));
        self.cycles = cycles;
        self.order = order;
    }

    /// Where a signal first appears: its first definition, else its first
    /// declaration, else its first use.
    fn first_position(&self, s: SignalId) -> usize {
        let sig = &self.signals[s];
        sig.definitions
            .first()
            .map(|&d| self.definitions[d].target.start)
            .or_else(|| sig.declarations.first().map(|d| d.start))
            .or_else(|| sig.references.first().map(|r| r.start))
            .unwrap_or(usize::MAX)
    }
}

/// Every name an expression reads, in source order (repeats included).
pub fn name_uses(e: &Expr) -> Vec<&Name> {
    let mut out = Vec::new();
    let mut stack = vec![e];
    while let Some(e) = stack.pop() {
        match &e.kind {
            ExprKind::Name(n) => out.push(n),
            ExprKind::Not { operand, .. } => stack.push(operand),
            ExprKind::Paren(inner) => stack.push(inner),
            ExprKind::Chain { operands, .. } => stack.extend(operands.iter().rev()),
            ExprKind::Const(_) | ExprKind::Error => {}
        }
    }
    out
}
