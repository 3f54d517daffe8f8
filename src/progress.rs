//! A progress bar with rate and time left, on a terminal only (silent otherwise).

use std::io::IsTerminal;
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::sync::Arc;
use std::thread::JoinHandle;
use std::time::Duration;

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

/// A bar that follows a shared counter from a background thread.
pub struct Progress {
    done: Arc<AtomicBool>,
    handle: Option<JoinHandle<()>>,
}

impl Progress {
    /// Starts following `counter` up to `total` (hidden when not on a terminal or `quiet`).
    pub fn start(counter: Arc<AtomicU64>, total: u64, quiet: bool) -> Self {
        let done = Arc::new(AtomicBool::new(false));
        let visible = !quiet && std::io::stderr().is_terminal();
        let handle = visible.then(|| {
            let done = done.clone();
            std::thread::spawn(move || {
                let bar = ProgressBar::with_draw_target(Some(total), ProgressDrawTarget::stderr());
                bar.set_style(
                    ProgressStyle::with_template(
                        "{bar:40.cyan/blue} {pos}/{len} samples  {per_sec}  eta {eta}",
                    )
                    .unwrap_or_else(|_| ProgressStyle::default_bar()),
                );
                while !done.load(Ordering::Relaxed) {
                    bar.set_position(counter.load(Ordering::Relaxed).min(total));
                    std::thread::sleep(Duration::from_millis(100));
                }
                bar.set_position(counter.load(Ordering::Relaxed).min(total));
                bar.finish_and_clear();
            })
        });
        Progress { done, handle }
    }
}

impl Drop for Progress {
    fn drop(&mut self) {
        self.done.store(true, Ordering::Relaxed);
        if let Some(h) = self.handle.take() {
            let _ = h.join();
        }
    }
}
