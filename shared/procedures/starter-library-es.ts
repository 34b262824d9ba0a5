import type { StepTranslation, Translations } from './translation'

// The starter library in Spanish, written the way a shop foreman talks a new hand through the
// job: short sentences, tú, the trade's words ("tabla de sacrificio", "fresa de planeado",
// "cero de pieza"). The safety wording says as much as the English and no less: every hazard,
// every way to avoid it. Keys match starter-library.ts; the signal words come from the steps.

// Holds that recur across procedures (the same keys as their English builders).
const protectiveGear: StepTranslation = {
  title: 'Ponte protección de ojos, oídos y contra el polvo',
  body: 'Ponte la protección antes de que arranque el husillo. No te la quites hasta que el husillo esté parado y el polvo se haya asentado.',
  guidance: 'Al cortar salen virutas tan rápido que pueden herir un ojo. El husillo y el colector de polvo juntos hacen tanto ruido que dañan el oído a lo largo de la jornada. El polvo fino de madera y de MDF se queda en el aire mucho después del corte y se respira hasta el fondo.',
  hazard: 'Las virutas que salen volando pueden dejarte ciego. Exponerte mucho tiempo al ruido del fresado causa una pérdida de oído permanente. El polvo de madera es una causa conocida de cáncer nasal, y el polvo de MDF además lleva formaldehído de la cola.',
  avoid: 'Usa gafas de seguridad con protección lateral. Usa orejeras o tapones. Usa una mascarilla o un respirador para polvo fino. Recógete el pelo largo y súbete las mangas sueltas.',
}

const isolatePower: StepTranslation = {
  title: 'Corta la corriente antes de desenchufar nada',
  body: 'Apaga la máquina en su seccionador principal. Ponle tu propio candado y tu etiqueta. Luego comprueba que nada puede arrancar y vuelve a dejar el mando de arranque en apagado.',
  guidance: 'Los cables del husillo, de los variadores y del sensor nunca se desenchufan con corriente. Un variador guarda carga después de apagarlo: que sus luces estén apagadas no prueba que se haya descargado, así que espera el tiempo que indica su manual. El husillo sigue girando mientras se para. Con tu propio candado nadie más puede volver a encender la máquina mientras tienes las manos en ella. Si la máquina va enchufada a una toma, desenchufarla basta solo mientras la clavija siga bajo tu control, en tu mano o a la vista, donde nadie más pueda volver a enchufarla.',
  hazard: 'Desenchufar un cable con la corriente puesta puede darte una descarga eléctrica o hacer que la máquina arranque sin aviso. Un variador puede guardar energía después de apagarlo, y el husillo sigue girando mientras frena.',
  avoid: 'Apaga en el seccionador principal y pon tu propio candado y tu etiqueta. Espera a que el husillo se pare del todo y espera el tiempo de descarga que indica el manual del variador: que se apaguen sus luces no es prueba. Pulsa el mando de arranque para comprobar que nada se mueve y vuelve a dejarlo en apagado. Si la máquina tiene clavija, desenchúfala y tenla bajo tu control, donde solo tú puedas volver a enchufarla.',
}

const stayWithMachine: StepTranslation = {
  title: 'Quédate con la máquina mientras corta',
  body: 'Quédate en la máquina desde que empieza el programa hasta que termina. Ten siempre una mano libre para llegar a la parada de emergencia.',
  guidance: 'Casi todo el daño de una fresadora en marcha pasa en los minutos en que nadie mira. Una fresa se puede romper, una pieza se puede soltar o las virutas en la campana de aspiración pueden empezar a arder. Parar a tiempo hace que un problema pequeño siga siendo pequeño.',
  hazard: 'Una fresa rota o una pieza suelta puede salir despedida por todo el taller. Las virutas calientes y el polvo pueden prenderse. Una máquina en marcha que se deja sola puede herir gravemente a alguien o provocar un incendio.',
  avoid: 'No te alejes de la máquina mientras corre el programa. No dejes que nadie entre en la zona de trabajo. Para el programa en cuanto cambie el ruido, salga humo o se pare la aspiración.',
}

const spindleStopped: StepTranslation = {
  title: 'Para el husillo antes de tocar la fresa',
  body: 'Para el husillo y espera a que deje de girar. Apaga el husillo en su mando antes de acercar las manos a la pinza.',
  guidance: 'En un cambio de herramienta tienes los dedos justo en la fresa. Si un programa sigue o alguien pulsa arranque, el husillo coge velocidad en uno o dos segundos, mucho más rápido de lo que puedes apartar la mano.',
  hazard: 'Si el husillo arranca con tus manos en la pinza, la fresa puede hacerte cortes profundos o cortarte dedos.',
  avoid: 'Para el husillo y espera a que deje de girar. Apaga el husillo en su mando o córtale la corriente. Deja el programa en pausa o cerrado hasta que hayas quitado las llaves del husillo.',
}

const homingClear: StepTranslation = {
  title: 'Apártate mientras la máquina hace el homing',
  body: 'En el homing cada eje se mueve solo hasta llegar a su final de carrera. No metas las manos en el recorrido del pórtico hasta que termine.',
  guidance: 'El pórtico pesa y se mueve sin aviso cuando empieza el homing. Donde pasa junto al bastidor o los topes pilla como una puerta.',
  hazard: 'El pórtico y el carro en movimiento pueden atrapar o golpear manos y brazos.',
  avoid: 'No dejes manos, herramientas ni cables sobre las guías ni sobre la mesa. Quédate fuera del recorrido del pórtico. Ten la parada de emergencia al alcance mientras se mueven los ejes.',
}

const sharpEdges: StepTranslation = {
  title: 'Coge las fresas por el vástago',
  body: 'Las fresas y las fresas de planeado cortan aunque parezcan desafiladas. Cógelas por el vástago o con un trapo.',
  guidance: 'Casi todos los cortes en un cambio de herramienta pasan cuando la fresa resbala al aflojar o apretar la tuerca de la pinza.',
  hazard: 'Los filos pueden cortarte dedos y palmas, sobre todo si resbala una llave.',
  avoid: 'Coge las fresas por el vástago o envuelve los filos en un trapo. Usa guantes anticorte para manipularlas y quítatelos antes de que arranque el husillo.',
}

const cutterRating: StepTranslation = {
  title: 'Revisa la velocidad máxima de la fresa y sus plaquitas',
  body: 'Busca la velocidad máxima marcada en la fresa de planeado o en su hoja. La velocidad de husillo planeada no puede pasar de ahí. Comprueba que cada tornillo de plaquita está apretado.',
  guidance: 'Muchas fresas de planeado grandes admiten bastante menos velocidad que el máximo del husillo. El Planificador avisa si la velocidad pasa del máximo de una fresa de la lista del taller. Aprieta los tornillos de las plaquitas solo con la llave del fabricante.',
  hazard: 'Una fresa que gira por encima de su velocidad máxima, o con un tornillo de plaquita flojo, puede romperse o lanzar una plaquita por el taller y herir gravemente a alguien.',
  avoid: 'Mantén la velocidad del husillo igual o por debajo del máximo marcado en la fresa. Aprieta todos los tornillos de las plaquitas antes de arrancar el husillo. Cambia las plaquitas desportilladas y los tornillos dañados.',
}

const finalSignoff = (statement: string): StepTranslation => ({
  title: 'Firma el trabajo',
  body: 'Lee la declaración de abajo. Firma solo si todo lo que dice es verdad.',
  guidance: 'En un trabajo guiado tu formador revisa el trabajo contigo y firma con su propio PIN. Tu firma y la suya quedan en el registro.',
  statement,
})

const spoilboardResurfacing: Translations = {
  es: {
    title: 'Planear la tabla de sacrificio',
    summary: 'Planear la tabla de sacrificio de MDF a ras de la fresa para que las profundidades que se ajusten después salgan iguales. Incluye despejar la mesa, poner los ceros, planificar, el corte y dejar la máquina lista para trabajar.',
    steps: {
      'check-board-log': {
        title: 'Mira cuánta tabla queda',
        body: 'Abre la pantalla Tabla de esta máquina. Apunta el espesor actual y el espesor mínimo. Si a la tabla le queda poco para el mínimo, para y pregunta a tu formador.',
        guidance: 'Cada planeado quita material para siempre. Una tabla demasiado fina se dobla con los sargentos y deja que los cortes pasantes lleguen a la mesa de debajo.',
      },
      'protective-gear': protectiveGear,
      'isolate-power': isolatePower,
      'clear-bed': {
        title: 'Despeja la mesa',
        body: 'Desenchufa el sensor de longitud de herramienta y quítalo de la mesa. Quita sargentos, topes, plantillas y tornillos sueltos. Barre o aspira las virutas y el polvo.',
        guidance: 'Todo lo que quede en la mesa está en el camino de la fresa, porque el planeado cubre toda la tabla y un poco más allá de sus bordes. Una cabeza de tornillo olvidada puede reventar una fresa de planeado.',
      },
      'restore-power': {
        title: 'Vuelve a dar corriente',
        body: 'Comprueba que la mesa está despejada y que no hay nadie en la máquina. Avisa a los de alrededor de que vuelve la corriente. Quita tu candado y tu etiqueta. Enciende la máquina.',
        guidance: 'Solo quien puso un candado lo quita. Si la máquina se mueve sola al volver la corriente, apágala y avisa a tu formador.',
      },
      'sensor-off-notice': {
        title: 'El controlador todavía espera el sensor',
        body: 'El sensor ya no está en la máquina, pero el controlador aún no lo sabe. Desactívalo en el controlador antes de cualquier cambio de herramienta o homing.',
        guidance: 'Muchos controladores miden la herramienta solos después de un cambio. Sin sensor en la mesa, la máquina sigue bajando la fresa buscando una señal que nunca llega.',
        hazard: 'Con el sensor fuera de la mesa pero todavía activado, una medición automática de la herramienta clava la fresa en la tabla de sacrificio.',
        avoid: 'Desactiva ahora el sensor de longitud de herramienta en los ajustes del controlador. Vuelve a activarlo solo cuando esté otra vez en la máquina.',
      },
      'sensor-disable': {
        title: 'Desactiva el sensor de longitud de herramienta en el controlador',
        body: 'Abre los ajustes del controlador. Desactiva el sensor de longitud de herramienta. Comprueba que el controlador ya lo muestra como desactivado.',
        guidance: 'Lo volverás a activar al final de este procedimiento. El trabajo te lo recuerda.',
      },
      'homing-clear': homingClear,
      'home': {
        title: 'Haz el homing de la máquina',
        body: 'Lanza el ciclo de homing. Espera a que todos los ejes indiquen que están en casa.',
        guidance: 'El homing le da a la máquina una posición conocida. Desde ahí se comprueba el programa de planeado contra el recorrido de la máquina, para que no choque con los topes.',
      },
      'spindle-stopped-vbit': spindleStopped,
      'sharp-edges': sharpEdges,
      'fit-vbit': {
        title: 'Pon una fresa en V afilada',
        body: 'Pon una fresa en V de punta fina en la pinza que le corresponde. Aprieta la tuerca con las dos llaves. Quita las llaves del husillo.',
        guidance: 'Una punta fina deja ver pequeños desvíos que una fresa ancha y plana esconde. Usa una fresa con la punta sin daños.',
      },
      'xy-zero': {
        title: 'Pon el cero de pieza en X e Y con la fresa en V',
        body: 'Deja el husillo apagado: tienes los ojos y los dedos cerca de la punta. Baja la punta de la fresa en V con el jog hasta que casi toque la esquina de la tabla que usas como origen. Alinea la punta con la esquina en las dos direcciones. Pon el cero de pieza en X e Y. Sube Z.',
        guidance: 'Usa pasos de jog pequeños para los últimos milímetros. Mira desde delante y desde un lado. Con el origen en la esquina de la tabla, el sobrante del plan llega más allá de cada borde.',
      },
      'spindle-stopped-cutter': spindleStopped,
      'fit-surfacing-cutter': {
        title: 'Cambia a la fresa de planeado',
        body: 'Quita la fresa en V. Limpia la pinza, la tuerca y el cono del husillo. Pon la fresa de planeado con el vástago bien metido en la pinza. Aprieta con las dos llaves y quítalas del husillo.',
        guidance: 'Las virutas en la pinza hacen que la fresa gire descentrada y deje escalones. Mete el vástago por lo menos hasta donde pide el fabricante de la fresa.',
      },
      'corner-marks': {
        title: 'Marca las esquinas con lápiz',
        body: 'Haz rayas de lápiz cerca de cada esquina y en el centro de la tabla. Después del planeado no debe quedar ninguna.',
        guidance: 'Las marcas son tu prueba de que se planeó todo. Si queda una marca en una zona, la tabla está baja ahí respecto al plano que cortan los movimientos X e Y de la máquina; otra pasada fina la quita.',
      },
      'z-zero': {
        title: 'Pon el cero de Z con una hoja de papel',
        body: 'Deja el husillo apagado mientras tengas los dedos cerca de la fresa. Mete una hoja de papel bajo la fresa. Baja Z con el jog en pasos de 1 mm, luego de 0,1 mm y luego de 0,01 mm. Para cuando la fresa justo pise el papel. Pon Z al espesor del papel, unos 0,1 mm.',
        guidance: 'Ir achicando el paso del jog al acercarte evita que claves la fresa en la tabla. Lo del papel es práctica normal de taller. Un papel de oficina normal de 80 g/m² tiene unos 0,1 mm de espesor.',
      },
      'depth-notice': {
        title: 'No quites más de lo necesario',
        body: 'Cada planeado deja la tabla más fina para siempre. Planifica la profundidad más pequeña que limpie toda la superficie.',
        guidance: 'Entre un cuarto y medio milímetro por pasada es lo normal en MDF (práctica habitual, sin fuente publicada). Si quedan marcas, una segunda pasada fina gasta menos tabla que una pasada honda.',
        hazard: 'Planear demasiado hondo quita espesor de tabla de sacrificio que no se puede recuperar y acorta la vida de la tabla.',
        avoid: 'Planifica poca profundidad por pasada. Revisa la profundidad en el planificador y en la vista previa antes de empezar. Repite una pasada solo si quedan marcas.',
      },
      'plan': {
        title: 'Planifica el programa de planeado',
        body: 'Abre el planificador. Mete el tamaño de la tabla con un sobrante en cada borde, la fresa, el paso lateral, la profundidad, el avance y la velocidad. Adjunta el plan y carga su programa en la máquina.',
        guidance: 'El sobrante asegura que el filo de la fresa pase de cada lado de la tabla. El planificador te avisa si la trayectoria se sale del recorrido de la máquina o deja sin cubrir parte de la zona.',
      },
      'preview-check': {
        title: 'Revisa la vista previa',
        body: 'Compara la vista previa con la tabla. La trayectoria debe cubrir cada borde con algo de sobrante. La profundidad debe coincidir con tu plan. Ningún movimiento puede salirse del recorrido de la máquina.',
        guidance: 'La vista previa es el último momento fácil para pillar una unidad equivocada, un origen equivocado o una primera pasada demasiado honda.',
      },
      'cutter-rating': cutterRating,
      'coolant-notice': {
        title: 'Refrigerante antes que husillo',
        body: 'Un husillo refrigerado por agua necesita el enfriador en marcha antes de arrancar. Con un husillo refrigerado por aire o una fresadora de mano, confirma y sigue.',
        guidance: 'Sin circulación de refrigerante el husillo se calienta en pocos minutos. Comprueba que el refrigerante circula de verdad, no solo que el enfriador está encendido.',
        hazard: 'Un husillo refrigerado por agua que trabaja sin refrigerante se recalienta y se puede estropear.',
        avoid: 'Enciende el enfriador y comprueba que el refrigerante circula antes de arrancar el husillo.',
      },
      'start-extraction': {
        title: 'Arranca la aspiración, el enfriador y el husillo',
        body: 'Pon la campana de aspiración y arranca el colector de polvo. Arranca el enfriador si el husillo es refrigerado por agua. Arranca el husillo a la velocidad planeada.',
        guidance: 'El planeado saca más polvo por minuto que casi cualquier otro trabajo. Comprueba la aspiración en la campana antes de empezar el corte.',
      },
      'stay-with-machine': stayWithMachine,
      'run-program': {
        title: 'Ejecuta el programa de planeado',
        body: 'Arranca el programa. Vigila de cerca la primera pasada. Para en seguida si la fresa se clava, cambia el ruido o se para la aspiración.',
        guidance: 'Un ruido parejo y virutas finas y uniformes quieren decir que el corte va bien. Ten una mano cerca de la parada de emergencia durante la primera pasada.',
      },
      'check-marks': {
        title: 'Comprueba que no queda ninguna marca de lápiz',
        body: 'Cuando acabe el programa, para el husillo y deja que se asiente el polvo. Mira cada esquina y el centro. No debe quedar ninguna marca de lápiz.',
        guidance: 'Mira con la vista rasante y una luz detrás de la tabla. Así se ven mejor las marcas flojas.',
      },
      'repeat-pass': {
        title: 'Repite una pasada si quedan marcas',
        body: 'Si queda alguna marca, baja el cero de Z entre 0,1 y 0,2 mm y vuelve a ejecutar el programa. Vuelve a mirar las marcas. Sáltate este paso si no queda ninguna.',
        guidance: 'Las marcas que quedan en una zona quieren decir que la tabla está baja ahí respecto al plano XY de la máquina. Los escalones o crestas pequeñas entre pasadas vecinas son otra cosa: vienen de un husillo fuera de escuadra, inclinado en la dirección del paso lateral. Si los ves, haz la comprobación de escuadra del husillo y avisa a tu formador.',
      },
      'photo-board': {
        title: 'Fotografía la tabla planeada',
        body: 'Haz una foto de toda la tabla desde arriba con las cuatro esquinas a la vista.',
        guidance: 'La foto se guarda con el trabajo, así el siguiente puede ver cómo quedó la tabla.',
        subject: 'Toda la tabla planeada vista desde arriba, con las cuatro esquinas a la vista.',
      },
      'board-thickness': {
        title: 'Mide el espesor de la tabla',
        body: 'Mide el espesor de la tabla con el calibre cerca de la esquina delantera izquierda. Apunta la lectura. Una lectura fuera del rango necesita un motivo.',
        guidance: 'El rango sirve para una tabla de 19 mm con un mínimo de 12 mm (práctica habitual, sin fuente publicada). Tu formador puede ajustar el rango de tu tabla en la Biblioteca.',
        label: 'Espesor de la tabla después de planear',
      },
      'isolate-power-sensor': isolatePower,
      'reinstall-sensor': {
        title: 'Vuelve a poner el sensor de longitud de herramienta',
        body: 'Pon el sensor en su sitio y enchufa su cable. Vuelve a poner los topes y sargentos que necesites después. Avisa a los de alrededor de que vuelve la corriente, quita tu candado y tu etiqueta y luego da corriente.',
        guidance: 'Enchufa el sensor solo con la corriente cortada, igual que lo desenchufaste.',
      },
      'sensor-enable': {
        title: 'Vuelve a activar el sensor de longitud de herramienta',
        body: 'Abre los ajustes del controlador y activa el sensor de longitud de herramienta. Haz una medición de herramienta para comprobar que funciona.',
        guidance: 'El siguiente espera que el sensor funcione. Una medición de prueba ahora encuentra una clavija floja antes de que importe.',
      },
      'clean-up': {
        title: 'Limpia',
        body: 'Aspira la mesa y la campana de aspiración. No soples el polvo con aire comprimido. Vacía el colector si está lleno más de dos tercios.',
        guidance: 'El aire comprimido vuelve a meter el polvo fino en el aire que respiras y lo empuja dentro de rodamientos y guías.',
      },
      'final-signoff': finalSignoff('La tabla de sacrificio está planeada y no queda ninguna marca de lápiz. El sensor de longitud de herramienta está otra vez en la máquina y activado. La mesa está limpia.'),
    },
  },
}

const toolChange: Translations = {
  es: {
    title: 'Cambiar la pinza y la fresa',
    summary: 'Cambiar la fresa y, si hace falta, la pinza. Incluye parar el husillo, limpiar, la profundidad de inserción, el apriete y medir la herramienta nueva.',
    steps: {
      'spindle-stopped': spindleStopped,
      'sharp-edges': sharpEdges,
      'raise-and-park': {
        title: 'Sube Z y lleva el husillo a un sitio cómodo',
        body: 'Sube Z del todo. Lleva el husillo con el jog a la parte delantera de la mesa, donde llegues bien a la tuerca.',
        guidance: 'En una posición cómoda las manos van más firmes con las llaves.',
      },
      'remove-bit': {
        title: 'Quita la fresa vieja',
        body: 'Sujeta el husillo con una llave y afloja la tuerca con la otra. Coge la fresa cuando caiga. Quita la tuerca y la pinza.',
        guidance: 'Algunas pinzas necesitan una segunda vuelta después de que la tuerca se afloja para soltar la fresa.',
      },
      'clean-collet': {
        title: 'Limpia la pinza, la tuerca y el cono',
        body: 'Limpia la pinza, el interior de la tuerca y el cono del husillo. Busca grietas, rebabas y marcas de desgaste en la pinza.',
        guidance: 'La resina y el polvo fino se acumulan en las ranuras de la pinza. Una pinza sucia agarra de forma desigual y la fresa gira descentrada.',
      },
      'collet-notice': {
        title: 'Usa una pinza sana y de la medida justa',
        body: 'La pinza tiene que ser exactamente de la medida del vástago. Cambia una pinza agrietada, rayada o gastada.',
        guidance: 'Vástagos en pulgadas y en milímetros que parecen iguales no valen para la misma pinza.',
        hazard: 'Una pinza gastada, sucia o de otra medida deja que la fresa resbale y gire descentrada, y estropea el trabajo y la fresa.',
        avoid: 'Pon la pinza que corresponde a la medida del vástago. Cámbiala cuando esté gastada o dañada.',
      },
      'insertion-depth': {
        title: 'Mete bastante vástago en la pinza',
        body: 'Una fresa sujeta por poco vástago se puede salir o partir. Mete el vástago hasta donde pide el fabricante de la fresa.',
        guidance: 'No la metas tanto que los filos o el radio del vástago queden dentro de la pinza.',
        hazard: 'Una fresa agarrada por poco vástago se puede salir o romper y salir despedida del husillo a toda velocidad, hiriendo gravemente a alguien.',
        avoid: 'Encaja primero la pinza en la tuerca. Mete el vástago por lo menos tan hondo como pide el fabricante de la fresa. Deja los filos fuera de la pinza.',
      },
      'fit-bit': {
        title: 'Pon la fresa nueva',
        body: 'Encaja la pinza en la tuerca y enrosca la tuerca en el husillo a mano. Mete la fresa a la profundidad correcta. Aprieta con las dos llaves.',
        guidance: 'Aprieta firme pero sin echar todo tu peso. El fabricante del husillo o de la fresadora da el par correcto.',
      },
      'wrenches-off': {
        title: 'Quita las llaves del husillo',
        body: 'Una llave olvidada en la tuerca sale disparada en cuanto arranca el husillo. Deja ahora las dos llaves en su sitio.',
        guidance: 'Acostúmbrate a tener las llaves en la mano o en su soporte, nunca sobre la máquina.',
        hazard: 'Una llave olvidada en la tuerca de la pinza sale despedida a toda velocidad cuando arranca el husillo y puede herir gravemente a alguien.',
        avoid: 'Quita las dos llaves del husillo y déjalas en su soporte antes de volver a dar corriente al husillo.',
      },
      'measure-tool': {
        title: 'Mide la longitud de la herramienta nueva',
        body: 'Vuelve a dar corriente al husillo. Haz la medición de longitud de herramienta, o pon el cero de Z a mano si la máquina no tiene sensor.',
        guidance: 'Cada fresa queda a una altura distinta en la pinza, así que el cero de Z se pone otra vez después de cada cambio.',
      },
      'final-signoff': finalSignoff('La fresa nueva está puesta a la profundidad correcta en una pinza sana, las llaves están fuera del husillo y la longitud de la herramienta está medida.'),
    },
  },
}

const dailyStartUp: Translations = {
  es: {
    title: 'Arrancar la máquina al empezar el día',
    summary: 'Dar una vuelta a la máquina, revisar las paradas, la aspiración y el refrigerante, hacer el homing de los ejes y calentar el husillo antes del primer trabajo.',
    steps: {
      'walk-round': {
        title: 'Da una vuelta a la máquina',
        body: 'Busca herramientas, recortes y piezas sueltas en la mesa, el pórtico y las guías. Comprueba que los cables y las mangueras no están rozados ni enganchados. Comprueba que el suelo alrededor de la máquina está despejado.',
        guidance: 'Lo que se quedó en el pórtico por la noche cae a la zona de trabajo en cuanto se mueve.',
      },
      'estop-reachable': {
        title: 'Asegúrate de que llegas a la parada de emergencia',
        body: 'Comprueba que llegas a la parada de emergencia desde donde te pones para manejar la máquina. Nada puede taparla.',
        guidance: 'En una emergencia tienes uno o dos segundos. Si tienes que rodear un carro para llegar a la parada, está demasiado lejos.',
        hazard: 'Si no se llega en seguida a la parada de emergencia, la máquina no se puede parar a tiempo para evitar una lesión grave.',
        avoid: 'Quita lo que tape la parada de emergencia. No empieces a trabajar si está dañada o falta. Avisa al dueño.',
      },
      'protective-gear': protectiveGear,
      'extraction-check': {
        title: 'Revisa el colector de polvo',
        body: 'Comprueba que la bolsa o el cubo del colector está lleno menos de dos tercios. Comprueba que la manguera está conectada a la campana de aspiración y no está rajada.',
        guidance: 'Un colector lleno pierde casi toda la aspiración, y entonces el polvo fino se queda en el aire.',
      },
      'coolant-check': {
        title: 'Revisa el refrigerante si el husillo es refrigerado por agua',
        body: 'Comprueba el nivel de refrigerante del enfriador y enciéndelo. Confirma y sigue si el husillo es refrigerado por aire o es una fresadora de mano.',
        guidance: 'Mira que haya circulación en el tubo de retorno o en el indicador de caudal del enfriador.',
        hazard: 'Un husillo refrigerado por agua que trabaja sin refrigerante se recalienta y se puede estropear.',
        avoid: 'Rellena el refrigerante si está bajo. Enciende el enfriador y comprueba que el refrigerante circula antes de arrancar el husillo.',
      },
      'power-on': {
        title: 'Enciende la máquina',
        body: 'Enciende en el seccionador principal y luego el controlador. Mira la máquina mientras arranca. Nada puede moverse hasta que tú lo mandes.',
        guidance: 'Una máquina no debe moverse sola al dar la corriente. Si lo hace, apágala y avisa al dueño.',
      },
      'homing-clear': homingClear,
      'home': {
        title: 'Haz el homing de la máquina',
        body: 'Lanza el ciclo de homing. Espera a que todos los ejes indiquen que están en casa.',
        guidance: 'Escucha si hay ruidos ásperos o de roce mientras se mueven los ejes. Indican una guía o un rodamiento que necesita atención.',
      },
      'warm-up-notice': {
        title: 'Calienta el husillo antes de trabajar fuerte',
        body: 'Haz un calentamiento del husillo a velocidades crecientes antes del primer trabajo. Sigue el tiempo y las velocidades de calentamiento del fabricante del husillo.',
        guidance: 'La grasa fría de los rodamientos está dura. Subir el husillo por escalones deja que se reparta y se caliente por igual.',
        hazard: 'Poner un husillo frío directamente a toda velocidad gasta sus rodamientos antes de tiempo.',
        avoid: 'Haz el ciclo de calentamiento del fabricante, o sube la velocidad por escalones durante varios minutos, antes del primer corte.',
      },
      'warm-up': {
        title: 'Calienta el husillo',
        body: 'Sube Z por encima de la mesa sin pieza. Haz el calentamiento. Apunta cuántos minutos duró.',
        guidance: 'Diez minutos es un calentamiento habitual (práctica habitual, sin fuente publicada). Usa el tiempo del fabricante de tu husillo si es otro.',
        label: 'Tiempo de calentamiento',
      },
      'first-job-ready': {
        title: 'Apunta cualquier cosa rara',
        body: 'Añade una nota por cualquier cosa que se viera, sonara u oliera mal. Avisa al dueño de lo que haya que arreglar antes de empezar.',
        guidance: 'Las notas se guardan con el historial de la máquina, así un problema que crece poco a poco no pasa desapercibido.',
      },
      'final-signoff': finalSignoff('La máquina está revisada, con el homing hecho y caliente, la parada de emergencia está al alcance y lo que había raro está apuntado.'),
    },
  },
}

const endOfDayShutdown: Translations = {
  es: {
    title: 'Apagar la máquina al acabar el día',
    summary: 'Parar y aparcar la máquina, limpiar el polvo sin riesgo y apagar el husillo, el enfriador, la aspiración y la corriente en el orden correcto.',
    steps: {
      'stop-program': {
        title: 'Termina o para el programa',
        body: 'Deja que termine el último programa, o páralo en un punto seguro. Para el husillo y espera a que deje de girar.',
        guidance: 'El husillo tarda varios segundos en pararse. Espera antes de meter la mano.',
      },
      'parking-clear': homingClear,
      'park': {
        title: 'Aparca el pórtico',
        body: 'Sube Z del todo. Lleva el pórtico a su sitio de aparcar, al fondo de la mesa.',
        guidance: 'Con el pórtico aparcado la mesa queda libre para limpiar y el husillo lejos de quien pase.',
      },
      'remove-tool': {
        title: 'Quita la fresa',
        body: 'Con el husillo apagado, saca la fresa de la pinza. Déjala en su soporte.',
        guidance: 'Con el husillo vacío por la noche, nadie se corta al estirarse sobre la mesa por la mañana.',
      },
      'dust-clean': {
        title: 'Aspira el polvo, nunca lo soples',
        body: 'El polvo fino de madera y de MDF hace daño al respirarlo. Limpia con aspirador, no con aire comprimido, y no te quites la mascarilla.',
        guidance: 'Soplar el polvo con aire comprimido vuelve a meter en el aire durante horas el polvo más fino y más dañino.',
        hazard: 'El polvo de madera es una causa conocida de cáncer nasal, y el polvo de MDF lleva formaldehído. Si lo soplas, acaba en el aire que respiras.',
        avoid: 'Aspira la mesa, las guías, el pórtico y la campana de aspiración. Lleva la mascarilla mientras limpias. Nunca limpies con aire comprimido.',
      },
      'clean-machine': {
        title: 'Limpia la máquina',
        body: 'Aspira la mesa, las guías, el pórtico y la campana de aspiración. Pasa un trapo seco por las guías.',
        guidance: 'El polvo de las guías se mete en los rodamientos y las correas.',
      },
      'collector-empty': {
        title: 'Revisa el colector de polvo',
        body: 'Vacía la bolsa o el cubo del colector si está lleno más de dos tercios. Cierra la compuerta de la máquina.',
        guidance: 'Vaciarlo al final del día hace que el turno siguiente nunca empiece con el colector lleno.',
      },
      'chiller-off': {
        title: 'Apaga el enfriador',
        body: 'Si el husillo es refrigerado por agua, deja el enfriador en marcha unos minutos después de parar el husillo. Luego apágalo. Sáltate esto con otros husillos.',
        guidance: 'Ese rato de más se lleva el último calor del husillo.',
      },
      'power-off': {
        title: 'Apaga la corriente',
        body: 'Cierra el programa del controlador. Apaga la máquina en el seccionador principal. Apaga el colector de polvo.',
        guidance: 'Al apagar en el seccionador nada puede arrancar por la noche.',
      },
      'end-notes': {
        title: 'Apunta cualquier cosa rara',
        body: 'Añade una nota de lo que necesite atención antes de mañana: una fresa gastada, un ruido, una manguera dañada.',
        guidance: 'El arranque de la mañana le enseña estas notas al siguiente.',
      },
      'final-signoff': finalSignoff('La máquina está aparcada, limpia y apagada, la fresa está fuera del husillo y el colector de polvo está listo para mañana.'),
    },
  },
}

const emergencyStopTest: Translations = {
  es: {
    title: 'Probar las paradas de emergencia',
    summary: 'Comprobar que cada parada de emergencia para el husillo y todos los ejes, que nada vuelve a arrancar solo al soltar una parada, y apuntar el tiempo que tarda en pararse el husillo.',
    steps: {
      'test-hazard': {
        title: 'Prueba sin fresa y con la mesa despejada',
        body: 'Esta prueba hace girar el husillo y mueve los ejes a propósito. No pongas ninguna fresa y mantén a todo el mundo lejos de la mesa.',
        guidance: 'La prueba revisa un sistema de seguridad, así que cuenta con que puede fallar. Nadie debe estar donde un fallo le pueda hacer daño.',
        hazard: 'Si una parada falla durante la prueba, el husillo y el pórtico siguen moviéndose y pueden herir gravemente a quien esté cerca de la mesa.',
        avoid: 'Quita la fresa del husillo, y no aprietes la tuerca sobre una pinza vacía: aplasta la pinza. Haz girar el husillo sin herramienta como dice el manual del fabricante del husillo. Despeja la mesa. Deja a todo el mundo fuera de la zona de trabajo. Ten a mano otra forma de cortar la corriente.',
      },
      'protective-gear': protectiveGear,
      'power-home': {
        title: 'Enciende y haz el homing',
        body: 'Enciende la máquina y haz el homing. Sube Z del todo.',
        guidance: 'Hacer antes el homing hace que los ejes se muevan dentro de límites conocidos durante la prueba.',
      },
      'spindle-stop-test': {
        title: 'Para el husillo en marcha',
        body: 'Arranca el husillo a poca velocidad sin fresa puesta. Pulsa la parada de emergencia. Cronometra cuánto tarda el husillo en dejar de girar.',
        guidance: 'Usa un cronómetro o el reloj de esta tableta. Cuenta desde que pulsas hasta que la tuerca deja de girar.',
      },
      'spindle-stop-time': {
        title: 'Apunta el tiempo de parada del husillo',
        body: 'Escribe los segundos desde que pulsas la parada hasta que el husillo queda quieto.',
        guidance: 'El manual del fabricante del husillo puede dar un tiempo de parada. El rango de aquí es un punto de partida (práctica habitual, sin fuente publicada).',
        label: 'Tiempo de parada del husillo',
      },
      'axis-stop-test': {
        title: 'Para un eje en movimiento',
        body: 'Suelta la parada y reinicia el controlador. Mueve X despacio con el jog a lo ancho de la mesa. Pulsa la parada de emergencia. El pórtico tiene que pararse en el acto.',
        guidance: 'Repítelo con cada botón de parada de emergencia si la máquina tiene más de uno.',
      },
      'no-restart': {
        title: 'Suelta la parada y comprueba que nada vuelve a arrancar',
        body: 'Suelta la parada de emergencia. Nada puede moverse ni arrancar hasta que reinicies el controlador y des una orden.',
        guidance: 'Una máquina que arranca sola después de una parada o un corte de luz puede pillar a alguien que esté metiendo la mano.',
      },
      'failed-stop': {
        title: 'Una parada que falla deja la máquina fuera de servicio',
        body: 'Si alguna parada no detuvo la máquina, o algo volvió a arrancar solo, la máquina no se puede usar.',
        guidance: 'Añade una nota diciendo qué parada falló y cómo. El dueño se encarga de la reparación: un circuito de parada lo repara solo una persona cualificada, y una avería eléctrica solo un electricista autorizado. Nadie en la máquina intenta arreglarlo.',
        hazard: 'Una máquina con una parada que ha fallado no se puede parar en una emergencia y puede herir gravemente a alguien.',
        avoid: 'Corta la corriente, bloquéala y etiqueta la máquina fuera de servicio. Avisa al dueño. Deja la reparación a una persona cualificada, y las averías eléctricas a un electricista autorizado. No uses la máquina hasta que esté reparada y vuelva a pasar esta prueba.',
      },
      'final-signoff': finalSignoff('Cada parada de emergencia detuvo el husillo y los ejes, nada volvió a arrancar solo y el tiempo de parada está apuntado.'),
    },
  },
}

const stockFlattening: Translations = {
  es: {
    title: 'Aplanar un tablón o un panel encolado',
    summary: 'Planear por las dos caras un tablón, un panel encolado o una tabla abarquillada con la fresa de planeado. Incluye sujetar la pieza, poner el cero en el punto más alto, planificar y darle la vuelta.',
    steps: {
      'protective-gear': protectiveGear,
      'inspect-stock': {
        title: 'Revisa la pieza',
        body: 'Busca clavos, tornillos, grapas, arenilla y nudos sueltos. Quita el metal o marca la zona que hay que evitar. Encuentra los puntos altos con una regla.',
        guidance: 'La madera recuperada y la de canto vivo esconden metal a menudo. Una fresa que se encuentra un clavo puede perder una plaquita o romperse.',
      },
      'stock-height': {
        title: 'Mide la pieza en su punto más grueso',
        body: 'Mide la pieza en su punto más grueso. Apunta la lectura para que el plan empiece por encima.',
        guidance: 'El punto más alto marca dónde empieza la primera pasada. La máquina necesita recorrido en Z suficiente para pasarlo con la fresa puesta.',
        label: 'Punto más grueso de la pieza',
      },
      'hold-down': {
        title: 'Sujeta la pieza para que no se pueda mover',
        body: 'La fresa agarra una pieza que cojea o resbala. Calza cualquier esquina que cojee y sujeta la pieza firme con sargentos o tornillos.',
        guidance: 'Calza por debajo una pieza abarquillada o revirada para que asiente sin cojear. Si no, los sargentos la aplanan y vuelve a su forma después del planeado.',
        hazard: 'Una pieza que se suelta puede salir lanzada por la fresa con fuerza bastante para herir gravemente a alguien.',
        avoid: 'Calza la pieza para que no cojee. Sujétala con sargentos o tornillos en varios puntos. Deja los sargentos bajos y fuera del camino de la fresa.',
      },
      'clamps-clear': {
        title: 'Deja los sargentos fuera del camino de la fresa',
        body: 'El planeado barre toda la zona más un sobrante. Cada sargento tiene que quedar fuera de esa zona y por debajo de la fresa en su pasada más baja.',
        guidance: 'Imagina el rectángulo entero del plan más el radio de la fresa por cada lado. Mueve los sargentos que queden dentro.',
        hazard: 'Una fresa que golpea un sargento puede reventar y lanzar trozos de metal por el taller, hiriendo gravemente a quien esté en su camino.',
        avoid: 'Pon los sargentos fuera de la zona planificada y de su sobrante. Comprueba su altura frente a la pasada más honda. Vuelve a comprobarlo en la vista previa.',
      },
      'homing-clear': homingClear,
      'home': {
        title: 'Haz el homing de la máquina',
        body: 'Lanza el ciclo de homing. Espera a que todos los ejes indiquen que están en casa.',
        guidance: 'El homing le da a la máquina una posición conocida para poder comprobar el plan contra su recorrido.',
      },
      'spindle-stopped': spindleStopped,
      'sharp-edges': sharpEdges,
      'fit-surfacing-cutter': {
        title: 'Pon la fresa de planeado',
        body: 'Limpia la pinza, la tuerca y el cono del husillo. Pon la fresa de planeado con el vástago bien metido en la pinza. Aprieta con las dos llaves y quítalas del husillo.',
        guidance: 'Una fresa grande carga la pinza más que casi cualquier otra. Una pinza limpia y bien apretada la mantiene centrada.',
      },
      'xy-zero': {
        title: 'Pon el cero de pieza en X e Y',
        body: 'Deja el husillo apagado. Lleva la fresa con el jog sobre la esquina de la pieza que usas como origen. Pon ahí el cero de pieza en X e Y.',
        guidance: 'El plan añade un sobrante alrededor de la pieza. El origen solo tiene que quedar cerca, no exacto.',
      },
      'z-zero': {
        title: 'Pon el cero de Z en el punto más alto',
        body: 'Deja el husillo apagado mientras tengas los dedos cerca de la fresa. Lleva la fresa sobre el punto más alto. Mete un papel debajo. Baja con el jog en pasos de 1 mm, 0,1 mm y 0,01 mm hasta que el papel quede pisado. Pon Z al espesor del papel.',
        guidance: 'Con el cero en el punto más alto, la primera pasada solo lo roza. Un papel de oficina normal de 80 g/m² tiene unos 0,1 mm de espesor.',
      },
      'plan': {
        title: 'Planifica las pasadas de aplanado',
        body: 'Abre el planificador. Mete el tamaño de la pieza con un sobrante, la fresa, el paso lateral, la profundidad por pasada, la profundidad total y el avance. Adjunta el plan y carga su programa.',
        guidance: 'En madera dura da pasadas finas. La profundidad total tiene que llegar al punto más bajo que quieras limpiar.',
      },
      'preview-check': {
        title: 'Revisa la vista previa',
        body: 'Comprueba que la trayectoria cubre la pieza con sobrante por todos los lados. Comprueba que ningún sargento queda dentro de la trayectoria. Comprueba que la pasada más honda queda por encima de la tabla de sacrificio.',
        guidance: 'Una pasada más honda que el fondo de la pieza corta la tabla de sacrificio.',
      },
      'cutter-rating': cutterRating,
      'start-extraction': {
        title: 'Arranca la aspiración, el enfriador y el husillo',
        body: 'Pon la campana de aspiración y arranca el colector de polvo. Arranca el enfriador si el husillo es refrigerado por agua y comprueba que el refrigerante circula. Arranca el husillo.',
        guidance: 'Comprueba la aspiración en la campana antes de la primera pasada.',
      },
      'stay-with-machine': stayWithMachine,
      'run-first-face': {
        title: 'Planea la primera cara',
        body: 'Ejecuta el programa. Vigila de cerca la primera pasada. Para si la pieza se mueve, la fresa se clava o cambia el ruido.',
        guidance: 'Escucha el cambio de tono cuando la fresa llega a los puntos altos. Eso es normal. Un golpe o una vibración no lo son.',
      },
      'flip-stock': {
        title: 'Dale la vuelta a la pieza y planea la segunda cara',
        body: 'Para el husillo. Suelta la pieza, dale la vuelta y sujétala plana sobre la cara planeada. Pon el cero de Z en la nueva cara de arriba y vuelve a ejecutar el programa.',
        guidance: 'Con la cara plana abajo la pieza ya no cojea, así que no necesita calzos. Comprueba que los sargentos siguen fuera de la trayectoria.',
      },
      'final-thickness': {
        title: 'Mide el espesor final',
        body: 'Mide el espesor en varios puntos. Apunta la lectura más pequeña.',
        guidance: 'Lecturas que se diferencian en más de unas décimas de milímetro quieren decir que una cara no está planeada del todo.',
        label: 'Espesor final, lectura más pequeña',
      },
      'photo-stock': {
        title: 'Fotografía la pieza aplanada',
        body: 'Haz una foto de la pieza planeada desde arriba.',
        guidance: 'La foto va con el registro del trabajo.',
        subject: 'La pieza aplanada vista desde arriba.',
      },
      'clean-up': {
        title: 'Limpia',
        body: 'Para el husillo, el enfriador y el colector de polvo. Aspira la mesa. No soples el polvo con aire comprimido.',
        guidance: 'El aire comprimido vuelve a meter el polvo fino en el aire que respiras.',
      },
      'final-signoff': finalSignoff('Las dos caras están planas, la pieza estuvo bien sujeta todo el tiempo y la máquina está limpia.'),
    },
  },
}

const spindleTramCheck: Translations = {
  es: {
    title: 'Comprobar la escuadra del husillo',
    summary: 'Medir con un reloj comparador en un brazo giratorio cuánto está a escuadra el husillo con la mesa, y apuntar la inclinación de delante atrás y de lado a lado.',
    steps: {
      'why-tram': {
        title: 'Por qué importa la escuadra',
        body: 'Un husillo inclinado deja escalones entre las pasadas de planeado y corta paredes en pendiente. Esta comprobación mide la inclinación.',
        guidance: 'La inclinación en la dirección del paso lateral deja un pequeño escalón entre pasadas vecinas. La inclinación en la dirección del avance deja cada pasada hundida en el centro.',
        hazard: 'Un husillo fuera de escuadra deja crestas en las superficies planeadas y hace desigual cada ajuste de profundidad.',
        avoid: 'Comprueba la escuadra después de cualquier choque, después de mover el soporte del husillo y cada vez que toque según el taller.',
      },
      'spindle-isolated': {
        title: 'Corta la corriente del husillo antes de girarlo a mano',
        body: 'Vas a girar el husillo a mano con un brazo de reloj en la pinza. El husillo no debe poder arrancar.',
        guidance: 'El brazo giratorio sobresale mucho de la pinza. A velocidad giraría como una cuchilla.',
        hazard: 'Si el husillo arranca con el brazo giratorio puesto, el brazo da vueltas a toda velocidad. Puede herirte gravemente las manos o salir despedido.',
        avoid: 'Apaga el husillo en su mando y córtale la alimentación. Deja el programa cerrado. Gira el husillo solo a mano.',
      },
      'reference-surface': {
        title: 'Prepara una referencia plana',
        body: 'Pon una referencia plana debajo del husillo, como una zona de tabla recién planeada o una placa rectificada. Límpiala.',
        guidance: 'La comprobación es tan buena como la superficie bajo la punta del reloj. Polvo o una viruta bajo la punta aparecen como inclinación.',
      },
      'fit-sweep-arm': {
        title: 'Pon el reloj en un brazo giratorio',
        body: 'Pon el brazo giratorio en la pinza y sujeta el reloj comparador en él. Deja la punta a 75 mm del eje del husillo, para que barra un círculo de 150 mm.',
        guidance: 'Un círculo más grande muestra inclinaciones más pequeñas. Usa siempre el mismo círculo para poder comparar lecturas.',
      },
      'preload': {
        title: 'Baja Z para precargar el reloj',
        body: 'Baja Z hasta que la punta del reloj toque la referencia y la aguja se mueva como media vuelta. Pon el reloj a cero en la posición de delante.',
        guidance: 'Un poco de precarga mantiene la punta en contacto en toda la vuelta.',
      },
      'tram-front-back': {
        title: 'Lee de delante atrás',
        body: 'Gira el husillo a mano para que la punta vaya de delante atrás. Escribe la lectura de atrás menos la de delante.',
        guidance: 'El rango permitido es un punto de partida para un círculo de 150 mm (práctica habitual, sin fuente publicada). Usa la cifra del fabricante si el manual la da.',
        label: 'Atrás menos delante en 150 mm',
      },
      'tram-left-right': {
        title: 'Lee de izquierda a derecha',
        body: 'Gira el husillo para que la punta vaya del lado izquierdo al derecho. Escribe la lectura de la derecha menos la de la izquierda.',
        guidance: 'Gira el husillo siempre en el mismo sentido. Girar adelante y atrás puede hacer que la punta resbale.',
        label: 'Derecha menos izquierda en 150 mm',
      },
      'adjust': {
        title: 'Ajusta si una lectura está fuera de rango',
        body: 'Si una lectura está fuera de rango, ajusta el soporte del husillo como dice el manual del fabricante de la máquina. Vuelve a medir las dos direcciones y apunta las lecturas nuevas. Sáltate este paso si las dos lecturas están dentro de rango.',
        guidance: 'Ajustar una dirección a menudo mueve un poco la otra, así que vuelve a medir siempre las dos.',
      },
      'remove-sweep-arm': {
        title: 'Quita el brazo giratorio',
        body: 'Sube Z. Saca el reloj y el brazo giratorio de la pinza. Guárdalos en su caja.',
        guidance: 'Comprueba que no queda nada en la pinza antes de volver a encender el husillo.',
      },
      'final-signoff': finalSignoff('Las dos lecturas de escuadra están apuntadas, cualquier ajuste está vuelto a medir y el brazo giratorio está fuera del husillo.'),
    },
  },
}

/** Translations of each starter procedure's version 1, by slug. */
export const STARTER_TRANSLATIONS: Readonly<Record<string, Translations>> = {
  'spoilboard-resurfacing': spoilboardResurfacing,
  'tool-change': toolChange,
  'daily-start-up': dailyStartUp,
  'end-of-day-shutdown': endOfDayShutdown,
  'emergency-stop-test': emergencyStopTest,
  'stock-flattening': stockFlattening,
  'spindle-tram-check': spindleTramCheck,
}
