// Views out of sight skip the work of an edit and catch up when seen: the
// utilities-and-exergy panel, tabbed behind the ledger, shows after its tab
// is chosen exactly what core computed for the latest edit.
#include <QDockWidget>
#include <QtTest>

#include "commands.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain_view/format.hpp"
#include "main_window.hpp"
#include "support/hundred_steps.hpp"

using namespace heatchain;

class HiddenViewsTest : public QObject {
    Q_OBJECT
private slots:
    void secondLawPanelCatchesUpWhenItsTabIsChosen() {
        gui::MainWindow w;
        w.setInteractive(false);
        w.resize(1400, 900);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        auto project = parseProject(testing::hundredStepWorksheet(), "hundred");
        QVERIFY(project.ok());
        w.document()->reset(project.value());
        auto* ledgerDock = w.findChild<QDockWidget*>(QStringLiteral("ledgerDock"));
        auto* panelDock = w.findChild<QDockWidget*>(QStringLiteral("secondLawDock"));
        QVERIFY(ledgerDock && panelDock);
        ledgerDock->raise();
        QApplication::processEvents();
        QVERIFY(w.secondLaw()->visibleRegion().isEmpty());  // behind the ledger's tab

        // Three edits while it is out of sight: step 50 heated to 61 °C at last.
        for (const char* t : {"55 degC", "58 degC", "61 degC"}) {
            Step s = w.document()->project().steps[50];
            s.to.T = Quantity{t, *parseQuantity(t, Dimension::Temperature)};
            w.document()->undoStack()->push(new gui::EditStepField(w.document(), 50, s, QStringLiteral("target")));
            QApplication::processEvents();
        }

        panelDock->raise();
        QApplication::processEvents();
        QVERIFY(!w.secondLaw()->visibleRegion().isEmpty());
        // Rows are the steps in order: read them without asking the panel
        // for a row (which would bring it up to date by itself).
        const SequenceResult& r = w.document()->result();
        const Project& p = w.document()->project();
        const Dimension e = view::energyDimension(r.system);
        for (int i : {49, 50, 51}) {
            QCOMPARE(w.secondLaw()->item(i, gui::SecondLawPanel::ColStep)->text(),
                     QString::fromStdString(r.steps[std::size_t(i)].id));
            QCOMPARE(w.secondLaw()->item(i, gui::SecondLawPanel::ColDestroyed)->text(),
                     view::formatDisplay(r.steps[std::size_t(i)].exergyDestroyed, e, p.displayUnits,
                                         view::displayContext(p)));
        }
        // The edit reached it: step 50 now destroys more exergy than step 48,
        // its twin before the edit (same 10 K rise then, 21 K now).
        QVERIFY(r.steps[50].exergyDestroyed > r.steps[48].exergyDestroyed);
    }
};

QTEST_MAIN(HiddenViewsTest)
#include "hidden_views_test.moc"
