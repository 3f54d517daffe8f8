//! Progress of a run: a bar with rate and time left on a terminal; on anything else (a batch job's
//! log) one line every `--log-every` seconds with samples done, rate and time left.

use std::io::IsTerminal;
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::sync::Arc;
use std::thread::JoinHandle;
use std::time::{Duration, Instant};

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

/// A follower of a shared counter of finished samples, on a background thread.
pub struct Progress {
    done: Arc<AtomicBool>,
    handle: Option<JoinHandle<()>>,
}

/// Seconds for people: `42.0 s`, `3.5 min`, `2.1 h`.
pub fn human_seconds(s: f64) -> String {
    if s < 90.0 {
        format!("{s:.1} s")
    } else if s < 5400.0 {
        format!("{:.1} min", s / 60.0)
    } else {
        format!("{:.1} h", s / 3600.0)
    }
}

/// One log line: `progress: 1200/8000 samples (15.0%), 40.0 samples/s, about 2.8 min left`.
pub fn log_line(done: u64, first: u64, total: u64, seconds: f64) -> String {
    let new = done.saturating_sub(first);
    let rate = if seconds > 0.0 {
        new as f64 / seconds
    } else {
        0.0
    };
    let left = if rate > 0.0 {
        format!(
            "about {} left",
            human_seconds(total.saturating_sub(done) as f64 / rate)
        )
    } else {
        "time left unknown yet".to_string()
    };
    let percent = if total > 0 {
        100.0 * done as f64 / total as f64
    } else {
        100.0
    };
    format!("progress: {done}/{total} samples ({percent:.1}%), {rate:.3} samples/s, {left}")
}

impl Progress {
    /// Starts following `counter` up to `total`: a bar on a terminal, a line every `log_every`
    /// seconds elsewhere, nothing with `quiet`.
    pub fn start(counter: Arc<AtomicU64>, total: u64, quiet: bool, log_every: f64) -> Self {
        let done = Arc::new(AtomicBool::new(false));
        let handle = if quiet {
            None
        } else if std::io::stderr().is_terminal() {
            let done = done.clone();
            Some(std::thread::spawn(move || bar(&counter, total, &done)))
        } else {
            let done = done.clone();
            let every = Duration::from_secs_f64(log_every);
            Some(std::thread::spawn(move || {
                log(&counter, total, &done, every)
            }))
        };
        Progress { done, handle }
    }
}

fn bar(counter: &AtomicU64, total: u64, done: &AtomicBool) {
    let bar = ProgressBar::with_draw_target(Some(total), ProgressDrawTarget::stderr());
    bar.set_style(
        ProgressStyle::with_template(
            "{bar:40.cyan/blue} {pos}/{len} samples  {per_sec}  eta {eta}",
        )
        .unwrap_or_else(|_| ProgressStyle::default_bar()),
    );
    let first = counter.load(Ordering::Relaxed).min(total);
    bar.set_position(first);
    bar.reset_eta();
    while !done.load(Ordering::Relaxed) {
        bar.set_position(counter.load(Ordering::Relaxed).min(total));
        std::thread::sleep(Duration::from_millis(100));
    }
    bar.set_position(counter.load(Ordering::Relaxed).min(total));
    bar.finish_and_clear();
}

fn log(counter: &AtomicU64, total: u64, done: &AtomicBool, every: Duration) {
    let started = Instant::now();
    let first = counter.load(Ordering::Relaxed).min(total);
    let mut last = Instant::now();
    while !done.load(Ordering::Relaxed) {
        std::thread::sleep(Duration::from_millis(50));
        if last.elapsed() >= every {
            last = Instant::now();
            let now = counter.load(Ordering::Relaxed).min(total);
            eprintln!(
                "motley: {}",
                log_line(now, first, total, started.elapsed().as_secs_f64())
            );
        }
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn log_line_states_count_rate_and_time_left() {
        // 200 new samples in 10 s: 20 per second; 600 left take 30 s.
        assert_eq!(
            log_line(400, 200, 1000, 10.0),
            "progress: 400/1000 samples (40.0%), 20.000 samples/s, about 30.0 s left"
        );
        assert_eq!(
            log_line(0, 0, 1000, 5.0),
            "progress: 0/1000 samples (0.0%), 0.000 samples/s, time left unknown yet"
        );
        assert_eq!(human_seconds(7200.0), "2.0 h");
    }
}
