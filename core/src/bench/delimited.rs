//! CSV records from accelerometers and data loggers: comma, semicolon or tab separated, with or
//! without a header line, decimal point or (with semicolons or tabs) decimal comma; either a
//! time column (seconds, or milliseconds when its header says `ms`) and one or more signal
//! columns, or a sample-rate line (`# sample rate: 1000 Hz`, also `rate`, `fs`) and signal
//! columns alone. Lines starting with `#` are comments. A time column whose steps stray more
//! than 1 % from their median is resampled to a uniform grid, and the record says so.

use super::resample;
use crate::error::{echo, number};
use crate::{Error, ErrorKind, FieldPath};

/// The most data lines read (some 24 hours at 200 Hz, 10 minutes at 48 kHz).
pub const MAX_ROWS: usize = 30_000_000;

/// One signal column of a CSV file at a uniform rate.
#[derive(Clone, Debug, PartialEq)]
pub struct Table {
    /// Samples per second.
    pub rate_hz: f64,
    /// The chosen column's values.
    pub samples: Vec<f32>,
    /// Signal columns in the file (the time column not counted).
    pub channels: usize,
    /// What was read and how (the column, the time unit, any resampling).
    pub notes: Vec<String>,
}

fn syntax(line: usize, message: String) -> Error {
    Error::new(ErrorKind::Syntax, message).at(FieldPath::item("line", line))
}

/// Reads signal column `channel` (0-based, not counting the time column) of CSV `text`.
pub fn read(text: &str, channel: usize) -> Result<Table, Error> {
    if text.len() > super::MAX_BYTES {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the CSV file is {} MB; at most 200 MB are read: cut it to the taps",
                text.len() / 1_000_000
            ),
        ));
    }
    let mut rate: Option<f64> = None;
    let mut body_start = 0;
    let mut first_line = 1;
    // Leading comments, blank lines and the sample-rate line.
    for (i, line) in text.split_inclusive('\n').enumerate() {
        let t = line.trim();
        if t.is_empty() || t.starts_with('#') {
            if let Some(r) = rate_line(t) {
                let r = r.map_err(|typed| {
                    Error::new(
                        ErrorKind::OutOfRange,
                        format!("the sample rate \"{}\" is not a positive number of hertz", echo(&typed)),
                    )
                    .at(FieldPath::item("line", i + 1))
                })?;
                rate = Some(r);
            }
            body_start += line.len();
            first_line = i + 2;
            continue;
        }
        if let Some(r) = rate_line(t) {
            rate = Some(r.map_err(|typed| {
                Error::new(
                    ErrorKind::OutOfRange,
                    format!("the sample rate \"{}\" is not a positive number of hertz", echo(&typed)),
                )
                .at(FieldPath::item("line", i + 1))
            })?);
            body_start += line.len();
            first_line = i + 2;
            continue;
        }
        break;
    }
    let body = &text[body_start..];
    let sample_line = body.lines().find(|l| !l.trim().is_empty()).unwrap_or("");
    // A tab or a semicolon separates when present (a comma beside one is a decimal comma).
    let delimiter = [b'\t', b';'].into_iter().find(|d| sample_line.bytes().any(|b| b == *d)).unwrap_or(b',');
    let decimal_comma = delimiter != b',' && body.lines().take(50).any(|l| l.contains(','));
    let mut reader = csv::ReaderBuilder::new()
        .delimiter(delimiter)
        .has_headers(false)
        .flexible(true)
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_reader(body.as_bytes());
    let mut header: Option<Vec<String>> = None;
    let mut width = 0;
    let mut times: Vec<f64> = Vec::new();
    let mut values: Vec<f32> = Vec::new();
    let mut time_column: Option<usize> = None;
    let mut time_scale = 1.0;
    let mut column = 0;
    let mut record = csv::StringRecord::new();
    let mut rows = 0usize;
    let mut reading: Option<String> = None;
    loop {
        let line = first_line + reader.position().line().saturating_sub(1) as usize;
        match reader.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => {
                return Err(syntax(line, format!("the CSV cannot be read here: {}", echo(&e.to_string()))))
            }
        }
        if record.iter().all(|f| f.is_empty()) {
            continue;
        }
        let line = first_line + record.position().map_or(0, |p| p.line().saturating_sub(1) as usize);
        if rows == 0 && header.is_none() && record.iter().any(|f| parse(f, decimal_comma).is_none()) {
            header = Some(record.iter().map(str::to_string).collect());
            continue;
        }
        if rows == 0 {
            width = record.len();
            let names = header.clone().unwrap_or_default();
            let named_time = names.iter().position(|n| is_time_name(n));
            time_column = named_time.or(if rate.is_none() && width >= 2 { Some(0) } else { None });
            if let Some(tc) = time_column {
                let name = names.get(tc).map(|n| n.to_ascii_lowercase()).unwrap_or_default();
                time_scale = if name.contains("ms") {
                    1e-3
                } else if name.contains("us") || name.contains('µ') {
                    1e-6
                } else {
                    1.0
                };
            }
            let signals = width - usize::from(time_column.is_some());
            if signals == 0 {
                return Err(syntax(line, "the CSV has a time column but no signal column".to_string()));
            }
            if time_column.is_none() && rate.is_none() {
                return Err(Error::new(
                    ErrorKind::Missing,
                    "the CSV has one column and no sample rate: add a line such as \"# sample rate: 1000 Hz\" before the data, or a time column",
                ));
            }
            if channel >= signals {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    format!("channel {} asked for, but the CSV has {signals} signal column(s)", channel + 1),
                )
                .at(FieldPath::root().key("channel")));
            }
            column = (0..width).filter(|c| Some(*c) != time_column).nth(channel).unwrap_or(0);
            let label = names.get(column).cloned().unwrap_or_else(|| format!("column {}", column + 1));
            let mut note =
                format!("signal: \"{}\" (signal column {} of {signals})", echo(&label), channel + 1);
            if let Some(tc) = time_column {
                let tname = names.get(tc).cloned().unwrap_or_else(|| format!("column {}", tc + 1));
                note.push_str(&format!(
                    "; time: \"{}\" read in {}",
                    echo(&tname),
                    if time_scale == 1.0 {
                        "seconds"
                    } else if time_scale == 1e-3 {
                        "milliseconds"
                    } else {
                        "microseconds"
                    }
                ));
            }
            header = Some(names);
            reading = Some(note);
        }
        if record.len() < width {
            return Err(syntax(
                line,
                format!("this line has {} field(s) where the first data line has {width}", record.len()),
            ));
        }
        let names = header.as_deref().unwrap_or(&[]);
        let cell = |c: usize| -> Result<f64, Error> {
            let field = record.get(c).unwrap_or("");
            let name = names.get(c).map(|n| format!(" (\"{}\")", echo(n))).unwrap_or_default();
            match parse(field, decimal_comma) {
                Some(v) if v.is_finite() => Ok(v),
                Some(_) | None => Err(syntax(
                    line,
                    format!("column {}{name}: \"{}\" is not a finite number", c + 1, echo(field)),
                )
                .with_value(field)),
            }
        };
        values.push(cell(column)? as f32);
        if let Some(tc) = time_column {
            let t = cell(tc)? * time_scale;
            if let Some(&last) = times.last() {
                if t <= last {
                    return Err(syntax(
                        line,
                        format!(
                            "the time {} does not increase (the line before has {})",
                            number(t),
                            number(last)
                        ),
                    ));
                }
            }
            times.push(t);
        }
        rows += 1;
        if rows > MAX_ROWS {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                format!("the CSV has more than {MAX_ROWS} data lines; cut it to the taps"),
            ));
        }
    }
    let mut notes: Vec<String> = reading.into_iter().collect();
    let signals = width.saturating_sub(usize::from(time_column.is_some()));
    if rows < super::MIN_SAMPLES {
        return Err(Error::new(
            ErrorKind::Missing,
            format!("the CSV holds {rows} data line(s); at least {} samples are needed", super::MIN_SAMPLES),
        ));
    }
    let (rate_hz, samples) = if time_column.is_some() {
        let u = resample::uniform(&times, &values, "time column")?;
        notes.extend(u.note);
        (u.rate_hz, u.samples)
    } else {
        (rate.unwrap_or(0.0), values)
    };
    Ok(Table { rate_hz, samples, channels: signals, notes })
}

/// A number as written in a CSV cell, with a decimal comma when `comma`. Words (NaN, inf) are
/// not numbers here.
fn parse(field: &str, comma: bool) -> Option<f64> {
    let t = field.trim();
    if t.is_empty() || t.bytes().any(|b| b.is_ascii_alphabetic() && b != b'e' && b != b'E') {
        return None;
    }
    if comma {
        t.replace(',', ".").parse().ok()
    } else {
        t.parse().ok()
    }
}

fn is_time_name(name: &str) -> bool {
    let n = name.trim().to_ascii_lowercase();
    let word = n.split(|c: char| !c.is_ascii_alphabetic()).next().unwrap_or("");
    matches!(word, "t" | "time" | "times" | "seconds" | "timestamp")
}

/// `Some(Ok(rate))` for a sample-rate line, `Some(Err(typed))` for one whose value is not a
/// positive number, `None` for any other line.
fn rate_line(line: &str) -> Option<Result<f64, String>> {
    let t = line.trim_start_matches('#').trim().to_ascii_lowercase();
    let rest = ["sample rate", "sample_rate", "samplerate", "sampling rate", "rate", "fs"]
        .iter()
        .find_map(|k| t.strip_prefix(k))?;
    let rest = rest.trim_start_matches([':', '=', ',', ';', '\t', ' ']).trim();
    if rest.is_empty() || rest.len() == t.len() {
        return None;
    }
    let value = rest.trim_end_matches("hz").trim().replace(',', ".");
    match value.parse::<f64>() {
        Ok(v) if v.is_finite() && v > 0.0 => Some(Ok(v)),
        _ => Some(Err(rest.to_string())),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn ramp(n: usize) -> Vec<f32> {
        (0..n).map(|i| (i as f32 * 0.3).sin()).collect()
    }

    #[test]
    fn reads_time_columns_rate_lines_and_decimal_commas() {
        let x = ramp(300);
        let mut text = String::from("time (s),accel x,accel y\n");
        for (i, v) in x.iter().enumerate() {
            text.push_str(&format!("{},{},{}\n", i as f64 / 500.0, v, -v));
        }
        let t = read(&text, 1).unwrap();
        assert!((t.rate_hz - 500.0).abs() < 1e-6);
        assert_eq!(t.channels, 2);
        assert!((t.samples[10] + x[10]).abs() < 1e-6);
        let mut text = String::from("# sample rate: 1000 Hz\n");
        for v in &x {
            text.push_str(&format!("{}\n", format!("{v}").replace('.', ",")));
        }
        // One column with decimal commas and no separator is ambiguous: a semicolon file is not.
        let mut semi = String::from("# fs = 1000\n");
        for v in &x {
            semi.push_str(&format!("{};{}\n", format!("{v}").replace('.', ","), 0));
        }
        let t = read(&semi, 0).unwrap();
        assert_eq!(t.rate_hz, 1000.0);
        assert!((t.samples[7] - x[7]).abs() < 1e-6);
        let mut tab = String::new();
        for (i, v) in x.iter().enumerate() {
            tab.push_str(&format!(
                "{}\t{}\n",
                format!("{}", i as f64 * 0.002).replace('.', ","),
                format!("{v}").replace('.', ",")
            ));
        }
        let t = read(&tab, 0).unwrap();
        assert!((t.rate_hz - 500.0).abs() < 1e-6);
    }

    #[test]
    fn bad_cells_name_their_line_and_column() {
        let mut text = String::from("t,a\n");
        for i in 0..300 {
            text.push_str(&format!(
                "{},{}\n",
                i as f64 * 0.01,
                if i == 41 { "NaN".to_string() } else { "0.5".to_string() }
            ));
        }
        let e = read(&text, 0).unwrap_err().to_string();
        assert!(e.contains("line[43]") && e.contains("column 2") && e.contains("NaN"), "{e}");
        let e = read("0.1\n0.2\n", 0).unwrap_err().to_string();
        assert!(e.contains("sample rate"), "{e}");
        let e = read("# sample rate: 0\n1\n", 0).unwrap_err().to_string();
        assert!(e.contains("positive"), "{e}");
        let e = read("t,a\n0,1\n0,2\n", 0).unwrap_err().to_string();
        assert!(e.contains("does not increase") || e.contains("at least"), "{e}");
    }
}
