package dev.termgate.bench;

import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Parse speed on a corpus of typical model-sized queries (two to four pattern parts, a WHERE, a RETURN with
 * aggregation, 120–300 characters), one thread, warm. Run with
 * {@code mvn -B -o -Pbench verify -Dtest=ParseSpeedBench -Dsurefire.failIfNoSpecifiedTests=false}.
 * Reports wall-clock and CPU-time rates: on a shared machine the CPU-time figure is the one that shows the parser.
 */
@Tag("bench")
public class ParseSpeedBench {

    /** Invented maritime questions written the way a model answers them (common practice for such corpora). */
    public static final List<String> CORPUS = List.of(
            "MATCH (v:Vessel)-[:CALLED_AT]->(p:Port)<-[:LOCATED_IN]-(t:Terminal) WHERE p.country = 'NL' AND v.grossTonnage > 50000 RETURN p.name AS port, count(DISTINCT v) AS vessels ORDER BY vessels DESC LIMIT 10",
            "MATCH (o:Company)-[:OWNS]->(v:Vessel)-[:FLAGGED_IN]->(c:Country) WHERE c.code IN ['PA', 'LR', 'MH'] RETURN o.name AS owner, collect(v.imo) AS ships, count(v) AS n ORDER BY n DESC",
            "MATCH (s:Shipment)-[:CARRIED_BY]->(v:Vessel), (s)-[:DECLARED_AT]->(o:CustomsOffice) WHERE s.declaredValue > 1000000 AND o.city STARTS WITH 'Rot' RETURN o.name, sum(s.declaredValue) AS total, avg(s.weight) AS meanWeight",
            "MATCH (i:Inspection)-[:OF]->(s:Shipment)-[:CONTAINS]->(g:Goods) WHERE i.result = 'seized' AND g.hsCode STARTS WITH '93' RETURN g.description AS goods, count(*) AS seizures ORDER BY seizures DESC LIMIT 5",
            "MATCH (v:Vessel)-[r:CALLED_AT]->(p:Port) WHERE r.arrival >= date('2024-01-01') AND r.arrival < date('2024-07-01') WITH p, count(r) AS calls WHERE calls > 20 RETURN p.name, calls ORDER BY calls DESC",
            "MATCH (a:Company)-[:SUBSIDIARY_OF*1..3]->(b:Company {name: 'Northwind Maritime Holdings'}) OPTIONAL MATCH (a)-[:OWNS]->(v:Vessel) RETURN a.name AS company, count(v) AS fleet ORDER BY fleet DESC",
            "MATCH (c:Container)-[:LOADED_ON]->(v:Vessel)-[:OPERATED_BY]->(op:Company) WHERE c.reefer = true AND NOT op.sanctioned RETURN op.name AS operator, count(c) AS reefers, max(c.temperature) AS warmest",
            "MATCH (s:Shipment)-[:ORIGIN]->(from:Port), (s)-[:DESTINATION]->(to:Port) WHERE from.country <> to.country AND s.status = 'in transit' RETURN from.name AS origin, to.name AS destination, count(s) AS shipments LIMIT 25",
            "MATCH (p:Person)-[:DIRECTOR_OF]->(c:Company)-[:OWNS]->(v:Vessel) WHERE v.builtYear < 1995 AND toLower(p.nationality) = 'unknown' RETURN p.name, collect(DISTINCT c.name) AS companies, count(v) AS oldShips",
            "MATCH (v:Vessel)-[:CALLED_AT]->(p:Port) WHERE p.name IN $ports AND v.type = 'tanker' RETURN v.name AS vessel, count(p) AS visits, min(v.builtYear) AS built ORDER BY visits DESC, vessel ASC SKIP 0 LIMIT 20",
            "MATCH (d:Declaration)-[:FILED_BY]->(b:Broker), (d)-[:COVERS]->(s:Shipment)-[:CONTAINS]->(g:Goods) WHERE d.filedOn > date('2023-12-31') RETURN b.name AS broker, count(DISTINCT d) AS declarations, sum(g.quantity) AS units",
            "MATCH (v:Vessel) WHERE v.imo STARTS WITH '97' AND exists { (v)-[:INSPECTED_IN]->(:Port {country: 'DE'}) } RETURN v.name, v.imo, size([(v)-[:CALLED_AT]->(p) | p]) AS ports ORDER BY ports DESC LIMIT 10",
            "MATCH (c:Company)<-[:OPERATED_BY]-(v:Vessel)-[:FLAGGED_IN]->(f:Country) WITH c, f, count(v) AS ships WHERE ships >= 3 RETURN c.name AS company, f.name AS flag, ships ORDER BY ships DESC, company",
            "MATCH (s:Shipment)-[:CARRIED_BY]->(v:Vessel) WHERE s.weight > 20000 AND (s.hazardous = true OR s.reefer = true) RETURN v.name AS vessel, count(s) AS risky, round(avg(s.weight), 1) AS meanWeight ORDER BY risky DESC",
            "MATCH (port:Port {country: 'BE'})<-[call:CALLED_AT]-(v:Vessel)-[:OWNED_BY]->(o:Company) RETURN o.name AS owner, count(call) AS calls, collect(DISTINCT v.name)[0..5] AS someVessels ORDER BY calls DESC LIMIT 15",
            "MATCH (i:Inspection)-[:AT]->(p:Port), (i)-[:OF]->(s:Shipment) WHERE i.date.year = 2024 AND i.result IN ['seized', 'fined'] RETURN p.name AS port, i.result AS outcome, count(*) AS n ORDER BY port, outcome");

    @Test
    void parseThroughput() {
        CypherParser parser = new CypherParser();
        for (String q : CORPUS) {
            ParseResult r = parser.parse(q);
            assertTrue(r.isValid(), () -> q + "\n" + r.render());
            assertTrue(q.length() >= 120 && q.length() <= 300, "corpus query of " + q.length() + " characters: " + q);
        }
        ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        // warm-up: fill ANTLR's prediction cache and let the JIT compile
        run(parser, 20_000);
        double best = 0;
        double bestCpu = 0;
        for (int round = 0; round < 5; round++) {
            int n = 50_000;
            long cpu0 = threads.getCurrentThreadCpuTime();
            long t0 = System.nanoTime();
            run(parser, n);
            long wall = System.nanoTime() - t0;
            long cpu = threads.getCurrentThreadCpuTime() - cpu0;
            double perSecond = n / (wall / 1e9);
            double perCpuSecond = n / (cpu / 1e9);
            best = Math.max(best, perSecond);
            bestCpu = Math.max(bestCpu, perCpuSecond);
            System.out.printf("parse speed round %d: %.0f queries/s wall, %.0f queries/s of CPU time%n", round, perSecond,
                    perCpuSecond);
        }
        System.out.printf("parse speed (best of 5, one thread, warm): %.0f queries/s wall, %.0f queries/s of CPU time%n",
                best, bestCpu);
    }

    private static int run(CypherParser parser, int n) {
        int ok = 0;
        for (int i = 0; i < n; i++) {
            if (parser.parse(CORPUS.get(i % CORPUS.size())).isValid()) ok++;
        }
        return ok;
    }
}
