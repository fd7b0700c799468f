package dev.termgate.engine;

import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;
import java.math.RoundingMode;

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

    /** An average month, 365.2425 / 12 days (openCypher 9's duration arithmetic). */
    private static final BigDecimal DAYS_PER_MONTH = new BigDecimal("30.436875");
    private static final BigDecimal NANOS_PER_DAY = BigDecimal.valueOf(86_400_000_000_000L);
    private static final BigDecimal NANOS_PER_SECOND = BigDecimal.valueOf(1_000_000_000L);

    /**
     * Multiplies each part; fractions of months and days spill into smaller units (openCypher 9), and a fraction of
     * a nanosecond is cut off. Exact decimal arithmetic on the factor as written: in doubles, 1 ns × 0.5 came out
     * as 1 ns instead of none (openCypher TCK, Temporal8 [7]).
     */
    DurationValue times(double f) {
        return times(factor(f));
    }

    /** {@code this / n}, exactly where the quotient is (openCypher TCK, Temporal8 [7]). */
    DurationValue dividedBy(double n) {
        if (n == 0) throw EngineException.runtime("division by zero");
        return times(BigDecimal.ONE.divide(factor(n), MathContext.DECIMAL128));
    }

    private static BigDecimal factor(double f) {
        if (Double.isNaN(f) || Double.isInfinite(f)) throw EngineException.runtime("a duration cannot be scaled by " + f);
        return BigDecimal.valueOf(f);
    }

    private DurationValue times(BigDecimal k) {
        BigDecimal m = BigDecimal.valueOf(months).multiply(k);
        BigDecimal wholeMonths = m.setScale(0, RoundingMode.DOWN);
        BigDecimal d = BigDecimal.valueOf(days).multiply(k).add(m.subtract(wholeMonths).multiply(DAYS_PER_MONTH));
        BigDecimal wholeDays = d.setScale(0, RoundingMode.DOWN);
        BigInteger ns = BigDecimal.valueOf(seconds).multiply(NANOS_PER_SECOND).add(BigDecimal.valueOf(nanos)).multiply(k)
                .add(d.subtract(wholeDays).multiply(NANOS_PER_DAY)).setScale(0, RoundingMode.DOWN).toBigIntegerExact();
        BigInteger[] sn = ns.divideAndRemainder(NANOS_PER_SECOND.toBigIntegerExact());
        try {
            return of(wholeMonths.longValueExact(), wholeDays.longValueExact(), sn[0].longValueExact(), sn[1].longValueExact());
        } catch (ArithmeticException e) {
            throw EngineException.runtime("duration out of range");
        }
    }

    /** ISO 8601 text as openCypher prints it, e.g. {@code P1Y2M10DT12H45M30.25S}; zero is {@code PT0S}. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("P");
        long y = months / 12, mo = months % 12;
        if (y != 0) sb.append(y).append('Y');
        if (mo != 0) sb.append(mo).append('M');
        if (days != 0) sb.append(days).append('D');
        if (seconds != 0 || nanos != 0) {
            // The time part is printed by its size, every field carrying its sign: -86,399.9 s is
            // PT-23H-59M-59.9S (openCypher TCK, Temporal10 [1]).
            boolean negative = seconds < 0;
            long whole = negative ? -(seconds + (nanos > 0 ? 1 : 0)) : seconds;
            long fraction = negative && nanos > 0 ? 1_000_000_000L - nanos : nanos;
            String sign = negative ? "-" : "";
            sb.append('T');
            long h = whole / 3600, mi = whole % 3600 / 60, sec = whole % 60;
            if (h != 0) sb.append(sign).append(h).append('H');
            if (mi != 0) sb.append(sign).append(mi).append('M');
            if (sec != 0 || fraction != 0) {
                sb.append(sign).append(sec);
                if (fraction != 0) sb.append('.').append(String.format("%09d", fraction).replaceAll("0+$", ""));
                sb.append('S');
            }
        }
        if (sb.length() == 1) sb.append("T0S");
        return sb.toString();
    }
}
