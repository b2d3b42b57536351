//! The wind-tunnel lab's measurements on a model, for `stackwake scale --measured`: a CSV
//! with the columns `model_speed_m_s` (required) and any of `tip_amplitude_m`, `strain`,
//! `stress_pa`, `frequency_hz` (at least one response column), found by header name in any
//! order, model units (SI). An empty cell in a response column means "not measured".
//!
//! Layout is forgiving as in the stations CSV (BOM, CRLF, `#` comments, blank rows, spaces,
//! `;` or tab separators); numbers are strict. Every problem is reported with its line and
//! column, all at once.

use std::path::Path;

use super::issue::{suggestion, ValidationIssue};
use super::stations_csv::LineIndex;
use super::{read_limited, InputError, ReadFailure};
use crate::similitude::measured::ModelMeasurement;

/// The columns of a measurements CSV; the first is required.
pub const MEASURED_COLUMNS: [&str; 5] = [
    "model_speed_m_s",
    "tip_amplitude_m",
    "strain",
    "stress_pa",
    "frequency_hz",
];

/// Reads and parses a measurements CSV.
pub fn load_measured(path: &Path) -> Result<Vec<ModelMeasurement>, InputError> {
    let label = path.display().to_string();
    let text = read_limited(path, &label, "measurements CSV").map_err(|e| match e {
        ReadFailure::Io(source) => InputError::Read {
            path: path.to_path_buf(),
            source,
        },
        ReadFailure::Other(e) => e,
    })?;
    parse_measured_csv(&text, &label).map_err(|issues| InputError::Invalid { label, issues })
}

/// Parses the text of a measurements CSV; `label` names the file in messages.
pub fn parse_measured_csv(
    text: &str,
    label: &str,
) -> Result<Vec<ModelMeasurement>, Vec<ValidationIssue>> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    let (mut reader, _) = super::stations_csv::spreadsheet_reader(text);
    let header_place = format!("{label} header");
    let headers: Vec<String> = match reader.headers() {
        Ok(h) => h.iter().map(str::to_string).collect(),
        Err(e) => {
            return Err(vec![ValidationIssue::key(
                header_place,
                format!("cannot read the header row: {e}"),
            )])
        }
    };
    let mut issues = Vec::new();
    let mut index: [Option<usize>; 5] = [None; 5];
    for (i, name) in headers.iter().enumerate() {
        match MEASURED_COLUMNS.iter().position(|c| c == name) {
            Some(k) if index[k].is_some() => issues.push(ValidationIssue::new(
                header_place.clone(),
                format!("\"{name}\""),
                "column given twice",
            )),
            Some(k) => index[k] = Some(i),
            None => {
                issues.push(ValidationIssue::new(
                    header_place.clone(),
                    format!("\"{name}\""),
                    format!("unknown column; {}", suggestion(name, &MEASURED_COLUMNS)),
                ));
            }
        }
    }
    if index[0].is_none() {
        issues.push(ValidationIssue::key(
            header_place.clone(),
            "missing column model_speed_m_s (the tunnel wind speed, m/s)",
        ));
    }
    if index[1..].iter().all(Option::is_none) {
        issues.push(ValidationIssue::key(
            header_place.clone(),
            "no response column; give at least one of tip_amplitude_m, strain, stress_pa, frequency_hz",
        ));
    }
    if !issues.is_empty() {
        return Err(issues);
    }

    let lines = LineIndex::new(text);
    let mut rows = Vec::new();
    for record in reader.records() {
        let record = match record {
            Ok(r) => r,
            Err(e) => {
                let place = match e.position() {
                    Some(p) => format!("{label} line {}", lines.line_of(p.byte())),
                    None => label.to_string(),
                };
                issues.push(ValidationIssue::key(place, format!("unreadable row: {e}")));
                continue;
            }
        };
        // The editor's line (header = line 1, comment and blank lines counted), as the
        // stations reader reports it.
        let line = record
            .position()
            .map(|p| lines.line_of(p.byte()))
            .unwrap_or(0);
        if record.iter().all(str::is_empty) {
            continue;
        }
        let mut values: [Option<f64>; 5] = [None; 5];
        for (k, col) in index.iter().enumerate() {
            let Some(i) = col else { continue };
            let cell = record.get(*i).unwrap_or("");
            let place = format!("{label} line {line}, column {}", MEASURED_COLUMNS[k]);
            if cell.is_empty() {
                if k == 0 {
                    issues.push(ValidationIssue::key(
                        place,
                        "empty; every row needs the tunnel speed",
                    ));
                }
                continue;
            }
            match cell.parse::<f64>() {
                Ok(v) if !v.is_finite() => {
                    issues.push(ValidationIssue::new(place, cell, "must be a finite number"))
                }
                Ok(v) if k == 0 && v <= 0.0 => {
                    issues.push(ValidationIssue::new(place, cell, "must be > 0"))
                }
                Ok(v) if k == 4 && v <= 0.0 => {
                    issues.push(ValidationIssue::new(place, cell, "must be > 0"))
                }
                Ok(v) if k == 1 && v < 0.0 => issues.push(ValidationIssue::new(
                    place,
                    cell,
                    "must be >= 0 (give the amplitude as a magnitude)",
                )),
                Ok(v) => values[k] = Some(v),
                Err(_) => {
                    let hint = if cell.contains(',') {
                        " (use a point as the decimal separator)"
                    } else {
                        " (plain number, no unit: the unit is in the column name)"
                    };
                    issues.push(ValidationIssue::new(
                        place,
                        format!("\"{cell}\""),
                        format!("not a number{hint}"),
                    ));
                }
            }
        }
        if let Some(speed_m_s) = values[0] {
            rows.push(ModelMeasurement {
                speed_m_s,
                tip_amplitude_m: values[1],
                strain: values[2],
                stress_pa: values[3],
                frequency_hz: values[4],
            });
        }
    }
    if issues.is_empty() && rows.is_empty() {
        issues.push(ValidationIssue::key(label, "no data rows"));
    }
    if issues.is_empty() {
        Ok(rows)
    } else {
        Err(issues)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_columns_in_any_order_with_gaps() {
        let rows = parse_measured_csv(
            "\u{feff}frequency_hz;model_speed_m_s;tip_amplitude_m\r\n# lab run 3\r\n12.5;2.0;0.0011\r\n;2.5;\r\n",
            "m.csv",
        )
        .unwrap();
        assert_eq!(rows.len(), 2);
        assert_eq!(rows[0].frequency_hz, Some(12.5));
        assert_eq!(rows[0].tip_amplitude_m, Some(0.0011));
        assert_eq!(rows[1].speed_m_s, 2.5);
        assert_eq!(rows[1].tip_amplitude_m, None);
    }

    #[test]
    fn reports_every_problem_with_its_place() {
        let errs = parse_measured_csv(
            "model_speed_m_s,tip_amplitude_m\n-1,0.1\n2 m/s,0,5\n",
            "m.csv",
        )
        .unwrap_err();
        let text: Vec<String> = errs.iter().map(ToString::to_string).collect();
        assert!(
            text.contains(&"m.csv line 2, column model_speed_m_s = -1: must be > 0".to_string()),
            "{text:?}"
        );
        assert!(
            text.iter()
                .any(|t| t
                    .starts_with("m.csv line 3, column model_speed_m_s = \"2 m/s\": not a number")),
            "{text:?}"
        );
    }

    #[test]
    fn line_numbers_are_the_editors_like_the_stations_reader() {
        // Header on line 2 after a comment, a blank line and a comment before the data: the
        // bad cell is on line 6 of the file as an editor numbers it.
        let text = "# lab run 3\nmodel_speed_m_s,tip_amplitude_m\n1.0,0.001\n\n# gust\n2.0,x\n";
        let errs = parse_measured_csv(text, "m.csv").unwrap_err();
        let text: Vec<String> = errs.iter().map(ToString::to_string).collect();
        assert_eq!(
            text,
            vec!["m.csv line 6, column tip_amplitude_m = \"x\": not a number (plain number, no unit: the unit is in the column name)".to_string()]
        );
        let stations = crate::input::stations_csv::parse_stations_csv(
            "# s\nz_m,outer_diameter_m,wall_m\n0,1,0.1\n\n# gust\n2,x,0.1\n",
            "s.csv",
        )
        .unwrap_err();
        assert!(
            stations[0].to_string().starts_with("s.csv line 6,"),
            "{stations:?}"
        );
    }

    #[test]
    fn header_problems() {
        let errs = parse_measured_csv("speed,tip_amplitude\n1,2\n", "m.csv").unwrap_err();
        assert!(errs
            .iter()
            .any(|e| e.rule.contains("missing column model_speed_m_s")));
        assert!(errs.iter().any(|e| e.rule.contains("no response column")));
        assert!(parse_measured_csv("model_speed_m_s,strain\n", "m.csv").is_err());
    }
}
