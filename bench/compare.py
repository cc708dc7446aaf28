#!/usr/bin/env python3
"""Times Orthogon against the NumPy peer (bench/peer.py) in one run and prints the ratios, the peak
resident memory and the differences between their numbers (docs/benchmarks.md).

  python3 bench/compare.py            # build, generate the data, run everything (about 5 minutes)
  python3 bench/compare.py --no-build # reuse target/orthogon.jar, target/orthogon.jsa and target/benchmarks.jar
  python3 bench/compare.py --repeat 5 # runs per end-to-end timing (median reported; default 3)

Needs Java 17, Maven, and NumPy and SciPy (Debian: apt-get install python3-numpy python3-scipy).
Timings are only as quiet as the machine: run it with nothing else busy.

Workloads (data from org.orthogon.bench.PeerWorkloads, seeded, written to target/peer-bench/):
  sup-Wald   N = 25, T = 600, two-step with the Newey-West (1994) bandwidth plus the fixed-weight variant,
             every break date with 15% trimming, end to end (command line, CSV in, JSON out)
  fit        N = 100, T = 1200, two-step, Bartlett 4 lags, full inference, end to end
  in-process the same fit: JMH PeerWorkloadBenchmark.twoStepBartlett4 against the peer's own timing
  threads    sup-Wald and rolling windows (120 months, step 1) with --threads 1 and 2: end to end, and the
             fits alone (JMH ThreadScalingBenchmark); the outputs must be byte-identical
"""
import json
import os
import subprocess
import sys
import time

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
WORK = os.path.join(ROOT, "target", "peer-bench")
JAR = os.path.join(ROOT, "target", "orthogon.jar")
BENCH_JAR = os.path.join(ROOT, "target", "benchmarks.jar")


def require_numpy():
    try:
        import numpy  # noqa: F401
        import scipy  # noqa: F401
    except ImportError:
        sys.exit("bench/compare.py needs NumPy and SciPy for the peer; on Debian: "
                 "apt-get install python3-numpy python3-scipy")


def timed(command, repeat):
    """Median wall time and the largest peak resident set size (MB, from the child's rusage) over `repeat` runs."""
    walls, peaks = [], []
    for _ in range(repeat):
        started = time.perf_counter()
        process = subprocess.Popen(command, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True, cwd=WORK)
        _, status, usage = os.wait4(process.pid, 0)
        walls.append(time.perf_counter() - started)
        err = process.stderr.read()
        process.stderr.close()
        if os.waitstatus_to_exitcode(status) != 0:
            sys.exit("failed: %s\n%s" % (" ".join(command), err))
        peaks.append(usage.ru_maxrss / 1024.0)
    walls.sort()
    return walls[len(walls) // 2], max(peaks)


def java(*args):
    """The launcher bin/orthogon (class-data archive, client compiler for short runs, serial collector)."""
    return [os.path.join(ROOT, "bin", "orthogon")] + list(args)


def peer(*args):
    return [sys.executable, os.path.join(ROOT, "bench", "peer.py")] + list(args)


def jmh(pattern):
    """Runs JMH benchmarks matching `pattern`; returns {name (with params): ms per op}."""
    out = subprocess.run(["java", "-jar", BENCH_JAR, pattern, "-rf", "json", "-rff",
                          os.path.join(WORK, "jmh.json")], capture_output=True, text=True, cwd=WORK)
    if out.returncode != 0:
        sys.exit("JMH failed:\n" + out.stdout[-3000:] + out.stderr[-3000:])
    results = {}
    for entry in json.load(open(os.path.join(WORK, "jmh.json"))):
        name = entry["benchmark"].rsplit(".", 1)[1]
        params = entry.get("params") or {}
        key = name + "".join("[%s=%s]" % item for item in sorted(params.items()))
        results[key] = entry["primaryMetric"]["score"]
    return results


def largest_difference(pairs):
    worst = 0.0
    for a, b in pairs:
        worst = max(worst, abs(a - b) / max(1.0, abs(b)))
    return worst


def main(argv):
    require_numpy()
    repeat = int(argv[argv.index("--repeat") + 1]) if "--repeat" in argv else 3
    os.makedirs(WORK, exist_ok=True)
    if "--no-build" not in argv:
        print("building target/orthogon.jar and target/benchmarks.jar ...", flush=True)
        subprocess.run(["mvn", "-q", "-Pbench", "-DskipTests", "package"], cwd=ROOT, check=True)
    subprocess.run(["java", "-cp", BENCH_JAR, "org.orthogon.bench.PeerWorkloads", WORK], check=True)
    rows = []

    # sup-Wald, end to end
    orthogon_sup = java("stability", "supwald.toml", "--json", "o-supwald.json", "--quiet")
    peer_sup = peer("supwald", "supwald.toml", "--json", "p-supwald.json")
    o_time, o_rss = timed(orthogon_sup, repeat)
    p_time, p_rss = timed(peer_sup, repeat)
    o_json = json.load(open(os.path.join(WORK, "o-supwald.json")))
    p_json = json.load(open(os.path.join(WORK, "p-supwald.json")))
    sup_diffs = []
    for o_variant, p_variant in ((o_json, p_json["two_step"]), (o_json["fixed_weight"], p_json["fixed_weight"])):
        o_sup = o_variant["sup_wald"]
        sup_diffs.append((o_sup["statistic"], p_variant["statistic"], o_sup["break_date"], p_variant["break_date"],
                          largest_difference(zip([s["statistic"] for s in o_sup["sequence"]], p_variant["sequence"])),
                          o_sup["critical_values"]["0.05"], p_variant["critical_values"]["0.05"]))
    rows.append(("sup-Wald end to end", o_time, p_time, 0.2, o_rss, p_rss))
    sup_rss = o_rss

    # fit, end to end
    o_time, o_rss_fit = timed(java("fit", "fit.toml", "--json", "o-fit.json", "--quiet"), repeat)
    p_time, p_rss_fit = timed(peer("fit", "fit.toml", "--json", "p-fit.json"), repeat)
    rows.append(("fit end to end", o_time, p_time, 0.5, o_rss_fit, p_rss_fit))
    o_fit = json.load(open(os.path.join(WORK, "o-fit.json")))
    p_fit = json.load(open(os.path.join(WORK, "p-fit.json")))
    fit_diffs = {
        "estimates": largest_difference(zip([p["estimate"] for p in o_fit["parameters"]], p_fit["estimates"])),
        "standard errors": largest_difference(zip([p["std_error"] for p in o_fit["parameters"]], p_fit["std_errors"])),
        "J": largest_difference([(o_fit["overidentification"]["statistic"], p_fit["j"]["statistic"])]),
        "pricing errors": largest_difference(zip([e["error"] for e in o_fit["pricing_errors"]],
                                                 p_fit["pricing_errors"])),
        "joint test": largest_difference([(o_fit["pricing_errors_joint"]["statistic"], p_fit["joint"]["statistic"])]),
        "HJ distance": largest_difference([(o_fit["hj_distance"]["value"], p_fit["hj"]["value"])]),
        "HJ p-value": largest_difference([(o_fit["hj_distance"]["p_value"], p_fit["hj"]["p_value"])]),
    }

    # in process: JMH against the peer's own timing of the same fit (median of 30 after the first)
    scores = jmh("PeerWorkloadBenchmark|ThreadScalingBenchmark")
    subprocess.run(peer("fit", "fit.toml", "--json", "p-fit-loop.json", "--repeat", "31"), cwd=WORK, check=True,
                   capture_output=True)
    p_in = json.load(open(os.path.join(WORK, "p-fit-loop.json")))["fit_seconds"]
    rows.append(("twoStepBartlett4 in process", scores["twoStepBartlett4"] / 1000.0, p_in, 0.67, None, None))

    # threads, end to end and in process
    threads_rows = []
    for name, args in (("sup-Wald", ["stability", "supwald.toml"]),
                       ("rolling", ["stability", "supwald.toml", "--no-sup-wald", "--window", "120", "--step", "1"])):
        outputs = []
        times = []
        for n in (1, 2):
            out = "o-%s-%d.json" % (name, n)
            wall, _ = timed(java(*args, "--threads", str(n), "--json", out, "--quiet"), repeat)
            times.append(wall)
            outputs.append(open(os.path.join(WORK, out), "rb").read())
        key = "supWaldBothVariants" if name == "sup-Wald" else "rollingBothVariants"
        threads_rows.append((name, times[0], times[1], scores[key + "[threads=1]"], scores[key + "[threads=2]"],
                             outputs[0] == outputs[1]))

    print()
    print("Orthogon against the NumPy peer (median of %d runs; RSS = peak resident set size)" % repeat)
    print("%-30s %10s %10s %7s %7s %9s %9s" % ("workload", "Orthogon", "peer", "ratio", "target", "RSS (MB)",
                                             "peer RSS"))
    for name, o, p, target, o_rss, p_rss in rows:
        ratio = o / p
        print("%-30s %9.3fs %9.3fs %7.3f %6s%s %9s %9s" % (name, o, p, ratio, "<=%.2g" % target,
                                                          " ok" if ratio <= target else " NO",
                                                          "" if o_rss is None else "%.0f" % o_rss,
                                                          "" if p_rss is None else "%.0f" % p_rss))
    print("sup-Wald peak RSS %.0f MB (target <= 256 MB): %s" % (sup_rss, "ok" if sup_rss <= 256 else "NO"))
    print()
    print("Threads: end to end (1 / 2 threads), the fits alone in process (JMH), identical output")
    for name, e1, e2, j1, j2, same in threads_rows:
        print("  %-9s end to end %.3fs / %.3fs = %.2fx; fits alone %.1f / %.1f ms = %.2fx (target >= 1.7x); "
              "identical output: %s" % (name, e1, e2, e1 / e2, j1, j2, j1 / j2, "yes" if same else "NO"))
    print()
    print("Agreement with the peer (largest |difference| / max(1, |peer value|))")
    for variant, (o_stat, p_stat, o_date, p_date, seq, o_cv, p_cv) in zip(("two-step", "fixed weight"), sup_diffs):
        print("  sup-Wald %-12s statistic %.10g vs %.10g (difference %.2e), break %s vs %s, whole sequence %.2e; "
              "5%% critical value %.3f vs %.3f (two simulations of the same limit)"
              % (variant, o_stat, p_stat, abs(o_stat - p_stat), o_date, p_date, seq, o_cv, p_cv))
    for name, diff in fit_diffs.items():
        print("  fit %-16s %.2e" % (name, diff))


if __name__ == "__main__":
    main(sys.argv[1:])
