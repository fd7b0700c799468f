package dev.termgate.engine;

/**
 * An openCypher duration: months, days, seconds and nanoseconds kept apart (a month has no fixed length).
 * {@code nanos} is within 0..999,999,999 after normalisation.
 */
public record DurationValue(long months, long days, long seconds, int nanos) {

    static DurationValue of(long months, long days, long seconds, long nanos) {
        long s = seconds + Math.floorDiv(nanos, 1_000_000_000L);
        int n = (int) Math.floorMod(nanos, 1_000_000_000L);
        return new DurationValue(months, days, s, n);
    }

    DurationValue plus(DurationValue o) {
        return of(Math.addExact(months, o.months), Math.addExact(days, o.days), Math.addExact(seconds, o.seconds), (long) nanos + o.nanos);
    }

    DurationValue negate() {
        return of(-months, -days, -seconds, -(long) nanos);
    }

    /** Multiplies each part; fractions of months and days spill into smaller units (openCypher 9). */
    DurationValue times(double f) {
        double m = months * f;
        long wm = (long) m;
        double d = days * f + (m - wm) * 30.436875;
        long wd = (long) d;
        double s = seconds * f + (d - wd) * 86400 + nanos * f / 1e9;
        long ws = (long) Math.floor(s);
        long ns = Math.round((s - ws) * 1e9);
        return of(wm, wd, ws, ns);
    }

    /** ISO 8601 text as openCypher prints it, e.g. {@code P1Y2M10DT12H45M30.25S}; zero is {@code PT0S}. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("P");
        long y = months / 12, mo = months % 12;
        if (y != 0) sb.append(y).append('Y');
        if (mo != 0) sb.append(mo).append('M');
        if (days != 0) sb.append(days).append('D');
        long totalNanos = seconds * 1_000_000_000L + nanos;
        if (totalNanos != 0) {
            sb.append('T');
            long h = seconds / 3600;
            long rest = seconds % 3600;
            long mi = rest / 60;
            long s = rest % 60;
            long n = nanos;
            if (s < 0 && n > 0 || (seconds < 0 && n > 0)) {
                // negative seconds with a positive fraction: borrow so both parts carry the same sign
                s += 1;
                n = n - 1_000_000_000L;
                if (s > 0 && mi < 0) { s -= 60; mi += 1; }
            }
            if (h != 0) sb.append(h).append('H');
            if (mi != 0) sb.append(mi).append('M');
            if (s != 0 || n != 0) {
                if (s == 0 && n < 0) sb.append('-');
                sb.append(s);
                if (n != 0) {
                    String frac = String.format("%09d", Math.abs(n)).replaceAll("0+$", "");
                    sb.append('.').append(frac);
                }
                sb.append('S');
            }
        }
        if (sb.length() == 1) sb.append("T0S");
        return sb.toString();
    }
}
