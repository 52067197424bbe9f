// The tap-test panel's microphone reader: an AudioWorklet processor that hands each block of the
// first input channel to the page as it comes (at the audio context's own sample rate, in blocks
// of whatever size the browser uses), together with the block's peak level for the meter. It
// outputs nothing, so nothing is played back.

class BenchCapture extends AudioWorkletProcessor {
  process(inputs) {
    const channel = inputs[0] && inputs[0][0];
    if (channel && channel.length > 0) {
      let peak = 0;
      for (let i = 0; i < channel.length; i++) {
        const a = Math.abs(channel[i]);
        if (a > peak) peak = a;
      }
      // A copy: the browser reuses the block's memory for the next one.
      const block = new Float32Array(channel);
      this.port.postMessage({ block, peak }, [block.buffer]);
    }
    return true;
  }
}

registerProcessor("modebench-bench-capture", BenchCapture);
