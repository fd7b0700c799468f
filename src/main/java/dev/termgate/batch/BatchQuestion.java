package dev.termgate.batch;

/**
 * One question of a batch.
 *
 * @param id       the key a result is recorded under: the file's own id when it gives one, else derived from
 *                 the question text, so a rerun finds its results even if lines were moved
 * @param line     where it stands in the question file (1-based line or record number)
 */
public record BatchQuestion(String id, int line, String question) {}
