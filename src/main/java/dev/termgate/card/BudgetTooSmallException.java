package dev.termgate.card;

/** The token budget cannot hold even the smallest useful card: its header lines and one ranked term. */
public final class BudgetTooSmallException extends RuntimeException {
    private final int budget;
    private final int needed;

    public BudgetTooSmallException(int budget, int needed) {
        super("a budget of " + budget + " tokens cannot hold the smallest useful card for this question ("
                + needed + " tokens: the card's header lines and one ranked term); raise --budget to at least "
                + needed, null, false, false);
        this.budget = budget;
        this.needed = needed;
    }

    public int budget() {
        return budget;
    }

    /** Tokens of the smallest useful card. */
    public int needed() {
        return needed;
    }
}
