"""Independent tap-test reference: synthesises ring-downs with numpy, writes them with
scipy.io.wavfile (32-bit float and 16-bit PCM) and Python's csv module, and reads their modes with
scipy.signal: the periodogram (rectangular window, zero-padded: a ring-down that starts at the
segment's first sample and dies away within it needs no taper, and a Hann window would weigh its
start near zero) and find_peaks for the frequencies between 5 Hz and 45 % of the rate,
refined by a parabola through the three bins around each maximum in dB, and, for the damping,
a Butterworth band-pass (sosfiltfilt) around each peak, the envelope from hilbert, and a straight
line fitted to the logarithm of the envelope while it falls from 50 % to 5 % of its largest value
(zeta = slope / (2 pi f)).

Input (stdin): JSON {"dir": folder, "cases": [{"id", "rate", "seconds", "noise", "seed",
"modes": [[hz, zeta, amplitude, phase]], "taps": [[t0, gain]]}]}.
Output: JSON {id: {"wav_float", "wav_pcm16", "csv": paths, "peaks_hz": [...], "zeta": [...]}}.
"""
import csv
import json
import os
import sys

import numpy as np
from scipy import signal
from scipy.io import wavfile


def synthesise(case):
    rng = np.random.default_rng(case["seed"])
    fs = case["rate"]
    n = int(round(case["seconds"] * fs))
    t = np.arange(n) / fs
    x = np.zeros(n)
    for t0, gain in case["taps"]:
        tt = t - t0
        on = tt >= 0
        for hz, zeta, amp, phase in case["modes"]:
            wd = 2 * np.pi * hz * np.sqrt(1 - zeta * zeta)
            x[on] += gain * amp * np.exp(-zeta * 2 * np.pi * hz * tt[on]) * np.cos(wd * tt[on] + phase)
    return x + case["noise"] * rng.standard_normal(n)


def peaks(segment, fs):
    nfft = 1 << int(np.ceil(np.log2(len(segment) * 8)))
    f, p = signal.periodogram(segment, fs, window="boxcar", nfft=nfft)
    db = 10 * np.log10(np.maximum(p, 1e-300))
    floor = np.median(db)
    idx, _ = signal.find_peaks(db, prominence=20, height=floor + 30)
    out = []
    for k in idx:
        if not 5.0 <= f[k] <= 0.45 * fs:
            continue
        a, b, c = db[k - 1], db[k], db[k + 1]
        shift = 0.5 * (a - c) / (a - 2 * b + c)
        out.append(float((k + shift) * fs / nfft))
    return out


def damping(segment, fs, hz):
    sos = signal.butter(4, [hz * 0.93, hz * 1.07], btype="bandpass", fs=fs, output="sos")
    y = signal.sosfiltfilt(sos, segment)
    env = np.abs(signal.hilbert(y))
    top = int(np.argmax(env))
    after = env[top:]
    window = np.where((after < 0.5 * env[top]) & (after > 0.05 * env[top]))[0]
    if len(window) < 10:
        return None
    # The first continuous run of the fall.
    run = window[: np.argmax(np.diff(window) > 1) + 1] if np.any(np.diff(window) > 1) else window
    tt = (top + run) / fs
    slope = np.polyfit(tt, np.log(after[run]), 1)[0]
    return float(-slope / (2 * np.pi * hz))


def main():
    data = json.load(sys.stdin)
    out = {}
    for case in data["cases"]:
        x = synthesise(case)
        fs = case["rate"]
        base = os.path.join(data["dir"], case["id"])
        wavfile.write(base + "-float.wav", fs, x.astype(np.float32))
        wavfile.write(base + "-pcm16.wav", fs, np.round(np.clip(x, -1, 1) * 32767).astype(np.int16))
        with open(base + ".csv", "w", newline="") as handle:
            writer = csv.writer(handle)
            writer.writerow(["time (s)", "signal"])
            for i, v in enumerate(x):
                writer.writerow([repr(i / fs), repr(float(v))])
        # The first tap's ring-down, to the next tap or the end.
        t0 = case["taps"][0][0]
        stop = case["taps"][1][0] if len(case["taps"]) > 1 else case["seconds"]
        segment = x[int(np.ceil(t0 * fs)) + int(0.002 * fs): int(stop * fs)]
        found = peaks(segment, fs)
        out[case["id"]] = {
            "wav_float": base + "-float.wav",
            "wav_pcm16": base + "-pcm16.wav",
            "csv": base + ".csv",
            "peaks_hz": found,
            "zeta": [damping(segment, fs, hz) for hz in found],
        }
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
