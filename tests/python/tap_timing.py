"""Times the tap test's steps in numpy/scipy on a recording, the yardstick for the engine's own:
a 1 ms mean-square envelope and the taps as rises of 12 dB over the level before and 14 dB over
its 10th percentile; each tap's ring-down to the next, tapered at its end, zero-padded to twice
its length and its power spectrum averaged (numpy.fft.rfft); the peaks (scipy.signal.find_peaks,
20 dB prominence, 30 dB over the median); per peak a band-pass (sosfiltfilt) of each ring-down,
hilbert's envelope and a straight line through its logarithm. One thread.

Input (stdin): JSON {"wav": path, "taps": [t0, ...] (only to report), "runs": r}.
Output: JSON {"seconds": median of r runs, "peaks_hz": [...]}.
"""
import json
import os
import sys
import time

os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import numpy as np  # noqa: E402
from scipy import signal  # noqa: E402
from scipy.io import wavfile  # noqa: E402


def analyse(x, fs):
    block = int(round(fs / 1000))
    n = len(x) // block
    energy = (x[: n * block].reshape(n, block) ** 2).mean(axis=1)
    floor = np.percentile(energy, 10)
    onsets = []
    held = 0.0
    for k, e in enumerate(energy):
        if e > floor * 10 ** 1.4 and e > held * 10 ** 1.2 and (not onsets or k - onsets[-1] > 50):
            onsets.append(k)
        held = max(held * 10 ** (-2.0 / 200), e)
    bounds = [k * block for k in onsets] + [len(x)]
    segments = [x[a:b] for a, b in zip(bounds[:-1], bounds[1:])]
    longest = max(len(s) for s in segments)
    m = 1 << int(np.ceil(np.log2(2 * longest)))
    power = np.zeros(m // 2 + 1)
    for s in segments:
        i = np.arange(len(s))
        w = 0.35875 + 0.48829 * np.cos(np.pi * i / len(s)) + 0.14128 * np.cos(2 * np.pi * i / len(s)) + 0.01168 * np.cos(3 * np.pi * i / len(s))
        power += np.abs(np.fft.rfft(s * w, m)) ** 2
    db = 10 * np.log10(power + 1e-300)
    idx, _ = signal.find_peaks(db, prominence=20, height=np.median(db) + 30)
    hz = idx * fs / m
    hz = hz[(hz > 5) & (hz < 0.45 * fs)]
    zetas = []
    for f in hz:
        sos = signal.butter(4, [f * 0.93, f * 1.07], btype="bandpass", fs=fs, output="sos")
        for s in segments:
            env = np.abs(signal.hilbert(signal.sosfiltfilt(sos, s)))
            top = int(np.argmax(env))
            fall = np.where(env[top:] > 0.05 * env[top])[0]
            t = (top + fall) / fs
            zetas.append(-np.polyfit(t, np.log(env[top + fall]), 1)[0] / (2 * np.pi * f))
    return hz, zetas


def main():
    data = json.load(sys.stdin)
    fs, x = wavfile.read(data["wav"])
    x = x.astype(np.float64)
    times = []
    for _ in range(data["runs"]):
        start = time.perf_counter()
        hz, _ = analyse(x, fs)
        times.append(time.perf_counter() - start)
    json.dump({"seconds": float(np.median(times)), "peaks_hz": [round(float(h), 2) for h in hz]}, sys.stdout)


if __name__ == "__main__":
    main()
