//! Reads the partial results that `risk --shard K/N` writes (`risk_partial.json` and its
//! rows of `risk_samples.csv`) for `risk-merge`: regular files only, with a size cap (the
//! exact statistics of a shard are larger than a case file, so the cap is 1 GiB).

use std::path::Path;

use super::InputError;
use crate::risk::{Partial, PARTIAL_FORMAT};

/// Largest partial file accepted, bytes.
pub const MAX_PARTIAL_BYTES: u64 = 1 << 30;

fn read_bytes(path: &Path) -> Result<Vec<u8>, InputError> {
    let bad = |reason: String| InputError::Partial {
        path: path.to_path_buf(),
        reason,
    };
    let meta = std::fs::metadata(path).map_err(|e| bad(e.to_string()))?;
    if !meta.is_file() {
        return Err(bad("not a regular file".into()));
    }
    if meta.len() > MAX_PARTIAL_BYTES {
        return Err(bad(format!(
            "{} bytes; at most {MAX_PARTIAL_BYTES}",
            meta.len()
        )));
    }
    std::fs::read(path).map_err(|e| bad(e.to_string()))
}

/// Reads one `risk_partial.json`.
pub fn read(path: &Path) -> Result<Partial, InputError> {
    let bytes = read_bytes(path)?;
    let bad = |reason: String| InputError::Partial {
        path: path.to_path_buf(),
        reason,
    };
    // The format tag first, so a partial of another stackwake version is named as such
    // rather than failing on a field it lacks.
    let value: serde_json::Value =
        serde_json::from_slice(&bytes).map_err(|e| bad(e.to_string()))?;
    if let Some(format) = value.pointer("/header/format").and_then(|f| f.as_str()) {
        if format != PARTIAL_FORMAT {
            return Err(bad(format!(
                "format {format:?}, this stackwake reads {PARTIAL_FORMAT:?}"
            )));
        }
    }
    let p: Partial = serde_json::from_value(value).map_err(|e| bad(e.to_string()))?;
    let modes = p.header.modes.len();
    let a = &p.accumulator;
    // The layout an accumulator of this header has (sizes only; no samples).
    let empty = crate::risk::Accumulator::with_resistance(
        modes,
        p.header.stages.len(),
        p.header.inputs.len(),
        p.header.resistance,
    );
    let events = empty.events.len();
    let consistent = a.resistance == p.header.resistance
        && a.mode_entries == empty.mode_entries
        && a.stage_entries == empty.stage_entries
        && a.sums.len() == empty.sums.len()
        && a.sketches.len() == a.sums.len()
        && a.sums.iter().all(|s| s.is_well_formed())
        && a.sketches
            .iter()
            .all(|s| s.counts.iter().sum::<u64>() + s.zeros == s.total)
        && a.events.len() == events
        && a.influence.len() == events * p.header.inputs.len()
        && p.header.stage_of.len() == modes
        && p.shard >= 1
        && p.shard <= p.shards
        && p.from <= p.to
        && p.to <= p.header.samples
        && a.samples + a.invalid == p.to - p.from;
    if !consistent {
        return Err(bad(
            "its statistics do not fit its own header (edited or damaged)".into(),
        ));
    }
    Ok(p)
}

/// Reads a shard's kept rows (no header line).
pub fn read_samples(path: &Path) -> Result<Vec<u8>, InputError> {
    read_bytes(path)
}
