# Peer of scripts/bench-engine.ts: what runPrediction does for an array of angles, written in
# numpy on the same points, so that the two can alternate in one run. For each process and frame
# it checks the angles' range, hashes their float64 bytes (SHA-256, hashlib) and evaluates dσ/dΩ:
# θ → cos θ, the lab → CM aberration map (photon reference particle), the closed form at t and u,
# the Jacobian dΩ*/dΩ_lab and the unit factor. The closed forms are those of app/engine/processes
# (docs/decisions/0003-engine-conventions.md); the kinematics come from the TypeScript side.
#
# Protocol, one JSON object per line on stdin, one answer line on stdout:
#   {"cmd": "case", ...}                    -> "ok"        (process id, frame and kinematics)
#   {"cmd": "run", "n": N, "repeat": R}     -> "<evaluation ms> <end-to-end ms>" per call, mean of R calls
#   {"cmd": "dump", "n": N, "path": p}      -> "dumped"    (the values as float64 for comparison)
#   {"cmd": "quit"}
# argv: the float64 files of the 10³ and 10⁶ angles in degrees.
import hashlib
import json
import sys
import time

import numpy as np

points = {1000: np.fromfile(sys.argv[1], dtype=np.float64), 1000000: np.fromfile(sys.argv[2], dtype=np.float64)}


def scalar_annihilation(k, s, t, u):
    m2 = k["m"] ** 2
    c12 = 1.0 - (2.0 * m2 * s) / ((t - m2) * (u - m2))
    return 4.0 * k["e2"] ** 2 * (1.0 + c12 * c12)


def photon_fusion_scalar(k, s, t, u):
    return scalar_annihilation(k, s, t, u) / 4.0


def scalar_compton(k, s, t, u):
    m2 = k["m"] ** 2
    c = 1.0 - (2.0 * m2 * t) / ((s - m2) * (u - m2))
    return 2.0 * k["e2"] ** 2 * (1.0 + c * c)


def pair_annihilation(k, s, t, u):
    m2 = k["m"] ** 2
    p = (m2 - t) / 2.0
    q = (m2 - u) / 2.0
    inv = 1.0 / p + 1.0 / q
    return 2.0 * k["e2"] ** 2 * (q / p + p / q + 2.0 * m2 * inv - m2 * m2 * inv * inv)


def compton(k, s, t, u):
    m2 = k["m"] ** 2
    a = s - m2
    b = m2 - u
    c = 1.0 + (2.0 * m2 * t) / (a * b)
    return 2.0 * k["e2"] ** 2 * ((t * t) / (a * b) + 1.0 + c * c)


def muon_pair(k, s, t, u):
    total = k["m"] ** 2 + k["M"] ** 2
    a = total - t
    b = total - u
    return (2.0 * k["e2"] ** 2 / (s * s)) * (a * a + b * b + 2.0 * s * total)


def bhabha(k, s, t, u):
    m2 = k["m"] ** 2
    m4 = m2 * m2
    return 2.0 * k["e2"] ** 2 * (
        (s * s + u * u + 8.0 * m2 * t - 8.0 * m4) / (t * t)
        + (u * u + t * t + 8.0 * m2 * s - 8.0 * m4) / (s * s)
        + (2.0 * (u - 2.0 * m2) * (u - 6.0 * m2)) / (s * t)
    )


def moller(k, s, t, u):
    m2 = k["m"] ** 2
    m4 = m2 * m2
    return 2.0 * k["e2"] ** 2 * (
        (s * s + u * u + 8.0 * m2 * t - 8.0 * m4) / (t * t)
        + (s * s + t * t + 8.0 * m2 * u - 8.0 * m4) / (u * u)
        + (2.0 * (s - 2.0 * m2) * (s - 6.0 * m2)) / (t * u)
    )


AMPLITUDES = {
    "scalar-annihilation": scalar_annihilation,
    "scalar-compton": scalar_compton,
    "photon-fusion-scalar": photon_fusion_scalar,
    "pair-annihilation": pair_annihilation,
    "compton": compton,
    "breit-wheeler": pair_annihilation,
    "muon-pair": muon_pair,
    "bhabha": bhabha,
    "moller": moller,
}


def evaluate(k, theta):
    c = np.cos(np.radians(theta))
    lab = k["frame"] == "lab"
    if lab:
        c = (c - k["beta"]) / (1.0 - k["beta"] * c)
    if k["process"] == "scalar-pair-production":
        # the CM form 16p'²(m² + p² sin²θ), as the engine evaluates it
        value = k["prefSpp"] * (k["m"] ** 2 + k["pIn2"] * (1.0 - c) * (1.0 + c))
    else:
        t = k["t1"] - k["pp2"] * (1.0 - c)
        u = k["u1"] - k["pp2"] * (1.0 + c)
        value = k["pref"] * AMPLITUDES[k["process"]](k, k["s"], t, u)
    if lab:
        jacobian = k["gamma"] * (1.0 + k["beta"] * c)
        value = value * (jacobian * jacobian)
    return value * k["toUnit"]


def end_to_end(k, theta):
    if not np.all((theta >= 0.0) & (theta <= 180.0)):
        raise ValueError("angle out of range")
    if (k["divergesForward"] and np.any(theta == 0.0)) or (k["divergesBackward"] and np.any(theta == 180.0)):
        raise ValueError("divergent angle")
    digest = hashlib.sha256(theta.tobytes()).hexdigest()
    return evaluate(k, theta), digest


case = None
print("ready", flush=True)
for line in sys.stdin:
    command = json.loads(line)
    if command["cmd"] == "quit":
        break
    if command["cmd"] == "case":
        case = command
        print("ok", flush=True)
    elif command["cmd"] == "run":
        theta = points[command["n"]]
        repeat = command["repeat"]
        start = time.perf_counter()
        for _ in range(repeat):
            evaluate(case, theta)
        middle = time.perf_counter()
        for _ in range(repeat):
            end_to_end(case, theta)
        stop = time.perf_counter()
        print(f"{(middle - start) * 1e3 / repeat} {(stop - middle) * 1e3 / repeat}", flush=True)
    elif command["cmd"] == "dump":
        evaluate(case, points[command["n"]]).tofile(command["path"])
        print("dumped", flush=True)
