#!/usr/bin/python3
"""Times the PyTorch peer's own evaluator (the Model class of the peer script) on one thread, by CPU time
of this process as well as by the wall clock, so that a busy machine does not count against it.

  peer_cpu.py PEER_SCRIPT OUTDIR [--batches 1,64,1024] [--seconds 2]

Prints one JSON object: per batch, edge evaluations per CPU second and per wall-clock second.
"""
import argparse, importlib.util, json, os, time

ap = argparse.ArgumentParser()
ap.add_argument("script"); ap.add_argument("outdir")
ap.add_argument("--batches", default="1,64,1024"); ap.add_argument("--seconds", type=float, default=2.0)
a = ap.parse_args()
spec = importlib.util.spec_from_file_location("torch_peer", a.script)
peer = importlib.util.module_from_spec(spec); spec.loader.exec_module(peer)
import numpy as np
import torch
torch.set_num_threads(1)
meta = json.load(open(os.path.join(a.outdir, "meta.json")))
model = peer.Model(os.path.join(a.outdir, "regions.json"), os.path.join(a.outdir, "params.npz"),
                   meta["sums"], meta["inputs"], meta["depth"], meta["repeats"])
rng = np.random.default_rng(1)
out = {"edges": model.edges}
for b in [int(t) for t in a.batches.split(",")]:
    x = torch.tensor(rng.normal(0, 1, (b, meta["vars"])))
    with torch.no_grad():
        model.log_density(x)
        n, c0, w0 = 0, time.process_time(), time.perf_counter()
        while time.process_time() - c0 < a.seconds:
            model.log_density(x); n += 1
        cpu = (time.process_time() - c0) / n
        wall = (time.perf_counter() - w0) / n
    out["batch%d" % b] = {"cpu_edge_evals_per_s": model.edges * b / cpu, "wall_edge_evals_per_s": model.edges * b / wall}
print(json.dumps(out))
