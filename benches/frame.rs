//! One full frame of the workbench's UI logic (every panel and plot, the
//! bundled example with data), headless through egui's Context with no
//! renderer. Target (issue: desktop): median under 4 ms. Also reports how
//! often the numbers were recomputed: an unchanged frame must reuse them.
//! Run: `cargo bench --bench frame`.

use criterion::{Criterion, criterion_group, criterion_main};
use priorwright::gui::files::NoChooser;
use priorwright::gui::{Settings, Workbench, show};

fn frame(c: &mut Criterion) {
    let ctx = egui::Context::default();
    let mut w = Workbench::example(
        Box::new(NoChooser),
        Settings {
            state_dir: None,
            autosave_secs: None,
        },
    );
    let input = || egui::RawInput {
        screen_rect: Some(egui::Rect::from_min_size(
            egui::Pos2::ZERO,
            egui::vec2(1400.0, 1000.0),
        )),
        ..Default::default()
    };
    // Warm up: fonts, layout caches, the derived numbers.
    for _ in 0..3 {
        let _ = ctx.run_ui(input(), |ui| show(ui, &mut w));
    }
    let computed = w.cache.computed;
    c.bench_function("gui/one frame, every panel", |b| {
        b.iter(|| ctx.run_ui(input(), |ui| show(ui, &mut w)))
    });
    assert_eq!(
        w.cache.computed, computed,
        "an unchanged frame recomputed the numbers"
    );
}

criterion_group!(benches, frame);
criterion_main!(benches);
