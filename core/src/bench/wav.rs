//! WAV files through `hound`: 8-, 16-, 24- and 32-bit integer PCM and 32-bit float, one channel
//! chosen. The file is read in two streaming passes from the bytes as given and never decoded
//! whole. A data chunk that ends early (a recorder stopped mid-write) is read as far as it goes,
//! and the record says so.

use std::io::Cursor;

use super::source::Source;
use crate::error::{echo, number};
use crate::{Error, ErrorKind, FieldPath};

/// A WAV file's one channel, read from the start as often as the analysis asks.
pub struct WavSource<'a> {
    bytes: &'a [u8],
    spec: hound::WavSpec,
    channel: usize,
    /// Frames the header promises.
    pub frames: usize,
    /// Frames the last pass actually read.
    pub read: usize,
    hits: usize,
}

fn format_error(e: hound::Error) -> Error {
    let what = match e {
        hound::Error::FormatError("inconsistent fmt chunk") => {
            "the WAV file is malformed: its format chunk's sample rate, channels and bit depth disagree"
                .to_string()
        }
        hound::Error::FormatError(m) => format!("the WAV file is malformed: {m}"),
        hound::Error::TooWide => "the WAV file's samples are wider than 32 bits".to_string(),
        hound::Error::UnfinishedSample => "the WAV file ends in the middle of a sample".to_string(),
        hound::Error::Unsupported => {
            "the WAV file's encoding is not PCM or 32-bit float (compressed audio is not read)".to_string()
        }
        hound::Error::InvalidSampleFormat => {
            "the WAV file's sample format does not match its bit depth".to_string()
        }
        hound::Error::IoError(e) => {
            format!("the WAV file ends before its header is complete ({})", echo(&e.to_string()))
        }
    };
    Error::new(ErrorKind::Syntax, what)
}

impl<'a> WavSource<'a> {
    /// Opens `bytes` as a WAV file and picks `channel` (0-based).
    pub fn open(bytes: &'a [u8], channel: usize) -> Result<WavSource<'a>, Error> {
        if bytes.len() > super::MAX_BYTES {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                format!(
                    "the WAV file is {} MB; at most 200 MB are read: cut it to the taps",
                    bytes.len() / 1_000_000
                ),
            ));
        }
        let reader = hound::WavReader::new(Cursor::new(bytes)).map_err(format_error)?;
        let spec = reader.spec();
        if spec.sample_rate == 0 {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                "the WAV file's sample rate is 0 Hz; it must be positive",
            )
            .with_value("0"));
        }
        let channels = spec.channels as usize;
        if channel >= channels {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                format!("channel {} asked for, but the WAV file has {channels} channel(s)", channel + 1),
            )
            .at(FieldPath::root().key("channel")));
        }
        let ok = match spec.sample_format {
            hound::SampleFormat::Int => matches!(spec.bits_per_sample, 8 | 16 | 24 | 32),
            hound::SampleFormat::Float => spec.bits_per_sample == 32,
        };
        if !ok {
            return Err(Error::new(
                ErrorKind::UnknownOption,
                format!(
                    "{}-bit {} samples are not read; 8-, 16-, 24- and 32-bit integer and 32-bit float are",
                    spec.bits_per_sample,
                    if spec.sample_format == hound::SampleFormat::Int { "integer" } else { "float" }
                ),
            ));
        }
        let frames = reader.duration() as usize;
        let seconds = frames as f64 / spec.sample_rate as f64;
        if seconds > super::MAX_SECONDS {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                format!(
                    "the recording lasts {} minutes; at most 30 minutes are analysed: cut it to the taps",
                    number((seconds / 60.0).round())
                ),
            ));
        }
        Ok(WavSource { bytes, spec, channel, frames, read: 0, hits: 0 })
    }

    /// Channels in the file.
    pub fn channels(&self) -> usize {
        self.spec.channels as usize
    }

    /// A description of the file for the record's notes.
    pub fn describe(&self) -> String {
        let kind = match self.spec.sample_format {
            hound::SampleFormat::Int => format!("{}-bit integer", self.spec.bits_per_sample),
            hound::SampleFormat::Float => "32-bit float".to_string(),
        };
        format!(
            "WAV, {kind}, {} Hz, channel {} of {}",
            self.spec.sample_rate,
            self.channel + 1,
            self.spec.channels
        )
    }

    /// Whether the last pass stopped before the header's length.
    pub fn truncated(&self) -> bool {
        self.read < self.frames
    }
}

impl<'a> WavSource<'a> {
    /// The data chunk's bytes as far as the file holds them, and the bytes per sample, when each
    /// sample takes exactly its bits' worth of bytes (every layout but a padded one, which the
    /// reader's own loop takes): the samples are then decoded straight from the bytes, with the
    /// same rules as the reader's (8-bit unsigned about 128, the others signed, little-endian).
    fn raw_data(&self) -> Option<(&'a [u8], usize)> {
        let reader = hound::WavReader::new(Cursor::new(self.bytes)).ok()?;
        let total = reader.len() as usize;
        let start = usize::try_from(reader.into_inner().position()).ok()?;
        let head = self.bytes.get(start.checked_sub(8)?..start)?;
        let len = u32::from_le_bytes([head[4], head[5], head[6], head[7]]) as usize;
        let width = (self.spec.bits_per_sample / 8) as usize;
        if &head[..4] != b"data" || total == 0 || len != total * width {
            return None;
        }
        let end = start.saturating_add(len).min(self.bytes.len());
        Some((&self.bytes[start..end], width))
    }

    /// One pass over the chosen channel's samples in `data` (`width` bytes each): every whole
    /// sample of that channel, as the reader's loop would yield them before a cut-off end.
    fn scan_raw(&mut self, data: &[u8], width: usize, visit: &mut dyn FnMut(&[f32])) -> usize {
        let channels = self.spec.channels as usize;
        let frame = width * channels;
        let whole = data.len() / width;
        let count = whole / channels + usize::from(whole % channels > self.channel);
        let first = self.channel * width;
        let sample = |i: usize| &data[i * frame + first..i * frame + first + width];
        let full = (1i64 << (self.spec.bits_per_sample - 1)) as f64;
        let top = (1i64 << (self.spec.bits_per_sample - 1)) - 1;
        let mut buffer: Vec<f32> = Vec::with_capacity(1 << 14);
        let mut hits = 0usize;
        let mut start = 0;
        while start < count {
            let end = (start + (1 << 14)).min(count);
            buffer.clear();
            match (self.spec.sample_format, width) {
                (hound::SampleFormat::Float, _) => buffer.extend((start..end).map(|i| {
                    let b = sample(i);
                    let v = f32::from_le_bytes([b[0], b[1], b[2], b[3]]);
                    hits += usize::from(v.abs() >= 1.0);
                    v
                })),
                (hound::SampleFormat::Int, _) => buffer.extend((start..end).map(|i| {
                    let b = sample(i);
                    let v: i64 = match width {
                        1 => b[0] as i64 - 128,
                        2 => i16::from_le_bytes([b[0], b[1]]) as i64,
                        3 => (i32::from_le_bytes([0, b[0], b[1], b[2]]) >> 8) as i64,
                        _ => i32::from_le_bytes([b[0], b[1], b[2], b[3]]) as i64,
                    };
                    hits += usize::from(v >= top || v < -top);
                    (v as f64 / full) as f32
                })),
            }
            visit(&buffer);
            start = end;
        }
        self.hits = hits;
        self.read = count;
        count
    }
}

impl Source for WavSource<'_> {
    fn rate_hz(&self) -> f64 {
        self.spec.sample_rate as f64
    }

    fn scan(&mut self, visit: &mut dyn FnMut(&[f32])) -> Result<usize, Error> {
        match self.raw_data() {
            Some((data, width)) => Ok(self.scan_raw(data, width, visit)),
            None => self.scan_reader(visit),
        }
    }

    fn full_scale_hits(&self) -> usize {
        self.hits
    }
}

impl WavSource<'_> {
    /// One pass through the reader's own sample loop (any layout it takes).
    fn scan_reader(&mut self, visit: &mut dyn FnMut(&[f32])) -> Result<usize, Error> {
        let mut reader = hound::WavReader::new(Cursor::new(self.bytes)).map_err(format_error)?;
        let channels = self.spec.channels as usize;
        let mut buffer: Vec<f32> = Vec::with_capacity(1 << 14);
        let mut index = 0usize;
        let mut frames = 0usize;
        self.hits = 0;
        let mut flush = |buffer: &mut Vec<f32>| {
            visit(buffer);
            buffer.clear();
        };
        match self.spec.sample_format {
            hound::SampleFormat::Float => {
                for s in reader.samples::<f32>() {
                    let Ok(v) = s else { break };
                    if index % channels == self.channel {
                        if v.abs() >= 1.0 {
                            self.hits += 1;
                        }
                        buffer.push(v);
                        frames += 1;
                        if buffer.len() == buffer.capacity() {
                            flush(&mut buffer);
                        }
                    }
                    index += 1;
                }
            }
            hound::SampleFormat::Int => {
                let full = (1i64 << (self.spec.bits_per_sample - 1)) as f64;
                let top = (1i64 << (self.spec.bits_per_sample - 1)) - 1;
                for s in reader.samples::<i32>() {
                    let Ok(v) = s else { break };
                    if index % channels == self.channel {
                        if (v as i64) >= top || (v as i64) < -top {
                            self.hits += 1;
                        }
                        buffer.push((v as f64 / full) as f32);
                        frames += 1;
                        if buffer.len() == buffer.capacity() {
                            flush(&mut buffer);
                        }
                    }
                    index += 1;
                }
            }
        }
        flush(&mut buffer);
        self.read = frames;
        Ok(frames)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A WAV file written by hound's writer: `frames` frames of `channels` channels of a seeded
    /// noise over the whole range (full scale included).
    fn file(format: hound::SampleFormat, bits: u16, channels: u16, frames: usize) -> Vec<u8> {
        let spec =
            hound::WavSpec { channels, sample_rate: 8000, bits_per_sample: bits, sample_format: format };
        let mut out = Cursor::new(Vec::new());
        let mut w = hound::WavWriter::new(&mut out, spec).unwrap();
        let mut rng = modebench_tests::random::Rng::new(bits as u64 * 10 + channels as u64);
        let top = (1i64 << (bits - 1)) as f64;
        for i in 0..frames * channels as usize {
            let u = if i % 97 == 0 { 1.0 } else { 2.0 * rng.unit() - 1.0 };
            match format {
                hound::SampleFormat::Float => w.write_sample((1.2 * u) as f32).unwrap(),
                hound::SampleFormat::Int => w
                    .write_sample(((u * top).floor() as i64).clamp(-(top as i64), top as i64 - 1) as i32)
                    .unwrap(),
            }
        }
        w.finalize().unwrap();
        out.into_inner()
    }

    /// One pass's samples, their count and the full-scale hits.
    type Pass = (Vec<f32>, usize, usize);

    /// The pass straight from the bytes, and the reader's own.
    fn both(bytes: &[u8], channel: usize) -> (Pass, Pass) {
        let run = |raw: bool| {
            let mut s = WavSource::open(bytes, channel).unwrap();
            let mut got = Vec::new();
            let n = if raw {
                let (data, width) = s.raw_data().expect("a plain layout");
                s.scan_raw(data, width, &mut |c: &[f32]| got.extend_from_slice(c))
            } else {
                s.scan_reader(&mut |c: &[f32]| got.extend_from_slice(c)).unwrap()
            };
            (got, n, s.hits)
        };
        (run(true), run(false))
    }

    #[test]
    fn the_bytes_decode_as_the_reader_decodes_them() {
        // hound's own sample loop is the reference: every encoding, each channel, and files cut
        // off inside a frame and inside a sample.
        let cases = [
            (hound::SampleFormat::Int, 8),
            (hound::SampleFormat::Int, 16),
            (hound::SampleFormat::Int, 24),
            (hound::SampleFormat::Int, 32),
            (hound::SampleFormat::Float, 32),
        ];
        for (format, bits) in cases {
            for channels in [1u16, 3] {
                let bytes = file(format, bits, channels, 5000);
                for cut in [0usize, 1, bits as usize / 8 + 1, 2 * bits as usize / 8] {
                    let bytes = &bytes[..bytes.len() - cut];
                    for channel in 0..channels as usize {
                        let (raw, reader) = both(bytes, channel);
                        assert!(raw.1 > 4000, "{bits} bits: {} samples", raw.1);
                        assert_eq!(
                            raw.1, reader.1,
                            "{bits} bits, {channels} ch, cut {cut}, channel {channel}"
                        );
                        assert_eq!(raw.2, reader.2, "full-scale hits, {bits} bits, cut {cut}");
                        assert!(
                            raw.0.iter().zip(&reader.0).all(|(a, b)| a.to_bits() == b.to_bits()),
                            "{bits} bits, cut {cut}"
                        );
                    }
                }
            }
        }
    }
}
