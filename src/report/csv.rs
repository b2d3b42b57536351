//! CSV tables with the contract columns (SI units in every column name). Text cells that a
//! spreadsheet would read as a formula (= + - @ at the start) are prefixed with a quote.

use serde::Serialize;

use super::ReportError;
use crate::modal::StageModes;
use crate::section::Annulus;

/// Neutralises a user-supplied text cell against spreadsheet formula injection.
pub fn safe_text(s: &str) -> String {
    match s.chars().next() {
        Some('=' | '+' | '-' | '@' | '\t' | '\r') => format!("'{s}"),
        _ => s.to_string(),
    }
}

/// Serialises rows to CSV bytes with a header from the row type's field names.
pub fn to_csv<T: Serialize>(file: &str, rows: &[T]) -> Result<Vec<u8>, ReportError> {
    let mut w = ::csv::Writer::from_writer(Vec::new());
    for r in rows {
        w.serialize(r).map_err(|e| ReportError::Format {
            file: file.into(),
            message: e.to_string(),
        })?;
    }
    w.into_inner().map_err(|e| ReportError::Format {
        file: file.into(),
        message: e.to_string(),
    })
}

/// Serialises rows, writing the header even when there are no rows.
pub fn to_csv_with_header<T: Serialize>(
    file: &str,
    header: &[&str],
    rows: &[T],
) -> Result<Vec<u8>, ReportError> {
    if rows.is_empty() {
        return Ok(format!("{}\n", header.join(",")).into_bytes());
    }
    to_csv(file, rows)
}

/// One row of modes.csv (contract).
#[derive(Debug, Clone, Serialize)]
pub struct ModeRow {
    pub stage: String,
    pub mode: usize,
    pub frequency_hz: f64,
    pub period_s: f64,
    pub modal_mass_kg: f64,
    pub equivalent_mass_kg_m: f64,
}

/// One row of mode_shapes.csv (contract). Borrows the stage name: a fine mesh has hundreds
/// of thousands of rows.
#[derive(Debug, Clone, Serialize)]
pub struct ShapeRow<'a> {
    pub stage: &'a str,
    pub mode: usize,
    pub z_m: f64,
    pub displacement: f64,
}

/// One row of sections.csv.
#[derive(Debug, Clone, Serialize)]
pub struct SectionCsvRow {
    pub stage: String,
    pub z_m: f64,
    pub outer_diameter_m: f64,
    pub wall_m: f64,
    pub area_m2: f64,
    pub second_moment_m4: f64,
    pub section_modulus_m3: f64,
    pub shell_mass_kg_m: f64,
    pub lining_mass_kg_m: f64,
}

pub fn mode_rows(stages: &[StageModes]) -> Vec<ModeRow> {
    stages
        .iter()
        .flat_map(|s| {
            s.modes.iter().map(move |m| ModeRow {
                stage: safe_text(&s.stage.name),
                mode: m.number,
                frequency_hz: m.frequency_hz,
                period_s: m.period_s(),
                modal_mass_kg: m.modal_mass_kg,
                equivalent_mass_kg_m: m.equivalent_mass_kg_m,
            })
        })
        .collect()
}

/// mode_shapes.csv, serialised row by row (the rows are never held all at once).
pub fn shape_csv(stages: &[StageModes]) -> Result<Vec<u8>, ReportError> {
    const FILE: &str = "mode_shapes.csv";
    let format = |e: ::csv::Error| ReportError::Format {
        file: FILE.into(),
        message: e.to_string(),
    };
    let mut w = ::csv::Writer::from_writer(Vec::new());
    for s in stages {
        let stage = safe_text(&s.stage.name);
        for m in &s.modes {
            for (z, w_m) in s.model.z_m.iter().zip(&m.displacement) {
                w.serialize(ShapeRow {
                    stage: &stage,
                    mode: m.number,
                    z_m: *z,
                    displacement: *w_m,
                })
                .map_err(format)?;
            }
        }
    }
    w.into_inner().map_err(|e| ReportError::Format {
        file: FILE.into(),
        message: e.to_string(),
    })
}

/// sections.csv rows: one per node with the section just above it (net values at
/// openings); where the section jumps (wall step, zone limit, opening limit) the section just
/// below comes first, on a row of its own with the same height.
pub fn section_rows(stages: &[StageModes]) -> Vec<SectionCsvRow> {
    let mut rows = Vec::new();
    for s in stages {
        let m = &s.model;
        let stage = safe_text(&s.stage.name);
        let mut below = m.sections_below.iter().peekable();
        for i in 0..m.z_m.len() {
            if let Some((_, b)) = below.next_if(|(k, _)| *k == i) {
                rows.push(SectionCsvRow {
                    stage: stage.clone(),
                    z_m: m.z_m[i],
                    outer_diameter_m: b.outer_diameter_m,
                    wall_m: b.wall_m,
                    area_m2: b.area_m2,
                    second_moment_m4: b.second_moment_m4,
                    section_modulus_m3: b.section_modulus_m3,
                    shell_mass_kg_m: b.shell_mass_kg_m,
                    lining_mass_kg_m: m.lining_mass_kg_m[i],
                });
            }
            let a = Annulus::new(m.outer_diameter_m[i], m.wall_m[i]);
            let area_m2 = m.area_m2.get(i).copied().unwrap_or_else(|| a.area_m2());
            let section_modulus_m3 = m
                .section_modulus_m3
                .get(i)
                .copied()
                .unwrap_or_else(|| a.section_modulus_m3());
            rows.push(SectionCsvRow {
                stage: stage.clone(),
                z_m: m.z_m[i],
                outer_diameter_m: m.outer_diameter_m[i],
                wall_m: m.wall_m[i],
                area_m2,
                second_moment_m4: m.second_moment_m4[i],
                section_modulus_m3,
                shell_mass_kg_m: m.shell_mass_kg_m[i],
                lining_mass_kg_m: m.lining_mass_kg_m[i],
            });
        }
    }
    rows
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn formula_cells_are_neutralised() {
        assert_eq!(safe_text("=cmd()"), "'=cmd()");
        assert_eq!(safe_text("@x"), "'@x");
        assert_eq!(safe_text("lined"), "lined");
    }
}
