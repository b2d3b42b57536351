//! The invented 120 m reinforced stack of the resistance integration tests (test data, not
//! design data).
#![allow(dead_code)]

/// One stage (shell, unlined), f_ck 35 MPa, B500 bars 0.3 % outside and 0.2 % inside.
pub const STACK_120M: &str = r#"title = "Invented: 120 m stack for the resistance tests"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
characteristic_strength_mpa = 35.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 120.0, outer_diameter_m = 8.0,  wall_m = 0.25 },
]
[[stage]]
name = "shell"
lining = false
[wind]
reference_speed_m_s = 25.0
[reinforcement]
characteristic_strength_mpa = 500.0
[[reinforcement.zone]]
from_z_m = 0.0
to_z_m = 120.0
outer_ratio = 0.003
inner_ratio = 0.002
outer_cover_m = 0.05
inner_cover_m = 0.05
"#;
