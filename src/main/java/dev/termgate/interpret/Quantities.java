package dev.termgate.interpret;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * Numbers, periods and comparatives in a question: "more than 3", "over 50,000 tonnes", "at least 60",
 * "before 2005", "in December 2024", "in the second half of 2024", "after the start of 2025".
 */
final class Quantities {

    enum Op {
        GT(">"), GE(">="), LT("<"), LE("<="), EQ("=");

        final String symbol;

        Op(String symbol) {
            this.symbol = symbol;
        }
    }

    /**
     * A number or a period. For a number, {@code value} and {@code unit} (a stemmed word such as "tonn", "kg",
     * "foot", or empty). For a period, {@code [start, end)} and {@code year} when the period is a whole year.
     */
    record Quantity(int from, int to, Op op, boolean period, double value, String unit, LocalDate start, LocalDate end,
                    boolean wholeYear) {}

    private static final Map<String, Integer> MONTHS = Map.ofEntries(Map.entry("january", 1), Map.entry("february", 2),
            Map.entry("march", 3), Map.entry("april", 4), Map.entry("may", 5), Map.entry("june", 6),
            Map.entry("july", 7), Map.entry("august", 8), Map.entry("september", 9), Map.entry("october", 10),
            Map.entry("november", 11), Map.entry("december", 12));

    /** Units a number may carry in a question (stems), common practice for the trade's wording. */
    private static final List<String> UNITS = List.of("tonn", "ton", "t", "kg", "kilogram", "metr", "m", "foot", "teu",
            "percent", "cubic", "year", "day");

    private Quantities() {}

    static List<Quantity> find(List<Words.Tok> t) {
        List<Quantity> out = new ArrayList<>();
        for (int i = 0; i < t.size(); i++) {
            Words.Tok w = t.get(i);
            if (!w.isNumber()) continue;
            boolean year = isYear(w);
            if (year) {
                Quantity q = period(t, i);
                out.add(q);
                i = Math.max(i, q.to() - 1);
                continue;
            }
            int[] opSpan = new int[] {i};
            Op op = comparator(t, i, opSpan);
            String unit = "";
            int end = i + 1;
            if (end < t.size() && UNITS.contains(t.get(end).stem())) {
                unit = t.get(end).stem();
                end++;
            }
            out.add(new Quantity(opSpan[0], end, op, false, w.number(), unit, null, null, false));
        }
        return out;
    }

    private static boolean isYear(Words.Tok w) {
        double v = w.number();
        return w.raw().length() == 4 && v >= 1800 && v <= 2200 && v == Math.floor(v);
    }

    /** The comparator written before token {@code i}; {@code from[0]} is moved to its first word. */
    private static Op comparator(List<Words.Tok> t, int i, int[] from) {
        String p1 = i >= 1 ? t.get(i - 1).lower() : "";
        String p2 = i >= 2 ? t.get(i - 2).lower() : "";
        String p3 = i >= 3 ? t.get(i - 3).lower() : "";
        Op op = null;
        int words = 0;
        if (p1.equals("than")) {
            if (p2.equals("more") || p2.equals("greater") || p2.equals("larger") || p2.equals("higher") || p2.equals("bigger")
                    || p2.equals("heavier") || p2.equals("longer") || p2.equals("deeper") || p2.equals("later")) {
                op = p3.equals("no") ? Op.LE : Op.GT;
            } else if (p2.equals("less") || p2.equals("fewer") || p2.equals("smaller") || p2.equals("lower")
                    || p2.equals("lighter") || p2.equals("shorter") || p2.equals("earlier")) {
                op = p3.equals("no") ? Op.GE : Op.LT;
            }
            words = p3.equals("no") ? 3 : 2;
        } else if ((p2.equals("at") && p1.equals("least"))) {
            op = Op.GE;
            words = 2;
        } else if (p2.equals("at") && p1.equals("most") || p2.equals("up") && p1.equals("to")) {
            op = Op.LE;
            words = 2;
        } else if (p1.equals("over") || p1.equals("above") || p1.equals("exceeding") || p1.equals("beyond")) {
            op = Op.GT;
            words = 1;
        } else if (p1.equals("under") || p1.equals("below")) {
            op = Op.LT;
            words = 1;
        } else if (p1.equals("minimum") || p1.equals("min")) {
            op = Op.GE;
            words = 1;
        } else if (p1.equals("maximum") || p1.equals("max")) {
            op = Op.LE;
            words = 1;
        }
        if (op == null) return Op.EQ;
        from[0] = i - words;
        return op;
    }

    /** A period around the year at {@code i}: a month or half/quarter before it, and the preposition that sets the comparison. */
    private static Quantity period(List<Words.Tok> t, int i) {
        int year = t.get(i).number().intValue();
        LocalDate start = LocalDate.of(year, 1, 1);
        LocalDate end = start.plusYears(1);
        boolean whole = true;
        int from = i;
        if (i >= 1 && MONTHS.containsKey(t.get(i - 1).lower())) {
            int m = MONTHS.get(t.get(i - 1).lower());
            start = LocalDate.of(year, m, 1);
            end = start.plusMonths(1);
            whole = false;
            from = i - 1;
        } else if (i >= 3 && t.get(i - 1).lower().equals("of") && t.get(i - 2).stem().equals("half")) {
            String which = t.get(i - 3).lower();
            whole = false;
            from = i - 3;
            if (which.equals("second") || which.equals("latter")) {
                start = LocalDate.of(year, 7, 1);
            } else {
                end = LocalDate.of(year, 7, 1);
            }
        } else if (i >= 3 && t.get(i - 1).lower().equals("of") && (t.get(i - 2).lower().equals("start")
                || t.get(i - 2).lower().equals("beginning"))) {
            end = start;
            whole = false;
            from = i - 2;
        } else if (i >= 3 && t.get(i - 1).lower().equals("of") && t.get(i - 2).lower().equals("end")) {
            start = end;
            whole = false;
            from = i - 2;
        }
        int k = from - 1;
        while (k >= 0 && (t.get(k).lower().equals("the") || t.get(k).lower().equals("of"))) k--;
        String prep = k >= 0 ? t.get(k).lower() : "";
        Op op = switch (prep) {
            case "before", "until", "prior" -> Op.LT;
            case "after" -> Op.GT;
            case "since", "from" -> Op.GE;
            case "by" -> Op.LE;
            default -> Op.EQ;
        };
        if (op != Op.EQ) from = k;
        return new Quantity(from, i + 1, op, true, year, "", start, end, whole);
    }

    static Optional<Quantity> at(List<Quantity> qs, int tok) {
        return qs.stream().filter(q -> tok >= q.from() && tok < q.to()).findFirst();
    }
}
