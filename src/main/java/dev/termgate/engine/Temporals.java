package dev.termgate.engine;

import java.time.DateTimeException;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.LocalTime;
import java.time.OffsetDateTime;
import java.time.OffsetTime;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.temporal.ChronoUnit;
import java.time.temporal.IsoFields;
import java.time.temporal.Temporal;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * openCypher temporal values on java.time: DATE = LocalDate, LOCAL TIME = LocalTime, TIME = OffsetTime,
 * LOCAL DATETIME = LocalDateTime, DATETIME = ZonedDateTime, DURATION = {@link DurationValue}. Construction
 * from ISO strings and maps, component access, comparison and arithmetic with durations.
 */
final class Temporals {
    private Temporals() {}

    static boolean isTemporal(Object v) {
        return v instanceof LocalDate || v instanceof LocalTime || v instanceof OffsetTime || v instanceof LocalDateTime
                || v instanceof ZonedDateTime || v instanceof DurationValue;
    }

    static String typeName(Object v) {
        if (v instanceof LocalDate) return "DATE";
        if (v instanceof LocalTime) return "LOCAL TIME";
        if (v instanceof OffsetTime) return "TIME";
        if (v instanceof LocalDateTime) return "LOCAL DATETIME";
        if (v instanceof ZonedDateTime) return "DATETIME";
        return "DURATION";
    }

    static Object normalize(Object v) {
        if (v instanceof OffsetDateTime o) return o.toZonedDateTime();
        if (v instanceof Instant i) return i.atZone(ZoneOffset.UTC);
        if (v instanceof java.util.Date d) return d.toInstant().atZone(ZoneOffset.UTC);
        if (v instanceof java.time.Duration d) return DurationValue.of(0, 0, d.getSeconds(), d.getNano());
        if (v instanceof java.time.Period p) return DurationValue.of(p.toTotalMonths(), p.getDays(), 0, 0);
        return v;
    }

    /** Ternary comparison within one temporal type; null across types and for durations. */
    static Integer compare(Object a, Object b) {
        if (a instanceof LocalDate x && b instanceof LocalDate y) return Integer.signum(x.compareTo(y));
        if (a instanceof LocalTime x && b instanceof LocalTime y) return Integer.signum(x.compareTo(y));
        if (a instanceof OffsetTime x && b instanceof OffsetTime y) return Integer.signum(utc(x).compareTo(utc(y)));
        if (a instanceof LocalDateTime x && b instanceof LocalDateTime y) return Integer.signum(x.compareTo(y));
        if (a instanceof ZonedDateTime x && b instanceof ZonedDateTime y) return Integer.signum(x.toInstant().compareTo(y.toInstant()));
        return null;
    }

    private static LocalTime utc(OffsetTime t) {
        return t.withOffsetSameInstant(ZoneOffset.UTC).toLocalTime();
    }

    static boolean equal(Object a, Object b) {
        Integer c = compare(a, b);
        if (c != null) return c == 0;
        return a.equals(b);
    }

    /** Total order used by ORDER BY among values of the same temporal type. */
    static int order(Object a, Object b) {
        Integer c = compare(a, b);
        if (c != null) return c;
        if (a instanceof DurationValue x && b instanceof DurationValue y) {
            long dx = x.months() * 2_629_746L + x.days() * 86_400L + x.seconds(), dy = y.months() * 2_629_746L + y.days() * 86_400L + y.seconds();
            return dx != dy ? Long.compare(dx, dy) : Integer.compare(x.nanos(), y.nanos());
        }
        return 0;
    }

    static int orderRank(Object v) {
        if (v instanceof ZonedDateTime) return 0;
        if (v instanceof LocalDateTime) return 1;
        if (v instanceof LocalDate) return 2;
        if (v instanceof OffsetTime) return 3;
        if (v instanceof LocalTime) return 4;
        return 5;
    }

    /** openCypher's text form (also what {@code toString()} returns). */
    static String text(Object v) {
        if (v instanceof ZonedDateTime z) {
            String base = z.toLocalDateTime().toString() + offsetText(z.getOffset());
            if (z.getZone() instanceof ZoneOffset) return base;
            return base + "[" + z.getZone().getId() + "]";
        }
        if (v instanceof OffsetTime t) return t.toLocalTime().toString() + offsetText(t.getOffset());
        if (v instanceof LocalDateTime t) return t.toString();
        if (v instanceof LocalDate d) {
            int y = d.getYear();
            if (y > 9999) return "+" + d;
            return d.toString();
        }
        return v.toString();
    }

    private static String offsetText(ZoneOffset o) {
        return o.getTotalSeconds() == 0 ? "Z" : o.getId();
    }

    // ---------------------------------------------------------------- construction

    /**
     * @param statementNow the statement's clock: every {@code date()}, {@code localtime()}… of one query reads the
     *                     same instant (openCypher TCK, Temporal10 [12]); {@code .realtime()} reads the real one
     */
    static Object construct(String fn, java.util.List<Object> args, java.util.function.Supplier<ZonedDateTime> statementNow) {
        String kind = fn.contains(".") ? fn.substring(0, fn.indexOf('.')) : fn;
        String op = fn.contains(".") ? fn.substring(fn.indexOf('.') + 1) : "";
        try {
            if (!op.isEmpty()) return special(kind, op, args, statementNow);
            if (args.isEmpty()) return convert(kind, statementNow.get(), null);
            Object a = args.get(0);
            if (a == null) return null;
            if (kind.equals("duration")) return duration(a);
            if (a instanceof String s) return parse(kind, s.strip());
            if (a instanceof Map<?, ?> m) return fromMap(kind, m);
            return convert(kind, a, null);
        } catch (DateTimeException | ArithmeticException | IllegalArgumentException e) {
            throw EngineException.runtime("invalid " + kind + " value: " + e.getMessage());
        }
    }

    private static Object special(String kind, String op, java.util.List<Object> args,
                                  java.util.function.Supplier<ZonedDateTime> statementNow) {
        switch (op) {
            case "statement", "transaction", "realtime" -> {
                // One query is one statement and one transaction here.
                ZonedDateTime now = op.equals("realtime") ? ZonedDateTime.now(ZoneOffset.UTC) : statementNow.get();
                if (args.isEmpty()) return convert(kind, now, null);
                if (args.get(0) == null) return null;
                return convert(kind, now.withZoneSameInstant(zoneOf(args.get(0))), null);
            }
            case "fromepoch" -> {
                long s = ((Number) args.get(0)).longValue();
                long n = args.size() > 1 ? ((Number) args.get(1)).longValue() : 0;
                return Instant.ofEpochSecond(s, n).atZone(ZoneOffset.UTC);
            }
            case "fromepochmillis" -> {
                return Instant.ofEpochMilli(((Number) args.get(0)).longValue()).atZone(ZoneOffset.UTC);
            }
            case "between", "inmonths", "indays", "inseconds" -> {
                if (args.get(0) == null || args.get(1) == null) return null;
                return between(op, args.get(0), args.get(1));
            }
            case "truncate" -> {
                if (args.size() < 2 || args.size() > 3) throw new IllegalArgumentException("truncate takes a unit, a value and an optional map");
                if (args.get(0) == null || args.get(1) == null) return null;
                Object fields = args.size() == 3 ? args.get(2) : null;
                if (fields != null && !(fields instanceof Map)) throw new IllegalArgumentException("the third argument of truncate must be a map");
                return truncate(kind, String.valueOf(args.get(0)), args.get(1), fields == null ? Map.of() : (Map<?, ?>) fields);
            }
            default -> throw EngineException.runtime("unknown function '" + kind + "." + op + "'");
        }
    }

    /**
     * {@code date.truncate(unit, value, fields)} and its kin (openCypher temporal functions): the value's local date
     * and time are cut down to the unit (a date unit also clears the time), then the map sets components below
     * the unit ({@code day}, {@code dayOfWeek}, {@code nanosecond}…, added to what the cut kept of the second)
     * and may give the {@code timezone}; the value keeps its own zone otherwise, UTC when it has none.
     */
    private static Object truncate(String kind, String unit, Object value, Map<?, ?> raw) {
        Map<String, Object> m = new java.util.HashMap<>();
        raw.forEach((k, v) -> m.put(String.valueOf(k).toLowerCase(Locale.ROOT), v));
        LocalDate date = value instanceof LocalDate d ? d : value instanceof LocalDateTime t ? t.toLocalDate()
                : value instanceof ZonedDateTime z ? z.toLocalDate() : null;
        LocalTime time = value instanceof LocalTime t ? t : value instanceof OffsetTime o ? o.toLocalTime()
                : value instanceof LocalDateTime t ? t.toLocalTime() : value instanceof ZonedDateTime z ? z.toLocalTime() : LocalTime.MIDNIGHT;
        ZoneId zone = value instanceof ZonedDateTime z ? z.getZone() : value instanceof OffsetTime o ? o.getOffset() : null;
        if (date == null && (kind.equals("date") || kind.equals("datetime") || kind.equals("localdatetime"))) {
            throw new IllegalArgumentException("cannot truncate a " + Values.typeName(value) + " to a " + kind);
        }
        switch (unit.toLowerCase(Locale.ROOT)) {
            case "millennium" -> date = LocalDate.of(Math.floorDiv(date(date, unit).getYear(), 1000) * 1000, 1, 1);
            case "century" -> date = LocalDate.of(Math.floorDiv(date(date, unit).getYear(), 100) * 100, 1, 1);
            case "decade" -> date = LocalDate.of(Math.floorDiv(date(date, unit).getYear(), 10) * 10, 1, 1);
            case "year" -> date = LocalDate.of(date(date, unit).getYear(), 1, 1);
            case "weekyear" -> date = date(date, unit).with(IsoFields.WEEK_OF_WEEK_BASED_YEAR, 1)
                    .with(java.time.temporal.ChronoField.DAY_OF_WEEK, 1);
            case "quarter" -> date = date(date, unit).withMonth((date.get(IsoFields.QUARTER_OF_YEAR) - 1) * 3 + 1).withDayOfMonth(1);
            case "month" -> date = date(date, unit).withDayOfMonth(1);
            case "week" -> date = date(date, unit).with(java.time.temporal.ChronoField.DAY_OF_WEEK, 1);
            case "day" -> { }
            case "hour" -> time = time.truncatedTo(ChronoUnit.HOURS);
            case "minute" -> time = time.truncatedTo(ChronoUnit.MINUTES);
            case "second" -> time = time.truncatedTo(ChronoUnit.SECONDS);
            case "millisecond" -> time = time.truncatedTo(ChronoUnit.MILLIS);
            case "microsecond" -> time = time.truncatedTo(ChronoUnit.MICROS);
            default -> throw new IllegalArgumentException("unknown unit '" + unit + "' for truncate");
        }
        if (DATE_UNITS.contains(unit.toLowerCase(Locale.ROOT))) time = LocalTime.MIDNIGHT;
        if (date != null) {
            if (m.containsKey("year")) date = date.withYear(intOf(m, "year", 0));
            if (m.containsKey("month")) date = date.withMonth(intOf(m, "month", 0));
            if (m.containsKey("day")) date = date.withDayOfMonth(intOf(m, "day", 0));
            if (m.containsKey("dayofweek")) date = date.with(java.time.temporal.ChronoField.DAY_OF_WEEK, intOf(m, "dayofweek", 0));
        }
        time = time.withHour(intOf(m, "hour", time.getHour())).withMinute(intOf(m, "minute", time.getMinute()))
                .withSecond(intOf(m, "second", time.getSecond()));
        long extra = intOf(m, "millisecond", 0) * 1_000_000L + intOf(m, "microsecond", 0) * 1_000L + intOf(m, "nanosecond", 0);
        time = time.withNano(Math.toIntExact(time.getNano() + extra));
        if (m.containsKey("timezone")) zone = zoneOf(m.get("timezone"));
        ZoneId z = zone == null ? ZoneOffset.UTC : zone;
        return switch (kind) {
            case "date" -> date;
            case "localtime" -> time;
            case "time" -> OffsetTime.of(time, offsetOf(z, date));
            case "localdatetime" -> LocalDateTime.of(date, time);
            case "datetime" -> ZonedDateTime.of(date, time, z);
            default -> throw new IllegalArgumentException(kind + " has no truncate");
        };
    }

    private static final java.util.Set<String> DATE_UNITS =
            java.util.Set.of("millennium", "century", "decade", "year", "weekyear", "quarter", "month", "week", "day");

    private static LocalDate date(LocalDate d, String unit) {
        if (d == null) throw new IllegalArgumentException("cannot truncate a time to the " + unit);
        return d;
    }

    private static Object convert(String kind, Object a, ZoneId zone) {
        LocalDate date = a instanceof LocalDate d ? d : a instanceof LocalDateTime t ? t.toLocalDate()
                : a instanceof ZonedDateTime z ? z.toLocalDate() : null;
        LocalTime time = a instanceof LocalTime t ? t : a instanceof OffsetTime o ? o.toLocalTime()
                : a instanceof LocalDateTime t ? t.toLocalTime() : a instanceof ZonedDateTime z ? z.toLocalTime() : null;
        ZoneId z = a instanceof ZonedDateTime zd ? zd.getZone() : a instanceof OffsetTime o ? o.getOffset() : null;
        switch (kind) {
            case "date" -> {
                if (date == null) throw new IllegalArgumentException("cannot make a date from " + Values.typeName(a));
                return date;
            }
            case "localtime" -> {
                if (time == null) throw new IllegalArgumentException("cannot make a local time from " + Values.typeName(a));
                return time;
            }
            case "time" -> {
                if (time == null) throw new IllegalArgumentException("cannot make a time from " + Values.typeName(a));
                ZoneOffset off = z == null ? ZoneOffset.UTC : offsetOf(z, date);
                return OffsetTime.of(time, off);
            }
            case "localdatetime" -> {
                if (date == null) throw new IllegalArgumentException("cannot make a local datetime from " + Values.typeName(a));
                return LocalDateTime.of(date, time == null ? LocalTime.MIDNIGHT : time);
            }
            case "datetime" -> {
                if (date == null) throw new IllegalArgumentException("cannot make a datetime from " + Values.typeName(a));
                return ZonedDateTime.of(date, time == null ? LocalTime.MIDNIGHT : time, z == null ? ZoneOffset.UTC : z);
            }
            default -> throw new IllegalArgumentException(kind);
        }
    }

    private static ZoneOffset offsetOf(ZoneId z, LocalDate date) {
        if (z instanceof ZoneOffset o) return o;
        return z.getRules().getOffset((date == null ? LocalDate.now() : date).atStartOfDay());
    }

    // ---- strings ----

    /** ISO 8601 dates; a year of more than four digits carries its sign, so 20150721 is 2015-07-21 (TCK Temporal2 [1]). */
    private static final Pattern DATE = Pattern.compile(
            "([+-]\\d{4,9}|\\d{4})(?:-?(?:(\\d{2})(?:-?(\\d{2}))?|W(\\d{2})(?:-?(\\d))?|(\\d{3})|Q(\\d)(?:-?(\\d{2}))?))?");
    private static final Pattern TIME = Pattern.compile("(\\d{2})(?::?(\\d{2})(?::?(\\d{2})(?:[.,](\\d{1,9}))?)?)?");
    private static final Pattern ZONE = Pattern.compile("(Z|[+-]\\d{2}(?::?\\d{2})?)?(?:\\[([^\\]]+)])?");

    static Object parse(String kind, String s) {
        if (kind.equals("duration")) return parseDuration(s);
        String datePart = null, timePart = null;
        if (kind.equals("time") || kind.equals("localtime")) timePart = s;
        else {
            int t = s.indexOf('T');
            if (t >= 0) {
                datePart = s.substring(0, t);
                timePart = s.substring(t + 1);
            } else datePart = s;
        }
        LocalDate date = datePart == null ? null : parseDate(datePart);
        LocalTime time = null;
        ZoneId zone = null;
        if (timePart != null) {
            Matcher m = TIME.matcher(timePart);
            if (!m.lookingAt()) throw new IllegalArgumentException("'" + s + "'");
            time = LocalTime.of(Integer.parseInt(m.group(1)), m.group(2) == null ? 0 : Integer.parseInt(m.group(2)),
                    m.group(3) == null ? 0 : Integer.parseInt(m.group(3)),
                    m.group(4) == null ? 0 : Integer.parseInt((m.group(4) + "000000000").substring(0, 9)));
            String rest = timePart.substring(m.end());
            Matcher zm = ZONE.matcher(rest);
            if (!zm.matches()) throw new IllegalArgumentException("'" + s + "'");
            if (zm.group(2) != null) zone = ZoneId.of(zm.group(2));
            else if (zm.group(1) != null) zone = zm.group(1).equals("Z") ? ZoneOffset.UTC : ZoneOffset.of(normOffset(zm.group(1)));
            if (zm.group(1) != null && zm.group(2) != null && !(zone instanceof ZoneOffset)) {
                // an explicit offset with a named zone: the named zone decides
            }
        }
        return switch (kind) {
            case "date" -> date;
            case "localtime" -> time;
            case "time" -> OffsetTime.of(time, zone == null ? ZoneOffset.UTC : offsetOf(zone, null));
            case "localdatetime" -> LocalDateTime.of(date, time == null ? LocalTime.MIDNIGHT : time);
            case "datetime" -> ZonedDateTime.of(date, time == null ? LocalTime.MIDNIGHT : time, zone == null ? ZoneOffset.UTC : zone);
            default -> throw new IllegalArgumentException(kind);
        };
    }

    private static String normOffset(String o) {
        if (o.length() == 3) return o + ":00";
        if (o.length() == 5) return o.substring(0, 3) + ":" + o.substring(3);
        return o;
    }

    private static LocalDate parseDate(String s) {
        Matcher m = DATE.matcher(s);
        if (!m.matches()) throw new IllegalArgumentException("'" + s + "' is not a date");
        int year = Integer.parseInt(m.group(1));
        if (m.group(4) != null) {
            int week = Integer.parseInt(m.group(4));
            int dow = m.group(5) == null ? 1 : Integer.parseInt(m.group(5));
            return LocalDate.of(year, 6, 1).with(IsoFields.WEEK_OF_WEEK_BASED_YEAR, week).with(ChronoFieldDayOfWeek.INSTANCE, dow);
        }
        if (m.group(6) != null) return LocalDate.ofYearDay(year, Integer.parseInt(m.group(6)));
        if (m.group(7) != null) {
            int q = Integer.parseInt(m.group(7));
            int dq = m.group(8) == null ? 1 : Integer.parseInt(m.group(8));
            return LocalDate.of(year, (q - 1) * 3 + 1, 1).plusDays(dq - 1L);
        }
        int month = m.group(2) == null ? 1 : Integer.parseInt(m.group(2));
        int day = m.group(3) == null ? 1 : Integer.parseInt(m.group(3));
        return LocalDate.of(year, month, day);
    }

    /** Day-of-week adjuster (1 = Monday) that keeps the week-based year. */
    private static final class ChronoFieldDayOfWeek {
        static final java.time.temporal.TemporalField INSTANCE = java.time.temporal.ChronoField.DAY_OF_WEEK;
    }

    // ---- maps ----

    private static Object fromMap(String kind, Map<?, ?> raw) {
        Map<String, Object> m = new java.util.HashMap<>();
        raw.forEach((k, v) -> m.put(String.valueOf(k).toLowerCase(Locale.ROOT), v));
        ZoneId zone = m.containsKey("timezone") ? zoneOf(m.get("timezone")) : null;
        LocalDate date = null;
        LocalTime time = null;
        ZoneId baseZone = null;
        // "datetime" selects a value's date, time and zone; "date" its date alone, the time and zone left to the
        // other keys and the defaults (openCypher TCK, Temporal3 [4], [8], [10]).
        Object base = m.containsKey("datetime") ? m.get("datetime") : m.containsKey("date") ? m.get("date") : null;
        boolean dateOnly = !m.containsKey("datetime");
        if (base != null) {
            if (base instanceof ZonedDateTime z) {
                date = z.toLocalDate();
                if (!dateOnly) { time = z.toLocalTime(); baseZone = z.getZone(); }
            } else if (base instanceof LocalDateTime t) {
                date = t.toLocalDate();
                if (!dateOnly) time = t.toLocalTime();
            } else if (base instanceof LocalDate d) date = d;
        }
        Object timeBase = m.get("time");
        if (timeBase != null) {
            if (timeBase instanceof LocalTime t) time = t;
            else if (timeBase instanceof OffsetTime o) { time = o.toLocalTime(); baseZone = o.getOffset(); }
            else if (timeBase instanceof LocalDateTime t) time = t.toLocalTime();
            else if (timeBase instanceof ZonedDateTime z) { time = z.toLocalTime(); baseZone = z.getZone(); }
        }
        if (m.containsKey("year") || m.containsKey("month") || m.containsKey("day") || m.containsKey("week")
                || m.containsKey("ordinalday") || m.containsKey("quarter") || m.containsKey("dayofweek") || m.containsKey("dayofquarter")) {
            date = dateFromMap(m, date);
        }
        boolean hasTimeFields = m.containsKey("hour") || m.containsKey("minute") || m.containsKey("second")
                || m.containsKey("millisecond") || m.containsKey("microsecond") || m.containsKey("nanosecond");
        if (hasTimeFields) {
            LocalTime t0 = time == null ? LocalTime.MIDNIGHT : time;
            int hour = intOf(m, "hour", t0.getHour());
            int minute = intOf(m, "minute", t0.getMinute());
            int second = intOf(m, "second", t0.getSecond());
            long nano = time != null && !(m.containsKey("millisecond") || m.containsKey("microsecond") || m.containsKey("nanosecond")) ? t0.getNano() : 0;
            if (m.containsKey("millisecond") || m.containsKey("microsecond") || m.containsKey("nanosecond")) {
                nano = intOf(m, "millisecond", 0) * 1_000_000L + intOf(m, "microsecond", 0) * 1_000L + intOf(m, "nanosecond", 0);
                if (time != null && !m.containsKey("millisecond")) nano += (t0.getNano() / 1_000_000) * 1_000_000L;
            }
            time = LocalTime.of(hour, minute, second, (int) nano);
        }
        ZoneId useZone = zone != null ? zone : baseZone;
        switch (kind) {
            case "date" -> { return date; }
            case "localtime" -> { return time; }
            case "time" -> {
                LocalTime t = time == null ? LocalTime.MIDNIGHT : time;
                if (zone != null && baseZone != null && timeBase != null) {
                    return OffsetTime.of(t, offsetOf(baseZone, date)).withOffsetSameInstant(offsetOf(zone, date));
                }
                return OffsetTime.of(t, useZone == null ? ZoneOffset.UTC : offsetOf(useZone, date));
            }
            case "localdatetime" -> { return LocalDateTime.of(date, time == null ? LocalTime.MIDNIGHT : time); }
            case "datetime" -> {
                LocalTime t = time == null ? LocalTime.MIDNIGHT : time;
                if (zone != null && baseZone != null) {
                    return ZonedDateTime.of(date, t, baseZone).withZoneSameInstant(zone);
                }
                return ZonedDateTime.of(date, t, useZone == null ? ZoneOffset.UTC : useZone);
            }
            default -> throw new IllegalArgumentException(kind);
        }
    }

    private static LocalDate dateFromMap(Map<String, Object> m, LocalDate base) {
        int year = intOf(m, "year", base == null ? 1970 : base.getYear());
        if (m.containsKey("week")) {
            int week = intOf(m, "week", 1);
            int dow = intOf(m, "dayofweek", base == null ? 1 : base.getDayOfWeek().getValue());
            LocalDate start = base != null && !m.containsKey("year") ? base : LocalDate.of(year, 6, 1);
            return start.with(IsoFields.WEEK_BASED_YEAR, m.containsKey("year") || base == null ? year : base.get(IsoFields.WEEK_BASED_YEAR))
                    .with(IsoFields.WEEK_OF_WEEK_BASED_YEAR, week).with(java.time.temporal.ChronoField.DAY_OF_WEEK, dow);
        }
        if (m.containsKey("ordinalday")) return LocalDate.ofYearDay(year, intOf(m, "ordinalday", 1));
        if (m.containsKey("quarter")) {
            int q = intOf(m, "quarter", 1);
            int dq = intOf(m, "dayofquarter", base == null ? 1 : base.get(IsoFields.DAY_OF_QUARTER));
            return LocalDate.of(year, (q - 1) * 3 + 1, 1).plusDays(dq - 1L);
        }
        int month = intOf(m, "month", base == null ? 1 : base.getMonthValue());
        int day = intOf(m, "day", base == null ? 1 : base.getDayOfMonth());
        return LocalDate.of(year, month, day);
    }

    private static int intOf(Map<String, Object> m, String key, int dflt) {
        Object v = m.get(key);
        if (v == null) return dflt;
        if (v instanceof Number n) return Math.toIntExact(n.longValue());
        throw new IllegalArgumentException(key + " must be an integer");
    }

    private static ZoneId zoneOf(Object v) {
        String s = String.valueOf(v);
        if (s.equals("Z")) return ZoneOffset.UTC;
        if (s.startsWith("+") || s.startsWith("-")) return ZoneOffset.of(normOffset(s));
        return ZoneId.of(s);
    }

    // ---------------------------------------------------------------- durations

    private static final Pattern ISO_DURATION = Pattern.compile(
            "([-+]?)P(?:([-+]?[\\d.]+)Y)?(?:([-+]?[\\d.]+)M)?(?:([-+]?[\\d.]+)W)?(?:([-+]?[\\d.]+)D)?"
                    + "(?:T(?:([-+]?[\\d.]+)H)?(?:([-+]?[\\d.]+)M)?(?:([-+]?[\\d.]+)S)?)?");

    static DurationValue duration(Object a) {
        if (a instanceof DurationValue d) return d;
        if (a instanceof String s) return parseDuration(s.strip());
        if (a instanceof Map<?, ?> raw) {
            Map<String, Object> m = new java.util.HashMap<>();
            raw.forEach((k, v) -> m.put(String.valueOf(k).toLowerCase(Locale.ROOT), v));
            DurationValue d = DurationValue.of(0, 0, 0, 0);
            d = d.plus(unit(m, "years", 12, 0, 0));
            d = d.plus(unit(m, "months", 1, 0, 0));
            d = d.plus(unit(m, "weeks", 0, 7, 0));
            d = d.plus(unit(m, "days", 0, 1, 0));
            d = d.plus(unit(m, "hours", 0, 0, 3600));
            d = d.plus(unit(m, "minutes", 0, 0, 60));
            d = d.plus(unit(m, "seconds", 0, 0, 1));
            d = d.plus(nanosUnit(m, "milliseconds", 1_000_000L));
            d = d.plus(nanosUnit(m, "microseconds", 1_000L));
            d = d.plus(nanosUnit(m, "nanoseconds", 1L));
            return d;
        }
        throw new IllegalArgumentException("cannot make a duration from " + Values.typeName(a));
    }

    private static DurationValue unit(Map<String, Object> m, String key, long months, long days, long seconds) {
        Object v = m.get(key);
        if (v == null) return DurationValue.of(0, 0, 0, 0);
        double f = ((Number) v).doubleValue();
        if (v instanceof Long l) return DurationValue.of(months * l, days * l, seconds * l, 0);
        return DurationValue.of(months, days, seconds, 0).times(f);
    }

    private static DurationValue nanosUnit(Map<String, Object> m, String key, long nanos) {
        Object v = m.get(key);
        if (v == null) return DurationValue.of(0, 0, 0, 0);
        return DurationValue.of(0, 0, 0, Math.round(((Number) v).doubleValue() * nanos));
    }

    /** ISO 8601's alternative form, a date and time in the place of the fields: P2012-02-02T14:37:21.545 (TCK Temporal2 [7]). */
    private static final Pattern ALTERNATIVE_DURATION =
            Pattern.compile("([-+]?)P(\\d{4})-(\\d{2})-(\\d{2})T(\\d{2}):(\\d{2}):(\\d{2}(?:[.,]\\d{1,9})?)");

    static DurationValue parseDuration(String s) {
        Matcher alt = ALTERNATIVE_DURATION.matcher(s);
        if (alt.matches()) {
            Map<String, Object> parts = new java.util.HashMap<>();
            String[] keys = {null, null, "years", "months", "days", "hours", "minutes", "seconds"};
            for (int i = 2; i <= 6; i++) parts.put(keys[i], Long.parseLong(alt.group(i)));
            String sec = alt.group(7).replace(',', '.');
            parts.put("seconds", sec.contains(".") ? (Object) Double.parseDouble(sec) : (Object) Long.parseLong(sec));
            DurationValue d = duration(parts);
            return alt.group(1).equals("-") ? d.negate() : d;
        }
        Matcher m = ISO_DURATION.matcher(s);
        if (!m.matches() || s.endsWith("P") || s.endsWith("T")) {
            throw new IllegalArgumentException("'" + s + "' is not a duration");
        }
        Map<String, Object> parts = new java.util.HashMap<>();
        String[] keys = {null, null, "years", "months", "weeks", "days", "hours", "minutes", "seconds"};
        for (int i = 2; i <= 8; i++) {
            if (m.group(i) == null) continue;
            String t = m.group(i);
            parts.put(keys[i], t.contains(".") ? (Object) Double.parseDouble(t) : (Object) Long.parseLong(t));
        }
        DurationValue d = duration(parts);
        return m.group(1).equals("-") ? d.negate() : d;
    }

    private static Object between(String op, Object a, Object b) {
        Temporal[] xy = aligned(a, b);
        Temporal x = xy[0], y = xy[1];
        switch (op) {
            case "inmonths" -> {
                return DurationValue.of(monthsBetween(x, y), 0, 0, 0);
            }
            case "indays" -> {
                return DurationValue.of(0, daysBetween(x, y), 0, 0);
            }
            case "inseconds" -> {
                return timeBetween(0, 0, x, y);
            }
            default -> {
                long months = monthsBetween(x, y);
                Temporal mid = hasDate(x) ? x.plus(months, ChronoUnit.MONTHS) : x;
                long days = daysBetween(mid, y);
                return timeBetween(months, days, hasDate(mid) ? mid.plus(days, ChronoUnit.DAYS) : mid, y);
            }
        }
    }

    private static boolean hasDate(Temporal t) {
        return t.isSupported(ChronoUnit.DAYS);
    }

    private static long monthsBetween(Temporal x, Temporal y) {
        if (!hasDate(x) || !hasDate(y)) return 0;
        return x.until(y, ChronoUnit.MONTHS);
    }

    private static long daysBetween(Temporal x, Temporal y) {
        if (!hasDate(x) || !hasDate(y)) return 0;
        return x.until(y, ChronoUnit.DAYS);
    }

    /** The months and days given plus the time from x to y, in seconds and nanoseconds (nanoseconds alone overflow). */
    private static DurationValue timeBetween(long months, long days, Temporal x, Temporal y) {
        if (x instanceof LocalDate && y instanceof LocalDate) return DurationValue.of(months, days, x.until(y, ChronoUnit.DAYS) * 86_400, 0);
        long seconds = x.until(y, ChronoUnit.SECONDS);
        return DurationValue.of(months, days, seconds, x.plus(seconds, ChronoUnit.SECONDS).until(y, ChronoUnit.NANOS));
    }

    /**
     * Two values brought to one type to measure between (openCypher TCK, Temporal10): a value without a date is put
     * on the other's date, and a value without a zone into the other's zone, so that the hour a daylight-saving
     * change adds or takes counts; two times compare in UTC when both have an offset, else as local times.
     */
    private static Temporal[] aligned(Object a, Object b) {
        boolean aDated = isDated(a), bDated = isDated(b);
        if (!aDated && !bDated) {
            boolean utc = a instanceof OffsetTime && b instanceof OffsetTime;
            return new Temporal[] {localTime(a, utc), localTime(b, utc)};
        }
        if (!aDated) return new Temporal[] {onDateOf(a, b), dated(b, a)};
        if (!bDated) return new Temporal[] {dated(a, b), onDateOf(b, a)};
        return new Temporal[] {dated(a, b), dated(b, a)};
    }

    private static boolean isDated(Object v) {
        return v instanceof LocalDate || v instanceof LocalDateTime || v instanceof ZonedDateTime;
    }

    private static LocalTime localTime(Object v, boolean utc) {
        if (v instanceof OffsetTime t) return utc ? t.withOffsetSameInstant(ZoneOffset.UTC).toLocalTime() : t.toLocalTime();
        return (LocalTime) v;
    }

    /** A dated value, in the zone of {@code other} when it has one and this has none; a date alone at midnight. */
    private static Temporal dated(Object v, Object other) {
        ZoneId zone = other instanceof ZonedDateTime z ? z.getZone() : null;
        if (v instanceof LocalDate d) {
            if (zone != null) return d.atStartOfDay(zone);
            return other instanceof LocalDate ? d : d.atStartOfDay();
        }
        if (v instanceof LocalDateTime t && zone != null) return t.atZone(zone);
        return (Temporal) v;
    }

    /** A time of day on the date (and in the zone) of a dated value. */
    private static Temporal onDateOf(Object time, Object datedValue) {
        Temporal d = dated(datedValue, datedValue);
        LocalDate date = LocalDate.from(d);
        if (d instanceof ZonedDateTime z) {
            if (time instanceof OffsetTime t) return t.atDate(date).atZoneSameInstant(z.getZone());
            return ZonedDateTime.of(date, (LocalTime) time, z.getZone());
        }
        return LocalDateTime.of(date, time instanceof OffsetTime t ? t.toLocalTime() : (LocalTime) time);
    }

    // ---------------------------------------------------------------- arithmetic and access

    static Object plus(Object t, DurationValue d) {
        if (t instanceof LocalDate x) return x.plusMonths(d.months()).plusDays(d.days()).plusDays(wholeDays(d));
        if (t instanceof LocalTime x) return x.plusSeconds(d.seconds()).plusNanos(d.nanos());
        if (t instanceof OffsetTime x) return x.plusSeconds(d.seconds()).plusNanos(d.nanos());
        if (t instanceof LocalDateTime x) return x.plusMonths(d.months()).plusDays(d.days()).plusSeconds(d.seconds()).plusNanos(d.nanos());
        if (t instanceof ZonedDateTime x) return x.plusMonths(d.months()).plusDays(d.days()).plusSeconds(d.seconds()).plusNanos(d.nanos());
        throw EngineException.runtime("cannot add a duration to a " + Values.typeName(t));
    }

    /**
     * The days a duration's time part holds in full, cut toward zero: a date moves by whole days only, so
     * 1984-10-11 - PT16H13M10S stays 1984-10-11 (openCypher TCK, Temporal8 [1]; flooring gave the day before).
     */
    private static long wholeDays(DurationValue d) {
        long seconds = d.seconds() < 0 && d.nanos() > 0 ? d.seconds() + 1 : d.seconds();
        return seconds / 86400;
    }

    static Object property(Object t, String key) {
        String k = key.toLowerCase(Locale.ROOT);
        if (t instanceof DurationValue d) return durationProperty(d, k);
        LocalDate date = t instanceof LocalDate d ? d : t instanceof LocalDateTime x ? x.toLocalDate() : t instanceof ZonedDateTime z ? z.toLocalDate() : null;
        LocalTime time = t instanceof LocalTime x ? x : t instanceof OffsetTime o ? o.toLocalTime() : t instanceof LocalDateTime x ? x.toLocalTime() : t instanceof ZonedDateTime z ? z.toLocalTime() : null;
        ZoneOffset off = t instanceof ZonedDateTime z ? z.getOffset() : t instanceof OffsetTime o ? o.getOffset() : null;
        if (date != null) {
            switch (k) {
                case "year": return (long) date.getYear();
                case "quarter": return (long) date.get(IsoFields.QUARTER_OF_YEAR);
                case "month": return (long) date.getMonthValue();
                case "week": return (long) date.get(IsoFields.WEEK_OF_WEEK_BASED_YEAR);
                case "weekyear": return (long) date.get(IsoFields.WEEK_BASED_YEAR);
                case "dayofquarter": return (long) date.get(IsoFields.DAY_OF_QUARTER);
                case "quarterday": return (long) date.get(IsoFields.DAY_OF_QUARTER);
                case "day": return (long) date.getDayOfMonth();
                case "ordinalday": return (long) date.getDayOfYear();
                case "dayofweek": case "weekday": return (long) date.getDayOfWeek().getValue();
                default: break;
            }
        }
        if (time != null) {
            switch (k) {
                case "hour": return (long) time.getHour();
                case "minute": return (long) time.getMinute();
                case "second": return (long) time.getSecond();
                case "millisecond": return (long) time.getNano() / 1_000_000;
                case "microsecond": return (long) time.getNano() / 1_000;
                case "nanosecond": return (long) time.getNano();
                default: break;
            }
        }
        if (off != null) {
            switch (k) {
                case "timezone": return t instanceof ZonedDateTime z ? (z.getZone() instanceof ZoneOffset ? offsetText(off) : z.getZone().getId()) : offsetText(off);
                case "offset": return offsetText(off);
                case "offsetminutes": return (long) off.getTotalSeconds() / 60;
                case "offsetseconds": return (long) off.getTotalSeconds();
                default: break;
            }
        }
        if (t instanceof ZonedDateTime z) {
            if (k.equals("epochseconds")) return z.toEpochSecond();
            if (k.equals("epochmillis")) return z.toInstant().toEpochMilli();
        }
        return null;
    }

    private static Object durationProperty(DurationValue d, String k) {
        long totalSeconds = d.seconds();
        return switch (k) {
            case "years" -> d.months() / 12;
            case "quarters" -> d.months() / 3;
            case "months" -> d.months();
            case "weeks" -> d.days() / 7;
            case "days" -> d.days();
            case "hours" -> totalSeconds / 3600;
            case "minutes" -> totalSeconds / 60;
            case "seconds" -> totalSeconds;
            case "milliseconds" -> totalSeconds * 1000 + d.nanos() / 1_000_000;
            case "microseconds" -> totalSeconds * 1_000_000 + d.nanos() / 1_000;
            case "nanoseconds" -> totalSeconds * 1_000_000_000L + d.nanos();
            case "quartersofyear" -> (d.months() % 12) / 3;
            case "monthsofquarter" -> d.months() % 3;
            case "monthsofyear" -> d.months() % 12;
            case "daysofweek" -> d.days() % 7;
            case "minutesofhour" -> (totalSeconds / 60) % 60;
            case "secondsofminute" -> totalSeconds % 60;
            case "millisecondsofsecond" -> (long) d.nanos() / 1_000_000;
            case "microsecondsofsecond" -> (long) d.nanos() / 1_000;
            case "nanosecondsofsecond" -> (long) d.nanos();
            default -> null;
        };
    }
}
