"""Runs NLTK's Baum-Welch (HiddenMarkovModelTrainer.train_unsupervised) one update at a time.

Run with Debian's interpreter, which sees python3-nltk:
    /usr/bin/python3 nltk_baum_welch.py < problem.json

Input (stdin): a list of problems, each {"start": [K], "transition": [K][K], "emission": [K][V],
"sequences": [[symbol ids]], "iterations": n}: probabilities, no end state. States are named
0..K-1 and symbols 0..V-1.
NLTK re-estimates the transitions and emissions but leaves the initial distribution as it was
("Rabiner says the priors don't need to be updated. I don't believe him. FIXME" in
nltk/tag/hmm.py). So that both sides fit the same model, after each NLTK update this script sets
the initial distribution to the expected start counts, gamma_1, taken from NLTK's own
_forward_probability and _backward_probability under the parameters before the update (Rabiner
1989, eq. 40a).
Output (stdout): {"nltk": version, "runs": [{"logLikelihoods2": [log2 P(data) before update n],
"models": [{"start", "transition", "emission"} after update n]}, one per problem]}.
"""
import contextlib
import json
import sys

import nltk
import numpy as np
from nltk.probability import DictionaryConditionalProbDist, DictionaryProbDist
from nltk.tag.hmm import HiddenMarkovModelTagger, HiddenMarkovModelTrainer


def build(states, symbols, start, transition, emission):
    priors = DictionaryProbDist({s: start[i] for i, s in enumerate(states)})
    transitions = DictionaryConditionalProbDist(
        {s: DictionaryProbDist({t: transition[i][j] for j, t in enumerate(states)}) for i, s in enumerate(states)}
    )
    outputs = DictionaryConditionalProbDist(
        {s: DictionaryProbDist({o: emission[i][k] for k, o in enumerate(symbols)}) for i, s in enumerate(states)}
    )
    return HiddenMarkovModelTagger(symbols, states, transitions, outputs, priors)


def posterior_starts(model, sequences, K):
    """Sum over sequences of P(state at t=0 | sequence), from NLTK's forward and backward lattices (log2)."""
    totals = np.zeros(K)
    for seq in sequences:
        alpha = model._forward_probability(seq)
        beta = model._backward_probability(seq)
        lp = np.logaddexp2.reduce(alpha[-1])
        totals += np.exp2(alpha[0] + beta[0] - lp)
    return totals / totals.sum()


def run(problem):
    K = len(problem["start"])
    V = len(problem["emission"][0])
    states = list(range(K))
    symbols = list(range(V))
    sequences = [[(o, None) for o in seq] for seq in problem["sequences"]]
    model = build(states, symbols, problem["start"], problem["transition"], problem["emission"])
    trainer = HiddenMarkovModelTrainer(states, symbols)
    lls, models = [], []
    for _ in range(problem["iterations"]):
        lls.append(float(sum(model.log_probability(seq) for seq in sequences)))
        start = posterior_starts(model, sequences, K)
        # train_unsupervised prints "iteration n logprob x" on stdout; keep stdout for the JSON.
        with contextlib.redirect_stdout(sys.stderr):
            model = trainer.train_unsupervised(sequences, model=model, max_iterations=1)
        transition = [[model._transitions[s].prob(t) for t in states] for s in states]
        emission = [[model._outputs[s].prob(o) for o in symbols] for s in states]
        model = build(states, symbols, list(start), transition, emission)
        models.append({"start": list(map(float, start)), "transition": transition, "emission": emission})
    return {"logLikelihoods2": lls, "models": models}


def main():
    problems = json.load(sys.stdin)
    json.dump({"nltk": nltk.__version__, "runs": [run(p) for p in problems]}, sys.stdout)


if __name__ == "__main__":
    main()
