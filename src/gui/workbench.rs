//! The app's state and the one place edits are applied.

use super::command::Command;
use super::derived::{Cache, Derived, Inputs};
use super::files::{self, Chooser, Purpose, Recovery};
use super::history::History;
use crate::data::{Mapping, ReadOptions, read_file};
use crate::elicit::fit::{Fixed, Judgment, Scale};
use crate::elicit::{PoolMethod, dials, fit, methods};
use crate::export::Target;
use crate::family::Prior;
use crate::project::{
    self, DataSource, Expert, MethodRecord, Pooling, Project, Scenario, StoredJudgment,
};
use std::path::{Path, PathBuf};
use std::sync::mpsc::Receiver;

/// The example project the app opens on (an invented scenario).
pub const EXAMPLE: &str = include_str!("../../sample-projects/checkout-button.ron");
/// Its file name, for messages.
pub const EXAMPLE_NAME: &str = "checkout-button.ron (bundled example)";

/// A message in the window.
#[derive(Clone, Debug, PartialEq)]
pub struct Notice {
    /// What happened.
    pub text: String,
    /// An error (else information).
    pub error: bool,
}

/// A dialog over the window.
#[derive(Clone, Debug, PartialEq)]
pub enum Dialog {
    /// Unsaved changes: what to do before `then`.
    Unsaved(Box<Command>),
    /// A path typed in where no file dialog could be shown.
    Path {
        /// What the path is for.
        purpose: Purpose,
        /// The text so far.
        text: String,
    },
    /// Columns of a data file to map.
    Mapping(MappingDraft),
    /// Unsaved work from a session that ended without saving.
    Recover(Box<Recovery>),
    /// The export text for a target.
    Export(Target),
}

/// A data file's header and the mapping being chosen.
#[derive(Clone, Debug, PartialEq)]
pub struct MappingDraft {
    /// The file.
    pub path: PathBuf,
    /// Its column names.
    pub columns: Vec<String>,
    /// The mapping so far.
    pub mapping: Mapping,
}

/// Settings that are not part of the project.
#[derive(Clone, Debug)]
pub struct View {
    /// Selected expert.
    pub expert: usize,
    /// Selected dial.
    pub dial: dials::Dial,
    /// Future size for the predictive.
    pub future: f64,
    /// Threshold for P(> c).
    pub threshold: f64,
    /// Dark theme.
    pub dark: bool,
    /// The handle being dragged, and the x-range frozen for the drag.
    pub dragging: Option<(super::panels::prior::Handle, (f64, f64))>,
    /// Judgment rows being typed: (probability, value) as text.
    pub rows: Vec<super::panels::judgments::Row>,
    /// The expert the rows belong to.
    pub rows_for: Option<usize>,
    /// Chips per bin and the bin edges.
    pub chips: Vec<f64>,
    /// Bin edges for the chips.
    pub edges: Vec<f64>,
    /// Imagined-data text (key=value).
    pub imagined: String,
    /// Observable-scale judgments: future sample text and rows.
    pub observable_future: String,
    /// Rows for the observable-scale judgments.
    pub observable_rows: Vec<super::panels::judgments::Row>,
    /// Alternative priors being edited: (name, key=value text).
    pub alternatives: Vec<(String, String)>,
    /// Whether the alternatives editor is open.
    pub alternatives_open: bool,
    /// Typed-in data statistics (key=value).
    pub typed_data: String,
    /// Which judgment form is showing.
    pub method: super::panels::judgments::Method,
    /// The last message of the chips, imagined or observable forms.
    pub method_note: Option<String>,
    /// Recent project files.
    pub recent: Vec<PathBuf>,
    /// The prior plot's last screen transform (for tests that drag handles).
    pub prior_transform: Option<egui_plot::PlotTransform>,
}

impl Default for View {
    fn default() -> Self {
        Self {
            expert: 0,
            dial: dials::Dial::Main,
            future: 20.0,
            threshold: 0.0,
            dark: false,
            dragging: None,
            rows: Vec::new(),
            rows_for: None,
            chips: Vec::new(),
            edges: Vec::new(),
            imagined: String::new(),
            observable_future: String::new(),
            observable_rows: Vec::new(),
            typed_data: String::new(),
            alternatives: Vec::new(),
            alternatives_open: false,
            method: super::panels::judgments::Method::Quantiles,
            method_note: None,
            recent: Vec::new(),
            prior_transform: None,
        }
    }
}

/// Where the app keeps its own files, and how often it autosaves.
#[derive(Clone, Debug, PartialEq)]
pub struct Settings {
    /// Recovery file and recent list (None: neither is kept).
    pub state_dir: Option<PathBuf>,
    /// Seconds between autosaves (None: off).
    pub autosave_secs: Option<f64>,
}

impl Settings {
    /// The desktop's settings.
    pub fn desktop() -> Self {
        Self {
            state_dir: files::state_dir(),
            autosave_secs: Some(5.0),
        }
    }
}

/// The whole app.
pub struct Workbench {
    /// The project being edited.
    pub project: Project,
    /// Its file, if it has one.
    pub path: Option<PathBuf>,
    /// The project as last saved or opened (for the changed marker).
    saved: Project,
    /// Transient settings.
    pub view: View,
    /// Undo and redo.
    pub history: History,
    /// Messages shown in the window.
    pub notices: Vec<Notice>,
    /// A dialog over the window.
    pub dialog: Option<Dialog>,
    /// Cached numbers.
    pub cache: Cache,
    /// File dialogs.
    chooser: Box<dyn Chooser>,
    /// An open dialog's answer, and what it is for.
    pending: Option<(Purpose, Receiver<Option<PathBuf>>)>,
    /// Autosave and state folder.
    pub settings: Settings,
    /// The project as last autosaved, and when.
    autosaved: Option<(Project, f64)>,
    /// Commands raised this frame.
    pub queue: Vec<Command>,
    /// Set when the app should close.
    pub quit: bool,
    /// The theme last applied.
    applied_dark: Option<bool>,
    /// Whether the drag under way has recorded its undo step.
    pub drag_recorded: bool,
}

impl Workbench {
    /// The app on the bundled example.
    pub fn example(chooser: Box<dyn Chooser>, settings: Settings) -> Self {
        let project = match project::from_text(EXAMPLE, EXAMPLE_NAME) {
            Ok(p) => p,
            Err(e) => {
                let mut w = Self::with_project(blank("beta-binomial"), None, chooser, settings);
                w.error(format!("the bundled example could not be read: {e}"));
                return w;
            }
        };
        Self::with_project(project, None, chooser, settings)
    }

    /// The app on a project file; a file that cannot be read leaves the
    /// example open with a notice.
    pub fn open(path: &Path, chooser: Box<dyn Chooser>, settings: Settings) -> Self {
        match project::load(path) {
            Ok(p) => {
                let mut w = Self::with_project(p, Some(path.to_path_buf()), chooser, settings);
                w.after_open();
                w
            }
            Err(e) => {
                let mut w = Self::example(chooser, settings);
                w.error(e.to_string());
                w
            }
        }
    }

    fn with_project(
        project: Project,
        path: Option<PathBuf>,
        chooser: Box<dyn Chooser>,
        settings: Settings,
    ) -> Self {
        let mut view = View::default();
        if let Some(dir) = &settings.state_dir {
            view.recent = files::read_recent(dir);
        }
        let mut w = Self {
            saved: project.clone(),
            project,
            path,
            view,
            history: History::default(),
            notices: Vec::new(),
            dialog: None,
            cache: Cache::default(),
            chooser,
            pending: None,
            settings,
            autosaved: None,
            queue: Vec::new(),
            quit: false,
            applied_dark: None,
            drag_recorded: false,
        };
        w.reset_view();
        if let Some(dir) = &w.settings.state_dir
            && let Some(r) = files::read_recovery(dir)
        {
            w.dialog = Some(Dialog::Recover(Box::new(r)));
        }
        w
    }

    /// Whether the project differs from the file.
    pub fn dirty(&self) -> bool {
        self.project != self.saved
    }

    /// Adds an error notice.
    pub fn error(&mut self, text: impl Into<String>) {
        self.notices.push(Notice {
            text: text.into(),
            error: true,
        });
    }

    /// Adds an information notice.
    pub fn inform(&mut self, text: impl Into<String>) {
        self.notices.push(Notice {
            text: text.into(),
            error: false,
        });
    }

    /// The derived numbers for the current state.
    pub fn derived(&mut self) -> &Derived {
        let inputs = Inputs {
            project: self.project.clone(),
            expert: self.view.expert,
            dial: self.view.dial,
            future: self.view.future,
            threshold: self.view.threshold,
            frozen_range: self.view.dragging.map(|(_, r)| r),
        };
        self.cache.get(&inputs)
    }

    /// The selected expert's prior.
    pub fn prior(&self) -> Option<&Prior> {
        self.project.experts.get(self.view.expert).map(|e| &e.prior)
    }

    /// Fresh view settings for the project (after open, new, family change).
    fn reset_view(&mut self) {
        self.view.expert = self
            .view
            .expert
            .min(self.project.experts.len().saturating_sub(1));
        if let Some(p) = self.prior().cloned() {
            if !dials::available(&p).contains(&self.view.dial) {
                self.view.dial = dials::first(&p);
            }
            self.view.future = match &p {
                Prior::GammaPoisson(_) => 1.0,
                Prior::NormalKnownVariance(_) | Prior::NormalInverseGamma(_) => 1.0,
                _ => 20.0,
            };
            self.view.threshold = dials::setting(&p, self.view.dial).centre;
            self.view.imagined.clear();
        }
        self.view.rows_for = None;
        self.view.chips.clear();
        self.view.edges.clear();
        self.view.dragging = None;
        self.view.method_note = None;
    }

    /// Notes for a project just opened: data files that have moved.
    fn after_open(&mut self) {
        let folder = self
            .path
            .as_ref()
            .and_then(|p| p.parent())
            .map(Path::to_path_buf)
            .unwrap_or_default();
        let missing: Vec<String> = self
            .project
            .data
            .iter()
            .filter_map(|d| d.path.as_ref())
            .filter(|f| !folder.join(f).exists())
            .cloned()
            .collect();
        for f in missing {
            self.inform(format!(
                "data file {f} is not where the project says; its stored statistics are used"
            ));
        }
        if let Some(dir) = &self.settings.state_dir
            && let Some(p) = &self.path
        {
            self.view.recent = files::push_recent(dir, p);
        }
    }

    /// Replaces the project (open, new, recover): history and view start afresh.
    fn replace(&mut self, project: Project, path: Option<PathBuf>) {
        self.saved = project.clone();
        self.project = project;
        self.path = path;
        self.history.clear();
        self.view.expert = 0;
        self.reset_view();
    }

    /// Runs every queued command, then polls dialogs and autosaves.
    pub fn apply_queue(&mut self, now: f64) {
        let queue = std::mem::take(&mut self.queue);
        for cmd in queue {
            self.apply(cmd);
        }
        self.poll_dialog();
        self.autosave(now);
    }

    /// Carries out one command.
    pub fn apply(&mut self, cmd: Command) {
        match cmd {
            Command::Undo => {
                if let Some(p) = self.history.undo(&self.project) {
                    self.project = p;
                    self.view.rows_for = None;
                    self.reset_selection();
                }
            }
            Command::Redo => {
                if let Some(p) = self.history.redo(&self.project) {
                    self.project = p;
                    self.view.rows_for = None;
                    self.reset_selection();
                }
            }
            Command::New | Command::Open | Command::OpenPath(_) | Command::Quit if self.dirty() => {
                self.dialog = Some(Dialog::Unsaved(Box::new(cmd)));
            }
            other => self.apply_unguarded(other),
        }
    }

    /// A command after the unsaved-changes guard.
    pub fn apply_unguarded(&mut self, cmd: Command) {
        match cmd {
            Command::New => {
                let fam = self.project.scenario.family.clone();
                self.replace(blank(&fam), None);
            }
            Command::Open => self.choose(Purpose::OpenProject),
            Command::OpenPath(path) => match project::load(&path) {
                Ok(p) => {
                    self.replace(p, Some(path));
                    self.after_open();
                }
                Err(e) => self.error(e.to_string()),
            },
            Command::Save => match self.path.clone() {
                Some(p) => self.save_to(&p),
                None => self.choose(Purpose::SaveProject),
            },
            Command::SaveAs => self.choose(Purpose::SaveProject),
            Command::SaveTo(p) => self.save_to(&p),
            Command::ChooseData => self.choose(Purpose::Data),
            Command::Report => self.choose(Purpose::Report),
            Command::ReportTo(p) => self.write_report(&p),
            Command::MapData(p) => self.map_data(p),
            Command::ReadData(p, mapping) => self.read_data(&p, mapping),
            Command::ShowExport(t) => self.dialog = Some(Dialog::Export(t)),
            Command::Copy(_) => {}
            Command::Dismiss(i) => {
                if i < self.notices.len() {
                    self.notices.remove(i);
                }
            }
            Command::Quit => {
                if let Some(dir) = &self.settings.state_dir {
                    files::clear_recovery(dir);
                }
                self.quit = true;
            }
            Command::Undo | Command::Redo => self.apply(cmd),
            edit => self.edit(edit),
        }
    }

    /// Keeps the selection valid after the project changed under it.
    fn reset_selection(&mut self) {
        let n = self.project.experts.len();
        if self.view.expert >= n {
            self.view.expert = n.saturating_sub(1);
        }
        if let Some(p) = self.prior().cloned()
            && !dials::available(&p).contains(&self.view.dial)
        {
            self.view.dial = dials::first(&p);
        }
    }

    /// An edit of the project: recorded for undo unless it continues a drag.
    fn edit(&mut self, cmd: Command) {
        let before = self.project.clone();
        let continuing = matches!(
            cmd,
            Command::SetPrior {
                continuing: true,
                ..
            }
        );
        match self.edited(cmd) {
            Ok(()) => {
                if self.project != before {
                    if !continuing {
                        self.history.record(&before);
                    }
                    self.project.changed = project::now_utc();
                    self.reset_selection();
                }
            }
            Err(e) => {
                self.project = before;
                self.error(e);
            }
        }
    }

    fn fixed(prior: &Prior) -> Fixed {
        match prior {
            Prior::NormalKnownVariance(p) => Fixed {
                sigma: Some(p.sigma),
                ..Fixed::default()
            },
            Prior::InverseGammaVariance(p) => Fixed {
                mu: p.mu,
                ..Fixed::default()
            },
            Prior::DirichletMultinomial(p) => Fixed {
                shares: Some(p.alpha.iter().map(|a| a / p.total()).collect()),
                names: p.names.clone(),
                ..Fixed::default()
            },
            _ => Fixed::default(),
        }
    }

    fn expert_mut(&mut self, i: usize) -> Result<&mut Expert, String> {
        self.project
            .experts
            .get_mut(i)
            .ok_or_else(|| format!("there is no expert {}", i + 1))
    }

    fn edited(&mut self, cmd: Command) -> Result<(), String> {
        let now = project::now_utc();
        match cmd {
            Command::SetPrior { expert, prior, .. } => {
                prior.validate().map_err(|e| e.to_string())?;
                let e = self.expert_mut(expert)?;
                e.prior = prior;
                e.changed = now;
            }
            Command::FitJudgments { expert, judgments } => {
                let prior = self.expert_mut(expert)?.prior.clone();
                let js: Vec<Judgment> = judgments
                    .iter()
                    .map(|j| Judgment {
                        parameter: j.parameter.clone(),
                        p: j.p,
                        value: j.value,
                    })
                    .collect();
                let f = fit::fit(prior.id(), &Self::fixed(&prior), Scale::Unknowns, &js)
                    .map_err(|e| e.to_string())?;
                let e = self.expert_mut(expert)?;
                e.prior = f.prior;
                e.judgments = judgments;
                e.method = None;
                e.changed = now;
            }
            Command::FitChips {
                expert,
                edges,
                chips,
            } => {
                let prior = self.expert_mut(expert)?.prior.clone();
                let name = prior.marginals()[dials::marginal_index(&prior, self.view.dial)]
                    .name
                    .clone();
                let param = Some(name);
                let f = methods::chips(
                    prior.id(),
                    param.as_deref(),
                    &Self::fixed(&prior),
                    &edges,
                    &chips,
                )
                .map_err(|e| e.to_string())?;
                let e = self.expert_mut(expert)?;
                e.prior = f.prior;
                e.judgments = f
                    .judgments
                    .iter()
                    .map(|j| StoredJudgment {
                        parameter: param.clone(),
                        p: j.p,
                        value: j.value,
                    })
                    .collect();
                e.method = Some(MethodRecord::Chips {
                    parameter: param,
                    edges,
                    chips,
                });
                e.changed = now;
            }
            Command::Imagined { expert, mean, text } => {
                let prior = self.expert_mut(expert)?.prior.clone();
                let keys = crate::family::keys::Keys::parse(
                    &text,
                    "imagined data",
                    methods::imagined_keys(prior.id()),
                )
                .map_err(|e| e.to_string())?;
                let p = methods::imagined(prior.id(), &Self::fixed(&prior), mean, &keys)
                    .map_err(|e| e.to_string())?;
                let e = self.expert_mut(expert)?;
                e.prior = p;
                e.method = Some(MethodRecord::Imagined { text });
                e.changed = now;
            }
            Command::Observable {
                expert,
                future,
                judgments,
            } => {
                let prior = self.expert_mut(expert)?.prior.clone();
                let fut = prior.parse_future(&future).map_err(|e| e.to_string())?;
                let js: Vec<Judgment> = judgments
                    .iter()
                    .map(|(p, v)| Judgment {
                        parameter: None,
                        p: *p,
                        value: *v,
                    })
                    .collect();
                let f = fit::fit(
                    prior.id(),
                    &Self::fixed(&prior),
                    Scale::Observable(fut),
                    &js,
                )
                .map_err(|e| e.to_string())?;
                let e = self.expert_mut(expert)?;
                e.prior = f.prior;
                e.method = Some(MethodRecord::Observable { future, judgments });
                e.changed = now;
            }
            Command::AddExpert => {
                let base = self
                    .prior()
                    .cloned()
                    .ok_or_else(|| "no expert to copy".to_owned())?;
                let n = self.project.experts.len() + 1;
                self.project.experts.push(Expert {
                    name: format!("Expert {n}"),
                    weight: 0.0,
                    judgments: Vec::new(),
                    prior: base,
                    method: None,
                    changed: now,
                });
                let w = 1.0 / n as f64;
                for e in &mut self.project.experts {
                    e.weight = w;
                }
                self.view.expert = n - 1;
            }
            Command::RemoveExpert(i) => {
                if self.project.experts.len() <= 1 {
                    return Err("a project needs at least one expert".to_owned());
                }
                if i >= self.project.experts.len() {
                    return Err(format!("there is no expert {}", i + 1));
                }
                self.project.experts.remove(i);
                normalise(&mut self.project.experts);
                if self.view.expert >= i && self.view.expert > 0 {
                    self.view.expert -= 1;
                }
            }
            Command::RenameExpert(i, name) => {
                let name = name.trim().to_owned();
                if name.is_empty() {
                    return Err("an expert needs a name".to_owned());
                }
                self.expert_mut(i)?.name = name;
            }
            Command::SetWeight(i, w) => {
                if !(w.is_finite() && (0.0..=1.0).contains(&w)) {
                    return Err(format!("weight {w} must lie between 0 and 1"));
                }
                let n = self.project.experts.len();
                if i >= n {
                    return Err(format!("there is no expert {}", i + 1));
                }
                if n == 1 {
                    return Err("with one expert the weight is 1".to_owned());
                }
                let rest: f64 = (0..n)
                    .filter(|k| *k != i)
                    .map(|k| self.project.experts[k].weight)
                    .sum();
                for (k, e) in self.project.experts.iter_mut().enumerate() {
                    e.weight = if k == i {
                        w
                    } else if rest > 0.0 {
                        e.weight / rest * (1.0 - w)
                    } else {
                        (1.0 - w) / (n - 1) as f64
                    };
                }
            }
            Command::SetPool(m) => {
                self.project.pooling.method = m;
                self.update_pooled();
            }
            Command::SetRobust(w) => {
                if let Some(w) = w
                    && !(w > 0.0 && w < 1.0)
                {
                    return Err(format!(
                        "robust weight {w} must lie strictly between 0 and 1"
                    ));
                }
                self.project.pooling.robust_weight = w;
            }
            Command::SetFamily(fam) if fam != self.project.scenario.family => {
                let fresh = blank(&fam);
                self.project.scenario.family = fam;
                for e in &mut self.project.experts {
                    e.prior = fresh.experts[0].prior.clone();
                    e.judgments.clear();
                    e.method = None;
                    e.changed = now.clone();
                }
                self.project.data.clear();
                self.project.history = None;
                self.project.pooling.pooled = None;
                self.view.dial = dials::Dial::Main;
                self.reset_view();
                self.inform(format!(
                        "switched to {}: each expert starts from a plain prior, and the data were set aside (undo brings them back)",
                        self.project.scenario.family
                    ));
            }
            Command::SetConflictThreshold(t) => self.project.checks.conflict_threshold = t,
            Command::SetAlternatives(rows) => {
                let fam = self.project.scenario.family.clone();
                let names = match &self.project.experts[0].prior {
                    Prior::DirichletMultinomial(d) => d.names.clone(),
                    _ => None,
                };
                let mut alts = Vec::new();
                for (i, (name, text)) in rows.iter().enumerate() {
                    let name = name.trim();
                    if name.is_empty() {
                        return Err(format!("alternative {} needs a name", i + 1));
                    }
                    let mut prior = Prior::parse(&fam, text)
                        .map_err(|e| format!("alternative '{name}': {e}"))?;
                    if let (Prior::DirichletMultinomial(d), Some(n)) = (&mut prior, &names)
                        && d.alpha.len() == n.len()
                    {
                        d.names = Some(n.clone());
                    }
                    alts.push(crate::analysis::sensitivity::Alternative {
                        name: name.to_owned(),
                        how: "stated in the workshop".to_owned(),
                        prior,
                    });
                }
                self.project.checks.alternatives = alts;
            }
            Command::SetTitle(t) => self.project.scenario.title = t,
            Command::SetNotes(t) => self.project.notes = t,
            Command::AddData(d) => {
                d.statistics.validate().map_err(|e| e.to_string())?;
                self.project.data.push(d);
            }
            Command::RemoveData(i) if i < self.project.data.len() => {
                self.project.data.remove(i);
            }
            _ => {}
        }
        self.project.validate().map_err(|e| e.to_string())?;
        Ok(())
    }

    fn update_pooled(&mut self) {
        self.project.pooling.pooled = match self.project.pooling.method {
            PoolMethod::Log => self.project.log_pool().ok(),
            PoolMethod::Linear => None,
        };
    }

    fn folder(&self) -> Option<PathBuf> {
        self.path
            .as_ref()
            .and_then(|p| p.parent())
            .map(Path::to_path_buf)
    }

    /// Starts a file dialog (or the path field where there is none).
    fn choose(&mut self, purpose: Purpose) {
        let folder = self.folder();
        self.pending = Some((purpose, self.chooser.start(purpose, folder.as_deref())));
        self.poll_dialog();
    }

    /// Takes a dialog's answer when it has come.
    fn poll_dialog(&mut self) {
        let Some((purpose, rx)) = &self.pending else {
            return;
        };
        let purpose = *purpose;
        let answer = match rx.try_recv() {
            Ok(a) => a,
            Err(std::sync::mpsc::TryRecvError::Empty) => return,
            Err(std::sync::mpsc::TryRecvError::Disconnected) => None,
        };
        self.pending = None;
        match answer {
            Some(path) => self.chosen(purpose, path),
            None => {
                self.dialog = Some(Dialog::Path {
                    purpose,
                    text: String::new(),
                });
            }
        }
    }

    /// The window's close button was pressed: true when the window must stay
    /// open because unsaved changes first need an answer.
    pub fn close_requested(&mut self) -> bool {
        if self.quit {
            return false;
        }
        if self.dirty() {
            self.apply(Command::Quit);
            true
        } else {
            self.apply_unguarded(Command::Quit);
            false
        }
    }

    /// Whether a file dialog is open.
    pub fn waiting(&self) -> bool {
        self.pending.is_some()
    }

    /// A path from a dialog or the path field.
    pub fn chosen(&mut self, purpose: Purpose, path: PathBuf) {
        match purpose {
            Purpose::OpenProject => self.apply_unguarded(Command::OpenPath(path)),
            Purpose::SaveProject => {
                let path = if path.extension().is_none() {
                    path.with_extension("ron")
                } else {
                    path
                };
                self.save_to(&path);
            }
            Purpose::Data => self.map_data(path),
            Purpose::Report => {
                let path = if path.extension().is_none() {
                    path.with_extension("html")
                } else {
                    path
                };
                self.write_report(&path);
            }
        }
    }

    fn save_to(&mut self, path: &Path) {
        if self.project.created.is_empty() {
            self.project.created = project::now_utc();
        }
        self.update_pooled();
        match project::save(path, &self.project) {
            Ok(()) => {
                self.saved = self.project.clone();
                self.path = Some(path.to_path_buf());
                if let Some(dir) = &self.settings.state_dir {
                    files::clear_recovery(dir);
                    self.view.recent = files::push_recent(dir, path);
                }
                self.autosaved = None;
                self.inform(format!("saved {}", path.display()));
            }
            Err(e) => self.error(format!("{e} (nothing was lost: the project is still open)")),
        }
    }

    /// Writes the report for the project as it is now (saved or not); data
    /// files are looked for beside the project's file.
    fn write_report(&mut self, path: &Path) {
        let home = self
            .path
            .clone()
            .unwrap_or_else(|| path.with_file_name("unsaved.ron"));
        match crate::cli::report_of(&self.project, &home)
            .map_err(|e| e.to_string())
            .and_then(|html| project::write_atomic(path, &html).map_err(|e| e.to_string()))
        {
            Ok(()) => self.inform(format!("wrote the report {}", path.display())),
            Err(e) => self.error(format!("the report was not written: {e}")),
        }
    }

    fn map_data(&mut self, path: PathBuf) {
        let columns = match header_of(&path) {
            Ok(c) => c,
            Err(e) => {
                self.error(e);
                return;
            }
        };
        let Some(prior) = self.prior().cloned() else {
            return;
        };
        let mapping = default_mapping(&prior, &columns);
        self.dialog = Some(Dialog::Mapping(MappingDraft {
            path,
            columns,
            mapping,
        }));
    }

    fn read_data(&mut self, path: &Path, mapping: Mapping) {
        let Some(prior) = self.prior().cloned() else {
            return;
        };
        match read_file(path, &mapping, &prior, ReadOptions::default()) {
            Ok(r) => {
                let rel = self
                    .folder()
                    .and_then(|f| path.strip_prefix(f).ok().map(Path::to_path_buf))
                    .unwrap_or_else(|| path.to_path_buf());
                let name = path
                    .file_name()
                    .map_or_else(|| "data".to_owned(), |n| n.to_string_lossy().into_owned());
                self.dialog = None;
                let rows = r.rows;
                let missing = r.missing;
                self.edit(Command::AddData(DataSource {
                    name: name.clone(),
                    path: Some(rel.display().to_string()),
                    mapping: Some(mapping),
                    missing_policy: crate::data::Missing::Skip,
                    statistics: r.data,
                    rows,
                    missing,
                }));
                self.inform(format!(
                    "read {name}: {rows} rows{}",
                    if missing > 0 {
                        format!(", {missing} skipped for a missing value")
                    } else {
                        String::new()
                    }
                ));
            }
            Err(e) => self.error(e.to_string()),
        }
    }

    /// Writes the recovery file when there is unsaved work not yet written.
    fn autosave(&mut self, now: f64) {
        let (Some(dir), Some(every)) = (&self.settings.state_dir, self.settings.autosave_secs)
        else {
            return;
        };
        if !self.dirty() {
            return;
        }
        if let Some((p, t)) = &self.autosaved
            && (p == &self.project || now - t < every)
        {
            return;
        }
        let r = Recovery {
            source: self.path.clone(),
            written: project::now_utc(),
            project: self.project.clone(),
        };
        let dir = dir.clone();
        match files::write_recovery(&dir, &r) {
            Ok(()) => self.autosaved = Some((self.project.clone(), now)),
            Err(e) => {
                self.error(format!("autosave failed: {e}"));
                self.settings.autosave_secs = None;
            }
        }
    }

    /// Seconds until unsaved work not yet in the recovery file is due to be
    /// written; None when there is nothing to write (so no wake-up is asked).
    pub fn autosave_due_in(&self, now: f64) -> Option<f64> {
        let every = self.settings.autosave_secs?;
        self.settings.state_dir.as_ref()?;
        if !self.dirty() {
            return None;
        }
        match &self.autosaved {
            Some((p, _)) if p == &self.project => None,
            Some((_, t)) => Some((every - (now - t)).max(0.0)),
            None => Some(0.0),
        }
    }

    /// Takes the offered recovery file.
    pub fn recover(&mut self, r: Recovery) {
        let source = r.source.clone();
        self.replace(r.project, source);
        // The recovered work is unsaved: mark it changed against the file.
        if let Some(p) = &self.path {
            self.saved = project::load(p).unwrap_or_else(|_| blank("beta-binomial"));
        } else {
            self.saved = blank(&self.project.scenario.family);
        }
        self.inform("recovered unsaved work from the last session; save it to keep it");
    }

    /// Declines the offered recovery file.
    pub fn discard_recovery(&mut self) {
        if let Some(dir) = &self.settings.state_dir {
            files::clear_recovery(dir);
        }
    }

    /// Applies the theme if it changed.
    pub fn apply_look(&mut self, ctx: &egui::Context) {
        if self.applied_dark != Some(self.view.dark) {
            super::look::apply(ctx, self.view.dark);
            self.applied_dark = Some(self.view.dark);
        }
    }
}

/// Rescales weights to sum to one.
fn normalise(experts: &mut [Expert]) {
    let total: f64 = experts.iter().map(|e| e.weight).sum();
    let n = experts.len() as f64;
    for e in experts {
        e.weight = if total > 0.0 {
            e.weight / total
        } else {
            1.0 / n
        };
    }
}

/// A project with one expert holding a plain prior of the family.
pub fn blank(family: &str) -> Project {
    let text = match family {
        "beta-binomial" => "alpha=2,beta=2",
        "gamma-poisson" => "alpha=2,beta=1",
        "gamma-exponential" => "alpha=2,beta=2000",
        "normal-known-variance" => "mu0=0,kappa0=1,sigma=1",
        "normal-inverse-gamma" => "mu0=0,kappa0=1,alpha0=2,beta0=2",
        "dirichlet-multinomial" => "alpha=2;2;2",
        _ => "alpha=3,beta=2,mu=0",
    };
    let prior = Prior::parse(family, text)
        .or_else(|_| Prior::parse("beta-binomial", "alpha=2,beta=2"))
        .unwrap_or_else(|_| unreachable_prior());
    let now = project::now_utc();
    Project {
        format_version: project::FORMAT_VERSION,
        scenario: Scenario {
            title: "Untitled elicitation".to_owned(),
            description: String::new(),
            unknown: String::new(),
            unit: String::new(),
            family: prior.id().to_owned(),
            high_stakes: false,
        },
        experts: vec![Expert {
            name: "Expert 1".to_owned(),
            weight: 1.0,
            judgments: Vec::new(),
            prior,
            method: None,
            changed: now.clone(),
        }],
        pooling: Pooling::default(),
        data: Vec::new(),
        history: None,
        checks: Default::default(),
        notes: String::new(),
        created: now.clone(),
        changed: now,
    }
}

/// Beta(1, 1) built without parsing (the parse above cannot fail for our own text).
fn unreachable_prior() -> Prior {
    Prior::BetaBinomial(crate::family::BetaBinomial {
        alpha: 1.0,
        beta: 1.0,
    })
}

/// A data file's column names.
pub fn header_of(path: &Path) -> Result<Vec<String>, String> {
    let name = path.display().to_string();
    let file = std::fs::File::open(path).map_err(|e| format!("{name}: cannot be opened: {e}"))?;
    let tsv = path
        .extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("tsv") || e.eq_ignore_ascii_case("tab"));
    let mut rdr = csv::ReaderBuilder::new()
        .delimiter(if tsv { b'\t' } else { b',' })
        .from_reader(std::io::Read::take(file, 1 << 20));
    let h = rdr
        .headers()
        .map_err(|e| format!("{name}, line 1: the header cannot be read: {e}"))?;
    let cols: Vec<String> = h
        .iter()
        .map(|c| c.trim().trim_start_matches('\u{feff}').to_owned())
        .filter(|c| !c.is_empty())
        .collect();
    if cols.is_empty() {
        return Err(format!(
            "{name}, line 1: the file is empty: a header row is needed"
        ));
    }
    Ok(cols)
}

/// A first guess at the mapping: the family's kind, the first columns.
pub fn default_mapping(prior: &Prior, columns: &[String]) -> Mapping {
    let col = |i: usize| {
        columns
            .get(i)
            .or(columns.first())
            .cloned()
            .unwrap_or_default()
    };
    match prior {
        Prior::BetaBinomial(_) => Mapping::Binary { column: col(0) },
        Prior::GammaPoisson(_) => Mapping::Counts {
            count: col(0),
            exposure: None,
        },
        Prior::GammaExponential(_) => Mapping::Times {
            time: col(0),
            event: None,
        },
        Prior::DirichletMultinomial(p) => Mapping::Category {
            column: col(0),
            labels: match &p.names {
                Some(n) => n.clone(),
                None => (1..=p.alpha.len()).map(|k| format!("theta{k}")).collect(),
            },
        },
        _ => Mapping::Values { column: col(0) },
    }
}
