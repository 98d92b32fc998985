//! Fonts, themes and colours: readable on a projector, distinguishable for
//! colour-blind viewers.
//!
//! Colours come from the Okabe–Ito palette (M. Okabe and K. Ito, "Color
//! Universal Design", 2008), chosen so the common colour-vision deficiencies
//! keep them apart; curves also differ by line style, so nothing rests on
//! colour alone.

use egui::{Color32, FontId, TextStyle};

/// The roles curves play.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Role {
    /// The prior being edited (or the pooled prior).
    Prior,
    /// The posterior.
    Posterior,
    /// The scaled likelihood.
    Likelihood,
    /// Handles and stated points.
    Mark,
}

/// Okabe–Ito colours.
const ORANGE: Color32 = Color32::from_rgb(0xE6, 0x9F, 0x00);
const SKY: Color32 = Color32::from_rgb(0x56, 0xB4, 0xE9);
const GREEN: Color32 = Color32::from_rgb(0x00, 0x9E, 0x73);
const BLUE: Color32 = Color32::from_rgb(0x00, 0x72, 0xB2);
const VERMILLION: Color32 = Color32::from_rgb(0xD5, 0x5E, 0x00);
const PURPLE: Color32 = Color32::from_rgb(0xCC, 0x79, 0xA7);
const YELLOW: Color32 = Color32::from_rgb(0xF0, 0xE4, 0x42);

/// A role's colour in a theme (blue is too dark on a dark background).
pub fn color(role: Role, dark: bool) -> Color32 {
    match (role, dark) {
        (Role::Prior, false) => BLUE,
        (Role::Prior, true) => SKY,
        (Role::Posterior, _) => VERMILLION,
        (Role::Likelihood, _) => GREEN,
        (Role::Mark, false) => Color32::BLACK,
        (Role::Mark, true) => Color32::WHITE,
    }
}

/// Colours for individual experts, apart from the pooled prior's.
pub fn expert_color(i: usize, dark: bool) -> Color32 {
    let light = [ORANGE, PURPLE, GREEN, VERMILLION];
    let dark_set = [ORANGE, PURPLE, YELLOW, GREEN];
    if dark {
        dark_set[i % dark_set.len()]
    } else {
        light[i % light.len()]
    }
}

/// Large type and roomy controls, and the chosen theme.
pub fn apply(ctx: &egui::Context, dark: bool) {
    ctx.set_visuals(if dark {
        egui::Visuals::dark()
    } else {
        egui::Visuals::light()
    });
    ctx.all_styles_mut(|style| {
        use egui::FontFamily::{Monospace, Proportional};
        style.text_styles = [
            (TextStyle::Heading, FontId::new(24.0, Proportional)),
            (TextStyle::Body, FontId::new(17.0, Proportional)),
            (TextStyle::Button, FontId::new(17.0, Proportional)),
            (TextStyle::Small, FontId::new(14.0, Proportional)),
            (TextStyle::Monospace, FontId::new(16.0, Monospace)),
        ]
        .into();
        style.spacing.item_spacing = egui::vec2(8.0, 6.0);
        style.spacing.interact_size.y = 26.0;
    });
}
