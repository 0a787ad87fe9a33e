"""Reference answers for crates/implica-logic/tests/oracle.rs.

Reads one JSON request per line on stdin and writes one JSON answer per line
on stdout, so that a single process serves the whole test:

  {"op": "sympy", "functions": [{"vars": n, "on": [...], "dc": [...],
                                 "forms": ["sop", "pos"]}, ...]}
    -> {"results": [{"sop": [term, ...], "pos": [clause, ...]}, ...]}

    sympy.logic's SOPform and POSform on the minterms and don't-cares, each
    result taken apart into its terms (SOP) or clauses (POS). A term or a
    clause is a string of one character per variable, variable 0 first:
    "1" the plain literal, "0" the negated one, "-" absent. The constant 1
    as a sum is one term of no literal; the constant 0 as a product is one
    clause of no literal.

  {"op": "maxsat", "problems": [{"rows": [[column, ...], ...],
                                 "literals": [count, ...]}, ...]}
    -> {"results": [{"columns": [column, ...], "terms": t, "literals": l}]}

    The minimum-cost cover of a unate covering problem (every row needs one
    of its columns; fewest columns, then fewest literals), solved with
    PySAT's RC2 MaxSAT solver.

  {"op": "mip", "problems": [same as "maxsat"]}
    -> {"results": [{"columns": [...], "terms": t, "literals": l}]}

    The same minimum, by the HiGHS mixed-integer solver (highspy): first
    the fewest columns, then, with the count fixed there, the fewest
    literals; both solved to a proven optimum (no gap allowed), single
    threaded. Faster than RC2 on the larger problems.

Minterm index bits map to variables most significant first, as in sympy's
SOPform (variables[0] is the leading bit) and in implica-logic.
"""

import json
import os
import sys

from sympy import Not, Symbol, false, symbols, true
from sympy.logic import POSform, SOPform
from sympy.logic.boolalg import And, Or


def literal(arg, index):
    if isinstance(arg, Symbol):
        return index[arg], "1"
    if isinstance(arg, Not) and isinstance(arg.args[0], Symbol):
        return index[arg.args[0]], "0"
    raise ValueError(f"not a literal: {arg}")


def parts(expr, vars, index, outer, inner, empty_part, no_part):
    """The terms (outer Or, inner And) or clauses (outer And, inner Or)."""
    if expr is empty_part:
        return ["-" * vars]
    if expr is no_part:
        return []
    out = []
    for part in expr.args if isinstance(expr, outer) else (expr,):
        cells = ["-"] * vars
        for lit in part.args if isinstance(part, inner) else (part,):
            i, value = literal(lit, index)
            if cells[i] != "-":
                raise ValueError(f"variable repeated in {part}")
            cells[i] = value
        out.append("".join(cells))
    return out


def sympy_forms(function):
    n = function["vars"]
    variables = symbols(f"x0:{n}")
    index = {v: i for i, v in enumerate(variables)}
    on, dc = function["on"], function["dc"]
    result = {}
    if "sop" in function["forms"]:
        expr = SOPform(variables, on, dc)
        result["sop"] = parts(expr, n, index, Or, And, true, false)
    if "pos" in function["forms"]:
        expr = POSform(variables, on, dc)
        result["pos"] = parts(expr, n, index, And, Or, false, true)
    return result


def maxsat(problem):
    from pysat.examples.rc2 import RC2
    from pysat.formula import WCNF

    rows, literals = problem["rows"], problem["literals"]
    # Fewest columns first: one column weighs more than all literals together.
    big = sum(literals) + 1
    wcnf = WCNF()
    for row in rows:
        wcnf.append([c + 1 for c in row])
    for c, lits in enumerate(literals):
        wcnf.append([-(c + 1)], weight=big + lits)
    with RC2(wcnf) as solver:
        model = solver.compute()
        if model is None:
            raise ValueError("covering problem without a solution")
        chosen = [c for c in range(len(literals)) if c + 1 in set(model)]
        cost = solver.cost
    terms, lits = len(chosen), sum(literals[c] for c in chosen)
    if cost != terms * big + lits:
        raise ValueError(f"RC2 cost {cost} does not match its model")
    return {"columns": chosen, "terms": terms, "literals": lits}


def mip(problem):
    import highspy
    import numpy as np

    rows, literals = problem["rows"], problem["literals"]
    n = len(literals)
    every = np.arange(n, dtype=np.int32)
    h = highspy.Highs()
    h.setOptionValue("output_flag", False)
    h.setOptionValue("threads", 1)
    # Costs are integers: stop only at a gap below one unit.
    h.setOptionValue("mip_rel_gap", 0.0)
    h.setOptionValue("mip_abs_gap", 0.5)
    h.addVars(n, np.zeros(n), np.ones(n))
    h.changeColsIntegrality(n, every, np.full(n, highspy.HighsVarType.kInteger))
    for row in rows:
        index = np.array(row, dtype=np.int32)
        h.addRow(1, highspy.kHighsInf, len(index), index, np.ones(len(index)))

    def optimum(costs):
        h.changeColsCost(n, every, np.array(costs, dtype=float))
        h.run()
        if h.getModelStatus() != highspy.HighsModelStatus.kOptimal:
            raise ValueError(f"HiGHS: {h.modelStatusToString(h.getModelStatus())}")
        x = h.getSolution().col_value
        return [c for c in range(n) if x[c] > 0.5]

    terms = len(optimum([1] * n))
    h.addRow(terms, terms, n, every, np.ones(n))
    chosen = optimum(literals)
    if len(chosen) != terms:
        raise ValueError("HiGHS changed the number of columns")
    return {"columns": chosen, "terms": terms, "literals": sum(literals[c] for c in chosen)}


def main():
    # Answers go to the real stdout; anything else written there (HiGHS
    # prints a banner from its library code) goes to stderr instead.
    answers = os.fdopen(os.dup(sys.stdout.fileno()), "w")
    sys.stdout.flush()
    os.dup2(sys.stderr.fileno(), sys.stdout.fileno())
    for line in iter(sys.stdin.readline, ""):
        if not line.strip():
            continue
        request = json.loads(line)
        if request["op"] == "sympy":
            answer = {"results": [sympy_forms(f) for f in request["functions"]]}
        elif request["op"] == "maxsat":
            answer = {"results": [maxsat(p) for p in request["problems"]]}
        elif request["op"] == "mip":
            answer = {"results": [mip(p) for p in request["problems"]]}
        else:
            raise ValueError(f"unknown op {request['op']!r}")
        answers.write(json.dumps(answer) + "\n")
        answers.flush()


if __name__ == "__main__":
    main()
