//! UTC timestamps without a date crate: days since 1970 to a civil date
//! (H. Hinnant's `civil_from_days`, chrono-compatible-algorithms, 2013).

/// Now as RFC 3339 UTC, to the second.
pub fn now_utc() -> String {
    let secs = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_secs());
    format_utc(secs)
}

/// Seconds since 1970-01-01T00:00:00Z as RFC 3339.
pub fn format_utc(secs: u64) -> String {
    let days = (secs / 86_400) as i64;
    let rem = secs % 86_400;
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = doy - (153 * mp + 2) / 5 + 1;
    let m = if mp < 10 { mp + 3 } else { mp - 9 };
    let y = yoe + era * 400 + i64::from(m <= 2);
    format!(
        "{y:04}-{m:02}-{d:02}T{:02}:{:02}:{:02}Z",
        rem / 3600,
        rem % 3600 / 60,
        rem % 60
    )
}

#[cfg(test)]
mod tests {
    #[test]
    fn known_instants() {
        // Common practice: Unix time 0 and 951782400 (the leap day 2000-02-29);
        // the third value was computed with Python's datetime module.
        assert_eq!(super::format_utc(0), "1970-01-01T00:00:00Z");
        assert_eq!(super::format_utc(951_782_400), "2000-02-29T00:00:00Z");
        // Python: datetime(2026, 12, 2, 5, 0, 45, tzinfo=timezone.utc).timestamp().
        assert_eq!(super::format_utc(1_796_187_645), "2026-12-02T05:00:45Z");
    }
}
