//! The note's stylesheet: A4 print layout (CSS paged media), with "page x of y" in the
//! bottom margin of every printed page (`counter(page)` / `counter(pages)` in a margin box;
//! the PDF test prints the note with headless Chromium and reads the footer back).
//! Text width on A4 with these margins: 210 - 2 x 14 = 182 mm; every table is set to fit it.

pub(crate) const CSS: &str = r#"
@page { size: A4; margin: 15mm 14mm 17mm 14mm;
  @bottom-left { content: "stackwake vortex-shedding design note"; font-family: "DejaVu Sans",
    "Liberation Sans", Arial, sans-serif; font-size: 7.5pt; color: #333; }
  @bottom-right { content: "page " counter(page) " of " counter(pages);
    font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; font-size: 7.5pt; } }
html { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; font-size: 10pt;
  color: #000; background: #fff; }
body { max-width: 182mm; margin: 0 auto; padding: 8mm 0; line-height: 1.35; }
h1 { font-size: 16pt; margin: 0 0 2mm 0; }
h2 { font-size: 12.5pt; margin: 7mm 0 2mm 0; border-bottom: 1.5px solid #000; }
h3 { font-size: 10.5pt; margin: 4mm 0 1.5mm 0; }
h4 { font-size: 9.5pt; margin: 3mm 0 1mm 0; }
table { border-collapse: collapse; margin: 1.5mm 0 3mm 0; font-size: 8pt; max-width: 100%;
  page-break-inside: avoid; break-inside: avoid; }
th, td { border: 0.6px solid #555; padding: 0.5mm 1.2mm; vertical-align: top; }
th { background: #e8e8e8; text-align: left; font-weight: bold; font-size: 7.5pt;
  line-height: 1.2; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.bad { font-weight: bold; }
table.constants { width: 100%; table-layout: fixed; page-break-inside: auto; break-inside: auto; }
table.constants td { overflow-wrap: anywhere; }
table.constants tr { page-break-inside: avoid; break-inside: avoid; }
sub { font-size: 75%; line-height: 0; }
table.title { width: 100%; font-size: 8.5pt; margin: 0 0 4mm 0; }
table.title th { width: 24%; background: #f0f0f0; font-size: 8.5pt; }
table.title td { word-break: break-all; }
.cautions { border: 1.5px solid #000; padding: 2mm 4mm; margin: 3mm 0; }
.cautions li { margin: 1mm 0; }
figure { margin: 3mm 0 5mm 0; page-break-inside: avoid; break-inside: avoid; }
figure svg { width: 100%; height: auto; display: block; }
figcaption { font-size: 8.5pt; margin-top: 1mm; }
.small { font-size: 8pt; }
section.major { page-break-before: always; break-before: page; }
footer { margin-top: 8mm; border-top: 1px solid #000; font-size: 8pt; padding-top: 2mm; }
@media print { body { padding: 0; max-width: none; } h2, h3, h4 { page-break-after: avoid;
  break-after: avoid; } }
"#;
