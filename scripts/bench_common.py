"""What scripts/bench-vs-sympy and scripts/bench-vs-mip share: the random
functions of the benchmarks, our minimizer run on them, the machine's name."""

import json
import platform
import random
import subprocess
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def functions(count, n, seed):
    """Random functions of n inputs: each minterm on with probability 3/8, a
    don't-care with probability 1/4 (the divan benchmark's shape)."""
    rng = random.Random(seed)
    out = []
    for _ in range(count):
        on, dc = [], []
        for m in range(1 << n):
            r = rng.randrange(8)
            if r < 3:
                on.append(m)
            elif r < 5:
                dc.append(m)
        out.append({"vars": n, "on": on, "dc": dc})
    return out


def ours(batch):
    """implica-logic's minimize_sop on each function, through the example
    crates/implica-logic/examples/minimize_batch.rs (release build)."""
    subprocess.run(
        ["cargo", "build", "--release", "--locked", "-p", "implica-logic",
         "--example", "minimize_batch"],
        cwd=ROOT, check=True,
    )
    exe = ROOT / "target" / "release" / "examples" / "minimize_batch"
    done = subprocess.run(
        [str(exe)], input=json.dumps({"functions": batch}), capture_output=True,
        text=True, check=True,
    )
    return json.loads(done.stdout)["results"]


def cpu():
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                return line.split(":", 1)[1].strip()
    except OSError:
        pass
    return platform.processor() or "unknown"
