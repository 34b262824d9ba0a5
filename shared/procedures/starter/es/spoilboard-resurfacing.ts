import type { Translations } from '../../translation'
import { protectiveGear, isolatePower, stayWithMachine, spindleStopped, homingClear, sharpEdges, cutterRating, finalSignoff } from './common-steps'

export const spoilboardResurfacing: Translations = {
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
