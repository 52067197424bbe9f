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

impl Source for WavSource<'_> {
    fn rate_hz(&self) -> f64 {
        self.spec.sample_rate as f64
    }

    fn scan(&mut self, visit: &mut dyn FnMut(&[f32])) -> Result<usize, Error> {
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

    fn full_scale_hits(&self) -> usize {
        self.hits
    }
}
