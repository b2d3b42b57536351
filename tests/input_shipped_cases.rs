//! The built-in demo and every example case shipped in examples/ load and validate. These are
//! invented scenarios of our own; the checks here are about the files, not the engineering.

use std::path::Path;

use stackwake::case::{BeamTheory, LiningMass, Profile};
use stackwake::input::{demo_case, load_case};

#[test]
fn demo_file_on_disk_matches_the_embedded_demo() {
    let from_disk = load_case(Path::new("data/demo.toml")).expect("data/demo.toml loads");
    let demo = demo_case();
    // Same bytes, so the same SHA-256; the demo says it is the embedded text.
    let (disk_src, demo_src) = (
        from_disk.source.clone().unwrap(),
        demo.source.clone().unwrap(),
    );
    assert_eq!(disk_src.sha256_hex, demo_src.sha256_hex);
    assert!(demo_src.built_in_demo && !disk_src.built_in_demo);
    let from_disk = stackwake::case::Case {
        source: None,
        ..from_disk
    };
    let demo = stackwake::case::Case {
        source: None,
        ..demo
    };
    assert_eq!(from_disk, demo);
    assert!(from_disk.title.starts_with("Invented demo"));
    assert_eq!(from_disk.shell.height_m(), 210.0);
    assert_eq!(from_disk.stages[0].top_z_m, Some(140.0));
}

#[test]
fn csv_stations_example_loads() {
    let case = load_case(Path::new("examples/csv_stations.toml")).expect("example loads");
    assert_eq!(case.shell.stations.len(), 4);
    assert_eq!(case.shell.height_m(), 150.0);
    assert!(matches!(case.linings[0].mass, LiningMass::Layer { .. }));
    // z_min for z0 = 0.3 m: EN 1991-1-4 Table 4.1, terrain category III.
    assert_eq!(
        case.wind.unwrap().profile,
        Profile::Log {
            roughness_m: 0.3,
            z_min_m: 5.0
        }
    );
}

#[test]
fn uniform_tube_example_loads() {
    let case = load_case(Path::new("examples/uniform_tube.toml")).expect("example loads");
    assert_eq!(case.shell.beam, BeamTheory::EulerBernoulli);
    assert_eq!(case.shell.geometry_at(40.0), (4.0, 0.25));
    // No lining and no [[stage]]: one default stage (two would be the same structure).
    assert_eq!(case.stages.len(), 1);
}
